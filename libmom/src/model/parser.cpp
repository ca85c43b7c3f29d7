// Model stage: the statement parser. Turns model text (or a file) into a wirefield::Model in
// SI units, applying --set overrides to `let` statements and checking every value where it
// is used. Inputs: text, file name, overrides; output: Model with warnings, or an InputError
// at FILE:LINE:COLUMN. Also parses command-line quantities (--freq, --z0) as expressions.
#include <fmt/format.h>

#include <algorithm>
#include <cctype>
#include <cerrno>
#include <cmath>
#include <cstdio>
#include <cstring>
#include <functional>
#include <map>
#include <memory>
#include <numbers>
#include <string_view>
#include <tuple>

#include "core/materials.hpp"
#include "core/read_file.hpp"
#include "model/expression.hpp"
#include "model/lexer.hpp"
#include "model/ranges.hpp"
#include "model/shapes.hpp"
#include "model/thin_wire.hpp"
#include "model/units.hpp"
#include "model/wire_path.hpp"
#include "network/line.hpp"
#include "wirefield/model.hpp"
#include "wirefield/network.hpp"

namespace wirefield {
namespace model {
namespace {

// Largest model file read. Real models are a few kB (the largest bundled one under 4 kB);
// 16 MiB holds some 10^5 statements and keeps a stray multi-gigabyte file from exhausting
// memory before its first line is even checked.
constexpr size_t kMaxFileBytes = size_t{16} << 20;
// Most wires a model may define: each takes at least 3 segments, so 10 000 wires already
// ask for 30 000 unknowns, a 13 GiB matrix. More is a generated file gone wrong.
constexpr size_t kMaxWires = 10000;
// Most statements a model may hold (lines that are not blank or comments). A hand-made model
// has tens; generated ones of 200 000 `let`s parse in well under a second (the model stage's
// tests), and 1 000 000 bounds the parse time and memory of anything larger.
constexpr size_t kMaxStatements = 1000000;
// Most segments one wire may ask for: 16 * N^2 bytes of complex matrix is then 149 GiB.
constexpr double kMaxSegmentsPerWire = 100000.0;
// Largest matched loss of a feed line at its loss figures: 1000 dB passes 1e-100 of the
// power, far past any real line, and stays far inside the 6158 dB (709 nepers) where e^x
// overflows double precision in the line's cosh and sinh.
constexpr double kMaxLineLossDb = 1000.0;
// Legal but dubious values, warned about: a z0 outside the impedances of feed lines and
// antenna systems (a few ohm for a small loop's match to 600 ohm open-wire line; common
// practice) and a coil of more turns than a single-layer loading coil has (common practice).
constexpr double kDubiousLowZ0_ohm = 1.0;
constexpr double kDubiousHighZ0_ohm = 1e4;
constexpr double kDubiousCoilTurns = 1e4;
// Bytes per matrix entry (a complex double), for the memory estimate in messages.
constexpr double kBytesPerMatrixEntry = 16.0;
// A position within this fraction of the wire length from an end is that end. Far below any
// segment length (the mesher never makes segments shorter than ~1e-4 of a wire) and well
// above the rounding of a length computed as sqrt(dx^2 + dy^2 + dz^2) (a few 1e-16).
constexpr double kEndSnapFraction = 1e-12;

const std::vector<std::string>& Keywords() {
  static const std::vector<std::string> kKeywords = {"units", "let",         "wire",   "shape",
                                                     "feed",  "load",        "ground", "frequency",
                                                     "z0",    "transformer", "line"};
  return kKeywords;
}

// The public description of a `let` variable: value, dimension and its SI unit when named.
VariableSpec DescribeVariable(const std::string& name, const Value& value,
                              const SourceLocation& location) {
  VariableSpec spec;
  spec.name = name;
  spec.value_si = value.si;
  spec.dimension = value.dimension.exponent;
  spec.quantity = Describe(value.dimension);
  for (const Quantity* q : {&LengthQuantity(), &FrequencyQuantity(), &ResistanceQuantity(),
                            &InductanceQuantity(), &CapacitanceQuantity(), &VoltageQuantity()}) {
    if (q->dimension == value.dimension) spec.unit = std::string(q->si_unit);
  }
  spec.location = location;
  return spec;
}

struct OverrideEntry {
  std::string expression;
  bool used = false;
};

class Parser {
 public:
  Parser(std::string file, const std::vector<Override>& overrides) : file_(std::move(file)) {
    for (const Override& o : overrides) {
      const SourceLocation where{"--set " + o.name, 0, 0};
      if (!IsName(o.name)) {
        throw InputError(where, fmt::format("'{}' is not a variable name", Shorten(o.name)));
      }
      if (overrides_.count(o.name) != 0) {
        throw InputError(where, "this variable is set twice on the command line; set it once");
      }
      overrides_[o.name] = OverrideEntry{o.expression, false};
    }
  }

  Model Parse(std::string_view text) {
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
          SourceLocation{"--set " + name, 0, 0},
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

 private:
  // ---- token access -------------------------------------------------------------------
  const Token& Peek() const { return tokens_[std::min(pos_, tokens_.size() - 1)]; }
  const Token& Next() {
    const Token& t = Peek();
    if (pos_ + 1 < tokens_.size()) ++pos_;
    return t;
  }
  bool IsPunct(std::string_view p) const {
    return Peek().kind == TokenKind::kPunct && Peek().text == p;
  }
  bool IsWord(std::string_view w) const {
    return Peek().kind == TokenKind::kName && Peek().text == w;
  }
  SourceLocation Loc(const Token& t) const { return At(source_, t.column); }
  InputError Error(const Token& t, const std::string& message) const {
    return InputError(Loc(t), message);
  }
  // "CONTEXT: missing WHAT" at the end of the line, else "CONTEXT: expected WHAT; got 'x'".
  InputError Expected(const std::string& context, const std::string& what) const {
    const Token& t = Peek();
    if (t.kind == TokenKind::kEnd) return Error(t, fmt::format("{}: missing {}", context, what));
    return Error(t, fmt::format("{}: expected {}; got {}", context, what, Quote(t)));
  }
  void ExpectPunct(std::string_view p, const std::string& context, const std::string& what) {
    if (!IsPunct(p)) throw Expected(context, what);
    Next();
  }
  void ExpectEnd(const std::string& statement) const {
    const Token& t = Peek();
    if (t.kind != TokenKind::kEnd) {
      if (IsDecimalComma()) throw DecimalCommaError();
      throw Error(t, fmt::format("unexpected {} at the end of the {} statement; remove it or "
                                 "start a new line",
                                 Quote(t), statement));
    }
  }
  // "1,5": a ',' right between two numbers, with no space around it, is a decimal comma.
  bool IsDecimalComma() const {
    if (pos_ == 0 || pos_ + 1 >= tokens_.size()) return false;
    const Token& comma = tokens_[pos_];
    const Token& before = tokens_[pos_ - 1];
    const Token& after = tokens_[pos_ + 1];
    return comma.kind == TokenKind::kPunct && comma.text == "," && !comma.space_before &&
           before.kind == TokenKind::kNumber && after.kind == TokenKind::kNumber &&
           !after.space_before;
  }
  InputError DecimalCommaError() const {
    const Token& before = tokens_[pos_ - 1];
    const Token& after = tokens_[pos_ + 1];
    return Error(Peek(), fmt::format("unexpected ',' in '{},{}'; write a decimal number with a "
                                     "point: {}.{}",
                                     before.text, after.text, before.text, after.text));
  }
  std::string Line(const SourceLocation& l) const { return fmt::format("line {}", l.line); }

  // ---- values at their use sites ------------------------------------------------------
  struct Measured {
    Value value;
    Token start;  // first token of the expression, for messages about its value
  };
  Measured Expression() {
    Token start = Peek();
    Value v = EvaluateExpression(tokens_, &pos_, scope_, source_);
    return Measured{v, std::move(start)};
  }
  // A value of the given quantity in SI; a plain number is taken in bare_unit_factor.
  double As(const Measured& m, const Quantity& q, double bare_unit_factor,
            const std::string& what) const {
    if (m.value.dimension.IsNone()) return m.value.si * bare_unit_factor;
    if (m.value.dimension == q.dimension) return m.value.si;
    throw Error(m.start, fmt::format("{} needs {} ({}); got {}", what, q.noun, q.unit_list,
                                     Describe(m.value.dimension)));
  }
  // Throws at the value's first token unless `v` lies in the allowed range of `kind`.
  void InRange(ValueKind kind, double v, const Measured& m, const std::string& what) const {
    if (auto message = OutOfRange(kind, v, what)) throw Error(m.start, *message);
  }
  double Plain(const Measured& m, const std::string& what, const std::string& meaning) const {
    if (m.value.dimension.IsNone()) return m.value.si;
    throw Error(m.start, fmt::format("{} needs a plain number ({}); got {}", what, meaning,
                                     Describe(m.value.dimension)));
  }

  // ---- names --------------------------------------------------------------------------
  std::string Name(const std::string& statement, const std::string& what) {
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
  void CheckNew(const std::map<std::string, SourceLocation>& defined, const std::string& kind,
                const std::string& name, const Token& at) const {
    const auto it = defined.find(name);
    if (it != defined.end()) {
      throw Error(at, fmt::format("{} '{}' is already defined at {}; give each {} its own name",
                                  kind, name, Line(it->second), kind));
    }
  }

  // ---- statements ---------------------------------------------------------------------
  void Statement() {
    const Token& keyword = Peek();
    if (keyword.kind != TokenKind::kName) {
      if (keyword.kind == TokenKind::kPunct && keyword.text == "/") {
        throw Error(keyword, "unexpected '/' at the start of the line; a comment starts with '#'");
      }
      throw Error(
          keyword,
          fmt::format("expected a statement ({}) at the start of the line; "
                      "got {}",
                      "units, let, wire, shape, feed, load, ground, frequency, z0, transformer, "
                      "line",
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

  void Units() {
    const Token& t = Peek();
    if (t.kind != TokenKind::kName)
      throw Expected("units", "the length unit (m, cm, mm, ft or in)");
    if (!IsLengthUnitName(t.text)) {
      if (FindUnit(t.text) != nullptr) {
        throw Error(t, fmt::format("units sets the length unit of bare numbers; '{}' is not a "
                                   "length unit: use m, cm, mm, ft or in",
                                   t.text));
      }
      throw Error(
          t, fmt::format("unknown length unit '{}'{}; use m, cm, mm, ft or in", Shorten(t.text),
                         DidYouMeanAside(t.text, {"m", "cm", "mm", "ft", "in"})));
    }
    Next();
    length_factor_ = FindUnit(t.text)->factor;
    ExpectEnd("units");
  }

  void Let() {
    const Token& name_token = Peek();
    const std::string name = Name("let", "a variable name (let NAME = EXPR)");
    std::string reason;
    if (IsReservedName(name, &reason)) {
      throw Error(name_token, fmt::format("let: {}; choose another name", reason));
    }
    if (Scope::Variable* existing = scope_.Find(name)) {
      throw Error(name_token, fmt::format("variable '{}' is already defined at {}; give each "
                                          "variable its own name",
                                          name, Line(existing->location)));
    }
    const std::string context = fmt::format("let '{}'", name);
    ExpectPunct("=", context, "'= EXPR'");
    Value value;
    const auto over = overrides_.find(name);
    if (over != overrides_.end()) {
      over->second.used = true;
      const LineSource set_source{"--set " + name, 1, 0};
      const std::vector<Token> set_tokens = LexLine(over->second.expression, set_source);
      size_t set_pos = 0;
      if (set_tokens[0].kind == TokenKind::kEnd) {
        throw InputError(At(set_source, 1), "the value is empty; write --set NAME=VALUE");
      }
      value = EvaluateExpression(set_tokens, &set_pos, scope_, set_source);
      if (set_tokens[set_pos].kind != TokenKind::kEnd) {
        throw InputError(At(set_source, set_tokens[set_pos].column),
                         fmt::format("unexpected {} after the value", Quote(set_tokens[set_pos])));
      }
      // The model's own expression is replaced, not evaluated; skip to the end of the line.
      // The variables it names count as used: the model uses them, the command line only
      // set this one aside, so they must not draw an unused-variable warning.
      for (; pos_ + 1 < tokens_.size(); ++pos_) {
        if (tokens_[pos_].kind != TokenKind::kName) continue;
        if (Scope::Variable* read = scope_.Find(tokens_[pos_].text)) read->used = true;
      }
    } else {
      value = Expression().value;
      ExpectEnd("let");
    }
    if (FindUnit(name) != nullptr) {
      model_.warnings.push_back(Warning{
          Loc(name_token),
          fmt::format("variable '{}' has the name of a unit; after a number '{}' still means "
                      "the unit (2 {} is not 2*{})",
                      name, name, name, name)});
    }
    scope_.Define(Scope::Variable{name, value, Loc(name_token), false});
    model_.variables.push_back(name);
    model_.variable_specs.push_back(DescribeVariable(name, value, Loc(name_token)));
  }

  Point ParsePoint(const std::string& context, const std::string& which) {
    Point p{};
    Coordinates(context, which, p.size(), p.data());
    return p;
  }

  // "(X, Y, Z)" (count 3) or "(X, Y)" (count 2): lengths in the `units` length.
  void Coordinates(const std::string& context, const std::string& which, size_t count,
                   double* out) {
    static constexpr const char* kAxis[] = {"X", "Y", "Z"};
    const std::string form = count == 3 ? "(X, Y, Z)" : "(X, Y)";
    ExpectPunct("(", context, fmt::format("'(' to open the {} point {}", which, form));
    for (size_t i = 0; i < count; ++i) {
      const Measured m = Expression();
      const std::string what = fmt::format("{}: the {} coordinate", context, kAxis[i]);
      out[i] = As(m, LengthQuantity(), length_factor_, what);
      InRange(ValueKind::kCoordinateM, out[i], m, what);
      if (i + 1 < count) {
        if (IsPunct(")")) {
          throw Error(Peek(), fmt::format("{}: the {} point needs {} coordinates {}; got {}",
                                          context, which, count, form, i + 1));
        }
        ExpectPunct(",", context, "',' between coordinates");
      }
    }
    if (IsPunct(",")) {
      throw Error(Peek(), fmt::format("{}: the {} point has more than {} coordinates; write "
                                      "{}",
                                      context, which, count, form));
    }
    ExpectPunct(")", context, fmt::format("')' to close the {} point", which));
  }

  // `through (X, Y, Z), (X, Y, Z), ...`: the corners of a bent wire, at least two, checked.
  std::vector<Point> ThroughPoints(const std::string& context,
                                   std::vector<SourceLocation>* written_at = nullptr) {
    std::vector<Point> points;
    std::vector<SourceLocation> locations;
    while (true) {
      locations.push_back(Loc(Peek()));
      points.push_back(ParsePoint(context, Ordinal(points.size() + 1)));
      if (!IsPunct(",")) break;
      Next();
    }
    if (points.size() < 2) {
      throw Expected(context,
                     "', (X, Y, Z)' and a second point (a wire through points needs at least "
                     "two)");
    }
    CheckWirePath(points, locations, context);
    WireSpec path;
    SetWirePath(points, &path);
    if (!std::isfinite(WireLength(path))) {
      throw InputError(locations.front(),
                       fmt::format("{}: the length is not a finite number", context));
    }
    if (written_at != nullptr) *written_at = std::move(locations);
    return points;
  }

  void Wire(const Token& keyword) {
    const Token& name_token = Peek();
    WireSpec wire;
    wire.location = Loc(keyword);
    wire.name = Name("wire", "a wire name (wire NAME from (X, Y, Z) to (X, Y, Z) radius R)");
    CheckNew(wire_lines_, "wire", wire.name, name_token);
    const std::string context = fmt::format("wire '{}'", wire.name);
    if (IsWord("through")) {
      Next();
      SetWirePath(ThroughPoints(context, &wire.point_locations), &wire);
      const double length_m = WireLength(wire);
      WireClauses(context, length_m, &wire);
      return AddWire(std::move(wire));
    }
    if (!IsWord("from")) throw Expected(context, "'from (X, Y, Z)' or 'through (X, Y, Z), ...'");
    Next();
    wire.point_locations.push_back(Loc(Peek()));
    wire.from_m = ParsePoint(context, "from");
    if (!IsWord("to")) throw Expected(context, "'to (X, Y, Z)'");
    Next();
    wire.point_locations.push_back(Loc(Peek()));
    wire.to_m = ParsePoint(context, "to");
    const double length_m = std::hypot(wire.to_m[0] - wire.from_m[0], wire.to_m[1] - wire.from_m[1],
                                       wire.to_m[2] - wire.from_m[2]);
    if (length_m == 0.0) {
      throw Error(name_token,
                  fmt::format("wire '{}' has zero length: both ends are at ({}, {}, {}) m; "
                              "move one end",
                              wire.name, FormatNumber(wire.from_m[0]), FormatNumber(wire.from_m[1]),
                              FormatNumber(wire.from_m[2])));
    }
    if (!std::isfinite(length_m)) {
      throw Error(name_token, fmt::format("{}: the length is not a finite number", context));
    }
    WireClauses(context, length_m, &wire);
    AddWire(std::move(wire));
  }

  // The radius, segments and conductor clauses of a wire or shape, in any order.
  // known_length_m: the wire's length when known before its clauses (the radius is then
  // checked against it at once); else the caller calls CheckRadius afterwards. extra_clause
  // (when given) reads one clause of its own and returns true, or returns false when the
  // clause is not one of its own; clause_help ends the message for an unknown clause.
  void WireClauses(
      const std::string& context, std::optional<double> known_length_m, WireSpec* wire,
      const std::function<bool()>& extra_clause = nullptr,
      const std::string& clause_help =
          "after the points come 'radius R' (or 'diameter D') and the optional 'segments N', "
          "'material NAME' or 'conductivity=SIGMA [permeability=MU_R]'") {
    radius_start_.reset();
    std::optional<double> radius_m;
    bool have_segments = false;
    ConductorClauses conductor;
    while (Peek().kind != TokenKind::kEnd) {
      const Token& clause = Peek();
      if (IsWord("radius") || IsWord("diameter")) {
        const bool is_diameter = clause.text == "diameter";
        if (radius_m) {
          throw Error(clause, wire->radius_clause == clause.text
                                  ? fmt::format("{}: {} is given twice", context, clause.text)
                                  : fmt::format("{}: give either 'radius R' or 'diameter D' "
                                                "(twice the radius), not both",
                                                context));
        }
        Next();
        const size_t value_pos = pos_;
        const Measured m = Expression();
        const double size = As(m, LengthQuantity(), length_factor_, context + ": " + clause.text);
        if (size <= 0.0) {
          throw Error(m.start, fmt::format("{}: the {} must be positive; got {} m", context,
                                           clause.text, FormatNumber(size)));
        }
        const double r = is_diameter ? size / 2.0 : size;
        InRange(ValueKind::kRadiusM, r, m, fmt::format("{}: the radius", context));
        radius_m = r;
        radius_start_ = m.start;
        wire->radius_m = r;
        wire->radius_location = Loc(m.start);
        wire->radius_clause = clause.text;
        wire->radius_written_number = WrittenNumber(value_pos);
        if (known_length_m) CheckRadius(context, *wire, *known_length_m);
      } else if (IsWord("segments")) {
        if (have_segments) throw Error(clause, fmt::format("{}: segments is given twice", context));
        Next();
        const Measured m = Expression();
        const double n = Plain(m, context + ": segments", "a count of segments");
        if (n <= 0.0 || n != std::floor(n)) {
          throw Error(m.start, fmt::format("{}: segments must be a positive whole number; got {}",
                                           context, FormatNumber(n)));
        }
        if (n > kMaxSegmentsPerWire) {
          const double gib = kBytesPerMatrixEntry * n * n / double(1ull << 30);
          throw Error(m.start,
                      fmt::format("segments {} on wire '{}' would need {:.0f} GiB for the matrix "
                                  "(16 bytes per entry, N^2 entries); use at most {}, or leave "
                                  "segments out and let the mesher choose",
                                  FormatNumber(n), wire->name, gib, kMaxSegmentsPerWire));
        }
        wire->segments = static_cast<int>(n);
        have_segments = true;
      } else if (IsWord("material") || IsWord("conductivity") || IsWord("permeability")) {
        Conductor(context, &conductor);
      } else if (!extra_clause || !extra_clause()) {
        if (IsDecimalComma()) throw DecimalCommaError();
        throw Error(clause,
                    fmt::format("{}: unexpected {}; {}", context, Quote(clause), clause_help));
      }
    }
    if (!radius_m) throw Expected(context, "'radius R' (or 'diameter D')");
    if (conductor.permeability && !conductor.conductivity) {
      throw Error(*conductor.permeability_token,
                  fmt::format("{}: permeability= needs conductivity=SIGMA beside it (a table "
                              "material sets its own)",
                              context));
    }
    if (conductor.material) {
      const core::Material* entry = core::FindMaterial(*conductor.material);
      wire->material = *conductor.material;
      wire->conductivity_s_per_m = entry->conductivity_s_per_m;
      wire->relative_permeability = entry->relative_permeability;
    } else if (conductor.conductivity) {
      wire->conductivity_s_per_m = *conductor.conductivity;
      wire->relative_permeability = conductor.permeability.value_or(1.0);
    }
  }

  // The number of the expression that starts at tokens_[from] and ends at pos_ when it is
  // one number with or without a length unit ("1", "2 mm"), else nothing.
  std::optional<double> WrittenNumber(size_t from) const {
    if (tokens_[from].kind != TokenKind::kNumber) return std::nullopt;
    if (pos_ == from + 1) return tokens_[from].number;
    if (pos_ == from + 2 && IsLengthUnitName(tokens_[from + 1].text)) return tokens_[from].number;
    return std::nullopt;
  }

  // The thin-wire model needs the radius (read last by WireClauses) well below the length
  // (model/thin_wire.hpp; the bound against the wavelength is the mesh stage's).
  void CheckRadius(const std::string& context, const WireSpec& wire, double length_m) const {
    const double r = wire.radius_m;
    const double max_r = kMaxRadiusOfLength * length_m;
    if (radius_start_ && r > max_r) {
      throw Error(*radius_start_,
                  fmt::format("{}: the radius {} m is not small against the wire length {} m; "
                              "the thin-wire model needs the radius under a tenth of the "
                              "length{}",
                              context, FormatNumber(r), FormatNumber(length_m),
                              RadiusUnitHint(wire, max_r)));
    }
  }

  void AddWire(WireSpec wire) {
    if (model_.wires.size() >= kMaxWires) {
      throw InputError(wire.location,
                       fmt::format("wire '{}' is wire number {}; a model may have at most {} "
                                   "wires (each needs at least 3 segments, and the matrix "
                                   "grows as the square of their sum)",
                                   Shorten(wire.name), model_.wires.size() + 1, kMaxWires));
    }
    wire_lines_[wire.name] = wire.location;
    wire_index_[wire.name] = model_.wires.size();
    model_.wires.push_back(std::move(wire));
  }

  // shape NAME KIND top=H length=L [low=HL] [toward=AZ] [at (X, Y)] radius R [...]: a wire
  // laid out the way it is put up in the field (model/shapes.hpp), named like any wire.
  void Shape(const Token& keyword) {
    const Token& name_token = Peek();
    WireSpec wire;
    wire.location = Loc(keyword);
    wire.name = Name("shape", "a wire name (shape NAME sloper top=H length=L radius R)");
    CheckNew(wire_lines_, "wire", wire.name, name_token);
    ShapeRequest request;
    request.context = fmt::format("shape '{}'", wire.name);
    const std::string& context = request.context;
    const std::vector<std::string>& kinds = ShapeKindNames();
    const std::string kind_list = "sloper, inverted-l, inverted-v or horizontal";
    const Token kind_token = Peek();
    if (kind_token.kind != TokenKind::kName)
      throw Expected(context, "the kind (" + kind_list + ")");
    std::string kind = Next().text;  // inverted-l is three tokens written without spaces
    while (IsPunct("-") && !Peek().space_before) {
      kind += Next().text;
      if (Peek().kind == TokenKind::kName && !Peek().space_before) kind += Next().text;
    }
    const auto found = std::find(kinds.begin(), kinds.end(), kind);
    if (found == kinds.end()) {
      throw Error(kind_token, fmt::format("{}: unknown kind '{}'{}; use {}", context, Shorten(kind),
                                          DidYouMeanAside(kind, kinds), kind_list));
    }
    request.kind = static_cast<ShapeKind>(found - kinds.begin());
    std::optional<ShapeNumber> top, length;
    std::optional<Token> toward_token, at_token;
    auto shape_clause = [&]() {
      const Token clause = Peek();
      auto twice = [&] {
        return Error(clause, fmt::format("{}: {} is given twice", context, clause.text));
      };
      if (IsWord("at")) {
        if (at_token) throw twice();
        Next();
        double xy[2];
        Coordinates(context, "at", 2, xy);
        request.support_x_m = xy[0];
        request.support_y_m = xy[1];
        at_token = clause;
        return true;
      }
      if (!IsWord("top") && !IsWord("length") && !IsWord("low") && !IsWord("toward")) return false;
      Next();
      ExpectPunct("=", context, fmt::format("'=' after {}", clause.text));
      const Measured m = Expression();
      if (clause.text == "toward") {
        if (toward_token) throw twice();
        const double az = Plain(m, context + ": toward", "an angle: 90deg");
        if (!(std::abs(az) <= 2.0 * std::numbers::pi)) {
          throw Error(m.start,
                      fmt::format("{}: toward={} is more than a turn; plain numbers are radians "
                                  "(as in cos()), so write the azimuth in degrees with deg, as "
                                  "toward={}deg",
                                  context, FormatNumber(az), FormatNumber(az)));
        }
        request.toward_rad = az;
        toward_token = clause;
        return true;
      }
      const std::string what = fmt::format("{}: {}", context, clause.text);
      const ShapeNumber number{As(m, LengthQuantity(), length_factor_, what), Loc(m.start)};
      InRange(ValueKind::kCoordinateM, number.value, m, what);
      std::optional<ShapeNumber>* slot = clause.text == "top"      ? &top
                                         : clause.text == "length" ? &length
                                                                   : &request.low_m;
      if (*slot) throw twice();
      *slot = number;
      return true;
    };
    WireClauses(
        context, std::nullopt, &wire, shape_clause,
        "after the kind come top=H, length=L, radius R (or diameter D) and the optional low=HL, "
        "toward=AZ, at (X, Y), 'segments N', 'material NAME' or 'conductivity=SIGMA "
        "[permeability=MU_R]'");
    if (!top) throw Expected(context, "'top=H' (the height of the support's top)");
    if (!length) throw Expected(context, "'length=L' (the length of the wire)");
    request.top_m = *top;
    request.length_m = *length;
    SetWirePath(ShapeCorners(request), &wire);
    CheckRadius(context, wire, WireLength(wire));
    AddWire(std::move(wire));
  }

  // The conductor clauses of a wire, as read; checked against each other as they come.
  struct ConductorClauses {
    std::optional<std::string> material;
    std::optional<Token> material_token;
    std::optional<double> conductivity;
    std::optional<double> permeability;
    std::optional<Token> permeability_token;
  };

  // Reads one of `material NAME`, `conductivity=SIGMA`, `permeability=MU_R`.
  void Conductor(const std::string& context, ConductorClauses* c) {
    const Token clause = Next();
    const std::string& word = clause.text;
    auto twice = [&] { return Error(clause, fmt::format("{}: {} is given twice", context, word)); };
    auto both = [&] {
      return Error(clause, fmt::format("{}: give either 'material NAME' or 'conductivity=SIGMA', "
                                       "not both",
                                       context));
    };
    if (word == "material") {
      if (c->material) throw twice();
      if (c->conductivity) throw both();
      const Token& name = Peek();
      if (name.kind == TokenKind::kEnd) {
        throw Error(name, fmt::format("{}: missing a material name after 'material' (the "
                                      "materials are {})",
                                      context, MaterialList()));
      }
      if (name.kind == TokenKind::kNumber) {
        throw Error(name, fmt::format("{}: material takes a name ({}), not a number; for a "
                                      "conductivity in S/m write conductivity={}",
                                      context, MaterialList(), name.text));
      }
      if (name.kind != TokenKind::kName) {
        throw Expected(context, fmt::format("a material name ({})", MaterialList()));
      }
      if (core::FindMaterial(name.text) == nullptr) {
        throw Error(name,
                    fmt::format("{}: unknown material '{}'{}; the materials are {}, or "
                                "write conductivity=SIGMA (S/m)",
                                context, Shorten(name.text),
                                DidYouMeanAside(name.text, core::MaterialNames()), MaterialList()));
      }
      Next();
      if (c->permeability) {
        throw Error(*c->permeability_token,
                    fmt::format("{}: permeability= goes with conductivity=SIGMA; material "
                                "'{}' sets its own",
                                context, name.text));
      }
      c->material = name.text;
      c->material_token = name;
      return;
    }
    ExpectPunct("=", context, fmt::format("'=' after {}", word));
    const Measured m = Expression();
    if (word == "conductivity") {
      if (c->conductivity) throw twice();
      if (c->material) throw both();
      const double sigma = Plain(m, context + ": conductivity", "in S/m");
      if (sigma <= 0.0) {
        throw Error(m.start, fmt::format("{}: conductivity must be positive; got {} S/m (leave "
                                         "it out for a perfect conductor)",
                                         context, FormatNumber(sigma)));
      }
      InRange(ValueKind::kConductivitySPerM, sigma, m, context + ": conductivity");
      c->conductivity = sigma;
    } else {
      if (c->permeability) throw twice();
      if (c->material) {
        throw Error(clause, fmt::format("{}: permeability= goes with conductivity=SIGMA; "
                                        "material '{}' sets its own",
                                        context, *c->material));
      }
      const double mu_r =
          Plain(m, context + ": permeability", "relative to vacuum; 1 for non-magnetic metals");
      if (mu_r < 1.0) {
        throw Error(m.start, fmt::format("{}: permeability must be at least 1 (relative to "
                                         "vacuum; 1 for non-magnetic metals); got {}",
                                         context, FormatNumber(mu_r)));
      }
      InRange(ValueKind::kPermeability, mu_r, m, context + ": permeability");
      c->permeability = mu_r;
      c->permeability_token = clause;
    }
  }

  // "copper, ..., aluminium (or aluminum), ..." for messages: the table names in table
  // order, each followed by its other spellings.
  static std::string MaterialList() {
    const std::vector<std::string> names = core::MaterialNames();
    std::string list;
    for (const std::string& n : names) {
      if (core::FindMaterial(n)->name != n) continue;  // another spelling, listed below
      list += (list.empty() ? "" : ", ") + n;
      for (const std::string& other : names) {
        if (other != n && core::FindMaterial(other)->name == n) list += " (or " + other + ")";
      }
    }
    return list;
  }

  WirePointSpec WirePoint(const std::string& context) {
    const Token& wire_token = Peek();
    if (wire_token.kind != TokenKind::kName) {
      throw Expected(context, "a point on a wire (WIRE@POS: dip@50%, dip@start, dip@2.5m)");
    }
    Next();
    const auto it = wire_index_.find(wire_token.text);
    if (it == wire_index_.end()) {
      std::vector<std::string> names;
      for (const WireSpec& w : model_.wires) names.push_back(w.name);
      std::string hint = DidYouMeanAside(wire_token.text, names);
      throw Error(wire_token,
                  fmt::format("{}: unknown wire '{}'{}{}", context, Shorten(wire_token.text), hint,
                              names.empty() ? "; no wire is defined above this line"
                                            : "; a wire must be defined on an earlier line"));
    }
    const WireSpec& wire = model_.wires[it->second];
    WirePointSpec spec;
    spec.wire = wire.name;
    spec.location = Loc(wire_token);
    if (!IsPunct("@")) throw Expected(context, "'@' and a position after the wire name (dip@50%)");
    Next();
    if (IsWord("start") || IsWord("end")) {
      spec.kind = Next().text == "start" ? PointKind::kStart : PointKind::kEnd;
      return spec;
    }
    const double length_m = WireLength(wire);
    const Measured m = Expression();
    if (IsPunct("%")) {
      Next();
      const double percent = Plain(m, context + ": a percent position", "percent of the length");
      if (percent < 0.0 || percent > 100.0) {
        throw Error(m.start, fmt::format("{}: position {}% is outside 0% to 100% of wire '{}'",
                                         context, FormatNumber(percent), wire.name));
      }
      if (percent == 0.0) {
        spec.kind = PointKind::kStart;
      } else if (percent == 100.0) {
        spec.kind = PointKind::kEnd;
      } else {
        spec.kind = PointKind::kPercent;
        spec.value = percent;
      }
      return spec;
    }
    const double d = As(m, LengthQuantity(), length_factor_, context + ": the position");
    const double snap_m = kEndSnapFraction * length_m;
    if (d < -snap_m) {
      throw Error(m.start,
                  fmt::format("{}: position {} m is before the start of wire '{}'; "
                              "positions run from 0 to its length {} m",
                              context, FormatNumber(d), wire.name, FormatNumber(length_m)));
    }
    if (d > length_m + snap_m) {
      throw Error(m.start, fmt::format("{}: position {} m is beyond the end of wire '{}' (its "
                                       "length is {} m); use a position from 0 to {} m, or a "
                                       "percent",
                                       context, FormatNumber(d), wire.name, FormatNumber(length_m),
                                       FormatNumber(length_m)));
    }
    if (d <= snap_m) {
      spec.kind = PointKind::kStart;
    } else if (d >= length_m - snap_m) {
      spec.kind = PointKind::kEnd;
    } else {
      spec.kind = PointKind::kDistance;
      spec.value = d;
    }
    return spec;
  }

  void Feed(const Token& keyword) {
    const Token& name_token = Peek();
    FeedSpec feed;
    feed.location = Loc(keyword);
    feed.name = Name("feed", "a feed name (feed NAME at WIRE@POS)");
    CheckNew(feed_lines_, "feed", feed.name, name_token);
    const std::string context = fmt::format("feed '{}'", feed.name);
    if (!IsWord("at")) throw Expected(context, "'at WIRE@POS'");
    Next();
    feed.at = WirePoint(context);
    if (IsWord("voltage")) {
      Next();
      const Measured m = Expression();
      feed.voltage_v = As(m, VoltageQuantity(), 1.0, context + ": voltage");
      if (feed.voltage_v == 0.0) {
        throw Error(m.start, fmt::format("{}: the voltage must not be zero (a feed of 0 V drives "
                                         "nothing); leave it out for 1 V",
                                         context));
      }
      InRange(ValueKind::kVoltageV, feed.voltage_v, m, context + ": voltage");
    }
    if (Peek().kind != TokenKind::kEnd) {
      throw Error(Peek(), fmt::format("{}: unexpected {}; after the point comes only an optional "
                                      "'voltage V'",
                                      context, Quote(Peek())));
    }
    feed_lines_[feed.name] = feed.location;
    model_.feeds.push_back(std::move(feed));
  }

  void Load(const Token& keyword) {
    const Token& name_token = Peek();
    LoadSpec load;
    load.location = Loc(keyword);
    load.name = Name("load", "a load name (load NAME at WIRE@POS series|parallel R=.. L=.. C=..)");
    CheckNew(load_lines_, "load", load.name, name_token);
    const std::string context = fmt::format("load '{}'", load.name);
    if (!IsWord("at")) throw Expected(context, "'at WIRE@POS'");
    Next();
    load.at = WirePoint(context);
    if (IsWord("coil")) {
      Next();
      load.coil = CoilClauses(context);
      load_lines_[load.name] = load.location;
      model_.loads.push_back(std::move(load));
      return;
    }
    if (IsWord("series")) {
      load.topology = LoadTopology::kSeries;
    } else if (IsWord("parallel")) {
      load.topology = LoadTopology::kParallel;
    } else {
      throw Expected(context, "'series' or 'parallel'");
    }
    Next();
    while (Peek().kind != TokenKind::kEnd) {
      const Token& element = Peek();
      if (element.kind != TokenKind::kName ||
          (element.text != "R" && element.text != "L" && element.text != "C")) {
        throw Error(element, fmt::format("{}: unknown element {}; use R=, L= or C=", context,
                                         Quote(element)));
      }
      Next();
      ExpectPunct("=", context, fmt::format("'=' after {}", element.text));
      const Measured m = Expression();
      const std::string what = fmt::format("{}: {}", context, element.text);
      auto twice = [&] {
        return Error(element, fmt::format("{}: {} is given twice", context, element.text));
      };
      if (element.text == "R") {
        if (load.resistance_ohm) throw twice();
        const double r = As(m, ResistanceQuantity(), 1.0, what);
        if (r < 0.0) {
          throw Error(m.start, fmt::format("{}: R must not be negative; got {} ohm", context,
                                           FormatNumber(r)));
        }
        InRange(ValueKind::kResistanceOhm, r, m, what);
        load.resistance_ohm = r;
      } else if (element.text == "L") {
        if (load.inductance_h) throw twice();
        const double l = As(m, InductanceQuantity(), 1.0, what);
        if (l < 0.0) {
          throw Error(m.start, fmt::format("{}: L must not be negative; got {} H", context,
                                           FormatNumber(l)));
        }
        InRange(ValueKind::kInductanceH, l, m, what);
        load.inductance_h = l;
      } else {
        if (load.capacitance_f) throw twice();
        const double c = As(m, CapacitanceQuantity(), 1.0, what);
        if (c <= 0.0) {
          throw Error(m.start, fmt::format("{}: C must be positive; got {} F (leave C out for no "
                                           "capacitor)",
                                           context, FormatNumber(c)));
        }
        InRange(ValueKind::kCapacitanceF, c, m, what);
        load.capacitance_f = c;
      }
    }
    if (!load.resistance_ohm && !load.inductance_h && !load.capacitance_f) {
      throw Error(Peek(), fmt::format("{} has none of R, L, C; give at least one (R=50, "
                                      "L=10uH, C=100pF)",
                                      context));
    }
    LoadWarnings(load);
    load_lines_[load.name] = load.location;
    model_.loads.push_back(std::move(load));
  }

  // The clauses of a coil load, those of the `coil` command: (turns=N | inductance=L)
  // diameter=D (length=L | pitch=P | close-wound) wire=d [insulation=T] [material=NAME]; sizes
  // are lengths (bare numbers in the `units` length). With inductance= the turns are found
  // (DesignCoilTurns) at the pitch given or close-wound.
  CoilSpec CoilClauses(const std::string& context) {
    CoilSpec coil;
    std::map<std::string, Token> given;
    static const std::vector<std::string> kClauses = {
        "turns", "inductance", "diameter", "length", "pitch", "wire", "insulation", "material"};
    const std::string usage =
        "turns=N|inductance=L diameter=D length=L|pitch=P|close-wound wire=d [insulation=T] "
        "[material=NAME]";
    std::optional<double> target_h;
    while (Peek().kind != TokenKind::kEnd) {
      const Token clause = Peek();
      if (IsCloseWound()) {
        Next(), Next(), Next();
        if (given.count("close-wound") != 0) {
          throw Error(clause, fmt::format("{}: close-wound is given twice", context));
        }
        given.emplace("close-wound", clause);
        continue;
      }
      if (clause.kind != TokenKind::kName ||
          std::find(kClauses.begin(), kClauses.end(), clause.text) == kClauses.end()) {
        throw Error(clause, fmt::format("{}: unexpected {} in the coil; write {}", context,
                                        Quote(clause), usage));
      }
      Next();
      if (given.count(clause.text) != 0) {
        throw Error(clause, fmt::format("{}: {} is given twice", context, clause.text));
      }
      given.emplace(clause.text, clause);
      ExpectPunct("=", context, fmt::format("'=' after {}", clause.text));
      if (clause.text == "material") {
        const Token& name = Peek();
        if (name.kind != TokenKind::kName || core::FindMaterial(name.text) == nullptr) {
          throw Error(name, fmt::format("{}: unknown coil wire material {}; the materials are {}",
                                        context, Quote(name), MaterialList()));
        }
        Next();
        const core::Material* entry = core::FindMaterial(name.text);
        coil.material = entry->name;
        coil.conductivity_s_per_m = entry->conductivity_s_per_m;
        coil.relative_permeability = entry->relative_permeability;
        continue;
      }
      const Measured m = Expression();
      const std::string what = fmt::format("{}: coil {}", context, clause.text);
      if (clause.text == "turns") {
        coil.turns = Plain(m, what, "a number of turns");
        if (!(coil.turns >= 1.0)) {
          throw Error(m.start, fmt::format("{}: the coil needs at least 1 turn; got {}", context,
                                           FormatNumber(coil.turns)));
        }
        InRange(ValueKind::kCoilTurns, coil.turns, m, what);
        if (coil.turns > kDubiousCoilTurns) {
          model_.warnings.push_back(Warning{
              Loc(m.start),
              fmt::format("{}: {} turns is more than any single-layer antenna coil ({} at most); "
                          "check the number",
                          context, FormatNumber(coil.turns), FormatNumber(kDubiousCoilTurns))});
        }
        continue;
      }
      if (clause.text == "inductance") {
        target_h = Positive(m, InductanceQuantity(), ValueKind::kInductanceH, context,
                            "the coil inductance", "");
        continue;
      }
      const double size_m = As(m, LengthQuantity(), length_factor_, what);
      const bool may_be_zero = clause.text == "insulation";
      if (size_m < 0.0 || (size_m == 0.0 && !may_be_zero)) {
        throw Error(m.start,
                    fmt::format("{}: the coil {} must be {}; got {} m", context, clause.text,
                                may_be_zero ? "zero or more" : "positive", FormatNumber(size_m)));
      }
      InRange(ValueKind::kCoilSizeM, size_m, m, what);
      if (clause.text == "diameter") coil.former_diameter_m = size_m;
      if (clause.text == "length") coil.length_m = size_m;
      if (clause.text == "pitch") coil.pitch_m = size_m;
      if (clause.text == "wire") coil.wire_diameter_m = size_m;
      if (clause.text == "insulation") coil.insulation_m = size_m;
    }
    // The winding: exactly one of length, pitch and close-wound.
    std::vector<const Token*> windings;
    for (const char* w : {"length", "pitch", "close-wound"}) {
      if (given.count(w) != 0) windings.push_back(&given.at(w));
    }
    if (windings.size() > 1) {
      const Token* second = windings[0];
      for (const Token* w : windings) second = w->column > second->column ? w : second;
      if (given.count("close-wound") == 0) {
        throw Error(*second, fmt::format("{}: give the coil's length or its pitch (length = "
                                         "turns x pitch), not both",
                                         context));
      }
      throw Error(*second, fmt::format("{}: give the coil's winding by length=L, pitch=P or "
                                       "close-wound, exactly one (close-wound sets the pitch to "
                                       "wire + 2 x insulation)",
                                       context));
    }
    if (given.count("turns") != 0 && target_h) {
      throw Error(given.at("inductance"),
                  fmt::format("{}: give the coil's turns=N or its inductance=L (the turns are "
                              "then found), not both",
                              context));
    }
    if (target_h && given.count("length") != 0) {
      throw Error(given.at("length"),
                  fmt::format("{}: length= fixes the winding, so it cannot go with "
                              "inductance=; give pitch=P or close-wound and the turns (and "
                              "length) are found",
                              context));
    }
    if (given.count("turns") == 0 && !target_h) {
      throw Error(Peek(), fmt::format("{}: the coil needs turns= (or inductance=); write {}",
                                      context, usage));
    }
    for (const char* required : {"diameter", "wire"}) {
      if (given.count(required) == 0) {
        throw Error(Peek(),
                    fmt::format("{}: the coil needs {}=; write {}", context, required, usage));
      }
    }
    if (windings.empty()) {
      throw Error(Peek(), fmt::format("{}: the coil needs length=L, pitch=P or close-wound; "
                                      "write {}",
                                      context, usage));
    }
    if (given.count("close-wound") != 0) {
      coil.pitch_m = coil.wire_diameter_m + 2.0 * coil.insulation_m;
    }
    const Token& winding = *windings.front();
    if (target_h) {
      try {
        return DesignCoilTurns(coil, *target_h);
      } catch (const InputError& e) {
        throw Error(given.at("inductance"), fmt::format("{}: {}", context, e.message()));
      }
    }
    const std::string problem = CoilProblem(coil);
    if (!problem.empty()) throw Error(winding, fmt::format("{}: {}", context, problem));
    return coil;
  }

  // `close-wound` at Peek(): three tokens written without spaces.
  bool IsCloseWound() const {
    return IsWord("close") && pos_ + 2 < tokens_.size() && tokens_[pos_ + 1].text == "-" &&
           !tokens_[pos_ + 1].space_before && tokens_[pos_ + 2].text == "wound" &&
           !tokens_[pos_ + 2].space_before;
  }

  void LoadWarnings(const LoadSpec& load) {
    const bool zero_r = load.resistance_ohm && *load.resistance_ohm == 0.0;
    const bool zero_l = load.inductance_h && *load.inductance_h == 0.0;
    if (load.topology == LoadTopology::kParallel && (zero_r || zero_l)) {
      model_.warnings.push_back(Warning{
          load.location, fmt::format("load '{}': a parallel {}=0 is a short circuit; the other "
                                     "elements have no effect",
                                     load.name, zero_r ? "R" : "L")});
    }
    if (load.topology == LoadTopology::kSeries && !load.capacitance_f &&
        (!load.resistance_ohm || zero_r) && (!load.inductance_h || zero_l)) {
      model_.warnings.push_back(
          Warning{load.location, fmt::format("load '{}' is a short circuit (0 ohm in series); it "
                                             "has no effect",
                                             load.name)});
    }
  }

  // ---- the feed chain: transformer and line -------------------------------------------
  // The feed a transformer or line sits at: a feed defined on an earlier line.
  std::string ChainFeed(const std::string& context) {
    if (!IsWord("at")) throw Expected(context, "'at FEED'");
    Next();
    const Token& t = Peek();
    if (t.kind != TokenKind::kName) throw Expected(context, "a feed name after 'at'");
    Next();
    if (feed_lines_.count(t.text) == 0) {
      std::vector<std::string> names;
      for (const FeedSpec& f : model_.feeds) names.push_back(f.name);
      throw Error(t, fmt::format("{}: unknown feed '{}'{}{}", context, Shorten(t.text),
                                 DidYouMeanAside(t.text, names),
                                 names.empty() ? "; no feed is defined above this line"
                                               : "; a feed must be defined on an earlier line"));
    }
    return t.text;
  }

  // "=" after a clause word, then a value.
  Measured ClauseValue(const std::string& context, const Token& clause) {
    ExpectPunct("=", context, fmt::format("'=' after {}", clause.text));
    return Expression();
  }

  // A positive value of q, in the allowed range of `kind`.
  double Positive(const Measured& m, const Quantity& q, ValueKind kind, const std::string& context,
                  const std::string& what, const std::string& advice) const {
    const double v = As(m, q, 1.0, fmt::format("{}: {}", context, what));
    if (!(v > 0.0)) {
      throw Error(m.start, fmt::format("{}: {} must be positive; got {} {}{}", context, what,
                                       FormatNumber(v), q.si_unit, advice));
    }
    InRange(kind, v, m, fmt::format("{}: {}", context, what));
    return v;
  }

  void Transformer(const Token& keyword) {
    const Token& name_token = Peek();
    TransformerSpec t;
    t.location = Loc(keyword);
    t.name = Name("transformer", "a transformer name (transformer NAME at FEED turns P:S)");
    CheckNew(transformer_lines_, "transformer", t.name, name_token);
    const std::string context = fmt::format("transformer '{}'", t.name);
    const Token feed_token = tokens_[pos_ + 1 < tokens_.size() ? pos_ + 1 : pos_];
    t.feed = ChainFeed(context);
    if (const auto it = feed_transformer_.find(t.feed); it != feed_transformer_.end()) {
      throw Error(feed_token,
                  fmt::format("{}: feed '{}' already has transformer '{}' ({}); a "
                              "feed takes one transformer",
                              context, t.feed, it->second.first, Line(it->second.second)));
    }
    bool have_turns = false;
    std::optional<Token> al_token, magnetizing_token, q_token, coreloss_token, leakage_token;
    while (Peek().kind != TokenKind::kEnd) {
      const Token clause = Peek();
      auto twice = [&] {
        return Error(clause, fmt::format("{}: {} is given twice", context, clause.text));
      };
      if (IsWord("turns")) {
        if (have_turns) throw twice();
        Next();
        if (Peek().kind == TokenKind::kNumber && pos_ + 1 < tokens_.size() &&
            tokens_[pos_ + 1].kind == TokenKind::kNumber) {  // "turns 2 16"
          throw Error(tokens_[pos_ + 1],
                      fmt::format("{}: expected ':' between the primary and the secondary turns "
                                  "(turns 2:16); got {}",
                                  context, Quote(tokens_[pos_ + 1])));
        }
        const Measured p = Expression();
        t.primary_turns = Plain(p, context + ": turns", "the primary turns, as in turns 2:16");
        if (!IsPunct(":")) {
          throw Expected(context, "':' between the primary and the secondary turns (turns 2:16)");
        }
        Next();
        const Measured s = Expression();
        t.secondary_turns = Plain(s, context + ": turns", "the secondary turns, as in turns 2:16");
        for (const auto& [value, at, side] :
             {std::tuple{t.primary_turns, p.start, "primary (transmitter side)"},
              std::tuple{t.secondary_turns, s.start, "secondary (antenna side)"}}) {
          if (!(value > 0.0)) {
            throw Error(at, fmt::format("{}: the {} turns must be positive; got {}", context, side,
                                        FormatNumber(value)));
          }
          if (auto message = OutOfRange(ValueKind::kTransformerTurns, value,
                                        fmt::format("{}: the {} turns", context, side))) {
            throw Error(at, *message);
          }
        }
        have_turns = true;
        continue;
      }
      if (IsWord("ratio")) throw RatioError(context);
      static const std::vector<std::string> kClauses = {
          "turns", "magnetizing", "al", "leakage", "compensation", "coreloss", "q"};
      if (clause.kind != TokenKind::kName ||
          std::find(kClauses.begin(), kClauses.end(), clause.text) == kClauses.end()) {
        throw Error(
            clause,
            fmt::format(
                "{}: unexpected {}{}; the clauses are turns P:S, magnetizing=L, "
                "al=A_L, leakage=L, compensation=C, coreloss=R and q=Q",
                context, Quote(clause),
                clause.kind == TokenKind::kName ? DidYouMeanAside(clause.text, kClauses) : ""));
      }
      Next();
      const Measured m = ClauseValue(context, clause);
      const std::string& w = clause.text;
      if (w == "magnetizing" || w == "al") {
        if ((w == "magnetizing" && magnetizing_token) || (w == "al" && al_token)) throw twice();
        if (magnetizing_token || al_token) {
          throw Error(clause, fmt::format("{}: give either magnetizing=L or al=A_L (which sets L "
                                          "= A_L * P^2), not both",
                                          context));
        }
        if (w == "magnetizing") {
          t.magnetizing_inductance_h =
              Positive(m, InductanceQuantity(), ValueKind::kInductanceH, context, "magnetizing",
                       " (leave it out for an ideal transformer)");
          magnetizing_token = clause;
        } else {
          double al = 0.0;
          if (m.value.dimension == kInductance) {
            al = m.value.si / 1e-9;
          } else if (m.value.dimension.IsNone()) {
            al = m.value.si;
          } else {
            throw Error(m.start, fmt::format("{}: al needs A_L in nH/turn^2 (a plain number, or "
                                             "with nH); got {}",
                                             context, Describe(m.value.dimension)));
          }
          if (!(al > 0.0)) {
            throw Error(m.start, fmt::format("{}: al must be positive; got {} nH/turn^2", context,
                                             FormatNumber(al)));
          }
          InRange(ValueKind::kAlNanohenryPerTurn2, al, m, context + ": al");
          t.al_nh_per_turn2 = al;
          al_token = clause;
        }
      } else if (w == "leakage") {
        if (leakage_token) throw twice();
        const double l = As(m, InductanceQuantity(), 1.0, context + ": leakage");
        if (l < 0.0) {
          throw Error(m.start, fmt::format("{}: leakage must not be negative; got {} H", context,
                                           FormatNumber(l)));
        }
        InRange(ValueKind::kInductanceH, l, m, context + ": leakage");
        t.leakage_inductance_h = l;
        leakage_token = clause;
      } else if (w == "compensation") {
        if (t.compensation_capacitance_f) throw twice();
        t.compensation_capacitance_f =
            Positive(m, CapacitanceQuantity(), ValueKind::kCapacitanceF, context, "compensation",
                     " (leave it out for no capacitor)");
      } else {
        const bool is_q = w == "q";
        if ((is_q && q_token) || (!is_q && coreloss_token)) throw twice();
        if (q_token || coreloss_token) {
          throw Error(clause, fmt::format("{}: give either coreloss=R or q=Q, not both", context));
        }
        if (is_q) {
          const double q = Plain(m, context + ": q", "the Q of the magnetizing inductance");
          if (!(q > 0.0)) {
            throw Error(m.start,
                        fmt::format("{}: q must be positive; got {}", context, FormatNumber(q)));
          }
          InRange(ValueKind::kQuality, q, m, context + ": q");
          t.core_q = q;
          q_token = clause;
        } else {
          t.core_loss_resistance_ohm =
              Positive(m, ResistanceQuantity(), ValueKind::kResistanceOhm, context, "coreloss",
                       " (leave it out for a lossless core)");
          coreloss_token = clause;
        }
      }
    }
    if (!have_turns) {
      throw Expected(context, "'turns P:S' (transmitter side : antenna side, as in turns 2:16)");
    }
    if (q_token && !magnetizing_token && !al_token) {
      throw Error(*q_token, fmt::format("{}: q= is the Q of the magnetizing inductance; give "
                                        "magnetizing=L or al=A_L too",
                                        context));
    }
    transformer_lines_[t.name] = t.location;
    feed_transformer_[t.feed] = {t.name, t.location};
    model_.transformers.push_back(std::move(t));
  }

  // `ratio 1:49` at Peek(): the transformer takes its turns, whose square is the impedance
  // ratio; the error names the turns that give the ratio written.
  InputError RatioError(const std::string& context) {
    const Token ratio = Next();
    if (IsPunct("=")) Next();
    const size_t p = pos_;
    const auto number = [&](size_t i) {
      return i < tokens_.size() && tokens_[i].kind == TokenKind::kNumber && tokens_[i].number > 0.0;
    };
    if (number(p) && p + 2 < tokens_.size() && tokens_[p + 1].kind == TokenKind::kPunct &&
        tokens_[p + 1].text == ":" && number(p + 2)) {
      const std::string primary = FormatNumber(std::sqrt(tokens_[p].number));
      const std::string secondary = FormatNumber(std::sqrt(tokens_[p + 2].number));
      return Error(ratio, fmt::format("{}: a transformer takes its turns, not its impedance "
                                      "ratio; an impedance ratio of {}:{} is a turns ratio of "
                                      "{}:{} (the impedance goes as the square of the turns): "
                                      "write turns {}:{}",
                                      context, tokens_[p].text, tokens_[p + 2].text, primary,
                                      secondary, primary, secondary));
    }
    return Error(ratio, fmt::format("{}: a transformer takes its turns, not its impedance "
                                    "ratio; write turns P:S (transmitter side : antenna side), "
                                    "the square roots of the impedance ratio: an impedance ratio "
                                    "of 1:49 is turns 1:7",
                                    context));
  }

  static std::string CableList() {
    std::string list;
    for (const CableInfo& c : CableTable()) list += (list.empty() ? "" : ", ") + c.name;
    return list;
  }

  // "rg58" -> "RG-58": the table name that differs only in case and dashes, else the nearest.
  static std::string CableHint(const std::string& written) {
    auto fold = [](const std::string& s) {
      std::string r;
      for (char c : s) {
        if (c != '-') r += static_cast<char>(std::tolower(static_cast<unsigned char>(c)));
      }
      return r;
    };
    std::vector<std::string> names;
    for (const CableInfo& c : CableTable()) {
      if (fold(c.name) == fold(written)) return fmt::format(" (did you mean '{}'?)", c.name);
      names.push_back(c.name);
    }
    return DidYouMeanAside(written, names);
  }

  void FeedLine(const Token& keyword) {
    const Token& name_token = Peek();
    FeedLineSpec line;
    line.location = Loc(keyword);
    line.name = Name("line", "a line name (line NAME at FEED length LEN cable=NAME)");
    CheckNew(line_lines_, "line", line.name, name_token);
    const std::string context = fmt::format("line '{}'", line.name);
    const Token feed_token = tokens_[pos_ + 1 < tokens_.size() ? pos_ + 1 : pos_];
    line.feed = ChainFeed(context);
    if (const auto it = feed_line_.find(line.feed); it != feed_line_.end()) {
      throw Error(feed_token,
                  fmt::format("{}: feed '{}' already has line '{}' ({}); a feed "
                              "takes one line",
                              context, line.feed, it->second.first, Line(it->second.second)));
    }
    std::optional<Token> length_token, cable_token, z0_token, velocity_token, loss_token;
    const std::string either = fmt::format(
        "{}: give either cable=NAME or z0=, velocity= and "
        "loss=, not both",
        context);
    while (Peek().kind != TokenKind::kEnd) {
      const Token clause = Peek();
      auto twice = [&] {
        return Error(clause, fmt::format("{}: {} is given twice", context, clause.text));
      };
      static const std::vector<std::string> kClauses = {"length", "cable", "z0", "velocity",
                                                        "loss"};
      if (clause.kind != TokenKind::kName ||
          std::find(kClauses.begin(), kClauses.end(), clause.text) == kClauses.end()) {
        throw Error(
            clause,
            fmt::format(
                "{}: unexpected {}{}; the clauses are length LEN and either "
                "cable=NAME or z0=Z velocity=VF [loss=DB@F,DB@F]",
                context, Quote(clause),
                clause.kind == TokenKind::kName ? DidYouMeanAside(clause.text, kClauses) : ""));
      }
      Next();
      const std::string& w = clause.text;
      if (w == "length") {
        if (length_token) throw twice();
        const Measured m = Expression();
        line.length_m = As(m, LengthQuantity(), length_factor_, context + ": length");
        if (!(line.length_m > 0.0)) {
          throw Error(m.start, fmt::format("{}: length must be positive; got {} m", context,
                                           FormatNumber(line.length_m)));
        }
        InRange(ValueKind::kLineLengthM, line.length_m, m, context + ": length");
        length_token = clause;
      } else if (w == "cable") {
        if (cable_token) throw twice();
        if (z0_token || velocity_token || loss_token) throw Error(clause, either);
        ExpectPunct("=", context, "'=' after cable");
        const Token& first = Peek();
        if (first.kind == TokenKind::kEnd) {
          throw Error(first, fmt::format("{}: missing a cable name after 'cable=' (the cables "
                                         "are {})",
                                         context, CableList()));
        }
        std::string written = Next().text;  // RG-58 is three tokens written without spaces
        while (Peek().kind != TokenKind::kEnd && !Peek().space_before) written += Next().text;
        const CableInfo* found = nullptr;
        for (const CableInfo& c : CableTable()) {
          if (c.name == written) found = &c;
        }
        if (found == nullptr) {
          throw Error(first,
                      fmt::format("{}: unknown cable '{}'{}; the cables are {}, or give "
                                  "z0=, velocity= and loss=",
                                  context, Shorten(written), CableHint(written), CableList()));
        }
        line.cable = found->name;
        line.z0_ohm = found->z0_ohm;
        line.velocity_factor = found->velocity_factor;
        line.loss1_db_per_100m = found->loss1_db_per_100m;
        line.loss1_frequency_hz = found->loss1_frequency_hz;
        line.loss2_db_per_100m = found->loss2_db_per_100m;
        line.loss2_frequency_hz = found->loss2_frequency_hz;
        line.loss_points = 2;
        cable_token = clause;
      } else if (w == "z0") {
        if (z0_token) throw twice();
        if (cable_token) throw Error(clause, either);
        line.z0_ohm = Positive(ClauseValue(context, clause), ResistanceQuantity(),
                               ValueKind::kImpedanceOhm, context, "z0", "");
        z0_token = clause;
      } else if (w == "velocity") {
        if (velocity_token) throw twice();
        if (cable_token) throw Error(clause, either);
        const Measured m = ClauseValue(context, clause);
        const double vf = Plain(m, context + ": velocity", "the velocity factor, as in 0.66");
        if (!(vf > 0.0 && vf <= 1.0)) {
          throw Error(m.start, fmt::format("{}: velocity is the velocity factor, above 0 and at "
                                           "most 1; got {}",
                                           context, FormatNumber(vf)));
        }
        line.velocity_factor = vf;
        velocity_token = clause;
      } else {
        if (loss_token) throw twice();
        if (cable_token) throw Error(clause, either);
        Loss(context, clause, &line);
        loss_token = clause;
      }
    }
    if (!length_token) throw Expected(context, "'length LEN' (the length of the line)");
    if (!cable_token) {
      if (!z0_token) {
        throw Expected(context, "'cable=NAME' or 'z0=Z velocity=VF loss=DB@F,DB@F' (cables: " +
                                    CableList() + ")");
      }
      if (!velocity_token) {
        throw Expected(context, "'velocity=VF' (the velocity factor of the line)");
      }
      if (!loss_token) line.loss_points = 0;  // documented: no loss= is a lossless line
    }
    // A matched loss beyond kMaxLineLossDb at its own loss figures overflows the line's
    // cosh and sinh (e^x overflows past x = 709 nepers, 6158 dB) long before any sweep.
    const double worst_db_per_100m =
        line.loss_points == 0 ? 0.0 : std::max(line.loss1_db_per_100m, line.loss2_db_per_100m);
    if (worst_db_per_100m * line.length_m / 100.0 > kMaxLineLossDb) {
      throw Error(*length_token,
                  fmt::format("{}: a matched loss of {} dB over its {} m is more than {} dB; "
                              "no power would reach the antenna: shorten the line or lower its "
                              "loss",
                              context, FormatNumber(worst_db_per_100m * line.length_m / 100.0),
                              FormatNumber(line.length_m), FormatNumber(kMaxLineLossDb)));
    }
    line_lines_[line.name] = line.location;
    feed_line_[line.feed] = {line.name, line.location};
    model_.feed_lines.push_back(std::move(line));
  }

  // loss=DB@F or loss=DB1@F1,DB2@F2 (dB per 100 m, matched).
  void Loss(const std::string& context, const Token& clause, FeedLineSpec* line) {
    ExpectPunct("=", context, "'=' after loss");
    double db[2] = {0.0, 0.0}, f[2] = {0.0, 0.0};
    int n = 0;
    Token first_start;
    while (true) {
      if (n == 2) {
        throw Error(Peek(), fmt::format("{}: loss takes one or two points (loss=1.3@10MHz,"
                                        "2.5@30MHz); remove the third",
                                        context));
      }
      const Measured m = Expression();
      if (n == 0) first_start = m.start;
      db[n] = Plain(m, context + ": loss", "dB per 100 m");
      if (db[n] < 0.0) {
        throw Error(m.start, fmt::format("{}: loss must not be negative; got {} dB/100 m", context,
                                         FormatNumber(db[n])));
      }
      InRange(ValueKind::kLossDbPer100m, db[n], m, context + ": loss");
      if (!IsPunct("@")) {
        throw Expected(context, "'@' and the frequency of the loss figure (loss=1.3@10MHz)");
      }
      Next();
      const Measured fm = Expression();
      f[n] = As(fm, FrequencyQuantity(), 1.0, context + ": loss=DB@F");
      if (f[n] > 0.0) InRange(ValueKind::kFrequencyHz, f[n], fm, context + ": loss=DB@F");
      if (!(f[n] > 0.0)) {
        throw Error(fm.start, fmt::format("{}: the frequency of a loss figure must be positive; "
                                          "got {} Hz",
                                          context, FormatNumber(f[n])));
      }
      ++n;
      if (!IsPunct(",")) break;
      Next();
    }
    line->loss1_db_per_100m = db[0];
    line->loss1_frequency_hz = f[0];
    line->loss_points = n;
    if (n == 1) return;
    if (f[0] == f[1]) {
      throw Error(first_start, fmt::format("{}: the two loss figures are at the same frequency "
                                           "{} MHz; give them at two frequencies",
                                           context, FormatNumber(f[0] / 1e6)));
    }
    if ((db[0] == 0.0) != (db[1] == 0.0)) {
      throw Error(first_start, fmt::format("{}: a line with loss at one frequency has loss at "
                                           "every frequency; give both figures positive, or "
                                           "both 0 for a lossless line",
                                           context));
    }
    line->loss2_db_per_100m = db[1];
    line->loss2_frequency_hz = f[1];
    const network::LossFit fit = network::FitLoss(*line);
    if (!fit.exact) {
      model_.warnings.push_back(Warning{
          Loc(clause),
          fmt::format(
              "{}: the loss grows {} between {} and {} MHz, which the conductor-plus-dielectric "
              "model cannot follow; the fit keeps only the {} term and misses a figure "
              "by {:.0f}%",
              context,
              fit.a_np_per_m_per_sqrt_hz > 0.0 ? "more slowly than sqrt(f)" : "faster than f",
              FormatNumber(f[0] / 1e6), FormatNumber(f[1] / 1e6),
              fit.a_np_per_m_per_sqrt_hz > 0.0 ? "sqrt(f)" : "f", 100.0 * fit.worst_misfit)});
    }
  }

  static std::string PresetList() {
    std::string list;
    for (const GroundPreset& p : GroundPresets()) list += (list.empty() ? "" : ", ") + p.name;
    return list;
  }

  void Ground(const Token& keyword) {
    if (ground_line_) {
      throw Error(keyword,
                  fmt::format("ground is already given at {}; give it once", Line(*ground_line_)));
    }
    const Token& kind = Peek();
    if (kind.kind != TokenKind::kName) throw Expected("ground", "the kind (free, perfect or real)");
    GroundSpec ground;
    ground.location = Loc(keyword);
    if (kind.text == "free") {
      ground.kind = GroundKind::kFree;
    } else if (kind.text == "perfect") {
      ground.kind = GroundKind::kPerfect;
    } else if (kind.text == "real") {
      ground.kind = GroundKind::kReal;
    } else {
      for (const GroundPreset& p : GroundPresets()) {
        if (p.name == kind.text) {
          throw Error(kind, fmt::format("ground: '{}' is a preset of a real ground; write "
                                        "'ground real preset={}'",
                                        p.name, p.name));
        }
      }
      throw Error(kind, fmt::format("ground: unknown kind '{}'{}; use free, perfect or real",
                                    Shorten(kind.text),
                                    DidYouMeanAside(kind.text, {"free", "perfect", "real"})));
    }
    Next();
    if (ground.kind == GroundKind::kReal) {
      std::optional<double> permittivity, conductivity;
      std::optional<Token> preset_token, method_token;
      const GroundPreset* preset = nullptr;
      while (Peek().kind != TokenKind::kEnd) {
        const Token& setting = Peek();
        const bool is_eps = IsWord("permittivity");
        if (IsWord("preset")) {
          if (preset_token) throw Error(setting, "ground real: preset is given twice");
          preset_token = setting;
          Next();
          ExpectPunct("=", "ground real", "'=' after preset");
          const Token& name = Peek();
          if (name.kind != TokenKind::kName) {
            throw Expected("ground real: preset", "a preset name (" + PresetList() + ")");
          }
          preset = FindGroundPreset(name.text);
          if (!preset) {
            std::vector<std::string> names;
            for (const GroundPreset& p : GroundPresets()) names.push_back(p.name);
            throw Error(name, fmt::format("ground real: unknown preset '{}'{}; the presets are {}",
                                          Shorten(name.text), DidYouMeanAside(name.text, names),
                                          PresetList()));
          }
          Next();
          continue;
        }
        if (IsWord("method")) {
          if (method_token) throw Error(setting, "ground real: method is given twice");
          method_token = setting;
          Next();
          ExpectPunct("=", "ground real", "'=' after method");
          const Token& name = Peek();
          if (name.kind == TokenKind::kName && name.text == "exact") {
            ground.method = GroundMethod::kExact;
          } else if (name.kind == TokenKind::kName && name.text == "reflection") {
            ground.method = GroundMethod::kReflection;
          } else {
            throw Error(name, fmt::format("ground real: unknown method {}{}; use method=exact (the "
                                          "Sommerfeld half-space) or method=reflection (the "
                                          "reflection-coefficient approximation)",
                                          Quote(name),
                                          name.kind == TokenKind::kName
                                              ? DidYouMeanAside(name.text, {"exact", "reflection"})
                                              : ""));
          }
          Next();
          continue;
        }
        if (IsWord("exact_below")) {
          if (ground.exact_below_m) throw Error(setting, "ground real: exact_below is given twice");
          Next();
          ExpectPunct("=", "ground real", "'=' after exact_below");
          const Measured m = Expression();
          const double h = As(m, LengthQuantity(), length_factor_, "ground real: exact_below");
          if (!(h >= 0.0) || !std::isfinite(h)) {
            throw Error(m.start, fmt::format("ground real: exact_below must be a height of 0 or "
                                             "more (0 turns the exact ground off); got {} m",
                                             FormatNumber(h)));
          }
          InRange(ValueKind::kCoordinateM, h, m, "ground real: exact_below");
          ground.exact_below_m = h;
          continue;
        }
        if (!is_eps && !IsWord("conductivity")) {
          throw Error(setting,
                      fmt::format("ground real: unknown setting {}{}; use preset=NAME, or "
                                  "permittivity= and conductivity=, and optionally "
                                  "method=exact|reflection and exact_below=HEIGHT",
                                  Quote(setting),
                                  setting.kind == TokenKind::kName
                                      ? DidYouMeanAside(setting.text,
                                                        {"preset", "permittivity", "conductivity",
                                                         "method", "exact_below"})
                                      : ""));
        }
        Next();
        ExpectPunct("=", "ground real", fmt::format("'=' after {}", setting.text));
        const Measured m = Expression();
        if (is_eps) {
          if (permittivity) throw Error(setting, "ground real: permittivity is given twice");
          const double eps =
              Plain(m, "ground real: permittivity", "relative to vacuum; 13 for average ground");
          if (eps < 1.0) {
            throw Error(m.start, fmt::format("ground real: permittivity must be at least 1 "
                                             "(relative to vacuum); got {}",
                                             FormatNumber(eps)));
          }
          InRange(ValueKind::kPermittivity, eps, m, "ground real: permittivity");
          permittivity = eps;
        } else {
          if (conductivity) throw Error(setting, "ground real: conductivity is given twice");
          const double sigma = Plain(m, "ground real: conductivity", "in S/m");
          if (sigma < 0.0) {
            throw Error(m.start, fmt::format("ground real: conductivity must not be negative; "
                                             "got {} S/m",
                                             FormatNumber(sigma)));
          }
          InRange(ValueKind::kConductivitySPerM, sigma, m, "ground real: conductivity");
          conductivity = sigma;
        }
      }
      if (preset) {
        if (permittivity || conductivity) {
          throw Error(*preset_token,
                      "ground real: give either preset=NAME or permittivity= and "
                      "conductivity=, not both");
        }
        permittivity = preset->permittivity;
        conductivity = preset->conductivity_s_per_m;
        ground.preset = preset->name;
      }
      if (!permittivity) {
        throw Expected("ground real",
                       "'permittivity=EPS_R' (or preset=NAME: " + PresetList() + ")");
      }
      if (!conductivity) throw Expected("ground real", "'conductivity=SIGMA' (S/m)");
      ground.permittivity = *permittivity;
      ground.conductivity_s_per_m = *conductivity;
      if (*permittivity == 1.0 && *conductivity == 0.0) {
        model_.warnings.push_back(Warning{ground.location,
                                          "ground real with permittivity 1 and conductivity 0 "
                                          "is empty space below z = 0; did you mean "
                                          "'ground free'?"});
      }
    } else {
      ExpectEnd("ground " + kind.text);
    }
    ground_line_ = ground.location;
    model_.ground = ground;
  }

  void Frequency(const Token& keyword) {
    if (frequency_line_) {
      throw Error(keyword, fmt::format("frequency is already given at {}; give it once (the "
                                       "command line may override it)",
                                       Line(*frequency_line_)));
    }
    const Measured m = Expression();
    const double f = As(m, FrequencyQuantity(), 1.0, "frequency");
    if (f <= 0.0) {
      throw Error(m.start, fmt::format("frequency must be positive; got {} Hz", FormatNumber(f)));
    }
    InRange(ValueKind::kFrequencyHz, f, m, "frequency");
    ExpectEnd("frequency");
    frequency_line_ = Loc(keyword);
    model_.frequency_hz = f;
    model_.frequency_location = Loc(keyword);
  }

  void Z0(const Token& keyword) {
    if (z0_line_) {
      throw Error(keyword, fmt::format("z0 is already given at {}; give it once", Line(*z0_line_)));
    }
    const Measured m = Expression();
    const double z0 = As(m, ResistanceQuantity(), 1.0, "z0");
    if (z0 <= 0.0) {
      throw Error(m.start, fmt::format("z0 must be positive; got {} ohm", FormatNumber(z0)));
    }
    InRange(ValueKind::kImpedanceOhm, z0, m, "z0");
    if (z0 < kDubiousLowZ0_ohm || z0 > kDubiousHighZ0_ohm) {
      model_.warnings.push_back(Warning{
          Loc(m.start), fmt::format("z0 {} ohm is far from any feed line ({} to {} ohm); the SWR "
                                    "against it says little about a real transmitter",
                                    FormatNumber(z0), FormatNumber(kDubiousLowZ0_ohm),
                                    FormatNumber(kDubiousHighZ0_ohm))});
    }
    ExpectEnd("z0");
    z0_line_ = Loc(keyword);
    model_.z0_ohm = z0;
  }

  std::string file_;
  Model model_;
  Scope scope_;
  std::map<std::string, OverrideEntry> overrides_;
  std::map<std::string, SourceLocation> wire_lines_, feed_lines_, load_lines_;
  // Names of transformers and lines (each kind its own namespace), and what sits at a feed.
  std::map<std::string, SourceLocation> transformer_lines_, line_lines_;
  std::map<std::string, std::pair<std::string, SourceLocation>> feed_transformer_, feed_line_;
  std::map<std::string, size_t> wire_index_;
  std::optional<SourceLocation> ground_line_, frequency_line_, z0_line_;
  std::optional<Token> radius_start_;  // the radius value of the wire being read
  double length_factor_ = 1.0;         // metres per bare length number (the `units` statement)
  LineSource source_;
  std::vector<Token> tokens_;
  size_t pos_ = 0;
  size_t statements_ = 0;
};

// A command-line quantity: one expression of the quantity q (bare numbers in its SI unit).
double ParseArgument(const std::string& text, const std::string& option_name, const Quantity& q,
                     ValueKind kind, const std::string& example) {
  const LineSource source{option_name, 1, 0};
  const std::vector<Token> tokens = LexLine(text, source);
  if (tokens[0].kind == TokenKind::kEnd) {
    throw InputError(SourceLocation{option_name, 0, 0},
                     fmt::format("{} needs a value such as {}", option_name, example));
  }
  Scope no_variables;
  size_t pos = 0;
  const Token& start = tokens[0];
  const Value v = EvaluateExpression(tokens, &pos, no_variables, source);
  if (tokens[pos].kind != TokenKind::kEnd) {
    throw InputError(At(source, tokens[pos].column),
                     fmt::format("unexpected {} after the value", Quote(tokens[pos])));
  }
  const double si = v.si;
  if (!v.dimension.IsNone() && v.dimension != q.dimension) {
    throw InputError(At(source, start.column),
                     fmt::format("{} needs {} ({}); got {}", option_name, q.noun, q.unit_list,
                                 Describe(v.dimension)));
  }
  if (si <= 0.0) {
    throw InputError(
        At(source, start.column),
        fmt::format("{} must be positive; got {} {}", option_name, FormatNumber(si), q.si_unit));
  }
  if (auto message = OutOfRange(kind, si, option_name)) {
    throw InputError(At(source, start.column), *message);
  }
  return si;
}

}  // namespace
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

Override ParseOverride(const std::string& text) {
  const SourceLocation where{"--set", 0, 0};
  const size_t eq = text.find('=');
  if (eq == std::string::npos) {
    throw InputError(where, fmt::format("expected NAME=VALUE (such as --set height=10m); got "
                                        "'{}'",
                                        model::Shorten(text)));
  }
  std::string name = text.substr(0, eq);
  while (!name.empty() && (name.back() == ' ' || name.back() == '\t')) name.pop_back();
  while (!name.empty() && (name.front() == ' ' || name.front() == '\t')) name.erase(0, 1);
  if (!model::IsName(name)) {
    throw InputError(where, fmt::format("'{}' is not a variable name (letters, digits and _, not "
                                        "starting with a digit); write --set NAME=VALUE",
                                        model::Shorten(name)));
  }
  return Override{name, text.substr(eq + 1)};
}

double ParseFrequencyArgument(const std::string& text, const std::string& option_name) {
  return model::ParseArgument(text, option_name, model::FrequencyQuantity(),
                              model::ValueKind::kFrequencyHz, "14.2MHz");
}

double ParseResistanceArgument(const std::string& text, const std::string& option_name) {
  return model::ParseArgument(text, option_name, model::ResistanceQuantity(),
                              model::ValueKind::kImpedanceOhm, "50 or 50ohm");
}

double ParseLengthArgument(const std::string& text, const std::string& option_name) {
  return model::ParseArgument(text, option_name, model::LengthQuantity(),
                              model::ValueKind::kCoilSizeM, "28.5mm");
}

double ParseVariableArgument(const std::string& text, const std::string& option_name,
                             const VariableSpec& variable) {
  const model::LineSource source{option_name, 1, 0};
  const std::vector<model::Token> tokens = model::LexLine(text, source);
  if (tokens[0].kind == model::TokenKind::kEnd) {
    throw InputError(
        SourceLocation{option_name, 0, 0},
        fmt::format("{} needs a value of '{}', {}", option_name, variable.name, variable.quantity));
  }
  model::Scope no_variables;
  size_t pos = 0;
  const model::Token& start = tokens[0];
  const model::Value v = model::EvaluateExpression(tokens, &pos, no_variables, source);
  if (tokens[pos].kind != model::TokenKind::kEnd) {
    throw InputError(model::At(source, tokens[pos].column),
                     fmt::format("unexpected {} after the value", model::Quote(tokens[pos])));
  }
  const model::Dimension wanted{variable.dimension};
  if (!v.dimension.IsNone() && v.dimension != wanted) {
    throw InputError(model::At(source, start.column),
                     fmt::format("{} needs {} like '{}'; got {}", option_name, variable.quantity,
                                 variable.name, model::Describe(v.dimension)));
  }
  return v.si;
}

double ParseInductanceArgument(const std::string& text, const std::string& option_name) {
  return model::ParseArgument(text, option_name, model::InductanceQuantity(),
                              model::ValueKind::kInductanceH, "20uH");
}

double ParseVoltageArgument(const std::string& text, const std::string& option_name) {
  return model::ParseArgument(text, option_name, model::VoltageQuantity(),
                              model::ValueKind::kVoltageV, "500V or 2kV");
}

}  // namespace wirefield
