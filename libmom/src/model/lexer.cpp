// Model stage: the lexer of the model language (one line at a time) and name suggestions.
// Input: line bytes; output: number, name and punctuation tokens with columns. Columns count
// characters; since only ASCII may appear before a comment, that is the byte index plus one.
#include "model/lexer.hpp"

#include <fmt/format.h>

#include <algorithm>
#include <cctype>
#include <charconv>
#include <cmath>
#include <cstdint>
#include <limits>

namespace wirefield::model {

SourceLocation At(const LineSource& source, int column) {
  return SourceLocation{source.file, source.line, column + source.column_offset};
}

namespace {

bool IsNameStart(char c) { return std::isalpha(static_cast<unsigned char>(c)) || c == '_'; }
bool IsNameChar(char c) { return std::isalnum(static_cast<unsigned char>(c)) || c == '_'; }
bool IsDigit(char c) { return c >= '0' && c <= '9'; }

// A hint for characters that word processors put in place of ASCII ones.
std::string NonAsciiHint(long cp) {
  switch (cp) {
    case 0x2212:
    case 0x2013:
    case 0x2014:
      return "; use '-' (ASCII minus)";
    case 0x00D7:
    case 0x22C5:
    case 0x00B7:
      return "; use '*' to multiply";
    case 0x00B5:
    case 0x03BC:
      return "; write micro as 'u' (10uH)";
    case 0x03A9:
    case 0x2126:
      return "; write 'ohm' (50ohm)";
    case 0x00B0:
      return "; write 'deg' (30deg)";
    case 0x2018:
    case 0x2019:
    case 0x201C:
    case 0x201D:
      return "; the language has no quotes";
    case 0x00A0:
      return "; a no-break space: use an ordinary space";
    case 0xFEFF:
      return "; a byte order mark in the middle of the file (pasted from another file?): "
             "delete it";
    default:
      return "; names, numbers and operators use ASCII only (comments may hold any text)";
  }
}

[[noreturn]] void ThrowBadByte(std::string_view line, size_t i, const LineSource& source) {
  const int column = static_cast<int>(i) + 1;
  const auto byte = static_cast<unsigned char>(line[i]);
  if (byte == 0) {
    throw InputError(At(source, column),
                     "unexpected NUL byte; is this a binary file? A model is UTF-8 text");
  }
  if (byte == '\r') {
    throw InputError(At(source, column),
                     "unexpected carriage return inside a line; save the file with "
                     "ordinary line ends");
  }
  if (byte < 0x20 || byte == 0x7F) {
    throw InputError(At(source, column),
                     fmt::format("unexpected control character U+{:04X}; a model is plain text",
                                 static_cast<unsigned>(byte)));
  }
  size_t length = 1;
  const long cp = DecodeUtf8(line, i, &length);
  if (cp < 0) {
    throw InputError(At(source, column),
                     fmt::format("unexpected byte 0x{:02X}: not UTF-8 text; a model is UTF-8 text",
                                 static_cast<unsigned>(byte)));
  }
  if (cp <= 0x9F) {  // a C1 control character (U+0080 to U+009F), never printed raw
    throw InputError(At(source, column),
                     fmt::format("unexpected control character U+{:04X}; a model is plain text",
                                 static_cast<unsigned>(cp)));
  }
  throw InputError(At(source, column),
                   fmt::format("unexpected character '{}' (U+{:04X}){}",
                               Printable(line.substr(i, length)), cp, NonAsciiHint(cp)));
}

[[noreturn]] void ThrowBadPunct(char c, int column, const LineSource& source) {
  std::string hint;
  switch (c) {
    case ';':
      hint = "; write one statement per line";
      break;
    case '[':
    case ']':
      hint = "; optional parts are written without brackets";
      break;
    case '"':
    case '\'':
      hint = "; the language has no quotes";
      break;
    case '.':
      hint = "; a decimal number needs a digit after its point (.5, 2.0)";
      break;
    case '\\':
      hint = "; a statement is written on one line, without continuation";
      break;
    default:
      break;
  }
  throw InputError(At(source, column), fmt::format("unexpected character '{}'{}", c, hint));
}

}  // namespace

std::vector<Token> LexLine(std::string_view line, const LineSource& source) {
  const size_t statement_length = std::min(line.find('#'), line.size());
  if (statement_length > static_cast<size_t>(kMaxStatementCharacters)) {
    throw InputError(At(source, kMaxStatementCharacters + 1),
                     fmt::format("the line is longer than {} characters before any comment; "
                                 "split the statement with let variables",
                                 kMaxStatementCharacters));
  }
  std::vector<Token> tokens;
  size_t i = 0;
  bool space = true;
  while (i < line.size()) {
    const char c = line[i];
    const int column = static_cast<int>(i) + 1;
    if (c == ' ' || c == '\t') {
      space = true;
      ++i;
      continue;
    }
    if (c == '#') break;
    const auto byte = static_cast<unsigned char>(c);
    if (byte < 0x20 || byte >= 0x7F) ThrowBadByte(line, i, source);
    Token token;
    token.column = column;
    token.space_before = space;
    space = false;
    if (IsDigit(c) || (c == '.' && i + 1 < line.size() && IsDigit(line[i + 1]))) {
      size_t j = i;
      while (j < line.size() && IsDigit(line[j])) ++j;
      if (j < line.size() && line[j] == '.') {
        ++j;
        while (j < line.size() && IsDigit(line[j])) ++j;
      }
      // An exponent only when digits follow 'e' (so "2em" is 2 then the unit "em").
      if (j < line.size() && (line[j] == 'e' || line[j] == 'E')) {
        size_t k = j + 1;
        if (k < line.size() && (line[k] == '+' || line[k] == '-')) ++k;
        if (k < line.size() && IsDigit(line[k])) {
          while (k < line.size() && IsDigit(line[k])) ++k;
          j = k;
        }
      }
      token.kind = TokenKind::kNumber;
      token.text = std::string(line.substr(i, j - i));
      double value = 0.0;
      const char* first = line.data() + i;
      const char* last = line.data() + j;
      const auto result = std::from_chars(first, last, value, std::chars_format::general);
      if (result.ec == std::errc::result_out_of_range || !std::isfinite(value)) {
        throw InputError(At(source, column),
                         fmt::format("number '{}' is out of the range of double precision "
                                     "(about 1e-308 to 1e308); write it with a unit or smaller",
                                     Shorten(token.text)));
      }
      if (result.ec != std::errc() || result.ptr != last) {
        throw InputError(At(source, column),
                         fmt::format("malformed number '{}'", Shorten(token.text)));
      }
      token.number = value;
      i = j;
    } else if (IsNameStart(c)) {
      size_t j = i;
      while (j < line.size() && IsNameChar(line[j])) ++j;
      token.kind = TokenKind::kName;
      token.text = std::string(line.substr(i, j - i));
      i = j;
    } else {
      static constexpr std::string_view kPunct = "(),+-*/^@%=:";  // ":" in turns 2:16
      if (kPunct.find(c) == std::string_view::npos) ThrowBadPunct(c, column, source);
      token.kind = TokenKind::kPunct;
      token.text = std::string(1, c);
      ++i;
    }
    tokens.push_back(std::move(token));
  }
  Token end;
  end.kind = TokenKind::kEnd;
  // Just past the last non-blank character before any comment.
  size_t stop = std::min(i, line.size());
  while (stop > 0 && (line[stop - 1] == ' ' || line[stop - 1] == '\t')) --stop;
  end.column = static_cast<int>(stop) + 1;
  end.space_before = true;
  tokens.push_back(std::move(end));
  return tokens;
}

std::vector<std::string_view> SplitLines(std::string_view text) {
  std::vector<std::string_view> lines;
  size_t start = 0;
  while (start < text.size()) {
    size_t end = text.find('\n', start);
    const bool has_newline = end != std::string_view::npos;
    if (!has_newline) end = text.size();
    std::string_view line = text.substr(start, end - start);
    if (!line.empty() && line.back() == '\r') line.remove_suffix(1);
    lines.push_back(line);
    start = has_newline ? end + 1 : end;
  }
  return lines;
}

std::string Shorten(std::string_view text) {
  constexpr size_t kMaxShown = 40;  // long enough for any real token, short enough for a line
  if (text.size() <= kMaxShown) return Printable(text);
  return Printable(text.substr(0, kMaxShown)) + "...";
}

std::string Quote(const Token& token) {
  if (token.kind == TokenKind::kEnd) return "the end of the line";
  return fmt::format("'{}'", Shorten(token.text));
}

bool IsName(std::string_view text) {
  if (text.empty() || !IsNameStart(text[0])) return false;
  return std::all_of(text.begin(), text.end(), IsNameChar);
}

namespace {

// Edit distance counting an insertion, deletion, substitution or swap of two neighbouring
// letters as one edit (the optimal-string-alignment form of the Damerau-Levenshtein distance).
size_t EditDistance(std::string_view a, std::string_view b) {
  std::vector<std::vector<size_t>> d(a.size() + 1, std::vector<size_t>(b.size() + 1));
  for (size_t i = 0; i <= a.size(); ++i) d[i][0] = i;
  for (size_t j = 0; j <= b.size(); ++j) d[0][j] = j;
  for (size_t i = 1; i <= a.size(); ++i) {
    for (size_t j = 1; j <= b.size(); ++j) {
      const size_t cost = a[i - 1] == b[j - 1] ? 0 : 1;
      d[i][j] = std::min({d[i - 1][j] + 1, d[i][j - 1] + 1, d[i - 1][j - 1] + cost});
      if (i > 1 && j > 1 && a[i - 1] == b[j - 2] && a[i - 2] == b[j - 1]) {
        d[i][j] = std::min(d[i][j], d[i - 2][j - 2] + 1);
      }
    }
  }
  return d[a.size()][b.size()];
}

bool EqualIgnoringCase(std::string_view a, std::string_view b) {
  return a.size() == b.size() && std::equal(a.begin(), a.end(), b.begin(), [](char x, char y) {
           return std::tolower(static_cast<unsigned char>(x)) ==
                  std::tolower(static_cast<unsigned char>(y));
         });
}

}  // namespace

std::string Nearest(std::string_view word, const std::vector<std::string>& candidates) {
  constexpr size_t kLongestSuggestable = 64;  // longer words are junk, not typos
  if (word.empty() || word.size() > kLongestSuggestable) return {};
  for (const std::string& c : candidates) {
    if (EqualIgnoringCase(word, c)) return c;
  }
  const size_t limit = std::max<size_t>(1, word.size() / 3);
  std::string best;
  size_t best_distance = std::numeric_limits<size_t>::max();
  for (const std::string& c : candidates) {
    if (c.size() > kLongestSuggestable) continue;
    const size_t d = EditDistance(word, c);
    if (d <= limit && d < best_distance) {
      best = c;
      best_distance = d;
    }
  }
  return best;
}

std::string DidYouMean(std::string_view word, const std::vector<std::string>& candidates) {
  const std::string best = Nearest(word, candidates);
  if (best.empty() || best == word) return {};
  return fmt::format("; did you mean '{}'?", best);
}

std::string DidYouMeanAside(std::string_view word, const std::vector<std::string>& candidates) {
  const std::string best = Nearest(word, candidates);
  if (best.empty() || best == word) return {};
  return fmt::format(" (did you mean '{}'?)", best);
}

}  // namespace wirefield::model
