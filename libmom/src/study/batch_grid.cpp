// Study layer: the grid of a batch (`wirefield batch`): its grounds found by name and its
// varied values read as constants of the model language, the whole grid checked before any work,
// and the grid's rows numbered (ground slowest, then each variable in the order given). The rows
// are run in batch_run.cpp and summarised in batch_summary.cpp.
#include "study/batch_grid.hpp"

#include <fmt/format.h>
#include <fmt/ranges.h>

#include <algorithm>
#include <cmath>
#include <set>

#include "model/expression.hpp"
#include "model/lexer.hpp"
#include "model/units.hpp"
#include "wirefield/batch.hpp"

namespace wirefield {
namespace {

// The unit a value of `dimension` is written in: the SI unit (exact, for the override) and
// the unit shown (MHz, uH, pF read better than Hz, H, F).
struct ValueUnit {
  std::string si_unit;
  std::string shown_unit;
  double shown_factor = 1.0;  // SI per shown unit
};

std::optional<ValueUnit> UnitOf(const model::Dimension& dimension) {
  if (dimension.IsNone()) return ValueUnit{"", "", 1.0};
  if (dimension == model::kFrequency) return ValueUnit{"Hz", "MHz", 1e6};
  if (dimension == model::kInductance) return ValueUnit{"H", "uH", 1e-6};
  if (dimension == model::kCapacitance) return ValueUnit{"F", "pF", 1e-12};
  for (const model::Quantity* q :
       {&model::LengthQuantity(), &model::ResistanceQuantity(), &model::VoltageQuantity()}) {
    if (dimension == q->dimension)
      return ValueUnit{std::string(q->si_unit), std::string(q->si_unit), 1.0};
  }
  return std::nullopt;
}

// A constant of the model language ("19.5m", "7.1MHz", "-2.5"), evaluated without variables.
model::Value Constant(const std::string& text, const std::string& where) {
  const model::LineSource source{where, 1, 0};
  const std::vector<model::Token> tokens = model::LexLine(text, source);
  if (tokens.front().kind == model::TokenKind::kEnd) {
    throw InputError(model::At(source, 1), "a value is empty; give a number with its unit");
  }
  model::Scope no_variables;
  size_t pos = 0;
  const model::Value value = model::EvaluateExpression(tokens, &pos, no_variables, source);
  if (tokens[pos].kind != model::TokenKind::kEnd) {
    throw InputError(model::At(source, tokens[pos].column),
                     fmt::format("unexpected {} after the value", model::Quote(tokens[pos])));
  }
  return value;
}

BatchValue MakeValue(double si, const ValueUnit& unit) {
  if (si == 0.0) si = 0.0;  // no -0
  BatchValue value;
  value.si = si;
  // fmt's shortest form reads back to the same double, so the override is exact.
  value.expression = fmt::format("{}{}", si, unit.si_unit);
  value.shown = fmt::format("{:.6g}", si / unit.shown_factor);
  value.label = value.shown + unit.shown_unit;
  return value;
}

const char* KindName(GroundKind kind) {
  switch (kind) {
    case GroundKind::kFree:
      return "free";
    case GroundKind::kPerfect:
      return "perfect";
    case GroundKind::kReal:
      return "real";
  }
  return "real";
}

std::string ListNames(const std::vector<std::string>& names) {
  std::string out;
  for (const std::string& n : names) out += (out.empty() ? "" : ", ") + n;
  return out;
}

}  // namespace

namespace study {

// The name a model's own ground is shown under: its preset, or its kind.
std::string OwnGroundName(const GroundSpec& ground) {
  if (!ground.preset.empty()) return ground.preset;
  return KindName(ground.kind);
}

// The grid's size as a product: "1 ground x 101 values of total x 20 values of height".
std::string GridFactors(const BatchOptions& options) {
  std::string factors = fmt::format("{} ground{}", std::max<size_t>(1, options.grounds.size()),
                                    options.grounds.size() > 1 ? "s" : "");
  for (const BatchVariable& v : options.variables) {
    factors +=
        fmt::format(" x {} value{} of {}", v.values.size(), v.values.size() > 1 ? "s" : "", v.name);
  }
  return factors;
}

// Every check that needs no row: InputError before any work.
void CheckBatchOptions(const BatchOptions& options, const Model& base) {
  if (options.spans.empty()) {
    throw InputError({"spans", 0, 0},
                     "spans is empty: give the frequencies to sweep (a band or a range)");
  }
  std::set<std::string> varied;
  for (const BatchVariable& variable : options.variables) {
    if (!varied.insert(variable.name).second) {
      throw InputError({"variables " + variable.name, 0, 0},
                       "this variable is varied twice; give one `variables` entry per "
                       "variable");
    }
    for (const Override& fixed : options.fixed_overrides) {
      if (fixed.name == variable.name) {
        throw InputError({"variables " + variable.name, 0, 0},
                         "this variable is also given to `fixed_overrides`; drop one of them");
      }
    }
    if (std::find(base.variables.begin(), base.variables.end(), variable.name) ==
        base.variables.end()) {
      throw InputError(
          {"variables " + variable.name, 0, 0},
          base.variables.empty()
              ? fmt::format("the model has no variable '{}' (it defines no variables; add "
                            "`let {} = ...` to vary it)",
                            variable.name, variable.name)
              : fmt::format("the model has no variable '{}' (its variables: {})", variable.name,
                            ListNames(base.variables)));
    }
    if (variable.values.empty()) {
      throw InputError({"variables " + variable.name, 0, 0}, "the variable has no values");
    }
  }
  const double rows = BatchRowCount(options);
  if (rows > kMaxBatchRows && !options.allow_large) {
    const std::string factors = GridFactors(options);
    throw InputError({"batch", 0, 0},
                     fmt::format("the grid has {:.0f} rows ({}), more than {}; each row is a "
                                 "sweep and a pattern. Use fewer grounds or coarser `variables` "
                                 "steps, or pass `allow_large` to run it anyway",
                                 rows, factors, kMaxBatchRows));
  }
  bool any_ground = options.grounds.empty() && base.ground.kind != GroundKind::kFree;
  for (const BatchGround& g : options.grounds) {
    const GroundKind kind = g.spec ? g.spec->kind : base.ground.kind;
    any_ground = any_ground || kind != GroundKind::kFree;
  }
  options.Validate(any_ground);
}

}  // namespace study

void BatchOptions::Validate(bool over_ground) const {
  if (!(pattern_step_deg > 0.0 && pattern_step_deg <= 10.0)) {
    throw InputError({"pattern_step_deg", 1, 1},
                     fmt::format("the pattern step must be greater than 0 and at most 10 "
                                 "degrees; got {:.6g}",
                                 pattern_step_deg));
  }
  const double lowest_deg = over_ground ? 0.0 : -90.0;
  if (!(elevation_deg >= lowest_deg && elevation_deg <= 90.0)) {
    throw InputError({"elevation_deg", 1, 1},
                     over_ground ? fmt::format("elevation_deg must lie between 0 and 90 degrees "
                                               "over a ground (there is no far field below it); "
                                               "got {:.6g}",
                                               elevation_deg)
                                 : fmt::format("elevation_deg must lie between -90 and 90 "
                                               "degrees; got {:.6g}",
                                               elevation_deg));
  }
  for (double f_hz : at_hz) {
    if (!(f_hz > 0.0) || !std::isfinite(f_hz)) {
      throw InputError({"at_hz", 1, 1},
                       fmt::format("at_hz needs a positive frequency; got {} Hz", f_hz));
    }
  }
}

std::vector<std::string> BatchGroundNames() {
  std::vector<std::string> names;
  for (const GroundPreset& preset : GroundPresets()) names.push_back(preset.name);
  names.push_back("free");
  names.push_back("perfect");
  return names;
}

std::optional<BatchGround> BatchGroundNamed(const std::string& name, const std::string& origin) {
  BatchGround ground{name, std::nullopt};
  if (name == "free") {
    ground.spec = GroundSpec{};
    ground.spec->kind = GroundKind::kFree;
  } else if (name == "perfect") {
    ground.spec = GroundSpec{};
    ground.spec->kind = GroundKind::kPerfect;
  } else if (const GroundPreset* preset = FindGroundPreset(name)) {
    ground.spec = RealGround(*preset);
  } else {
    return std::nullopt;
  }
  ground.spec->location = SourceLocation{origin, 1, 1};
  return ground;
}

namespace {

std::string Where(const std::string& name, const std::string& origin) {
  return origin.empty() ? "variables " + name : origin;
}

// The variable of `values` (all of one quantity, at most kMaxVaryValues), its labels in the
// unit it reads best in.
BatchVariable MakeVariable(const std::string& name, const std::vector<model::Value>& values,
                           const std::string& origin) {
  const std::string where = Where(name, origin);
  if (values.size() > static_cast<size_t>(kMaxVaryValues)) {
    throw InputError({where, 1, 1}, fmt::format("at most {} values", kMaxVaryValues));
  }
  const std::optional<ValueUnit> unit = UnitOf(values.front().dimension);
  if (!unit) {
    throw InputError(
        {where, 1, 1},
        fmt::format("the values are {}; give a plain number or one with a unit "
                    "of the model language ({})",
                    model::Describe(values.front().dimension), model::KnownUnitsSummary()));
  }
  BatchVariable variable;
  variable.name = name;
  variable.origin = origin;
  variable.unit = unit->si_unit;
  variable.shown_unit = unit->shown_unit;
  for (const model::Value& v : values) variable.values.push_back(MakeValue(v.si, *unit));
  return variable;
}

}  // namespace

BatchVariable BatchVariableFromValues(const std::string& name,
                                      const std::vector<std::string>& texts,
                                      const std::string& origin) {
  const std::string where = Where(name, origin);
  if (texts.empty()) throw InputError({where, 1, 1}, "the variable has no values");
  std::vector<model::Value> values;
  for (const std::string& part : texts) {
    values.push_back(Constant(part, where));
    if (!(values.back().dimension == values.front().dimension)) {
      throw InputError({where, 1, 1},
                       fmt::format("every value must be of one quantity; '{}' is {}, the "
                                   "first is {}",
                                   model::Shorten(part), model::Describe(values.back().dimension),
                                   model::Describe(values.front().dimension)));
    }
    if (values.size() > static_cast<size_t>(kMaxVaryValues)) break;
  }
  return MakeVariable(name, values, origin);
}

BatchVariable BatchVariableFromRange(const std::string& name, const std::string& first,
                                     const std::string& last, const std::string& step_text,
                                     const std::string& origin) {
  const std::string where = Where(name, origin);
  const model::Value from = Constant(first, where);
  const model::Value to = Constant(last, where);
  const model::Value step = Constant(step_text, where);
  if (!(to.dimension == from.dimension) || !(step.dimension == from.dimension)) {
    throw InputError({where, 1, 1},
                     fmt::format("A, B and STEP must be of one quantity; got {}, {} and {}",
                                 model::Describe(from.dimension), model::Describe(to.dimension),
                                 model::Describe(step.dimension)));
  }
  if (!(step.si > 0.0)) {
    throw InputError({where, 1, 1},
                     fmt::format("the step must be positive; got {}", model::Shorten(step_text)));
  }
  if (!(to.si >= from.si)) {
    throw InputError({where, 1, 1},
                     fmt::format("the last value ({}) must not be below the first ({})",
                                 model::Shorten(last), model::Shorten(first)));
  }
  const double count = std::floor((to.si - from.si) / step.si + 1e-9) + 1.0;
  if (!(count <= kMaxVaryValues)) {
    throw InputError({where, 1, 1},
                     fmt::format("the range gives {:.0f} values (at most {}); use a larger "
                                 "step",
                                 count, kMaxVaryValues));
  }
  std::vector<model::Value> values;
  for (int i = 0; i < static_cast<int>(count); ++i) {
    double si = from.si + i * step.si;
    if (std::abs(si - to.si) <= 1e-9 * step.si) si = to.si;  // the inclusive end, exactly
    values.push_back(model::Value{si, from.dimension});
  }
  return MakeVariable(name, values, origin);
}

double BatchRowCount(const BatchOptions& options) {
  double rows = static_cast<double>(std::max<size_t>(1, options.grounds.size()));
  for (const BatchVariable& v : options.variables) rows *= static_cast<double>(v.values.size());
  return rows;
}

BatchGrid::BatchGrid(size_t ground_count, std::vector<size_t> dimension_sizes)
    : ground_count_(std::max<size_t>(1, ground_count)), sizes_(std::move(dimension_sizes)) {
  rows_ = static_cast<double>(ground_count_);
  for (size_t size : sizes_) rows_ *= static_cast<double>(size);
}

BatchGrid::Point BatchGrid::At(size_t index) const {
  if (!(static_cast<double>(index) < rows_)) {
    throw ComputationError(fmt::format("BatchGrid::At: row {} of a grid of {:.0f}", index, rows_));
  }
  Point point;
  point.values.resize(sizes_.size());
  size_t rest = index;
  for (size_t d = sizes_.size(); d-- > 0;) {
    point.values[d] = rest % sizes_[d];
    rest /= sizes_[d];
  }
  point.ground = rest;
  return point;
}

}  // namespace wirefield
