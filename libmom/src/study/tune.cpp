// Study layer: tuning a model variable to a frequency. Each trial value re-parses the model text
// with the value as a --set override and re-meshes it (segment counts held, see HeldSegments), then
// solves at the target. Resonance: a coarse scan of the bounds for sign changes of the feed
// reactance, each refined by TOMS748 (Boost.Math), poles rejected, series/parallel told apart
// by dX/df. Min-swr: Brent's minimiser (Boost.Math) around the best scan sample. Two variables
// alternate one-dimensional solves (Gauss-Seidel). docs/numerics.md, "Tuning".
#include "wirefield/tune.hpp"

#include <fmt/format.h>

#include <algorithm>
#include <boost/math/tools/minima.hpp>
#include <boost/math/tools/toms748_solve.hpp>
#include <chrono>
#include <cmath>
#include <cstdint>
#include <limits>
#include <map>
#include <utility>

#include "core/enum_names.hpp"

namespace wirefield {
namespace {

// The one spelling of the goals and resonance kinds, printed and parsed.
constexpr core::EnumNames<TuneGoal, 2> kGoalNames = {
    {{TuneGoal::kResonance, "resonance"}, {TuneGoal::kMinSwr, "min-swr"}}};
constexpr core::EnumNames<ResonanceKind, 3> kKindNames = {{{ResonanceKind::kAuto, "auto"},
                                                           {ResonanceKind::kSeries, "series"},
                                                           {ResonanceKind::kParallel, "parallel"}}};

// Root-finder stop: the bracket is narrower than 2^-40 of its ends (about 1e-12 relative),
// far below any tolerance a builder could cut to; TOMS748 reaches it in 10-20 solves.
constexpr int kRootBits = 40;
constexpr std::uintmax_t kMaxRootIterations = 60;
// Brent's minimiser cannot resolve better than sqrt(machine epsilon) on a smooth minimum;
// 26 bits asks for about 1.5e-8 relative.
constexpr int kMinimumBits = 26;
// A zero found by the root finder counts as a resonance only when |X| there is below this
// share of |Z|: a true zero has |X| ~ 1e-9 |Z|, a sign change through a pole keeps |X| ~ |Z|.
constexpr double kPoleRatio = 0.01;
// Relative frequency step of the dX/df estimate that tells series from parallel.
constexpr double kSlopeStep = 1e-4;
// Relative step of the finite difference of the sensitivity: 0.1% of the value (1 cm on a
// 10 m wire), small against the trimming a builder does and large against rounding.
constexpr double kSensitivityStep = 1e-3;
// The finest scan of the bounds before a tune reports that no resonance lies there: 12
// samples refined three times (23, 45, 89), about a 1% step of a -/+30% range.
constexpr int kMaxScanSamples = 100;
// Half-widths (relative) of the frequency brackets tried around a target for the resonance.
constexpr double kFrequencyBrackets[] = {0.002, 0.005, 0.01, 0.02, 0.05, 0.1};

double Seconds(std::chrono::steady_clock::time_point since) {
  return std::chrono::duration<double>(std::chrono::steady_clock::now() - since).count();
}

// A value of the variable as --set text that the parser reads back exactly (17 digits).
std::string OverrideText(const VariableSpec& spec, double value_si) {
  if (spec.unit.empty()) return fmt::format("{:.17g}", value_si);
  return fmt::format("{:.17g} {}", value_si, spec.unit);
}

// Shows a value with its unit in the trade's size: 10.052 m, 82.5 uH, 100 pF.
std::string ShowValue(const VariableSpec& spec, double value_si) {
  if (spec.unit == "H") return fmt::format("{:.4g} uH", value_si * 1e6);
  if (spec.unit == "F") return fmt::format("{:.4g} pF", value_si * 1e12);
  if (spec.unit == "m") return fmt::format("{:.4f} m", value_si);
  if (spec.unit.empty()) return fmt::format("{:.6g}", value_si);
  return fmt::format("{:.6g} {}", value_si, spec.unit);
}

std::string Mhz(double frequency_hz) { return fmt::format("{:.4f} MHz", frequency_hz / 1e6); }

std::string NamesOf(const Model& model) {
  std::string list;
  for (const VariableSpec& v : model.variable_specs) list += (list.empty() ? "" : ", ") + v.name;
  return list;
}

// What one solve of a trial gives about the first feed.
struct Sample {
  double value_si = 0.0;
  bool ok = false;  // false: the model is invalid at this value (message in why)
  std::string why;
  Complex z_ohm;
  Complex transmitter_z_ohm;
  double swr = 0.0;
};

struct Root {
  double value_si = 0.0;
  ResonanceKind kind = ResonanceKind::kSeries;
};

// Builds and solves trial models. Holds the text, the fixed overrides, the current value of
// every tuned variable and the segment counts.
class Trials {
 public:
  Trials(const std::string& text, const std::string& file, const TuneOptions& options)
      : text_(text), file_(file), options_(options) {}

  // Parses at the start values; returns the model (for its variables and warnings).
  Model Start(const std::vector<TuneTarget>& targets) {
    Model model = ParseModelText(text_, file_, options_.overrides);
    std::map<std::string, int> seen;
    for (const TuneTarget& t : targets) {
      const auto it = std::find_if(model.variable_specs.begin(), model.variable_specs.end(),
                                   [&](const VariableSpec& v) { return v.name == t.variable; });
      if (it == model.variable_specs.end()) {
        throw InputError(SourceLocation{"variable", 0, 0},
                         model.variable_specs.empty()
                             ? fmt::format("the model has no variable '{}' (it defines no "
                                           "variables; add a `let` for the length to tune)",
                                           t.variable)
                             : fmt::format("the model has no variable '{}' (its variables: {})",
                                           t.variable, NamesOf(model)));
      }
      if (seen[t.variable]++ > 0) {
        throw InputError(
            SourceLocation{"variable", 0, 0},
            fmt::format("'{}' is varied twice; give each target (`variable`) its own variable",
                        t.variable));
      }
      const bool named = !it->unit.empty();
      const bool plain = it->dimension == std::array<int, 4>{};
      if (!named && !plain) {
        throw InputError(it->location,
                         fmt::format("tune varies lengths, inductances, capacitances, "
                                     "resistances, frequencies, voltages or plain numbers; '{}' "
                                     "is {}",
                                     it->name, it->quantity));
      }
      specs_.push_back(*it);
      values_.push_back(it->value_si);
    }
    // Fixed overrides of tuned variables are replaced by the trial values.
    for (const Override& o : options_.overrides) {
      if (seen.count(o.name) == 0) fixed_.push_back(o);
    }
    return model;
  }

  const VariableSpec& spec(size_t i) const { return specs_[i]; }
  double value(size_t i) const { return values_[i]; }
  void set_value(size_t i, double v) { values_[i] = v; }
  int solves() const { return solves_; }
  void count_solves(int n) { solves_ += n; }

  // The model with variable i at value_si and the others at their current values.
  Model ModelAt(size_t i, double value_si) const {
    std::vector<Override> overrides = fixed_;
    for (size_t k = 0; k < specs_.size(); ++k) {
      overrides.push_back(
          Override{specs_[k].name, OverrideText(specs_[k], k == i ? value_si : values_[k]), ""});
    }
    Model model = ParseModelText(text_, file_, overrides);
    if (options_.z0_ohm) model.z0_ohm = options_.z0_ohm;
    if (held_.size() == model.wires.size()) {
      for (size_t w = 0; w < held_.size(); ++w) {
        if (model.wires[w].segments == 0) model.wires[w].segments = held_[w];
      }
    }
    return model;
  }

  Simulation SimulationAt(size_t i, double value_si) const {
    return Simulation(ModelAt(i, value_si), Mesh());
  }

  // One solve at frequency_hz; an input error of the trial model (a wire turned inside out
  // at this value) makes a sample that is not ok instead of stopping the tune.
  Sample SolveAt(size_t i, double value_si, double frequency_hz) {
    Sample s;
    s.value_si = value_si;
    try {
      const Simulation simulation = SimulationAt(i, value_si);
      s = FromSolve(simulation.Solve(frequency_hz), value_si);
      ++solves_;
    } catch (const InputError& error) {
      s.ok = false;
      s.why = error.message();
    }
    return s;
  }

  static Sample FromSolve(const SolveResult& r, double value_si) {
    Sample s;
    s.value_si = value_si;
    s.ok = true;
    s.z_ohm = r.feeds.front().impedance_ohm;
    s.transmitter_z_ohm = r.feeds.front().transmitter_impedance_ohm;
    s.swr = r.feeds.front().swr;
    return s;
  }

  // Holds each wire's segment count at the largest the mesher picks for the start values and
  // for every variable at its bounds, so that the reactance is a smooth function of the value
  // (a count that steps with the length would add small jumps a root finder could land on).
  void HoldSegments(const std::vector<std::pair<double, double>>& bounds) {
    std::vector<int> counts;
    auto take = [&](size_t i, double v) {
      try {
        const Simulation simulation(ModelAt(i, v), Mesh());
        const auto& mesh = simulation.wire_mesh();
        if (counts.empty()) counts.assign(mesh.size(), 0);
        if (counts.size() != mesh.size()) return;
        for (size_t w = 0; w < mesh.size(); ++w) {
          counts[w] = std::max(counts[w], mesh[w].segments_used);
        }
      } catch (const InputError&) {
        // The model is invalid at this bound; the scan reports it where it matters.
      }
    };
    take(0, values_[0]);
    for (size_t i = 0; i < bounds.size(); ++i) {
      take(i, bounds[i].first);
      take(i, bounds[i].second);
    }
    held_ = counts;
  }
  const std::vector<int>& held() const { return held_; }

  SimulationOptions Mesh() const { return mesh_options_; }
  void set_mesh(SimulationOptions o) { mesh_options_ = o; }

 private:
  std::string text_;
  std::string file_;
  const TuneOptions& options_;
  std::vector<VariableSpec> specs_;
  std::vector<double> values_;
  std::vector<Override> fixed_;
  std::vector<int> held_;
  SimulationOptions mesh_options_;
  int solves_ = 0;
};

// Series (dX/df > 0) or parallel (dX/df < 0) at a zero of X, from two solves at f -/+ a step.
ResonanceKind KindAt(const Simulation& simulation, double frequency_hz, int* solves) {
  const double x_low =
      simulation.Solve(frequency_hz * (1.0 - kSlopeStep)).feeds[0].impedance_ohm.imag();
  const double x_high =
      simulation.Solve(frequency_hz * (1.0 + kSlopeStep)).feeds[0].impedance_ohm.imag();
  if (solves != nullptr) *solves += 2;
  return x_high > x_low ? ResonanceKind::kSeries : ResonanceKind::kParallel;
}

bool KindFits(ResonanceKind wanted, ResonanceKind found) {
  return wanted == ResonanceKind::kAuto || wanted == found;
}

// Refines a sign change of X between samples a and b (variable i at frequency f); returns the
// root with its kind, or nullopt when the sign change is a pole (|X| stays large).
std::optional<Root> RefineRoot(Trials& trials, size_t i, double frequency_hz, const Sample& a,
                               const Sample& b) {
  double found = a.value_si;  // a sample exactly at X = 0 is the root itself
  if (a.z_ohm.imag() != 0.0) {
    std::map<double, Sample> seen{{a.value_si, a}, {b.value_si, b}};
    auto sample_at = [&](double v) {
      const auto hit = seen.find(v);
      if (hit != seen.end()) return hit->second;
      Sample s = trials.SolveAt(i, v, frequency_hz);
      if (!s.ok) throw InputError(trials.spec(i).location, s.why);
      seen[v] = s;
      return s;
    };
    auto x_of = [&](double v) { return sample_at(v).z_ohm.imag(); };
    std::uintmax_t iterations = kMaxRootIterations;
    const auto [low, high] = boost::math::tools::toms748_solve(
        x_of, a.value_si, b.value_si, a.z_ohm.imag(), b.z_ohm.imag(),
        boost::math::tools::eps_tolerance<double>(kRootBits), iterations);
    // The end of the final bracket with the smaller |X| (both were solved by the finder).
    const Sample s_low = sample_at(low);
    const Sample s_high = sample_at(high);
    const Sample& best =
        std::abs(s_low.z_ohm.imag()) <= std::abs(s_high.z_ohm.imag()) ? s_low : s_high;
    if (!best.ok || std::abs(best.z_ohm.imag()) > kPoleRatio * std::abs(best.z_ohm)) {
      return std::nullopt;
    }
    found = best.value_si;
  }
  int solves = 0;
  const Simulation simulation = trials.SimulationAt(i, found);
  const ResonanceKind kind = KindAt(simulation, frequency_hz, &solves);
  trials.count_solves(solves);
  return Root{found, kind};
}

// Samples evenly over [low, high]. `cache` keeps earlier samples by value: a grid of n points
// refined to 2n - 1 gives the same values at the old points (k/(n-1) and 2k/(2n-2) round alike),
// so a finer scan costs only its new points.
std::vector<Sample> Scan(Trials& trials, size_t i, double frequency_hz, double low, double high,
                         int samples, std::map<double, Sample>* cache = nullptr) {
  std::vector<Sample> out;
  for (int k = 0; k < samples; ++k) {
    const double v = low + (high - low) * (static_cast<double>(k) / (samples - 1));
    if (cache != nullptr) {
      const auto hit = cache->find(v);
      if (hit != cache->end()) {
        out.push_back(hit->second);
        continue;
      }
    }
    out.push_back(trials.SolveAt(i, v, frequency_hz));
    if (cache != nullptr) (*cache)[v] = out.back();
  }
  return out;
}

// The roots of the kind wanted among the sign changes of a scan.
std::vector<Root> RootsOf(Trials& trials, size_t i, double frequency_hz,
                          const std::vector<Sample>& scan, ResonanceKind kind,
                          std::vector<Root>* other_kind = nullptr) {
  std::vector<Root> roots;
  for (size_t k = 0; k + 1 < scan.size(); ++k) {
    const Sample& a = scan[k];
    const Sample& b = scan[k + 1];
    if (!a.ok || !b.ok) continue;
    const double xa = a.z_ohm.imag();
    const double xb = b.z_ohm.imag();
    if (!(xa == 0.0 || (xa < 0.0) != (xb < 0.0))) continue;
    if (xb == 0.0 && k + 2 < scan.size()) continue;  // counted as the next pair's start
    const std::optional<Root> root = RefineRoot(trials, i, frequency_hz, a, b);
    if (root && KindFits(kind, root->kind)) roots.push_back(*root);
    if (root && !KindFits(kind, root->kind) && other_kind != nullptr) other_kind->push_back(*root);
  }
  return roots;
}

[[noreturn]] void FailNoRoot(const Trials& trials, size_t i, double frequency_hz, double low,
                             double high, const std::vector<Sample>& scan, ResonanceKind kind,
                             const std::string& feed, const std::vector<Root>& other_kind) {
  const VariableSpec& spec = trials.spec(i);
  const Sample* nearest = nullptr;
  for (const Sample& s : scan) {
    if (s.ok && (nearest == nullptr || std::abs(s.z_ohm.imag()) < std::abs(nearest->z_ohm.imag())))
      nearest = &s;
  }
  const std::string what = kind == ResonanceKind::kAuto
                               ? "no resonance"
                               : fmt::format("no {} resonance", ToString(kind));
  std::string message =
      fmt::format("tune: {} of the feed '{}' at {} for '{}' between {} and {}", what, feed,
                  Mhz(frequency_hz), spec.name, ShowValue(spec, low), ShowValue(spec, high));
  if (nearest != nullptr) {
    message += fmt::format(
        "; the nearest value found is {} = {}, where |X| = {:.1f} ohm "
        "(Z = {:.1f} {} j{:.1f} ohm)",
        spec.name, ShowValue(spec, nearest->value_si), std::abs(nearest->z_ohm.imag()),
        nearest->z_ohm.real(), nearest->z_ohm.imag() < 0 ? "-" : "+",
        std::abs(nearest->z_ohm.imag()));
  } else if (!scan.empty()) {
    message += fmt::format("; the model is invalid over the whole range: {}", scan.front().why);
  }
  if (!other_kind.empty()) {
    message += fmt::format(
        "; a {} resonance lies at {} = {} (`kind` {} takes it)", ToString(other_kind.front().kind),
        spec.name, ShowValue(spec, other_kind.front().value_si), ToString(other_kind.front().kind));
  }
  message += "; widen `min_si`/`max_si`, check `frequency_hz`";
  if (kind != ResonanceKind::kAuto) message += " and `kind`";
  message += ", or use `goal` min-swr";
  throw InputError(spec.location, message);
}

// One-dimensional resonance solve for variable i at its target; updates its value and, on
// the first call with kind auto, fixes the kind found. `local` first tries a narrow bracket
// around the current value (later alternations, where the value moves little).
void SolveResonance(Trials& trials, size_t i, const TuneTarget& target, double low, double high,
                    ResonanceKind& kind, bool local, const std::string& feed,
                    const TuneOptions& options) {
  const double current = trials.value(i);
  if (local) {
    const double half = 0.02 * (high - low);
    const double a = std::max(low, current - half);
    const double b = std::min(high, current + half);
    const std::vector<Sample> scan = Scan(trials, i, target.frequency_hz, a, b, 3);
    const std::vector<Root> roots = RootsOf(trials, i, target.frequency_hz, scan, kind);
    if (!roots.empty()) {
      trials.set_value(i, roots.front().value_si);
      return;
    }
  }
  // A sharp resonance (a coil and a short tail have a high Q) can fall between two samples
  // of the coarse scan; with no root found the scan is refined (2n - 1 points) up to
  // kMaxScanSamples before the tune gives up.
  std::map<double, Sample> cache;
  std::vector<Sample> scan;
  std::vector<Root> roots;
  std::vector<Root> other_kind;
  for (int samples = options.scan_samples;; samples = 2 * samples - 1) {
    scan = Scan(trials, i, target.frequency_hz, low, high, samples, &cache);
    other_kind.clear();
    roots = RootsOf(trials, i, target.frequency_hz, scan, kind, &other_kind);
    if (!roots.empty() || 2 * samples - 1 > kMaxScanSamples) break;
  }
  if (roots.empty())
    FailNoRoot(trials, i, target.frequency_hz, low, high, scan, kind, feed, other_kind);
  const Root best =
      *std::min_element(roots.begin(), roots.end(), [&](const Root& a, const Root& b) {
        return std::abs(a.value_si - current) < std::abs(b.value_si - current);
      });
  trials.set_value(i, best.value_si);
  kind = best.kind;
}

// One-dimensional min-swr solve: the best scan sample, then Brent between its neighbours.
void SolveMinSwr(Trials& trials, size_t i, const TuneTarget& target, double low, double high,
                 const TuneOptions& options) {
  const std::vector<Sample> scan =
      Scan(trials, i, target.frequency_hz, low, high, options.scan_samples);
  size_t best = scan.size();
  for (size_t k = 0; k < scan.size(); ++k) {
    if (scan[k].ok && (best == scan.size() || scan[k].swr < scan[best].swr)) best = k;
  }
  if (best == scan.size()) {
    throw InputError(trials.spec(i).location,
                     fmt::format("tune: the model is invalid for '{}' between {} and {}: {}",
                                 trials.spec(i).name, ShowValue(trials.spec(i), low),
                                 ShowValue(trials.spec(i), high), scan.front().why));
  }
  const double a = scan[best > 0 ? best - 1 : 0].value_si;
  const double b = scan[std::min(best + 1, scan.size() - 1)].value_si;
  auto swr_of = [&](double v) {
    const Sample s = trials.SolveAt(i, v, target.frequency_hz);
    return s.ok ? s.swr : std::numeric_limits<double>::max();
  };
  std::uintmax_t iterations = kMaxRootIterations;
  const auto [value, swr] =
      boost::math::tools::brent_find_minima(swr_of, a, b, kMinimumBits, iterations);
  trials.set_value(i, swr <= scan[best].swr ? value : scan[best].value_si);
}

// The resonance frequency of variable i at value v near its target, and the reactance's
// Newton estimate of the offset when none is bracketed.
std::optional<double> ResonanceAt(Trials& trials, size_t i, double value_si, double target_hz,
                                  ResonanceKind kind) {
  try {
    const Simulation simulation = trials.SimulationAt(i, value_si);
    int solves = 0;
    const std::optional<double> f = FindResonanceNear(simulation, target_hz, kind, &solves);
    trials.count_solves(solves);
    return f;
  } catch (const InputError&) {
    return std::nullopt;
  }
}

}  // namespace

std::string ToString(TuneGoal goal) { return core::NameOf(goal, kGoalNames, "min-swr"); }

std::string ToString(ResonanceKind kind) { return core::NameOf(kind, kKindNames, "auto"); }

std::optional<double> FindResonanceNear(const Simulation& simulation, double frequency_hz,
                                        ResonanceKind kind, int* solves) {
  int count = 0;
  auto x_of = [&](double f) {
    ++count;
    return simulation.Solve(f).feeds[0].impedance_ohm.imag();
  };
  auto z_of = [&](double f) {
    ++count;
    return simulation.Solve(f).feeds[0].impedance_ohm;
  };
  const double x0 = x_of(frequency_hz);
  std::optional<double> found;
  double found_distance = std::numeric_limits<double>::max();
  double inner = 0.0;
  for (double h : kFrequencyBrackets) {
    // Look on each side between the last bracket tried and this one.
    for (int side : {-1, 1}) {
      const double f_near = frequency_hz * (1.0 + side * inner);
      const double f_far = frequency_hz * (1.0 + side * h);
      const double x_near = inner == 0.0 ? x0 : x_of(f_near);
      const double x_far = x_of(f_far);
      if (x_near == 0.0) {
        found = f_near;
        found_distance = 0.0;
        continue;
      }
      if ((x_near < 0.0) == (x_far < 0.0)) continue;
      const double f_low = std::min(f_near, f_far);
      const double f_high = std::max(f_near, f_far);
      const double x_low = side < 0 ? x_far : x_near;
      const double x_high = side < 0 ? x_near : x_far;
      const ResonanceKind slope =
          x_high > x_low ? ResonanceKind::kSeries : ResonanceKind::kParallel;
      if (!KindFits(kind, slope)) continue;
      std::uintmax_t iterations = kMaxRootIterations;
      const auto [a, b] = boost::math::tools::toms748_solve(
          x_of, f_low, f_high, x_low, x_high, boost::math::tools::eps_tolerance<double>(kRootBits),
          iterations);
      const double f = 0.5 * (a + b);
      const Complex z = z_of(f);
      if (std::abs(z.imag()) > kPoleRatio * std::abs(z)) continue;  // a pole, not a resonance
      if (std::abs(f - frequency_hz) < found_distance) {
        found = f;
        found_distance = std::abs(f - frequency_hz);
      }
    }
    if (found) break;
    inner = h;
  }
  if (solves != nullptr) *solves += count;
  return found;
}

void TuneOptions::Validate() const {
  const auto fail = [](const char* field, const std::string& bound, const std::string& value) {
    throw InputError(SourceLocation{field, 1, 1},
                     fmt::format("{} must be {}; got {}", field, bound, value));
  };
  if (scan_samples < 3 || scan_samples > 200) {
    fail("scan_samples", "from 3 to 200", fmt::to_string(scan_samples));
  }
  if (!(tolerance > 0.0 && tolerance < 0.1)) {
    fail("tolerance", "greater than 0 and less than 0.1", fmt::format("{}", tolerance));
  }
  if (max_iterations < 1) fail("max_iterations", "at least 1", fmt::to_string(max_iterations));
  if (!(default_span > 0.0 && default_span < 1.0)) {
    fail("default_span", "greater than 0 and less than 1", fmt::format("{}", default_span));
  }
}

TuneResult Tune(const std::string& model_text, const std::string& file_name,
                const std::vector<TuneTarget>& targets, const TuneOptions& options) {
  const auto start = std::chrono::steady_clock::now();
  if (targets.empty()) {
    throw InputError(SourceLocation{"variable", 0, 0},
                     "give a target: the variable to tune (`variable`) and its frequency "
                     "(`frequency_hz`)");
  }
  options.Validate();
  auto progress = [&](const std::string& line) {
    if (options.progress) options.progress(line);
  };

  Trials trials(model_text, file_name, options);
  Model start_model = trials.Start(targets);
  double highest_hz = 0.0;
  std::vector<std::pair<double, double>> bounds;
  for (size_t i = 0; i < targets.size(); ++i) {
    const TuneTarget& t = targets[i];
    const VariableSpec& spec = trials.spec(i);
    if (!(t.frequency_hz > 0.0) || !std::isfinite(t.frequency_hz)) {
      throw InputError(
          SourceLocation{"frequency_hz", 0, 0},
          fmt::format("frequency_hz must be a positive frequency; got {} Hz", t.frequency_hz));
    }
    highest_hz = std::max(highest_hz, t.frequency_hz);
    const double span = options.default_span * std::abs(spec.value_si);
    const double low = t.min_si.value_or(spec.value_si - span);
    const double high = t.max_si.value_or(spec.value_si + span);
    if (!(high > low) || !std::isfinite(low) || !std::isfinite(high)) {
      throw InputError(
          SourceLocation{t.min_si || t.max_si ? "min_si" : "variable", 0, 0},
          spec.value_si == 0.0 && !t.min_si && !t.max_si
              ? fmt::format("'{}' is 0 in the model, so the default bounds (-/+{:g}% of it) are "
                            "empty; give `min_si` and `max_si`",
                            spec.name, options.default_span * 100)
              : fmt::format("the bounds of '{}' must have `min_si` below `max_si`; got {} to {}",
                            spec.name, ShowValue(spec, low), ShowValue(spec, high)));
    }
    bounds.emplace_back(low, high);
  }
  SimulationOptions mesh = options.simulation;
  if (!mesh.max_frequency_hz) mesh.max_frequency_hz = highest_hz;
  trials.set_mesh(mesh);
  // The model at its start values must mesh; its warnings are the report's.
  if (options.z0_ohm) start_model.z0_ohm = options.z0_ohm;
  const Simulation start_simulation(start_model, mesh);
  const std::string feed = start_simulation.model().feeds.front().name;
  TuneResult result;
  result.model_file = file_name;
  result.feed_name = feed;
  result.goal = options.goal;
  result.kind_given = options.kind;
  result.warnings = start_simulation.warnings();
  trials.HoldSegments(bounds);

  // Start each variable inside its bounds.
  for (size_t i = 0; i < targets.size(); ++i) {
    trials.set_value(i, std::clamp(trials.value(i), bounds[i].first, bounds[i].second));
  }
  std::vector<ResonanceKind> kinds(targets.size(), options.kind);
  bool converged = false;
  int iteration = 0;
  while (!converged && iteration < options.max_iterations) {
    ++iteration;
    std::vector<double> before;
    for (size_t i = 0; i < targets.size(); ++i) before.push_back(trials.value(i));
    for (size_t i = 0; i < targets.size(); ++i) {
      progress(fmt::format("tune: pass {}: '{}' for {} ({} solves so far)", iteration,
                           trials.spec(i).name, Mhz(targets[i].frequency_hz), trials.solves()));
      if (options.goal == TuneGoal::kResonance) {
        SolveResonance(trials, i, targets[i], bounds[i].first, bounds[i].second, kinds[i],
                       iteration > 1, feed, options);
      } else {
        SolveMinSwr(trials, i, targets[i], bounds[i].first, bounds[i].second, options);
      }
    }
    if (targets.size() == 1) {
      converged = true;
      break;
    }
    converged = true;
    for (size_t i = 0; i < targets.size(); ++i) {
      if (options.goal == TuneGoal::kResonance) {
        const std::optional<double> f =
            ResonanceAt(trials, i, trials.value(i), targets[i].frequency_hz, kinds[i]);
        if (!f || std::abs(*f / targets[i].frequency_hz - 1.0) > options.tolerance) {
          converged = false;
        }
      } else {
        const double scale = std::max(std::abs(before[i]), bounds[i].second - bounds[i].first);
        if (std::abs(trials.value(i) - before[i]) > options.tolerance * scale) converged = false;
      }
    }
  }
  if (!converged) {
    std::string where;
    for (size_t i = 0; i < targets.size(); ++i) {
      where += fmt::format("{}{} = {}", where.empty() ? "" : ", ", trials.spec(i).name,
                           ShowValue(trials.spec(i), trials.value(i)));
    }
    throw ComputationError(fmt::format(
        "tune: the {} variables did not settle within {:g} (relative) after {} alternations "
        "(last values {}); the variables may act on both targets alike: choose variables that "
        "each set one band, or narrow `min_si`/`max_si`",
        targets.size(), options.tolerance, options.max_iterations, where));
  }

  progress("tune: impedance and sensitivity at the tuned values");
  for (size_t i = 0; i < targets.size(); ++i) {
    const VariableSpec& spec = trials.spec(i);
    TunedVariable out;
    out.name = spec.name;
    out.unit = spec.unit;
    out.quantity = spec.quantity;
    out.start_si = spec.value_si;
    out.min_si = bounds[i].first;
    out.max_si = bounds[i].second;
    out.value_si = trials.value(i);
    out.target_hz = targets[i].frequency_hz;
    const Simulation simulation = trials.SimulationAt(i, out.value_si);
    const SolveResult solved = options.mesh_estimate
                                   ? SolveWithMeshEstimate(simulation, out.target_hz)
                                   : simulation.Solve(out.target_hz);
    trials.count_solves(1);
    if (solved.mesh_estimate) {
      out.mesh_error_ohm = solved.feeds.front().mesh_error_ohm;
      out.mesh_notes = solved.mesh_estimate->notes;
      const std::vector<Warning>& mesh_warnings = solved.mesh_estimate->warnings;
      result.warnings.insert(result.warnings.end(), mesh_warnings.begin(), mesh_warnings.end());
    }
    const Sample at = Trials::FromSolve(solved, out.value_si);
    out.z_ohm = at.z_ohm;
    out.transmitter_z_ohm = at.transmitter_z_ohm;
    out.swr = at.swr;
    result.z0_ohm = simulation.model().z0_ohm.value_or(kDefaultZ0Ohm);
    result.unknowns = simulation.unknowns();
    int solves = 0;
    out.resonance_hz = FindResonanceNear(simulation, out.target_hz, kinds[i], &solves);
    trials.count_solves(solves);
    if (out.resonance_hz) {
      int counted = 0;
      out.resonance_kind = KindAt(simulation, *out.resonance_hz, &counted);
      trials.count_solves(counted);
      // Sensitivity: central difference of the resonance frequency at value -/+ step.
      const double step = kSensitivityStep *
                          (out.value_si != 0.0 ? std::abs(out.value_si) : out.max_si - out.min_si);
      out.sensitivity_step_si = step;
      const std::optional<double> f_minus =
          ResonanceAt(trials, i, out.value_si - step, *out.resonance_hz, *out.resonance_kind);
      const std::optional<double> f_plus =
          ResonanceAt(trials, i, out.value_si + step, *out.resonance_hz, *out.resonance_kind);
      if (f_minus && f_plus) out.sensitivity_hz_per_si = (*f_plus - *f_minus) / (2.0 * step);
    }
    result.variables.push_back(out);
  }
  result.segments_used = trials.held();
  result.iterations = iteration;
  result.solves = trials.solves();
  result.elapsed_s = Seconds(start);
  return result;
}

TuneResult TuneFile(const std::string& path, const std::vector<TuneTarget>& targets,
                    const TuneOptions& options) {
  return Tune(ReadModelFileText(path), path, targets, options);
}

}  // namespace wirefield
