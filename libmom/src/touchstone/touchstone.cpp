// Touchstone stage: one-port Touchstone 1.1 files (.s1p) in and out. Reading: option line,
// comments and data lines -> S11 against frequency, with every defect reported at
// FILE:LINE:COLUMN; writing: impedances -> S11 in RI form, full precision. The format is the
// open Touchstone File Format Specification, version 1.1 (IBIS Open Forum).
#include "wirefield/touchstone.hpp"

#include <fmt/format.h>

#include <cctype>
#include <cerrno>
#include <cmath>
#include <cstdlib>
#include <fstream>
#include <optional>
#include <sstream>
#include <string>
#include <vector>

#include "core/constants.hpp"
#include "core/enum_names.hpp"
#include "core/read_file.hpp"
#include "model/ranges.hpp"

namespace wirefield {
namespace {

constexpr double kDegree_rad = core::kPi / 180.0;

struct Token {
  std::string text;
  int column = 1;  // 1-based
};

// Splits a line at spaces and tabs (after the comment is cut off), keeping columns.
std::vector<Token> Tokens(const std::string& line) {
  std::vector<Token> out;
  std::size_t i = 0;
  while (i < line.size()) {
    while (i < line.size() && (line[i] == ' ' || line[i] == '\t')) ++i;
    if (i >= line.size()) break;
    const std::size_t start = i;
    while (i < line.size() && line[i] != ' ' && line[i] != '\t') ++i;
    out.push_back(Token{line.substr(start, i - start), static_cast<int>(start) + 1});
  }
  return out;
}

std::string Upper(const std::string& text) {
  std::string out = text;
  for (char& c : out) c = static_cast<char>(std::toupper(static_cast<unsigned char>(c)));
  return out;
}

// Control bytes and long tokens are shown shortened and escaped (Printable), so a binary
// file gives a readable message.
std::string Shown(const std::string& text) {
  constexpr std::size_t kMaxShown = 24;
  if (text.size() <= kMaxShown) return Printable(text);
  return Printable(std::string_view(text).substr(0, kMaxShown)) + "...";
}

// A finite decimal number of the whole token ("1.5", "-2e-3", "+7"), else nothing.
std::optional<double> Number(const std::string& text) {
  if (text.empty()) return {};
  for (char c : text) {
    const bool allowed = std::isdigit(static_cast<unsigned char>(c)) || c == '.' || c == 'e' ||
                         c == 'E' || c == '+' || c == '-';
    if (!allowed) return {};
  }
  errno = 0;
  char* end = nullptr;
  const double value = std::strtod(text.c_str(), &end);
  if (end != text.c_str() + text.size() || errno == ERANGE || !std::isfinite(value)) return {};
  return value;
}

const char* FormatName(TouchstoneFormat format) {
  static constexpr core::EnumNames<TouchstoneFormat, 3> kNames = {
      {{TouchstoneFormat::kRealImaginary, "RI"},
       {TouchstoneFormat::kMagnitudeAngle, "MA"},
       {TouchstoneFormat::kDecibelAngle, "DB"}}};
  return core::NameOf(format, kNames, "?");
}

class Reader {
 public:
  Reader(const std::string& text, const std::string& file) : text_(text) { data_.file = file; }

  TouchstoneData Read() {
    std::size_t pos = 0;
    int line_number = 0;
    while (pos <= text_.size()) {
      std::size_t end = text_.find('\n', pos);
      if (end == std::string::npos) end = text_.size();
      std::string line = text_.substr(pos, end - pos);
      ++line_number;
      pos = end + 1;
      if (!line.empty() && line.back() == '\r') line.pop_back();
      const std::size_t comment = line.find('!');
      if (comment != std::string::npos) line.resize(comment);
      ReadLine(line, line_number);
      if (end == text_.size()) break;
    }
    if (data_.points.empty()) {
      throw InputError(SourceLocation{data_.file, 0, 0},
                       "no data lines: a one-port Touchstone file needs lines of a frequency "
                       "and the two parts of S11, e.g. `14.2 0.1 -0.05` after the option line "
                       "`# MHZ S RI R 50`");
    }
    return data_;
  }

 private:
  [[noreturn]] void Fail(int line, int column, const std::string& message) const {
    throw InputError(SourceLocation{data_.file, line, column}, message);
  }

  void ReadLine(const std::string& line, int line_number) {
    const std::vector<Token> tokens = Tokens(line);
    if (tokens.empty()) return;
    if (tokens.front().text[0] == '#') {
      // Touchstone 1.1 has one option line, before the data; a second one would change the
      // meaning of the numbers if it were read, so it is refused rather than ignored.
      const int column = static_cast<int>(line.find('#')) + 1;
      if (options_line_ > 0) {
        Fail(line_number, column,
             fmt::format("a second option line (the first is line {}); a Touchstone file has "
                         "one option line: delete this one or merge the two",
                         options_line_));
      }
      if (data_line_ > 0) {
        Fail(line_number, column,
             fmt::format("an option line after the data (which starts at line {}); move it "
                         "above the first data line",
                         data_line_));
      }
      ReadOptions(line, line_number);
      options_line_ = line_number;
      return;
    }
    if (tokens.front().text[0] == '[') {
      Fail(line_number, tokens.front().column,
           fmt::format("'{}' is a keyword of Touchstone version 2.0; this reader takes version "
                       "1.1 one-port files: save the file as a version 1 .s1p file",
                       Shown(tokens.front().text)));
    }
    if (data_line_ == 0) data_line_ = line_number;
    ReadData(tokens, line_number, static_cast<int>(line.size()));
  }

  void ReadOptions(const std::string& line, int line_number) {
    const std::size_t hash = line.find('#');
    std::vector<Token> tokens = Tokens(line.substr(hash + 1));
    for (Token& token : tokens) token.column += static_cast<int>(hash) + 1;
    for (std::size_t i = 0; i < tokens.size(); ++i) {
      const std::string word = Upper(tokens[i].text);
      if (word == "HZ") {
        data_.frequency_unit_hz = 1.0;
      } else if (word == "KHZ") {
        data_.frequency_unit_hz = 1e3;
      } else if (word == "MHZ") {
        data_.frequency_unit_hz = 1e6;
      } else if (word == "GHZ") {
        data_.frequency_unit_hz = 1e9;
      } else if (word == "S") {
        // S parameters: the only kind read.
      } else if (word == "Y" || word == "Z" || word == "G" || word == "H") {
        Fail(line_number, tokens[i].column,
             fmt::format("this file holds {} parameters; only S parameters are read: save the "
                         "measurement as S11 (option line `# MHZ S RI R 50`)",
                         word));
      } else if (word == "RI") {
        data_.format = TouchstoneFormat::kRealImaginary;
      } else if (word == "MA") {
        data_.format = TouchstoneFormat::kMagnitudeAngle;
      } else if (word == "DB") {
        data_.format = TouchstoneFormat::kDecibelAngle;
      } else if (word == "R") {
        if (i + 1 >= tokens.size()) {
          Fail(line_number, tokens[i].column,
               "R needs the reference resistance in ohm after it, e.g. `R 50`");
        }
        const std::optional<double> r = Number(tokens[i + 1].text);
        if (!r) {
          Fail(line_number, tokens[i + 1].column,
               fmt::format("the reference resistance after R must be a number of ohm, e.g. "
                           "`R 50`; got '{}'",
                           Shown(tokens[i + 1].text)));
        }
        if (auto message = model::OutOfRange(model::ValueKind::kImpedanceOhm, *r,
                                             "the reference resistance after R")) {
          Fail(line_number, tokens[i + 1].column, *message);
        }
        data_.reference_ohm = *r;
        ++i;
      } else {
        Fail(line_number, tokens[i].column,
             fmt::format("unknown word '{}' in the option line; it takes a frequency unit "
                         "(HZ, KHZ, MHZ, GHZ), the parameter S, a format (RI, MA, DB) and "
                         "R with the reference resistance, e.g. `# MHZ S RI R 50`",
                         Shown(tokens[i].text)));
      }
    }
  }

  void ReadData(const std::vector<Token>& tokens, int line_number, int line_length) {
    std::vector<double> values;
    for (const Token& token : tokens) {
      const std::optional<double> value = Number(token.text);
      if (!value) {
        Fail(line_number, token.column,
             fmt::format("expected a number, got '{}'; a data line holds a frequency and the "
                         "two parts of S11 (here {}), separated by spaces; start comments with "
                         "'!'",
                         Shown(token.text), FormatName(data_.format)));
      }
      values.push_back(*value);
    }
    if (values.size() < 3) {
      Fail(line_number, line_length + 1,
           fmt::format("a one-port data line needs 3 numbers (the frequency and the two parts "
                       "of S11, here {}); this line has {}",
                       FormatName(data_.format), values.size()));
    }
    if (values.size() > 3) {
      Fail(line_number, tokens[3].column,
           fmt::format("a one-port data line has 3 numbers (the frequency and the two parts of "
                       "S11); this line has {}: is this a file of more than one port?",
                       values.size()));
    }
    const double frequency_hz = values[0] * data_.frequency_unit_hz;
    if (!std::isfinite(frequency_hz) || frequency_hz < 0.0) {
      Fail(line_number, tokens[0].column,
           fmt::format("the frequency must be 0 or more; got '{}'", Shown(tokens[0].text)));
    }
    if (!data_.points.empty() && !(frequency_hz > data_.points.back().frequency_hz)) {
      Fail(line_number, tokens[0].column,
           fmt::format("the frequency {} is not above the {} of line {}; the data lines must "
                       "be in order of increasing frequency, without repeats",
                       Shown(tokens[0].text), previous_frequency_text_, data_.points.back().line));
    }
    Complex s11;
    switch (data_.format) {
      case TouchstoneFormat::kRealImaginary:
        s11 = Complex(values[1], values[2]);
        break;
      case TouchstoneFormat::kMagnitudeAngle:
        s11 = std::polar(values[1], values[2] * kDegree_rad);
        break;
      case TouchstoneFormat::kDecibelAngle:
        s11 = std::polar(std::pow(10.0, values[1] / 20.0), values[2] * kDegree_rad);
        break;
    }
    if (!std::isfinite(s11.real()) || !std::isfinite(s11.imag())) {
      Fail(line_number, tokens[1].column,
           fmt::format("S11 '{} {}' is too large to represent; check the format ({})",
                       Shown(tokens[1].text), Shown(tokens[2].text), FormatName(data_.format)));
    }
    data_.points.push_back(TouchstonePoint{frequency_hz, s11, line_number});
    previous_frequency_text_ = Shown(tokens[0].text);
  }

  const std::string& text_;
  TouchstoneData data_;
  int options_line_ = 0;  // the line of the option line; 0 before it
  int data_line_ = 0;     // the first data line; 0 before it
  std::string previous_frequency_text_;
};

}  // namespace

TouchstoneData ParseTouchstone(const std::string& text, const std::string& file_name) {
  return Reader(text, file_name).Read();
}

TouchstoneData ReadTouchstone(const std::string& path) {
  // A measured one-port file has some hundreds of lines; 64 MiB is far past any real one and
  // keeps a wrong path (a disk image) from filling the memory.
  constexpr std::size_t kMaxBytes = std::size_t{64} << 20;
  const std::string text =
      core::ReadInputFile(path, "Touchstone file", kMaxBytes,
                          "the Touchstone file is larger than 64 MiB; is this the right file?");
  return ParseTouchstone(text, path);
}

Complex ImpedanceFromReflection(Complex s11, double reference_ohm) {
  const Complex denominator = 1.0 - s11;
  if (std::abs(denominator) == 0.0) {
    throw ComputationError(
        "a reflection coefficient of exactly 1 (an open circuit) has no "
        "finite impedance");
  }
  return reference_ohm * (1.0 + s11) / denominator;
}

std::string FormatTouchstone(const std::vector<double>& frequencies_hz,
                             const std::vector<Complex>& impedances_ohm, double reference_ohm,
                             const std::vector<std::string>& comments) {
  if (frequencies_hz.size() != impedances_ohm.size()) {
    throw ComputationError("FormatTouchstone: as many impedances as frequencies are needed");
  }
  std::string out;
  for (const std::string& comment : comments) {
    std::string line = comment;
    for (char& c : line) {
      if (c == '\n' || c == '\r') c = ' ';
    }
    out += "! " + line + "\n";
  }
  out += fmt::format("# MHZ S RI R {}\n", reference_ohm);
  for (std::size_t i = 0; i < frequencies_hz.size(); ++i) {
    const Complex z = impedances_ohm[i];
    const Complex s11 = (z - reference_ohm) / (z + reference_ohm);
    if (!std::isfinite(s11.real()) || !std::isfinite(s11.imag()) ||
        !std::isfinite(frequencies_hz[i])) {
      throw ComputationError(
          fmt::format("cannot write a non-finite S11 at {} Hz to Touchstone", frequencies_hz[i]));
    }
    out += fmt::format("{:.17g} {:.17g} {:.17g}\n", frequencies_hz[i] / 1e6, s11.real() + 0.0,
                       s11.imag() + 0.0);
  }
  return out;
}

}  // namespace wirefield
