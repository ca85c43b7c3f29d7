// Post stage: far field, gain, pattern search, cuts, figures of merit and the power budget of
// a solved model. The model gives the ground (its images, and the half-space the pattern
// covers) and the file its warnings name; the solve gives the currents, the frequency and the
// feed and load powers. Wraps post::FarFieldSource with the grid search, beamwidths and
// front-to-back.
#include "post/pattern.hpp"

#include <fmt/format.h>

#include <algorithm>
#include <cmath>
#include <vector>

#include "core/constants.hpp"
#include "core/parallel.hpp"
#include "core/progress.hpp"
#include "post/far_field.hpp"

namespace wirefield {
namespace {

constexpr double kDeg = core::kPi / 180.0;
// The run checks energy conservation: above this relative mismatch it warns.
constexpr double kBalanceTolerance = 0.02;
// An efficiency computed above 1 is always clamped to 1; the note says so once the excess
// shows in the printed figure (two decimals of a percent).
constexpr double kEfficiencyNoteAbove = 5e-5;
// An azimuth cut whose gains vary less than this (dB) has no front to speak of.
constexpr double kMinFrontContrastDb = 3.0;
// Grid step of the search for the maximum (the cuts use the user's step).
constexpr double kSearchStepDeg = 2.0;
// Lobes whose peaks differ by less than this (dB) count as equally strong.
constexpr double kLobeTieDb = 0.05;

// Maximum of a unimodal function on [lo, hi] by golden-section search (to 1e-4 degrees).
template <typename F>
double GoldenMax(F f, double lo, double hi) {
  const double ratio = 0.5 * (std::sqrt(5.0) - 1.0);
  double a = lo, b = hi;
  double c = b - ratio * (b - a), d = a + ratio * (b - a);
  double fc = f(c), fd = f(d);
  while (b - a > 1e-4) {
    if (fc < fd) {
      a = c;
      c = d;
      fc = fd;
      d = a + ratio * (b - a);
      fd = f(d);
    } else {
      b = d;
      d = c;
      fd = fc;
      c = b - ratio * (b - a);
      fc = f(c);
    }
  }
  return 0.5 * (a + b);
}

double ToDbi(double gain) { return gain > 1e-100 ? 10.0 * std::log10(gain) : kNoGainDbi; }

double InputPower(const SolveResult& solved) {
  double p = 0.0;
  for (const FeedResult& f : solved.feeds) p += f.power_w;
  return p;
}

struct Evaluator {
  post::FarFieldSource source;
  double input_w;
  int threads = 1;
  core::Progress* progress = nullptr;  // counts directions, when there is one

  FarFieldPoint At(double elevation_deg, double azimuth_deg) const {
    FarFieldPoint p;
    p.elevation_deg = elevation_deg;
    p.azimuth_deg = azimuth_deg;
    const double theta = (90.0 - elevation_deg) * kDeg, phi = azimuth_deg * kDeg;
    // Gains from the field about the antenna's centre: the same to the bit wherever the
    // antenna stands (sideways, over a ground); the reported phasors refer to the origin.
    const auto [et, ep] = source.CentredField(theta, phi);
    const Complex shift = source.CentrePhase(theta, phi);
    p.e_theta_v = et * shift;
    p.e_phi_v = ep * shift;
    const double scale = 4.0 * core::kPi / (2.0 * core::kEta0_ohm * input_w);
    p.gain_vertical_dbi = ToDbi(std::norm(et) * scale);
    p.gain_horizontal_dbi = ToDbi(std::norm(ep) * scale);
    p.gain_dbi = ToDbi((std::norm(et) + std::norm(ep)) * scale);
    return p;
  }

  // The points of `directions` ({elevation, azimuth} pairs), evaluated on `threads` threads.
  std::vector<FarFieldPoint> AtAll(const std::vector<std::pair<double, double>>& directions) const {
    std::vector<FarFieldPoint> points(directions.size());
    constexpr int kChunk = 64;  // directions per task and per progress count
    const int n = static_cast<int>(directions.size());
    core::ParallelFor(threads, static_cast<size_t>((n + kChunk - 1) / kChunk), [&](size_t chunk) {
      const int c = static_cast<int>(chunk);
      const int end = std::min(n, (c + 1) * kChunk);
      for (int i = c * kChunk; i < end; ++i) {
        points[i] = At(directions[i].first, directions[i].second);
      }
      if (progress) progress->Advance(end - c * kChunk);
    });
    return points;
  }
};

Evaluator MakeEvaluator(const Model& model, const SolveResult& solved) {
  const double input_w = InputPower(solved);
  if (!(input_w > 0.0)) {
    throw ComputationError(
        "the feeds deliver no power to the antenna, so gain is undefined; give a feed a "
        "non-zero voltage");
  }
  return {post::FarFieldSource(solved.currents, solved.frequency_hz, model.ground), input_w, 1,
          nullptr};
}

void Append(PatternCut* cut, double angle_deg, const FarFieldPoint& p) {
  cut->angle_deg.push_back(angle_deg);
  cut->gain_dbi.push_back(p.gain_dbi);
  cut->gain_vertical_dbi.push_back(p.gain_vertical_dbi);
  cut->gain_horizontal_dbi.push_back(p.gain_horizontal_dbi);
}

// The azimuth cut at one elevation: 0..360 deg, both ends included.
PatternCut AzimuthCut(const Evaluator& eval, double elevation_deg, int n_az, double step) {
  PatternCut cut;
  cut.plane = "azimuth";
  cut.fixed_angle_deg = elevation_deg;
  std::vector<std::pair<double, double>> directions;
  for (int ia = 0; ia <= n_az; ++ia) directions.emplace_back(elevation_deg, ia * step);
  const std::vector<FarFieldPoint> points = eval.AtAll(directions);
  for (int ia = 0; ia <= n_az; ++ia) Append(&cut, ia * step, points[ia]);
  return cut;
}

// Width of the region within 3 dB of the cut's maximum that contains it, with linear
// interpolation at the crossings. circular: the cut wraps around (azimuth).
std::optional<double> Beamwidth(const PatternCut& cut, bool circular) {
  const int n = static_cast<int>(cut.gain_dbi.size());
  if (n < 3) return std::nullopt;
  const int peak = static_cast<int>(std::max_element(cut.gain_dbi.begin(), cut.gain_dbi.end()) -
                                    cut.gain_dbi.begin());
  const double level = cut.gain_dbi[peak] - 3.0;
  const double step = cut.angle_deg[1] - cut.angle_deg[0];
  auto walk = [&](int dir) -> std::optional<double> {
    for (int s = 1; s < n; ++s) {
      int i = peak + dir * s, prev = peak + dir * (s - 1);
      if (circular) {
        i = ((i % n) + n) % n;
        prev = ((prev % n) + n) % n;
      } else if (i < 0 || i >= n) {
        return (s - 1) * step;  // the lobe reaches the end of the cut (the ground)
      }
      if (cut.gain_dbi[i] < level) {
        const double frac = (cut.gain_dbi[prev] - level) / (cut.gain_dbi[prev] - cut.gain_dbi[i]);
        return (s - 1 + frac) * step;
      }
    }
    return std::nullopt;
  };
  const auto left = walk(-1), right = walk(+1);
  if (!left || !right) return std::nullopt;
  // Within 3 dB from end to end: no lobe to measure.
  if (*left + *right >= (n - 1) * step - 1e-9) return std::nullopt;
  return *left + *right;
}

}  // namespace

DirectionGain BestOverAzimuth(const PatternCut& azimuth_cut) {
  const std::vector<double>& gains = azimuth_cut.gain_dbi;
  if (gains.empty() || azimuth_cut.angle_deg.size() != gains.size() ||
      azimuth_cut.gain_vertical_dbi.size() != gains.size() ||
      azimuth_cut.gain_horizontal_dbi.size() != gains.size()) {
    throw ComputationError("internal error: the azimuth cut is empty or its arrays differ");
  }
  // The first sample within kTieDb of the maximum: a symmetric pattern's equal lobes differ
  // by rounding only, and the first keeps the choice stable.
  constexpr double kTieDb = 1e-9;
  const double best_dbi = *std::max_element(gains.begin(), gains.end());
  const auto i = static_cast<std::size_t>(
      std::find_if(gains.begin(), gains.end(), [&](double g) { return g >= best_dbi - kTieDb; }) -
      gains.begin());
  DirectionGain best;
  best.elevation_deg = azimuth_cut.fixed_angle_deg;
  best.azimuth_deg = azimuth_cut.angle_deg[i];
  best.gain_dbi = gains[i];
  best.gain_vertical_dbi = azimuth_cut.gain_vertical_dbi[i];
  best.gain_horizontal_dbi = azimuth_cut.gain_horizontal_dbi[i];
  return best;
}

namespace post {

FarFieldPoint FarField(const Model& model, const SolveResult& solved, double elevation_deg,
                       double azimuth_deg) {
  return MakeEvaluator(model, solved).At(elevation_deg, azimuth_deg);
}

PatternResult ComputePattern(const Model& model, const SolveResult& solved,
                             const PatternOptions& options) {
  const bool over_ground = model.ground.kind != GroundKind::kFree;
  options.Validate(over_ground);
  Evaluator eval = MakeEvaluator(model, solved);
  PatternResult r;
  r.frequency_hz = solved.frequency_hz;
  // A whole number of steps per 90 degrees, no coarser than asked.
  const int per_quadrant = static_cast<int>(std::ceil(90.0 / options.step_deg - 1e-9));
  const double step = 90.0 / per_quadrant;
  r.step_deg = step;

  // Grid search for the maximum, on a grid no finer than kSearchStepDeg (wire antennas have
  // no lobes narrower than several times that), then refined off the grid below.
  const int n_az = 4 * per_quadrant;
  const int search_per_quadrant =
      std::min(per_quadrant, static_cast<int>(std::ceil(90.0 / kSearchStepDeg - 1e-9)));
  const double search_step = 90.0 / search_per_quadrant;
  std::vector<std::pair<double, double>> search;
  for (int ie = over_ground ? 0 : -search_per_quadrant; ie <= search_per_quadrant; ++ie) {
    const double el = ie * search_step;
    const bool pole = std::abs(ie) == search_per_quadrant;
    for (int ia = 0; ia < (pole ? 1 : 4 * search_per_quadrant); ++ia) {
      search.emplace_back(el, ia * search_step);
    }
  }
  // The work in directions, for the progress lines: the search, the low-angle and the two
  // cuts, and the power integration's grid (a few dozen more for the refinement).
  const int cut_points = (over_ground ? 2 : 4) * per_quadrant + 1;
  const double directions =
      static_cast<double>(search.size()) +
      static_cast<double>(n_az + 1) * (std::size(kLowAngleElevations_deg) + 1) + cut_points +
      static_cast<double>(eval.source.power_grid().directions());
  core::Progress progress("pattern", directions);
  eval.threads = core::ResolveThreads(options.threads);
  eval.progress = &progress;
  double best = -INFINITY;
  {
    const std::vector<FarFieldPoint> points = eval.AtAll(search);
    for (size_t i = 0; i < points.size(); ++i) {
      if (points[i].gain_dbi > best) {
        best = points[i].gain_dbi;
        r.max_gain_dbi = points[i].gain_dbi;
        r.max_gain_elevation_deg = search[i].first;
        r.max_gain_azimuth_deg = search[i].second;
      }
    }
  }

  // Refine the maximum off the grid: alternate golden-section searches in elevation and
  // azimuth within one search step of the best grid point.
  const double el_min = over_ground ? 0.0 : -90.0;
  auto gain_at = [&](double el, double az) { return eval.At(el, az).gain_dbi; };
  {
    double el = r.max_gain_elevation_deg, az = r.max_gain_azimuth_deg;
    for (int round = 0; round < 2; ++round) {
      el = GoldenMax([&](double e) { return gain_at(e, az); }, std::max(el_min, el - search_step),
                     std::min(90.0, el + search_step));
      if (std::abs(el) < 90.0 - 1e-9) {
        az =
            GoldenMax([&](double a) { return gain_at(el, a); }, az - search_step, az + search_step);
      }
    }
    const double refined = gain_at(el, az);
    if (refined > r.max_gain_dbi + 1e-6) {  // flat patterns keep the grid point
      r.max_gain_dbi = refined;
      r.max_gain_elevation_deg = el;
      r.max_gain_azimuth_deg = std::fmod(az + 360.0, 360.0);
    }
  }
  // Equal lobes (a horizontal dipole one wavelength up has two of the same height): the
  // take-off angle is the lowest lobe toward the front within kLobeTieDb of the maximum.
  {
    // In free space the scan starts at the horizon too: a tie across elevations (a
    // horizontal dipole's broadside plane) then reports the horizon, not the nadir.
    if (!over_ground && r.max_gain_elevation_deg < 0.0) {
      double best_az = 0.0, best_gain = -INFINITY;
      for (int ia = 0; ia < n_az; ++ia) {
        const double g = gain_at(0.0, ia * step);
        if (g > best_gain) {
          best_gain = g;
          best_az = ia * step;
        }
      }
      best_az =
          GoldenMax([&](double a) { return gain_at(0.0, a); }, best_az - step, best_az + step);
      if (gain_at(0.0, best_az) >= r.max_gain_dbi - kLobeTieDb) {
        r.max_gain_elevation_deg = 0.0;
        r.max_gain_azimuth_deg = std::fmod(best_az + 360.0, 360.0);
      }
    }
    const double az = r.max_gain_azimuth_deg;
    double lowest = r.max_gain_elevation_deg;
    for (int ie = 1; ie < per_quadrant; ++ie) {
      const double el = ie * step;
      if (el >= std::abs(lowest) && lowest >= 0.0) break;
      const double g = gain_at(el, az);
      if (g < gain_at(el - step, az) || g < gain_at(el + step, az)) continue;
      const double peak_el =
          GoldenMax([&](double e) { return gain_at(e, az); }, el - step, el + step);
      if (gain_at(peak_el, az) >= r.max_gain_dbi - kLobeTieDb) {
        lowest = peak_el;
        break;
      }
    }
    r.max_gain_elevation_deg = lowest + 0.0;  // no -0
    if (std::abs(r.max_gain_elevation_deg) < 1e-9) r.max_gain_elevation_deg = 0.0;
  }

  const FarFieldPoint at_max = eval.At(r.max_gain_elevation_deg, r.max_gain_azimuth_deg);
  r.max_gain_vertical_dbi = at_max.gain_vertical_dbi;
  r.max_gain_horizontal_dbi = at_max.gain_horizontal_dbi;
  // Take-off angle: elevation of the strongest radiation in the plane of the maximum, toward
  // the front.
  r.takeoff_elevation_deg = r.max_gain_elevation_deg;

  // The low-angle table: the azimuth cut at each low elevation and its best sample.
  std::vector<PatternCut> low_cuts;
  for (double el : kLowAngleElevations_deg) {
    low_cuts.push_back(AzimuthCut(eval, el, n_az, step));
    r.low_angle.push_back(BestOverAzimuth(low_cuts.back()));
  }

  // Elevation cut: angle 0 is the horizon toward its azimuth, 90 the zenith, 180 the horizon
  // behind (in free space it continues below). By default its azimuth is that of the
  // strongest low-angle gain; when the maximum's own azimuth does as well there (a vertical's
  // circle, a beam's main lobe), that one, so the cut also passes through the maximum.
  double cut_az = 0.0;
  if (options.elevation_cut_azimuth_deg) {
    cut_az = std::fmod(*options.elevation_cut_azimuth_deg, 360.0);
    r.elevation_cut.choice = CutChoice::kGiven;
  } else {
    const DirectionGain strongest = *std::max_element(
        r.low_angle.begin(), r.low_angle.end(),
        [](const DirectionGain& a, const DirectionGain& b) { return a.gain_dbi < b.gain_dbi; });
    cut_az =
        gain_at(strongest.elevation_deg, r.max_gain_azimuth_deg) >= strongest.gain_dbi - kLobeTieDb
            ? r.max_gain_azimuth_deg
            : strongest.azimuth_deg;
    r.elevation_cut.choice = CutChoice::kStrongestLowAngle;
  }
  r.elevation_cut.plane = "elevation";
  r.elevation_cut.fixed_angle_deg = cut_az;
  const int cut_hi = over_ground ? 2 * per_quadrant : 3 * per_quadrant;
  const int cut_lo = over_ground ? 0 : -per_quadrant;
  {
    std::vector<std::pair<double, double>> cut;
    for (int i = cut_lo; i <= cut_hi; ++i) {
      const double a = i * step;
      const double el = a <= 90.0 ? a : 180.0 - a;
      const double az = a <= 90.0 ? cut_az : cut_az + 180.0;
      cut.emplace_back(el, std::fmod(az, 360.0));
    }
    const std::vector<FarFieldPoint> points = eval.AtAll(cut);
    for (int i = cut_lo; i <= cut_hi; ++i) Append(&r.elevation_cut, i * step, points[i - cut_lo]);
  }
  if (over_ground) {
    r.elevation_cut.beamwidth_deg = Beamwidth(r.elevation_cut, false);
  } else {
    PatternCut closed = r.elevation_cut;  // -90..270 is a full circle: drop the repeat
    closed.angle_deg.pop_back();
    closed.gain_dbi.pop_back();
    r.elevation_cut.beamwidth_deg = Beamwidth(closed, true);
  }

  // Azimuth cut: at the take-off angle, unless the maximum is near the zenith, where that
  // would be a small circle around it; then at a low angle.
  CutChoice az_choice = CutChoice::kTakeoff;
  double cut_el = r.takeoff_elevation_deg;
  if (options.azimuth_cut_elevation_deg) {
    cut_el = *options.azimuth_cut_elevation_deg;
    az_choice = CutChoice::kGiven;
  } else if (std::abs(r.takeoff_elevation_deg) > kNearZenithElevation_deg) {
    cut_el = kLowAzimuthCutElevation_deg;
    az_choice = CutChoice::kLowAngleNearZenith;
  }
  const auto same_cut = std::find_if(low_cuts.begin(), low_cuts.end(), [&](const PatternCut& c) {
    return c.fixed_angle_deg == cut_el;
  });
  r.azimuth_cut = same_cut != low_cuts.end() ? *same_cut : AzimuthCut(eval, cut_el, n_az, step);
  r.azimuth_cut.choice = az_choice;
  {
    PatternCut closed = r.azimuth_cut;  // without the repeated 360
    closed.angle_deg.pop_back();
    closed.gain_dbi.pop_back();
    r.azimuth_cut.beamwidth_deg = Beamwidth(closed, true);
    const auto [lo, hi] = std::minmax_element(closed.gain_dbi.begin(), closed.gain_dbi.end());
    if (*hi - *lo >= kMinFrontContrastDb) {
      const int front = static_cast<int>(hi - closed.gain_dbi.begin());
      auto at = [&](int offset) { return closed.gain_dbi[(front + offset) % n_az]; };
      r.front_to_back_db = *hi - at(2 * per_quadrant);
      r.front_to_side_db = *hi - std::max(at(per_quadrant), at(3 * per_quadrant));
    } else {
      r.azimuth_cut.beamwidth_deg.reset();  // omnidirectional: no lobe to measure
    }
  }

  // Power budget and the energy check.
  r.power.input_w = eval.input_w;
  r.power.radiated_w = eval.source.RadiatedPower(eval.threads, [&](int n) { progress.Advance(n); });
  for (const LoadResult& l : solved.loads) r.power.loads_w += l.power_w;
  r.power.wires_w = solved.wire_loss_w;
  r.power.efficiency_computed = r.power.radiated_w / r.power.input_w;
  r.power.efficiency = std::min(r.power.efficiency_computed, 1.0);
  if (r.power.efficiency_computed > 1.0 + kEfficiencyNoteAbove) {
    // Energy conservation (Poynting's theorem): the radiated power cannot exceed the input.
    // Above it the far-field integral and the feed's 0.5 Re(V I*) disagree by the
    // discretization's power-balance error (thick wires, coarse segments): say so, and report
    // the physical bound. Beyond kBalanceTolerance the balance check below also warns.
    r.power.efficiency_note = fmt::format(
        "the radiated power came out {:.3g}% above the input, which no antenna can do: the "
        "power-balance error of the discretization ({} the {:g}% tolerance); the efficiency is "
        "shown as 100%",
        100.0 * (r.power.efficiency_computed - 1.0),
        r.power.efficiency_computed - 1.0 > kBalanceTolerance ? "beyond" : "within",
        100.0 * kBalanceTolerance);
  }
  const double accounted = r.power.radiated_w + r.power.loads_w + r.power.wires_w;
  if (model.ground.kind == GroundKind::kReal) {
    // The ground takes what is neither radiated nor dissipated in the antenna.
    r.power.ground_w = r.power.input_w - accounted;
    if (r.power.ground_w < -kBalanceTolerance * r.power.input_w) {
      Warning w;
      w.location = model.ground.location;
      w.message = fmt::format(
          "the ground loss comes out negative ({:.1f}% of the input): the antenna is too close "
          "to the real ground for the reflection-coefficient approximation; the gain and "
          "efficiency here are not reliable",
          100.0 * r.power.ground_w / r.power.input_w);
      r.warnings.push_back(std::move(w));
    }
    return r;
  }
  r.power.balance_error = (accounted - r.power.input_w) / r.power.input_w;
  if (std::abs(r.power.balance_error) > kBalanceTolerance) {
    Warning w;
    w.location.file = model.file;
    w.message = fmt::format(
        "power balance is off by {:.1f}%: radiated ({:.4g} W) plus dissipated "
        "({:.4g} W) should equal the input ({:.4g} W); the mesh is probably too "
        "coarse or the geometry outside the thin-wire model (wires closer than a "
        "few radii): give more segments or separate the wires",
        100.0 * r.power.balance_error, r.power.radiated_w, r.power.loads_w + r.power.wires_w,
        r.power.input_w);
    r.warnings.push_back(std::move(w));
  }
  return r;
}

}  // namespace post
}  // namespace wirefield
