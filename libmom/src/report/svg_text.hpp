// Report stage: small helpers shared by the SVG plots (pattern, sweep): XML escaping of text,
// pixel coordinates with one decimal, and the layout of labels: an estimate of a text's box
// and a record of the boxes already drawn, so that no label is put on top of another or
// outside the picture.
#pragma once

#include <fmt/format.h>

#include <algorithm>
#include <cmath>
#include <string>
#include <vector>

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

// The font list of every picture: DejaVu Sans first, the widest of them, for which the text
// widths below are estimated (narrower fonts only leave more room).
inline constexpr const char* kFontFamily = "DejaVu Sans, Liberation Sans, Arial, sans-serif";

// Estimated advance of `text` in pixels at `size_px`, from the advance widths of DejaVu Sans
// in em (digits 0.636, space and period 0.318, capitals about 0.70, lower case about 0.60),
// rounded up; an XML character reference such as "&#176;" counts as one character.
inline double TextWidth(const std::string& text, double size_px, bool bold = false) {
  double em = 0.0;
  for (std::size_t i = 0; i < text.size(); ++i) {
    const unsigned char c = static_cast<unsigned char>(text[i]);
    if (c == '&') {
      const std::size_t end = text.find(';', i);
      if (end != std::string::npos && end - i <= 8) i = end;
      em += 0.64;
    } else if ((c & 0xC0) == 0x80) {
      continue;  // a UTF-8 continuation byte: counted with its lead byte
    } else if (c == ' ' || c == '.' || c == ',' || c == ':' || c == ';' || c == '|' || c == 'i' ||
               c == 'j' || c == 'l' || c == '\'' || c == '(' || c == ')') {
      em += 0.36;
    } else if (c == 'm' || c == 'w' || c == 'M' || c == 'W') {
      em += 0.98;
    } else if (c >= 'A' && c <= 'Z') {
      em += 0.74;
    } else {
      em += 0.64;
    }
  }
  return em * size_px * (bold ? 1.12 : 1.0);
}

// The font size, at most `size_px`, at which `text` fits in `width_px`.
inline double FitSize(const std::string& text, double size_px, double width_px, bool bold = false) {
  const double width = TextWidth(text, size_px, bold);
  return width <= width_px ? size_px : std::floor(size_px * width_px / width * 10.0) / 10.0;
}

// An axis-aligned box in picture pixels.
struct TextBox {
  double x0 = 0.0;
  double y0 = 0.0;
  double x1 = 0.0;
  double y1 = 0.0;
  bool Overlaps(const TextBox& other, double margin_px) const {
    return x0 < other.x1 + margin_px && other.x0 < x1 + margin_px && y0 < other.y1 + margin_px &&
           other.y0 < y1 + margin_px;
  }
};

// The box of a horizontal text drawn at (x, y) (the baseline) with text-anchor `anchor`
// ("start", "middle" or "end"): from the ascent (0.93 em) above the baseline to the descent
// (0.24 em) below, the line box of DejaVu Sans.
inline TextBox BoxOfText(double x, double y, const std::string& text, double size_px,
                         const std::string& anchor, bool bold = false) {
  const double width = TextWidth(text, size_px, bold);
  const double left = anchor == "middle" ? x - width / 2.0 : (anchor == "end" ? x - width : x);
  return TextBox{left, y - 0.93 * size_px, left + width, y + 0.24 * size_px};
}

// The labels already drawn on a picture of width x height pixels. A new label is drawn only
// where it overlaps none of them and stays inside the picture.
class LabelSpace {
 public:
  LabelSpace(double width_px, double height_px) : width_px_(width_px), height_px_(height_px) {}
  bool Free(const TextBox& box, double margin_px = 2.0) const {
    if (box.x0 < 1.0 || box.y0 < 1.0 || box.x1 > width_px_ - 1.0 || box.y1 > height_px_ - 1.0) {
      return false;
    }
    return std::none_of(taken_.begin(), taken_.end(),
                        [&](const TextBox& t) { return t.Overlaps(box, margin_px); });
  }
  void Take(const TextBox& box) { taken_.push_back(box); }
  // Takes the box and returns true when it is free.
  bool TakeIfFree(const TextBox& box, double margin_px = 2.0) {
    if (!Free(box, margin_px)) return false;
    Take(box);
    return true;
  }

 private:
  double width_px_;
  double height_px_;
  std::vector<TextBox> taken_;
};

// Splits `text` at spaces into lines no wider than `width_px` at `size_px` (a word longer
// than the width gets a line of its own).
inline std::vector<std::string> WrapText(const std::string& text, double size_px, double width_px) {
  std::vector<std::string> lines;
  std::string line;
  std::size_t start = 0;
  while (start <= text.size()) {
    std::size_t end = text.find(' ', start);
    if (end == std::string::npos) end = text.size();
    const std::string word = text.substr(start, end - start);
    const std::string joined = line.empty() ? word : line + " " + word;
    if (!line.empty() && TextWidth(joined, size_px) > width_px) {
      lines.push_back(line);
      line = word;
    } else {
      line = joined;
    }
    start = end + 1;
  }
  if (!line.empty()) lines.push_back(line);
  return lines;
}

}  // namespace wirefield::report
