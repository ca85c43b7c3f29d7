// Model stage: the statement parser's loop and its small core. Turns model text (or a file)
// into a wirefield::Model in SI units, applying --set overrides to `let` statements and
// checking every value where it is used: this file reads the lines, dispatches each statement
// to its family's file (parser.hpp), and holds the token cursor, the error reporting and the
// reading of values and names that every statement shares. Inputs: text, file name,
// overrides; output: Model with warnings, or an InputError at FILE:LINE:COLUMN.
#include "model/parser.hpp"

#include <fmt/format.h>

#include <algorithm>
#include <string_view>

#include "core/read_file.hpp"

namespace wirefield {
namespace model {
namespace {

// Largest model file read. Real models are a few kB (the largest bundled one under 4 kB);
// 16 MiB holds some 10^5 statements and keeps a stray multi-gigabyte file from exhausting
// memory before its first line is even checked.
constexpr size_t kMaxFileBytes = size_t{16} << 20;
// Most statements a model may hold (lines that are not blank or comments). A hand-made model
// has tens; generated ones of 200 000 `let`s parse in well under a second (the model stage's
// tests), and 1 000 000 bounds the parse time and memory of anything larger.
constexpr size_t kMaxStatements = 1000000;

const std::vector<std::string>& Keywords() {
  static const std::vector<std::string> kKeywords = {"units", "let",         "wire",   "shape",
                                                     "feed",  "load",        "ground", "frequency",
                                                     "z0",    "transformer", "line"};
  return kKeywords;
}

}  // namespace

Parser::Parser(std::string file, const std::vector<Override>& overrides) : file_(std::move(file)) {
  for (const Override& o : overrides) {
    const std::string origin = o.origin.empty() ? "override " + o.name : o.origin;
    const SourceLocation where{origin, 0, 0};
    if (!IsName(o.name)) {
      throw InputError(where, fmt::format("'{}' is not a variable name (letters, digits and _, "
                                          "not starting with a digit)",
                                          Shorten(o.name)));
    }
    if (overrides_.count(o.name) != 0) {
      throw InputError(where,
                       "this variable is given two values from outside the model; give "
                       "it one");
    }
    overrides_[o.name] = OverrideEntry{o.expression, origin, false};
  }
}

Model Parser::Parse(std::string_view text) {
  model_.file = file_;
  if (text.size() >= 3 && text.substr(0, 3) == "\xEF\xBB\xBF") text.remove_prefix(3);  // BOM
  const std::vector<std::string_view> lines = SplitLines(text);
  for (size_t i = 0; i < lines.size(); ++i) {
    source_ = LineSource{file_, static_cast<int>(i) + 1, 0};
    tokens_ = LexLine(lines[i], source_);
    pos_ = 0;
    if (Peek().kind == TokenKind::kEnd) continue;
    if (++statements_ > kMaxStatements) {
      throw Error(Peek(), fmt::format("the model has more than {} statements; a model is "
                                      "made by hand or by a script, and this one looks like a "
                                      "generated file gone wrong",
                                      kMaxStatements));
    }
    Statement();
  }
  for (const auto& [name, entry] : overrides_) {
    if (entry.used) continue;
    std::string list;
    for (const std::string& n : scope_.Names()) list += (list.empty() ? "" : ", ") + n;
    throw InputError(
        SourceLocation{entry.origin, 0, 0},
        list.empty()
            ? fmt::format("the model has no variable '{}' (it defines no variables)", name)
            : fmt::format("the model has no variable '{}' (its variables: {})", name, list));
  }
  if (model_.feeds.empty()) {
    throw InputError(SourceLocation{file_, static_cast<int>(lines.size()) + 1, 1},
                     "the model has no feed; add 'feed NAME at WIRE@POS'");
  }
  for (const Scope::Variable& v : scope_.variables()) {
    if (!v.used) {
      model_.warnings.push_back(
          Warning{v.location, fmt::format("variable '{}' is never used", v.name)});
    }
  }
  return std::move(model_);
}

// ---- token access -------------------------------------------------------------------------

// "CONTEXT: missing WHAT" at the end of the line, else "CONTEXT: expected WHAT; got 'x'".
InputError Parser::Expected(const std::string& context, const std::string& what) const {
  const Token& t = Peek();
  if (t.kind == TokenKind::kEnd) return Error(t, fmt::format("{}: missing {}", context, what));
  return Error(t, fmt::format("{}: expected {}; got {}", context, what, Quote(t)));
}

void Parser::ExpectPunct(std::string_view p, const std::string& context, const std::string& what) {
  if (!IsPunct(p)) throw Expected(context, what);
  Next();
}

void Parser::ExpectEnd(const std::string& statement) const {
  const Token& t = Peek();
  if (t.kind != TokenKind::kEnd) {
    if (IsDecimalComma()) throw DecimalCommaError();
    throw Error(t, fmt::format("unexpected {} at the end of the {} statement; remove it or "
                               "start a new line",
                               Quote(t), statement));
  }
}

// "1,5": a ',' right between two numbers, with no space around it, is a decimal comma.
bool Parser::IsDecimalComma() const {
  if (pos_ == 0 || pos_ + 1 >= tokens_.size()) return false;
  const Token& comma = tokens_[pos_];
  const Token& before = tokens_[pos_ - 1];
  const Token& after = tokens_[pos_ + 1];
  return comma.kind == TokenKind::kPunct && comma.text == "," && !comma.space_before &&
         before.kind == TokenKind::kNumber && after.kind == TokenKind::kNumber &&
         !after.space_before;
}

InputError Parser::DecimalCommaError() const {
  const Token& before = tokens_[pos_ - 1];
  const Token& after = tokens_[pos_ + 1];
  return Error(Peek(), fmt::format("unexpected ',' in '{},{}'; write a decimal number with a "
                                   "point: {}.{}",
                                   before.text, after.text, before.text, after.text));
}

std::string Parser::Line(const SourceLocation& l) { return fmt::format("line {}", l.line); }

// ---- values at their use sites --------------------------------------------------------------

Parser::Measured Parser::Expression() {
  Token start = Peek();
  Value v = EvaluateExpression(tokens_, &pos_, scope_, source_);
  return Measured{v, std::move(start)};
}

// A value of the given quantity in SI; a plain number is taken in bare_unit_factor.
double Parser::As(const Measured& m, const Quantity& q, double bare_unit_factor,
                  const std::string& what) const {
  if (m.value.dimension.IsNone()) return m.value.si * bare_unit_factor;
  if (m.value.dimension == q.dimension) return m.value.si;
  throw Error(m.start, fmt::format("{} needs {} ({}); got {}", what, q.noun, q.unit_list,
                                   Describe(m.value.dimension)));
}

// Throws at the value's first token unless `v` lies in the allowed range of `kind`.
void Parser::InRange(ValueKind kind, double v, const Measured& m, const std::string& what) const {
  if (auto message = OutOfRange(kind, v, what)) throw Error(m.start, *message);
}

double Parser::Plain(const Measured& m, const std::string& what, const std::string& meaning) const {
  if (m.value.dimension.IsNone()) return m.value.si;
  throw Error(m.start, fmt::format("{} needs a plain number ({}); got {}", what, meaning,
                                   Describe(m.value.dimension)));
}

// A positive value of q, in the allowed range of `kind`.
double Parser::Positive(const Measured& m, const Quantity& q, ValueKind kind,
                        const std::string& context, const std::string& what,
                        const std::string& advice, double bare_unit_factor) const {
  const double v = As(m, q, bare_unit_factor, fmt::format("{}: {}", context, what));
  if (!(v > 0.0)) {
    throw Error(m.start, fmt::format("{}: {} must be positive; got {} {}{}", context, what,
                                     FormatNumber(v), q.si_unit, advice));
  }
  InRange(kind, v, m, fmt::format("{}: {}", context, what));
  return v;
}

// ---- names and statements -----------------------------------------------------------------

std::string Parser::Name(const std::string& statement, const std::string& what) {
  const Token& t = Peek();
  if (t.kind == TokenKind::kNumber && pos_ + 1 < tokens_.size() &&
      tokens_[pos_ + 1].kind == TokenKind::kName && !tokens_[pos_ + 1].space_before) {
    throw Error(t, fmt::format("{}: expected {}; got '{}{}': a name starts with a letter or "
                               "'_' ({}_{})",
                               statement, what, t.text, tokens_[pos_ + 1].text,
                               tokens_[pos_ + 1].text, t.text));
  }
  if (t.kind != TokenKind::kName) throw Expected(statement, what);
  Next();
  return t.text;
}

void Parser::CheckNew(const std::map<std::string, SourceLocation>& defined, const std::string& kind,
                      const std::string& name, const Token& at) const {
  const auto it = defined.find(name);
  if (it != defined.end()) {
    throw Error(at, fmt::format("{} '{}' is already defined at {}; give each {} its own name", kind,
                                name, Line(it->second), kind));
  }
}

// `NAME` after a statement's word, new among the names of its kind (a shape names a wire).
Parser::Named Parser::NewName(const Token& keyword, const std::string& statement,
                              const std::string& kind, const std::string& usage,
                              const std::map<std::string, SourceLocation>& names) {
  Named named;
  named.token = Peek();
  named.location = Loc(keyword);
  named.name = Name(statement, usage);
  CheckNew(names, kind, named.name, named.token);
  named.context = fmt::format("{} '{}'", statement, named.name);
  return named;
}

void Parser::Statement() {
  const Token& keyword = Peek();
  if (keyword.kind != TokenKind::kName) {
    if (keyword.kind == TokenKind::kPunct && keyword.text == "/") {
      throw Error(keyword, "unexpected '/' at the start of the line; a comment starts with '#'");
    }
    throw Error(keyword, fmt::format("expected a statement ({}) at the start of the line; "
                                     "got {}",
                                     "units, let, wire, shape, feed, load, ground, frequency, z0, "
                                     "transformer, line",
                                     Quote(keyword)));
  }
  Next();
  const std::string& k = keyword.text;
  if (k == "units") return Units();
  if (k == "let") return Let();
  if (k == "wire") return Wire(keyword);
  if (k == "shape") return Shape(keyword);
  if (k == "feed") return Feed(keyword);
  if (k == "load") return Load(keyword);
  if (k == "ground") return Ground(keyword);
  if (k == "frequency") return Frequency(keyword);
  if (k == "z0") return Z0(keyword);
  if (k == "transformer") return Transformer(keyword);
  if (k == "line") return FeedLine(keyword);
  std::string hint = DidYouMean(k, Keywords());
  if (hint.empty())
    hint =
        "; statements are units, let, wire, shape, feed, load, ground, frequency, z0, "
        "transformer, line";
  throw Error(keyword, fmt::format("unknown statement '{}'{}", Shorten(k), hint));
}

}  // namespace model

Model ParseModelText(const std::string& text, const std::string& file_name,
                     const std::vector<Override>& overrides) {
  model::Parser parser(file_name, overrides);
  return parser.Parse(text);
}

std::string ReadModelFileText(const std::string& path) {
  return core::ReadInputFile(path, "model file", model::kMaxFileBytes,
                             fmt::format("the file is larger than {} MiB; a model file is a few kB "
                                         "of text. Is this the right file?",
                                         model::kMaxFileBytes >> 20));
}

Model ParseModelFile(const std::string& path, const std::vector<Override>& overrides) {
  return ParseModelText(ReadModelFileText(path), path, overrides);
}

}  // namespace wirefield
