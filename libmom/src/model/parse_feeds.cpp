// Model stage: what sits on a wire at a point: `feed` (a voltage source) and `load` (series
// or parallel R, L, C, or a coil given by its winding), with the WIRE@POS point they share.
// Inputs: the statement's tokens and the wires above it; outputs: the Model's feeds and loads.
#include <fmt/format.h>

#include <algorithm>
#include <cmath>

#include "core/materials.hpp"
#include "model/parser.hpp"

namespace wirefield::model {
namespace {

// A coil of more turns than a single-layer loading coil has is warned about (common
// practice).
constexpr double kDubiousCoilTurns = 1e4;
// A position within this fraction of the wire length from an end is that end. Far below any
// segment length (the mesher never makes segments shorter than ~1e-4 of a wire) and well
// above the rounding of a length computed as sqrt(dx^2 + dy^2 + dz^2) (a few 1e-16).
constexpr double kEndSnapFraction = 1e-12;
// The clauses of a coil, for messages.
constexpr const char* kCoilUsage =
    "turns=N|inductance=L diameter=D length=L|pitch=P|close-wound wire=d [insulation=T] "
    "[material=NAME]";

}  // namespace

WirePointSpec Parser::WirePoint(const std::string& context) {
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
    throw Error(m.start, fmt::format("{}: position {} m is before the start of wire '{}'; "
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

// `at WIRE@POS`: where a feed or load sits.
WirePointSpec Parser::AtWirePoint(const std::string& context) {
  if (!IsWord("at")) throw Expected(context, "'at WIRE@POS'");
  Next();
  return WirePoint(context);
}

void Parser::Feed(const Token& keyword) {
  const Named named =
      NewName(keyword, "feed", "feed", "a feed name (feed NAME at WIRE@POS)", feed_lines_);
  const std::string& context = named.context;
  FeedSpec feed = Started<FeedSpec>(named);
  feed.at = AtWirePoint(context);
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

void Parser::Load(const Token& keyword) {
  const Named named =
      NewName(keyword, "load", "load",
              "a load name (load NAME at WIRE@POS series|parallel R=.. L=.. C=..)", load_lines_);
  const std::string& context = named.context;
  LoadSpec load = Started<LoadSpec>(named);
  load.at = AtWirePoint(context);
  if (IsWord("coil")) {
    Next();
    load.coil = CoilClauses(context);
    load_lines_[load.name] = load.location;
    model_.loads.push_back(std::move(load));
    return;
  }
  if (IsWord("choke")) {
    Next();
    load.choke = ChokeClauses(context);
    load_lines_[load.name] = load.location;
    model_.loads.push_back(std::move(load));
    return;
  }
  if (IsWord("series")) {
    load.topology = LoadTopology::kSeries;
  } else if (IsWord("parallel")) {
    load.topology = LoadTopology::kParallel;
  } else {
    throw Expected(context, "'series', 'parallel', 'coil' or 'choke'");
  }
  Next();
  while (Peek().kind != TokenKind::kEnd) {
    const Token& element = Peek();
    if (element.kind != TokenKind::kName ||
        (element.text != "R" && element.text != "L" && element.text != "C")) {
      throw Error(element,
                  fmt::format("{}: unknown element {}; use R=, L= or C=", context, Quote(element)));
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
        throw Error(m.start,
                    fmt::format("{}: L must not be negative; got {} H", context, FormatNumber(l)));
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
CoilSpec Parser::CoilClauses(const std::string& context) {
  CoilSpec coil;
  std::map<std::string, Token> given;
  static const std::vector<std::string> kClauses = {
      "turns", "inductance", "diameter", "length", "pitch", "wire", "insulation", "material"};
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
                                      Quote(clause), kCoilUsage));
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
  return CheckCoil(context, coil, given, target_h);
}

// The coil's clauses checked against each other once all are read: one winding, turns or
// inductance, the sizes it needs; then the turns found for an inductance, or the coil checked.
CoilSpec Parser::CheckCoil(const std::string& context, CoilSpec coil,
                           const std::map<std::string, Token>& given,
                           std::optional<double> target_h) {
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
    throw Error(Peek(), fmt::format("{}: the coil needs turns= (or inductance=); write {}", context,
                                    kCoilUsage));
  }
  for (const char* required : {"diameter", "wire"}) {
    if (given.count(required) == 0) {
      throw Error(Peek(),
                  fmt::format("{}: the coil needs {}=; write {}", context, required, kCoilUsage));
    }
  }
  if (windings.empty()) {
    throw Error(Peek(), fmt::format("{}: the coil needs length=L, pitch=P or close-wound; "
                                    "write {}",
                                    context, kCoilUsage));
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

// The clauses of a choke load: its impedance curve as points `(F, R, X), (F, R, X), ...` with
// increasing F, or its winding `turns=N al=A_L [q=Q]` on a ferrite core.
ChokeSpec Parser::ChokeClauses(const std::string& context) {
  const std::string usage =
      "(F, R, X) points of its impedance, such as (7MHz, 1.2kohm, 300ohm), "
      "or turns=N al=A_L [q=Q]";
  ChokeSpec choke;
  if (IsPunct("(")) {
    while (true) {
      const Token& start = Peek();
      const ChokePoint point = ChokeTablePoint(context);
      if (!choke.points.empty() && !(point.frequency_hz > choke.points.back().frequency_hz)) {
        throw Error(start, fmt::format("{}: the choke's points must go up in frequency; "
                                       "{:.6g} MHz follows {:.6g} MHz",
                                       context, point.frequency_hz / 1e6,
                                       choke.points.back().frequency_hz / 1e6));
      }
      choke.points.push_back(point);
      if (!IsPunct(",")) break;
      Next();
    }
    if (Peek().kind != TokenKind::kEnd) {
      throw Error(Peek(), fmt::format("{}: unexpected {} after the choke's points; separate "
                                      "points with commas",
                                      context, Quote(Peek())));
    }
    return choke;
  }
  std::map<std::string, Token> given;
  while (Peek().kind != TokenKind::kEnd) {
    const Token& word = Peek();
    if (word.kind != TokenKind::kName ||
        (word.text != "turns" && word.text != "al" && word.text != "q")) {
      throw Error(word, fmt::format("{}: unexpected {} in the choke; give {}", context, Quote(word),
                                    usage));
    }
    if (given.count(word.text) != 0) {
      throw Error(word, fmt::format("{}: {} is given twice", context, word.text));
    }
    given.emplace(word.text, word);
    Next();
    ExpectPunct("=", context, fmt::format("'=' after {}", word.text));
    const Measured m = Expression();
    const std::string what = fmt::format("{}: choke {}", context, word.text);
    if (word.text == "turns") {
      choke.turns = Plain(m, what, "a number of turns through the core");
      if (!(choke.turns >= 1.0)) {
        throw Error(m.start, fmt::format("{}: the choke needs at least 1 turn; got {}", context,
                                         FormatNumber(choke.turns)));
      }
      InRange(ValueKind::kTransformerTurns, choke.turns, m, what);
    } else if (word.text == "al") {
      if (m.value.dimension == kInductance) {
        choke.al_nh = m.value.si / 1e-9;
      } else if (m.value.dimension.IsNone()) {
        choke.al_nh = m.value.si;
      } else {
        throw Error(m.start, fmt::format("{}: al needs A_L in nH/turn^2 (a plain number, or "
                                         "with nH); got {}",
                                         context, Describe(m.value.dimension)));
      }
      if (!(choke.al_nh > 0.0)) {
        throw Error(m.start, fmt::format("{}: al must be positive; got {} nH/turn^2", context,
                                         FormatNumber(choke.al_nh)));
      }
      InRange(ValueKind::kAlNanohenryPerTurn2, choke.al_nh, m, what);
    } else {
      const double q = Plain(m, what, "the Q of the choke's inductance");
      if (!(q > 0.0)) {
        throw Error(m.start,
                    fmt::format("{}: q must be positive; got {}", context, FormatNumber(q)));
      }
      InRange(ValueKind::kQuality, q, m, what);
      choke.q = q;
    }
  }
  if (given.count("turns") == 0 || given.count("al") == 0) {
    throw Expected(context, fmt::format("the choke's {}", usage));
  }
  return choke;
}

// One `(F, R, X)` point of a choke's impedance: a frequency, a resistance (not negative) and a
// reactance (either sign).
ChokePoint Parser::ChokeTablePoint(const std::string& context) {
  ExpectPunct("(", context, "'(' before a choke point (F, R, X)");
  ChokePoint point;
  const Measured f = Expression();
  point.frequency_hz = As(f, FrequencyQuantity(), 1.0, context + ": choke point frequency");
  if (!(point.frequency_hz > 0.0)) {
    throw Error(f.start, fmt::format("{}: a choke point's frequency must be positive; got {} Hz",
                                     context, FormatNumber(point.frequency_hz)));
  }
  InRange(ValueKind::kFrequencyHz, point.frequency_hz, f, context + ": choke point frequency");
  ExpectPunct(",", context, "',' after the frequency (F, R, X)");
  const Measured r = Expression();
  point.resistance_ohm = As(r, ResistanceQuantity(), 1.0, context + ": choke point R");
  if (point.resistance_ohm < 0.0) {
    throw Error(r.start, fmt::format("{}: a choke point's R must not be negative; got {} ohm",
                                     context, FormatNumber(point.resistance_ohm)));
  }
  InRange(ValueKind::kResistanceOhm, point.resistance_ohm, r, context + ": choke point R");
  ExpectPunct(",", context, "',' after R (F, R, X)");
  const Measured x = Expression();
  point.reactance_ohm = As(x, ResistanceQuantity(), 1.0, context + ": choke point X");
  InRange(ValueKind::kResistanceOhm, std::abs(point.reactance_ohm), x, context + ": choke point X");
  ExpectPunct(")", context, "')' after X (F, R, X)");
  return point;
}

// `close-wound` at Peek(): three tokens written without spaces.
bool Parser::IsCloseWound() const {
  return IsWord("close") && pos_ + 2 < tokens_.size() && tokens_[pos_ + 1].text == "-" &&
         !tokens_[pos_ + 1].space_before && tokens_[pos_ + 2].text == "wound" &&
         !tokens_[pos_ + 2].space_before;
}

void Parser::LoadWarnings(const LoadSpec& load) {
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

}  // namespace wirefield::model
