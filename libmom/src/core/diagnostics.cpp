// Core: formatting of source locations, input errors and warnings (shared by every stage).
#include <fmt/format.h>

#include "wirefield/model.hpp"

namespace wirefield {

long DecodeUtf8(std::string_view text, size_t i, size_t* length) {
  *length = 1;
  const auto b0 = static_cast<unsigned char>(text[i]);
  int extra = 0;
  long cp = 0;
  // The second byte's range narrows for E0 (no overlong), ED (no surrogates D800-DFFF),
  // F0 (no overlong) and F4 (nothing past U+10FFFF): RFC 3629, section 4.
  unsigned char low = 0x80, high = 0xBF;
  if (b0 < 0x80) return b0;
  if (b0 >= 0xC2 && b0 <= 0xDF) {
    extra = 1;
    cp = b0 & 0x1F;
  } else if (b0 >= 0xE0 && b0 <= 0xEF) {
    extra = 2;
    cp = b0 & 0x0F;
    if (b0 == 0xE0) low = 0xA0;
    if (b0 == 0xED) high = 0x9F;
  } else if (b0 >= 0xF0 && b0 <= 0xF4) {
    extra = 3;
    cp = b0 & 0x07;
    if (b0 == 0xF0) low = 0x90;
    if (b0 == 0xF4) high = 0x8F;
  } else {
    return -1;
  }
  if (i + static_cast<size_t>(extra) >= text.size()) return -1;
  for (int k = 1; k <= extra; ++k) {
    const auto b = static_cast<unsigned char>(text[i + static_cast<size_t>(k)]);
    const unsigned char lo = k == 1 ? low : 0x80;
    const unsigned char hi = k == 1 ? high : 0xBF;
    if (b < lo || b > hi) return -1;
    cp = (cp << 6) | (b & 0x3F);
  }
  *length = static_cast<size_t>(extra) + 1;
  return cp;
}

std::string Printable(std::string_view text) {
  std::string out;
  out.reserve(text.size());
  size_t i = 0;
  while (i < text.size()) {
    size_t length = 1;
    const long cp = DecodeUtf8(text, i, &length);
    if (cp == '\\') {
      out += "\\\\";
    } else if (cp == '\t') {
      out += "\\t";
    } else if (cp == '\n') {
      out += "\\n";
    } else if (cp == '\r') {
      out += "\\r";
    } else if (cp < 0 || cp < 0x20 || (cp >= 0x7F && cp <= 0x9F)) {
      for (size_t k = 0; k < length; ++k) {
        out += fmt::format("\\x{:02X}", static_cast<unsigned char>(text[i + k]));
      }
    } else {
      out.append(text.substr(i, length));
    }
    i += length;
  }
  return out;
}

std::string ToString(const SourceLocation& location) {
  const std::string file = Printable(location.file);
  if (location.line <= 0) return file;
  return fmt::format("{}:{}:{}", file, location.line, location.column);
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
