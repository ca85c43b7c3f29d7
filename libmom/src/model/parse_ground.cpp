// Model stage: the `ground` statement: free space, a perfect ground, or a real ground given by
// a preset or by its permittivity and conductivity, with the method that models it. Inputs:
// the statement's tokens; output: the Model's ground.
#include <fmt/format.h>

#include <cmath>

#include "model/parser.hpp"

namespace wirefield::model {

std::string Parser::PresetList() {
  std::string list;
  for (const GroundPreset& p : GroundPresets()) list += (list.empty() ? "" : ", ") + p.name;
  return list;
}

void Parser::Ground(const Token& keyword) {
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
    RealGround(&ground);
  } else {
    ExpectEnd("ground " + kind.text);
  }
  ground_line_ = ground.location;
  model_.ground = ground;
}

// The settings of a real ground, in any order: preset=NAME, or permittivity= and
// conductivity=, and the optional method= and exact_below=.
void Parser::RealGround(GroundSpec* ground) {
  std::optional<double> permittivity, conductivity;
  std::optional<Token> preset_token, method_token;
  const GroundPreset* preset = nullptr;
  while (Peek().kind != TokenKind::kEnd) {
    const Token& setting = Peek();
    const bool is_eps = IsWord("permittivity");
    if (IsWord("preset")) {
      if (preset_token) throw Error(setting, "ground real: preset is given twice");
      preset_token = setting;
      preset = PresetSetting();
      continue;
    }
    if (IsWord("method")) {
      if (method_token) throw Error(setting, "ground real: method is given twice");
      method_token = setting;
      ground->method = MethodSetting();
      continue;
    }
    if (IsWord("exact_below")) {
      if (ground->exact_below_m) throw Error(setting, "ground real: exact_below is given twice");
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
      ground->exact_below_m = h;
      continue;
    }
    if (!is_eps && !IsWord("conductivity")) {
      throw Error(
          setting,
          fmt::format("ground real: unknown setting {}{}; use preset=NAME, or "
                      "permittivity= and conductivity=, and optionally "
                      "method=exact|reflection and exact_below=HEIGHT",
                      Quote(setting),
                      setting.kind == TokenKind::kName
                          ? DidYouMeanAside(setting.text, {"preset", "permittivity", "conductivity",
                                                           "method", "exact_below"})
                          : ""));
    }
    Next();
    ExpectPunct("=", "ground real", fmt::format("'=' after {}", setting.text));
    const Measured m = Expression();
    // permittivity (relative, at least 1) or conductivity (S/m, 0 or more)
    const std::string what = "ground real: " + setting.text;
    std::optional<double>& slot = is_eps ? permittivity : conductivity;
    if (slot) throw Error(setting, what + " is given twice");
    const double v =
        Plain(m, what, is_eps ? "relative to vacuum; 13 for average ground" : "in S/m");
    if (v < (is_eps ? 1.0 : 0.0)) {
      throw Error(m.start, is_eps ? fmt::format("{} must be at least 1 (relative to vacuum); "
                                                "got {}",
                                                what, FormatNumber(v))
                                  : fmt::format("{} must not be negative; got {} S/m", what,
                                                FormatNumber(v)));
    }
    InRange(is_eps ? ValueKind::kPermittivity : ValueKind::kConductivitySPerM, v, m, what);
    slot = v;
  }
  if (preset) {
    if (permittivity || conductivity) {
      throw Error(*preset_token,
                  "ground real: give either preset=NAME or permittivity= and "
                  "conductivity=, not both");
    }
    permittivity = preset->permittivity;
    conductivity = preset->conductivity_s_per_m;
    ground->preset = preset->name;
  }
  if (!permittivity) {
    throw Expected("ground real", "'permittivity=EPS_R' (or preset=NAME: " + PresetList() + ")");
  }
  if (!conductivity) throw Expected("ground real", "'conductivity=SIGMA' (S/m)");
  ground->permittivity = *permittivity;
  ground->conductivity_s_per_m = *conductivity;
  if (*permittivity == 1.0 && *conductivity == 0.0) {
    model_.warnings.push_back(Warning{ground->location,
                                      "ground real with permittivity 1 and conductivity 0 "
                                      "is empty space below z = 0; did you mean "
                                      "'ground free'?"});
  }
}

// `preset=NAME` after the word preset: the table entry it names.
const GroundPreset* Parser::PresetSetting() {
  Next();
  ExpectPunct("=", "ground real", "'=' after preset");
  const Token& name = Peek();
  if (name.kind != TokenKind::kName) {
    throw Expected("ground real: preset", "a preset name (" + PresetList() + ")");
  }
  const GroundPreset* preset = FindGroundPreset(name.text);
  if (!preset) {
    std::vector<std::string> names;
    for (const GroundPreset& p : GroundPresets()) names.push_back(p.name);
    throw Error(name,
                fmt::format("ground real: unknown preset '{}'{}; the presets are {}",
                            Shorten(name.text), DidYouMeanAside(name.text, names), PresetList()));
  }
  Next();
  return preset;
}

// `method=exact|reflection` after the word method.
GroundMethod Parser::MethodSetting() {
  Next();
  ExpectPunct("=", "ground real", "'=' after method");
  const Token& name = Peek();
  GroundMethod method = GroundMethod::kExact;
  if (name.kind == TokenKind::kName && name.text == "exact") {
    method = GroundMethod::kExact;
  } else if (name.kind == TokenKind::kName && name.text == "reflection") {
    method = GroundMethod::kReflection;
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
  return method;
}

}  // namespace wirefield::model
