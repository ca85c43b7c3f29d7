// Core: reads an input file (a model, a measured Touchstone file) whole, refusing what is not
// a regular file. A FIFO or a device could block forever or never end, so the file is opened
// without blocking and checked with fstat before any read. Errors are InputErrors at PATH.
#pragma once

#include <cstddef>
#include <string>

namespace wirefield::core {

// The whole text of the regular file at `path`. `what` names it in errors ("model file",
// "Touchstone file"); max_bytes bounds it (a larger file is refused with `too_large`, a
// sentence saying why such a file is surely the wrong one). Throws InputError at path.
std::string ReadInputFile(const std::string& path, const std::string& what, std::size_t max_bytes,
                          const std::string& too_large);

}  // namespace wirefield::core
