// Model stage: splits model text into lines and each line into tokens.
// Input: the bytes of one line (without its newline) and where it came from; output: tokens
// with 1-based columns (one per character; a tab is one column). Comments are dropped.
// Any non-ASCII or control character outside a comment is an InputError.
#pragma once

#include <string>
#include <string_view>
#include <vector>

#include "wirefield/model.hpp"

namespace wirefield::model {

enum class TokenKind { kNumber, kName, kPunct, kEnd };

struct Token {
  TokenKind kind = TokenKind::kEnd;
  std::string text;           // as written (for kEnd: empty)
  double number = 0.0;        // kNumber only
  int column = 0;             // 1-based, of the first character
  bool space_before = false;  // whitespace separates it from the previous token
};

// Where a line came from: diagnostics for column c point at file:line:(c + column_offset).
struct LineSource {
  std::string file;
  int line = 1;
  int column_offset = 0;
};
SourceLocation At(const LineSource& source, int column);

// Longest statement text (before any comment) a line may hold. Real statements are under
// 200 characters; the cap keeps a binary or generated file from costing gigabytes of tokens.
inline constexpr int kMaxStatementCharacters = 10000;

// Tokens of one line, always ending with a kEnd token (its column: just past the last
// character before any comment). Throws InputError for characters the language has no use for.
std::vector<Token> LexLine(std::string_view line, const LineSource& source);

// Splits text at '\n'; a '\r' just before a '\n' is dropped. A final line without '\n' counts.
std::vector<std::string_view> SplitLines(std::string_view text);

// Text of a token for messages: "'abc'", "the end of the line", long text shortened.
std::string Quote(const Token& token);
std::string Shorten(std::string_view text);

// Identifier rule of the language: [A-Za-z_][A-Za-z0-9_]*.
bool IsName(std::string_view text);

// The candidate closest to word (same letters ignoring case first, then edit distance of at
// most a third of its length, at least 1); empty when none is close.
std::string Nearest(std::string_view word, const std::vector<std::string>& candidates);
// "; did you mean 'X'?" or "" (for appending at the end of a message).
std::string DidYouMean(std::string_view word, const std::vector<std::string>& candidates);
// " (did you mean 'X'?)" or "" (for the middle of a message).
std::string DidYouMeanAside(std::string_view word, const std::vector<std::string>& candidates);

}  // namespace wirefield::model
