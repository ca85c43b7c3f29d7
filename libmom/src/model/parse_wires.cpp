// Model stage: the statements that put up the wires: `wire` (straight, from/to, or bent,
// through points) and `shape` (a wire laid out the way it is put up in the field), with the
// clauses they share: radius or diameter, segments, the conductor (material or conductivity
// and permeability) and the insulation. Inputs: the statement's tokens; output: the Model's
// wires.
#include <fmt/format.h>
#include <fmt/ranges.h>

#include <algorithm>
#include <cmath>
#include <numbers>

#include "core/materials.hpp"
#include "model/parser.hpp"
#include "model/shapes.hpp"
#include "model/thin_wire.hpp"
#include "model/wire_path.hpp"

namespace wirefield::model {
namespace {

// Most wires a model may define: each takes at least 3 segments, so 10 000 wires already
// ask for 30 000 unknowns, a 13 GiB matrix. More is a generated file gone wrong.
constexpr size_t kMaxWires = 10000;
// Most segments one wire may ask for: 16 * N^2 bytes of complex matrix is then 149 GiB.
constexpr double kMaxSegmentsPerWire = 100000.0;
// Bytes per matrix entry (a complex double), for the memory estimate in messages.
constexpr double kBytesPerMatrixEntry = 16.0;
// The parts of an insulation clause that follow the word `insulation`, each written PART=VALUE.
constexpr const char* kInsulationParts[] = {"thickness", "outer_diameter", "permittivity",
                                            "loss_tangent"};
// An outer radius above this many conductor radii makes the thin-coating approximation rough
// (docs/numerics.md, "Insulated wire": its error grows with ln(b/a)).
constexpr double kMaxThinCoatingRatio = 10.0;

}  // namespace

Point Parser::ParsePoint(const std::string& context, const std::string& which) {
  Point p{};
  Coordinates(context, which, p.size(), p.data());
  return p;
}

// "(X, Y, Z)" (count 3) or "(X, Y)" (count 2): lengths in the `units` length.
void Parser::Coordinates(const std::string& context, const std::string& which, size_t count,
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
        throw Error(Peek(), fmt::format("{}: the {} point needs {} coordinates {}; got {}", context,
                                        which, count, form, i + 1));
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

// A corner of a wire: "(X, Y, Z)", or WIRE@POS on a wire defined above (its point on that
// wire's path, recorded in taps as the corner-th corner, for the mesher to join there).
Point Parser::Corner(const std::string& context, const std::string& which, size_t corner,
                     std::vector<WireTap>* taps) {
  const bool wire_point = Peek().kind == TokenKind::kName && pos_ + 1 < tokens_.size() &&
                          tokens_[pos_ + 1].kind == TokenKind::kPunct &&
                          tokens_[pos_ + 1].text == "@";
  if (!wire_point) return ParsePoint(context, which);
  const WirePointSpec on = WirePoint(context);
  const WireSpec& host = model_.wires[wire_index_.at(on.wire)];
  taps->push_back({corner, on});
  return PointAlong(host, PositionAlong(on, WireLength(host)));
}

// `through (X, Y, Z), (X, Y, Z), ...`: the corners of a bent wire, at least two, checked.
// With taps, a corner may also be WIRE@POS (Corner).
std::vector<Point> Parser::ThroughPoints(const std::string& context,
                                         std::vector<SourceLocation>* written_at,
                                         std::vector<WireTap>* taps) {
  std::vector<Point> points;
  std::vector<SourceLocation> locations;
  while (true) {
    locations.push_back(Loc(Peek()));
    const std::string which = Ordinal(points.size() + 1);
    points.push_back(taps != nullptr ? Corner(context, which, points.size(), taps)
                                     : ParsePoint(context, which));
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

void Parser::Wire(const Token& keyword) {
  const Named named =
      NewName(keyword, "wire", "wire",
              "a wire name (wire NAME from (X, Y, Z) to (X, Y, Z) radius R)", wire_lines_);
  const Token& name_token = named.token;
  const std::string& context = named.context;
  WireSpec wire = Started<WireSpec>(named);
  if (IsWord("through")) {
    Next();
    SetWirePath(ThroughPoints(context, &wire.point_locations, &wire.taps), &wire);
    const double length_m = WireLength(wire);
    WireClauses(context, length_m, &wire);
    return AddWire(std::move(wire));
  }
  if (!IsWord("from")) throw Expected(context, "'from (X, Y, Z)' or 'through (X, Y, Z), ...'");
  Next();
  wire.point_locations.push_back(Loc(Peek()));
  wire.from_m = Corner(context, "from", 0, &wire.taps);
  if (!IsWord("to")) throw Expected(context, "'to (X, Y, Z)'");
  Next();
  wire.point_locations.push_back(Loc(Peek()));
  wire.to_m = Corner(context, "to", 1, &wire.taps);
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
// checked against it after them); else the caller calls CheckRadius afterwards. extra_clause
// (when given) reads one clause of its own and returns true, or returns false when the
// clause is not one of its own; clause_help ends the message for an unknown clause.
void Parser::WireClauses(const std::string& context, std::optional<double> known_length_m,
                         WireSpec* wire, const std::function<bool()>& extra_clause,
                         const std::string& clause_help) {
  radius_start_.reset();
  SizeClauses size;
  bool have_segments = false;
  ConductorClauses conductor;
  InsulationClauses insulation;
  while (Peek().kind != TokenKind::kEnd) {
    const Token& clause = Peek();
    if (SizeClause(context, &size, wire)) {
      // radius, diameter, size, strand or strands
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
    } else if (IsInsulationWord()) {
      Insulation(context, &insulation);
    } else if (!extra_clause || !extra_clause()) {
      if (IsDecimalComma()) throw DecimalCommaError();
      throw Error(clause,
                  fmt::format("{}: unexpected {}; {}", context, Quote(clause), clause_help));
    }
  }
  if (!size.clause) throw Expected(context, "'radius R' (or 'diameter D')");
  StrandedSize(context, size, known_length_m, wire);
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
  if (insulation.word) ApplyInsulation(context, insulation, wire);
}

// One clause of the size of a wire's conductor: `radius R`, `diameter D`, `size A` (the
// cross-section of its metal, as wire is sold: 1.5mm2), `strand=d` (the diameter of one strand
// of a stranded wire) or `strands=N`; false when the next clause is none of them. The radius
// of a solid wire is set at once; that of a stranded one by StrandedSize, once every clause is
// read, which then checks the radius against the wire's length.
bool Parser::SizeClause(const std::string& context, SizeClauses* size, WireSpec* wire) {
  if (IsWord("strands")) {
    Strands(context, size);
    return true;
  }
  if (!IsWord("radius") && !IsWord("diameter") && !IsWord("size") && !IsWord("strand")) {
    return false;
  }
  const Token clause = Peek();
  const std::string& word = clause.text;
  if (size->clause) {
    const std::string& before = size->clause->text;
    auto is_radius = [](const std::string& w) { return w == "radius" || w == "diameter"; };
    throw Error(clause, before == word ? fmt::format("{}: {} is given twice", context, word)
                        : is_radius(before) && is_radius(word)
                            ? fmt::format("{}: give either 'radius R' or 'diameter D' "
                                          "(twice the radius), not both",
                                          context)
                            : fmt::format("{}: give one of 'radius R', 'diameter D', 'size A' "
                                          "or 'strand=d', not two: {} gives the size already",
                                          context, before));
  }
  Next();
  if (word == "strand") ExpectPunct("=", context, "'=' after strand (strand=0.3mm)");
  const size_t value_pos = pos_;
  const Measured m = Expression();
  double r = 0.0;
  if (word == "size") {
    if (m.value.dimension.IsNone()) {
      throw Error(m.start,
                  fmt::format("{}: size is the cross-section of the metal and takes an "
                              "area unit ({}): write size {}mm2",
                              context, AreaQuantity().unit_list, FormatNumber(m.value.si)));
    }
    const double area_m2 = As(m, AreaQuantity(), 1.0, context + ": size");
    if (area_m2 <= 0.0) {
      throw Error(m.start, fmt::format("{}: the size must be positive; got {} m^2", context,
                                       FormatNumber(area_m2)));
    }
    size->value = area_m2;
    wire->cross_section_m2 = area_m2;
    r = std::sqrt(area_m2 / std::numbers::pi);  // a solid round conductor: A = pi r^2
  } else {
    const double length_m = As(m, LengthQuantity(), length_factor_, context + ": " + word);
    if (length_m <= 0.0) {
      throw Error(m.start, fmt::format("{}: the {} must be positive; got {} m", context, word,
                                       FormatNumber(length_m)));
    }
    size->value = length_m;
    r = word == "radius" ? length_m : length_m / 2.0;
  }
  InRange(ValueKind::kRadiusM, r, m, fmt::format("{}: the radius", context));
  size->clause = clause;
  radius_start_ = m.start;
  wire->radius_m = r;
  wire->radius_location = Loc(m.start);
  wire->radius_clause = word;
  wire->radius_written_number =
      word == "radius" || word == "diameter" ? WrittenNumber(value_pos) : std::nullopt;
  return true;
}

// strands=N: a stranded conductor of N round strands in concentric lay.
void Parser::Strands(const std::string& context, SizeClauses* size) {
  const Token clause = Next();
  if (size->strands_token) {
    throw Error(clause, fmt::format("{}: strands is given twice", context));
  }
  ExpectPunct("=", context, "'=' after strands (strands=7)");
  const Measured m = Expression();
  const double n = Plain(m, context + ": strands", "a count of strands");
  if (!(n >= 1.0 && n <= StrandCount(kMaxStrandLayers)) || n != std::floor(n) ||
      StrandLayers(static_cast<int>(n)) < 0) {
    throw Error(m.start, fmt::format("{}: strands={} is not a count of strands in concentric "
                                     "lay; use 1 (solid), 7, 19, 37, 61, 91 or 127 (a centre "
                                     "strand and L layers of 6, 12, 18, ... round it: 1 + "
                                     "3 L (L + 1), up to {})",
                                     context, FormatNumber(n), StrandCount(kMaxStrandLayers)));
  }
  size->strands = static_cast<int>(n);
  size->strands_token = clause;
}

// The size once every clause is read: the radii of a stranded wire (model/thin_wire.hpp;
// strand=d gives the strands' diameter, size A shares A among them, radius and diameter give
// the outer size of the bundle), then the radius checked against known_length_m when given.
void Parser::StrandedSize(const std::string& context, const SizeClauses& size,
                          std::optional<double> known_length_m, WireSpec* wire) {
  const std::string& word = size.clause->text;
  if (word == "strand" && !size.strands_token) {
    throw Error(*size.clause, fmt::format("{}: strand=d is the diameter of one strand of a "
                                          "stranded wire; give strands=N beside it, or "
                                          "'diameter D' for a solid wire",
                                          context));
  }
  if (size.strands == 1) {
    if (known_length_m) CheckRadius(context, *wire, *known_length_m);
    return;
  }
  const int layers = StrandLayers(size.strands);
  const double across = 2.0 * layers + 1.0;  // strand diameters across the bundle
  const double d = word == "size" ? std::sqrt(4.0 * size.value / (std::numbers::pi * size.strands))
                   : word == "strand"   ? size.value
                   : word == "diameter" ? size.value / across
                                        : 2.0 * size.value / across;
  wire->strands = size.strands;
  wire->loss_radius_m = across * d / 2.0;
  if (!wire->cross_section_m2)
    wire->cross_section_m2 = size.strands * std::numbers::pi * d * d / 4.0;
  wire->radius_m = StrandedEquivalentRadius(size.strands, d);
  wire->radius_written_number.reset();
  if (known_length_m) CheckRadius(context, *wire, *known_length_m);
}

// The number of the expression that starts at tokens_[from] and ends at pos_ when it is
// one number with or without a length unit ("1", "2 mm"), else nothing.
std::optional<double> Parser::WrittenNumber(size_t from) const {
  if (tokens_[from].kind != TokenKind::kNumber) return std::nullopt;
  if (pos_ == from + 1) return tokens_[from].number;
  if (pos_ == from + 2 && IsLengthUnitName(tokens_[from + 1].text)) return tokens_[from].number;
  return std::nullopt;
}

// The thin-wire model needs the radius (read last by WireClauses) well below the length
// (model/thin_wire.hpp; the bound against the wavelength is the mesh stage's).
void Parser::CheckRadius(const std::string& context, const WireSpec& wire, double length_m) const {
  const double r = wire.radius_m;
  const double max_r = kMaxRadiusOfLength * length_m;
  if (radius_start_ && r > max_r) {
    throw Error(
        *radius_start_,
        fmt::format("{}: the radius {} m is not small against the wire length {} m; "
                    "the thin-wire model needs the radius under a tenth of the "
                    "length{}",
                    context, FormatNumber(r), FormatNumber(length_m), RadiusUnitHint(wire, max_r)));
  }
}

void Parser::AddWire(WireSpec wire) {
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
void Parser::Shape(const Token& keyword) {
  const Named named =
      NewName(keyword, "shape", "wire", "a wire name (shape NAME sloper top=H length=L radius R)",
              wire_lines_);
  WireSpec wire = Started<WireSpec>(named);
  ShapeRequest request;
  request.context = named.context;
  const std::string& context = request.context;
  const std::vector<std::string>& kinds = ShapeKindNames();
  const std::string kind_list = "sloper, inverted-l, inverted-v or horizontal";
  const Token kind_token = Peek();
  if (kind_token.kind != TokenKind::kName) throw Expected(context, "the kind (" + kind_list + ")");
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
      "[permeability=MU_R]', and 'insulation PLASTIC thickness=T'");
  if (!top) throw Expected(context, "'top=H' (the height of the support's top)");
  if (!length) throw Expected(context, "'length=L' (the length of the wire)");
  request.top_m = *top;
  request.length_m = *length;
  SetWirePath(ShapeCorners(request), &wire);
  CheckRadius(context, wire, WireLength(wire));
  AddWire(std::move(wire));
}

// Reads one of `material NAME`, `conductivity=SIGMA`, `permeability=MU_R`.
void Parser::Conductor(const std::string& context, ConductorClauses* c) {
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
std::string Parser::MaterialList() {
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

// True at `insulation` or at one of its parts (thickness=, outer_diameter=, ...).
bool Parser::IsInsulationWord() const {
  if (IsWord("insulation")) return true;
  return std::any_of(std::begin(kInsulationParts), std::end(kInsulationParts),
                     [this](const char* part) { return IsWord(part); });
}

// Reads `insulation [PLASTIC]` or one of its parts, PART=VALUE. A part given before the word
// `insulation` is an error: it belongs to that clause.
void Parser::Insulation(const std::string& context, InsulationClauses* c) {
  const Token word = Peek();
  if (word.text != "insulation") {
    if (!c->word) {
      throw Error(word, fmt::format("{}: {}= is part of the insulation clause; write "
                                    "'insulation PLASTIC {}=...' (or 'insulation "
                                    "permittivity=EPS_R ...')",
                                    context, word.text, word.text));
    }
    return InsulationPart(context, c);
  }
  if (c->word) throw Error(word, fmt::format("{}: insulation is given twice", context));
  Next();
  c->word = word;
  // A plastic's name follows, unless the next word starts another clause.
  const Token& name = Peek();
  const bool next_is_clause =
      IsInsulationWord() || IsWord("radius") || IsWord("diameter") || IsWord("segments") ||
      IsWord("material") || IsWord("at") ||
      (pos_ + 1 < tokens_.size() && tokens_[pos_ + 1].kind == TokenKind::kPunct &&
       tokens_[pos_ + 1].text == "=");
  if (name.kind != TokenKind::kName || next_is_clause) return;
  const std::vector<std::string> plastics = core::DielectricNames();
  const std::string list = fmt::format("{}", fmt::join(plastics, ", "));
  if (core::FindDielectric(name.text) == nullptr) {
    throw Error(
        name, fmt::format("{}: unknown insulation '{}'{}; the plastics are {}, or give "
                          "your own with permittivity=EPS_R [loss_tangent=TAN_D]",
                          context, Shorten(name.text), DidYouMeanAside(name.text, plastics), list));
  }
  c->preset = name;
  Next();
}

// Reads one part of the insulation clause, PART=VALUE, checked on its own.
void Parser::InsulationPart(const std::string& context, InsulationClauses* c) {
  const Token part = Next();
  const std::string& word = part.text;
  ExpectPunct("=", context, fmt::format("'=' after {}", word));
  const Measured m = Expression();
  const std::string what = fmt::format("{}: insulation {}", context, word);
  auto twice = [&] { return Error(part, fmt::format("{} is given twice", what)); };
  auto not_finite = [&](double v) {
    if (!std::isfinite(v)) throw Error(m.start, fmt::format("{} is not a finite number", what));
  };
  if (word == "thickness" || word == "outer_diameter") {
    const bool is_thickness = word == "thickness";
    std::optional<Measured>& slot = is_thickness ? c->thickness : c->outer_diameter;
    if (slot) throw twice();
    if (c->thickness || c->outer_diameter) {
      throw Error(part, fmt::format("{}: give the insulation either thickness=T (radial) or "
                                    "outer_diameter=D, not both",
                                    context));
    }
    const double size_m = As(m, LengthQuantity(), length_factor_, what);
    not_finite(size_m);
    if (!(size_m > 0.0)) {
      throw Error(m.start, fmt::format("{} must be positive; got {} m (leave out insulation "
                                       "for a bare wire)",
                                       what, FormatNumber(size_m)));
    }
    (is_thickness ? c->thickness_m : c->outer_diameter_m) = size_m;
    slot = m;
    return;
  }
  if (c->preset && (word == "permittivity" || word == "loss_tangent")) {
    throw Error(part, fmt::format("{}: insulation {} sets its own {}; leave out '{}' to give "
                                  "permittivity= and loss_tangent= by hand",
                                  context, c->preset->text, word, c->preset->text));
  }
  // A plain number of at least `least`; below it an error saying what the part needs.
  auto plain_value = [&](std::optional<Measured>* slot, const char* meaning, double least,
                         const char* need) {
    if (*slot) throw twice();
    const double v = Plain(m, what, meaning);
    not_finite(v);
    if (v < least) {
      throw Error(m.start, fmt::format("{} {}; got {}", what, need, FormatNumber(v)));
    }
    *slot = m;
    return v;
  };
  if (word == "permittivity") {
    c->relative_permittivity =
        plain_value(&c->permittivity, "relative to vacuum", 1.0,
                    "must be at least 1 (relative to vacuum; plastics are about 2 to 5)");
    InRange(ValueKind::kPermittivity, c->relative_permittivity, m, what);
    return;
  }
  c->loss_tangent_value =
      plain_value(&c->loss_tangent, "tan delta; 0 for a lossless plastic", 0.0,
                  "must not be negative (0 for a lossless plastic, about 0.0003 for polyethylene)");
}

// Completes the insulation against the wire's radius: its size and its plastic, checked.
void Parser::ApplyInsulation(const std::string& context, const InsulationClauses& c,
                             WireSpec* wire) {
  if (!c.thickness && !c.outer_diameter) {
    throw Error(*c.word, fmt::format("{}: insulation needs the jacket's size: thickness=T "
                                     "(radial) or outer_diameter=D",
                                     context));
  }
  if (!c.preset && !c.permittivity) {
    throw Error(*c.word, fmt::format("{}: insulation needs its plastic ({}) or "
                                     "permittivity=EPS_R [loss_tangent=TAN_D]",
                                     context, fmt::join(core::DielectricNames(), ", ")));
  }
  InsulationSpec spec;
  spec.location = Loc(*c.word);
  if (c.preset) {
    const core::Dielectric* plastic = core::FindDielectric(c.preset->text);
    spec.preset = plastic->name;
    spec.relative_permittivity = plastic->relative_permittivity;
    spec.loss_tangent = plastic->loss_tangent;
  } else {
    spec.relative_permittivity = c.relative_permittivity;
    spec.loss_tangent = c.loss_tangent_value;
  }
  const double a_m = wire->radius_m;
  if (c.outer_diameter) {
    if (!(c.outer_diameter_m > 2.0 * a_m)) {
      throw Error(c.outer_diameter->start,
                  fmt::format("{}: insulation outer_diameter {} m is not more than the wire's "
                              "diameter {} m; give the jacket's outside diameter, or its "
                              "thickness=T",
                              context, FormatNumber(c.outer_diameter_m), FormatNumber(2.0 * a_m)));
    }
    spec.thickness_m = c.outer_diameter_m / 2.0 - a_m;
  } else {
    spec.thickness_m = c.thickness_m;
  }
  const double ratio = (a_m + spec.thickness_m) / a_m;
  if (ratio > kMaxThinCoatingRatio) {
    model_.warnings.push_back(Warning{
        spec.location,
        fmt::format("{}: the insulation's outer radius is {:.3g} times the conductor's (more "
                    "than {:g}): the thin-coating approximation is rough for so thick a jacket; "
                    "check the thickness (a bare number is in the `units` length)",
                    context, ratio, kMaxThinCoatingRatio)});
  }
  wire->insulation = spec;
}

}  // namespace wirefield::model
