# The dependency-direction check (scripts/check_layers.cmake) bites: run on small trees made
# here, it passes a tree whose includes point only to earlier stages and fails, naming the file,
# the line and the reason, on each kind of offence. The trees take their stage folders from the
# real libmom/src, so the order itself is written only in the checker.
# Run by ctest as layers.check_bites: cmake -DSOURCE_DIR=<repo> -DWORK_DIR=<dir> -P this file.

cmake_minimum_required(VERSION 3.20)

set(checker "${SOURCE_DIR}/scripts/check_layers.cmake")
file(GLOB stages LIST_DIRECTORIES true RELATIVE "${SOURCE_DIR}/libmom/src"
     "${SOURCE_DIR}/libmom/src/*")

# A tree at WORK_DIR/<name> with a folder per stage, a legal include chain (fill includes
# geometry/ and a public header; the public header includes another) and the file `path`
# holding `text` (none when path is empty).
function(make_tree name path text)
  set(root "${WORK_DIR}/${name}")
  file(REMOVE_RECURSE "${root}")
  foreach(stage IN LISTS stages)
    file(MAKE_DIRECTORY "${root}/libmom/src/${stage}")
  endforeach()
  file(WRITE "${root}/libmom/src/geometry/mesh.hpp" "#pragma once\n#include <vector>\n")
  file(WRITE "${root}/libmom/src/fill/assemble.cpp"
       "// fill\n#include \"fill/assemble.hpp\"\n\n#include \"geometry/mesh.hpp\"\n"
       "#include \"wirefield/model.hpp\"\n")
  file(WRITE "${root}/libmom/include/wirefield/simulation.hpp"
       "#pragma once\n#include <string>\n#include \"wirefield/model.hpp\"\n")
  if(path)
    file(WRITE "${root}/${path}" "${text}")
  endif()
endfunction()

# Runs the checker on tree `name`; `expect` is PASS or a text its failure must contain.
function(expect_check name expect)
  execute_process(COMMAND "${CMAKE_COMMAND}" "-DROOT=${WORK_DIR}/${name}" -P "${checker}"
                  RESULT_VARIABLE result OUTPUT_VARIABLE out ERROR_VARIABLE out)
  if(expect STREQUAL "PASS")
    if(NOT result EQUAL 0)
      message(FATAL_ERROR "${name}: the check failed on a legal tree:\n${out}")
    endif()
    return()
  endif()
  if(result EQUAL 0)
    message(FATAL_ERROR "${name}: the check passed a tree that breaks the order:\n${out}")
  endif()
  string(FIND "${out}" "${expect}" at)
  if(at LESS 0)
    message(FATAL_ERROR "${name}: the check failed, but without \"${expect}\":\n${out}")
  endif()
endfunction()

make_tree(legal "" "")
expect_check(legal PASS)

# An earlier stage includes a later one (line 3 of the file).
make_tree(later "libmom/src/fill/kernel.cpp"
          "// fill\n#include <cmath>\n#include \"post/results.hpp\"\n")
expect_check(later
             "libmom/src/fill/kernel.cpp:3: fill includes post/results.hpp, of the later stage post")

# A stage calls back into the study layer.
make_tree(study "libmom/src/post/pattern.cpp" "#include \"study/pipeline.hpp\"\n")
expect_check(study
             "libmom/src/post/pattern.cpp:1: post includes study/pipeline.hpp, of the later stage study")

# The api layer is the last: not even study/ may include it.
make_tree(api "libmom/src/study/sweep.cpp" "// study\n\n#include \"api/helpers.hpp\"\n")
expect_check(api "libmom/src/study/sweep.cpp:3: study includes api/helpers.hpp, of the later stage api")

# A public header includes an internal one.
make_tree(public "libmom/include/wirefield/pattern.hpp"
          "#pragma once\n#include \"wirefield/simulation.hpp\"\n#include \"post/far_field.hpp\"\n")
expect_check(public "libmom/include/wirefield/pattern.hpp:3: the public header includes the internal post/far_field.hpp")

# report/'s headers stay inside report/, though study/ comes after it.
make_tree(report "libmom/src/study/batch_run.cpp" "#include \"report/text_table.hpp\"\n")
expect_check(report "libmom/src/study/batch_run.cpp:1: study includes report/text_table.hpp: only report includes its headers")

# A new folder must take its place in the order.
make_tree(folder "libmom/src/extra/thing.cpp" "#include \"core/constants.hpp\"\n")
expect_check(folder "libmom/src/extra: a folder that is not in the stage order")

# An include without its folder could hide a stage.
make_tree(bare "libmom/src/solve/dense.cpp" "#include \"assemble.hpp\"\n")
expect_check(bare "libmom/src/solve/dense.cpp:1: #include \"assemble.hpp\": write a library header")

message(STATUS "check_layers bites: 1 legal tree passed, 7 broken trees failed as expected")
