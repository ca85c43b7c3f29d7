// Report stage: small helpers shared by the SVG plots (pattern, sweep): XML escaping of text
// and pixel coordinates with one decimal.
#pragma once

#include <fmt/format.h>

#include <string>

namespace wirefield::report {

// Escapes text for XML 1.0 character data and attribute values; control characters (not
// allowed in XML 1.0) become '?'.
inline std::string Escape(const std::string& text) {
  std::string out;
  for (char c : text) {
    switch (c) {
      case '&':
        out += "&amp;";
        break;
      case '<':
        out += "&lt;";
        break;
      case '>':
        out += "&gt;";
        break;
      case '"':
        out += "&quot;";
        break;
      default:
        out += (static_cast<unsigned char>(c) < 0x20 && c != '\t') ? '?' : c;
    }
  }
  return out;
}

// A pixel coordinate with one decimal (and no "-0.0").
inline std::string Px(double value) { return fmt::format("{:.1f}", value + 0.0); }

}  // namespace wirefield::report
