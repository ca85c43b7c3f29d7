# The dependency direction of libmom, checked: reads every #include "..." of libmom/src and
# libmom/include and fails (exit 1, one line FILE:LINE per offence) when a stage includes a
# later stage, when a stage but report/ includes a header of report/, or when a public header
# includes anything but another public header. Run as the ctest test layers.direction, or by
# hand: cmake -DROOT=<the repository> -P scripts/check_layers.cmake

cmake_minimum_required(VERSION 3.20)

# The order of the stages, written only here (docs/architecture.md shows it as a picture). A
# stage may include its own headers, the public headers (wirefield/...) and the headers of the
# stages before it, never of a later one, so that each stage can be read, tested and changed
# knowing only what comes before it. The order is the one the data flows in: text -> Model ->
# mesh -> matrix -> currents -> results. network/ (the feed chain's two-ports, circuit theory
# on a terminal impedance) comes after solve/ and before post/ because post/ turns each solved
# feed impedance into what the transmitter sees and the voltages along the chain through it;
# it needs nothing of the mesh or the matrix. bands/, coil/ and touchstone/ are leaves beside
# the pipeline. study/ and api/ come last: they are the layer that runs the stages in order,
# and no stage may call back into them.
set(WIREFIELD_STAGES
    core        # constants, materials, diagnostics, threads, memory
    model       # model text -> Model
    geometry    # Model -> mesh
    conductor   # skin-effect impedance of round wires (fill, coil)
    ground      # reflection coefficients and Sommerfeld integrals of real ground
    fill        # mesh -> impedance matrix and excitation
    solve       # the dense solve Z I = V
    network     # feed chain two-ports: transformer, line, reflection
    post        # currents -> feed and load results, far field, stress, exposure
    bands       # band table and per-band summaries of a sweep
    coil        # the coil calculator
    touchstone  # Touchstone files: read, write, compare
    report      # text, JSON, CSV and SVG of the public result types (wirefield_report)
    study       # runs the stages: Simulation, sweep, batch, tuner
    api)        # public entries that hand a model and its solve to post/
# Stages whose headers only they include: report/ is its own library (wirefield_report), built
# on top of wirefield, which must not need it.
set(WIREFIELD_PRIVATE_STAGES report)

if(NOT ROOT)
  message(FATAL_ERROR "check_layers: give the repository as -DROOT=<path>")
endif()

set(offences "")
# Appends "FILE:LINE: WHY" for the include line `text` of `file` to `offences`; the
# arguments after `text` are joined into WHY.
function(offend file text)
  string(JOIN "" why ${ARGN})
  file(READ "${file}" content)
  string(FIND "${content}" "${text}" at)
  string(SUBSTRING "${content}" 0 ${at} before)
  string(REGEX MATCHALL "\n" newlines "${before}")
  list(LENGTH newlines line)
  math(EXPR line "${line} + 1")
  file(RELATIVE_PATH shown "${ROOT}" "${file}")
  set(offences "${offences}\n  ${shown}:${line}: ${why}" PARENT_SCOPE)
endfunction()

# Every folder of libmom/src is a stage of the list, and every stage a folder.
file(GLOB folders LIST_DIRECTORIES true RELATIVE "${ROOT}/libmom/src" "${ROOT}/libmom/src/*")
foreach(folder IN LISTS folders)
  if(IS_DIRECTORY "${ROOT}/libmom/src/${folder}" AND NOT folder IN_LIST WIREFIELD_STAGES)
    string(APPEND offences "\n  libmom/src/${folder}: a folder that is not in the stage order "
           "of scripts/check_layers.cmake (add it where its includes put it)")
  endif()
endforeach()
foreach(stage IN LISTS WIREFIELD_STAGES)
  if(NOT IS_DIRECTORY "${ROOT}/libmom/src/${stage}")
    string(APPEND offences "\n  libmom/src/${stage}: a stage of the order that has no folder")
  endif()
endforeach()

set(include_regex "^[ \t]*#[ \t]*include[ \t]*[\"<]([^\">]+)[\">]")
file(GLOB_RECURSE sources "${ROOT}/libmom/src/*.cpp" "${ROOT}/libmom/src/*.hpp"
     "${ROOT}/libmom/include/*.hpp" "${ROOT}/libmom/include/*.hpp.in")
foreach(file IN LISTS sources)
  file(RELATIVE_PATH relative "${ROOT}/libmom" "${file}")
  set(stage "")  # empty for a public header
  if(relative MATCHES "^src/([^/]+)/")
    set(stage "${CMAKE_MATCH_1}")
    list(FIND WIREFIELD_STAGES "${stage}" stage_rank)
  endif()
  file(STRINGS "${file}" lines REGEX "${include_regex}")
  foreach(text IN LISTS lines)
    string(REGEX MATCH "${include_regex}" matched "${text}")
    set(header "${CMAKE_MATCH_1}")
    string(FIND "${text}" "\"" quoted)
    set(folder "")
    if(header MATCHES "^([^/]+)/")
      set(folder "${CMAKE_MATCH_1}")
    endif()
    if(folder STREQUAL "wirefield")
      continue()  # a public header: standard types only, for every stage
    endif()
    if(NOT folder IN_LIST WIREFIELD_STAGES)
      if(quoted GREATER_EQUAL 0)
        offend("${file}" "${text}" "#include \"${header}\": write a library header as "
               "STAGE/FILE or wirefield/FILE")
      endif()
      continue()  # <...>: the standard library or a dependency
    endif()
    if(NOT stage)
      offend("${file}" "${text}" "the public header includes the internal ${header} "
             "(public headers use standard types and other public headers only)")
      continue()
    endif()
    list(FIND WIREFIELD_STAGES "${folder}" folder_rank)
    if(folder_rank GREATER stage_rank)
      offend("${file}" "${text}" "${stage} includes ${header}, of the later stage ${folder}")
    elseif(folder IN_LIST WIREFIELD_PRIVATE_STAGES AND NOT folder STREQUAL stage)
      offend("${file}" "${text}" "${stage} includes ${header}: only ${folder} includes its "
             "headers")
    endif()
  endforeach()
endforeach()

if(offences)
  string(JOIN " " order ${WIREFIELD_STAGES})
  message(FATAL_ERROR "libmom's dependency direction is broken (order: ${order}):${offences}")
endif()
list(LENGTH sources checked)
message(STATUS "check_layers: ${checked} files, every include points to an earlier stage")
