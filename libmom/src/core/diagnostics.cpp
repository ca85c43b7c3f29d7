// Core: formatting of source locations, input errors and warnings (shared by every stage).
#include <fmt/format.h>

#include "wirefield/model.hpp"

namespace wirefield {

std::string ToString(const SourceLocation& location) {
  if (location.line <= 0) return location.file;
  return fmt::format("{}:{}:{}", location.file, location.line, location.column);
}

InputError::InputError(SourceLocation location, const std::string& message)
    : std::runtime_error(location.file.empty()
                             ? fmt::format("error: {}", message)
                             : fmt::format("{}: error: {}", ToString(location), message)),
      location_(std::move(location)),
      message_(message) {}

std::string ToString(const Warning& warning) {
  if (warning.location.file.empty()) return fmt::format("warning: {}", warning.message);
  return fmt::format("{}: warning: {}", ToString(warning.location), warning.message);
}

}  // namespace wirefield
