// Geometry stage: the mesher. Model -> Mesh (segments, triangle bases, feed and load ports),
// plus the geometry diagnostics: errors for feeds or loads at free ends and for models too
// large for memory, for wires below or on the ground, warnings for short or long segments,
// crossings and the clearance above a real ground.
#include "geometry/mesh.hpp"

#include <fmt/format.h>

#include <algorithm>
#include <cmath>
#include <map>
#include <numeric>
#include <set>
#include <utility>

#include "core/constants.hpp"
#include "model/thin_wire.hpp"

namespace wirefield::geometry {
namespace {

// Segments shorter than this many radii make the reduced thin-wire kernel inaccurate
// (common practice: the thin-wire approximation wants segment length >> radius).
constexpr double kMinSegmentRadii = 4.0;
// Segments longer than this fraction of a wavelength under-resolve the current
// (common practice: 0.1 wavelength is the usual upper bound for piecewise-linear bases).
constexpr double kMaxSegmentWavelengths = 0.1;
// Segments shorter than this many radii are refused: the reduced thin-wire kernel fails there.
// Measured on a centre-fed 10.2 m dipole at 14.2 MHz against its value at 4 radii (docs/
// numerics.md, "Segments short against the radius"): radius 5 cm, |dZ|/|Z| is 5.6% at one
// radius, 10% at 0.8, 31% at 0.6, 67% at 0.5 and 100% at 0.25 (2.3e-5 - j0.046 ohm at 0.2);
// radius 2 cm, 1.7% at one radius, 10% at 0.6, 25% at 0.5.
constexpr double kMinSegmentOfRadius = 1.0;
// Relative slack on that bound, so that a wire of exactly N radii in N segments passes despite
// the rounding of length / N.
constexpr double kSegmentBoundSlack = 1e-9;
// Below this length in wavelengths the longest wire is electrically small: the radiation
// resistance falls as the square of the length (a short dipole's 80 pi^2 (l/lambda)^2 ohm,
// Balanis, Antenna Theory, 3rd ed., eq. 4-37; from memory) to milliohms, so every result is
// a tiny difference of large numbers. 0.01 wavelength (a 10 m wire below 300 kHz) is the
// threshold (common practice); every bundled model is above 0.1.
constexpr double kElectricallySmallWavelengths = 0.01;
// Two wires leaving a joint in directions within about 8 degrees of opposite continue each
// other straight on (cos 172 deg = -0.99).
constexpr double kStraightThroughCosine = 0.99;
// Mesh nodes closer than this fraction of the shortest wire coincide.
constexpr double kJoinRelativeTolerance = 1e-6;
// Radii below this fraction of the wire length are not physical and would underflow the
// reduced kernel's radius squared.
constexpr double kMinRadiusOfLength = 1e-12;
// Hard cap on unknowns whatever the memory: a dense LU of this size already takes hours.
constexpr long long kMaxUnknowns = 40000;
// Segment counts tried, one fewer each time, when looking for the largest count whose segments
// are all long enough: more are needed only where feeds, loads or bends crowd one stretch.
constexpr int kMaxRemeshTries = 64;

Vec3 ToVec(const Point& p) { return Vec3(p[0], p[1], p[2]); }

double GiB(double bytes) { return bytes / (1024.0 * 1024.0 * 1024.0); }

const char* EndName(bool at_end) { return at_end ? "end" : "start"; }

// A wire end, for joint clustering.
struct EndRef {
  int wire = 0;
  bool at_end = false;
};

struct WireLayout {
  Vec3 from, to;
  std::vector<Vec3> corners;     // from, the bends, to (two for a straight wire)
  std::vector<double> corner_m;  // each corner's distance along the wire from its start
  double length_m = 0.0;
  std::vector<double> nodes_m;  // node distances from the start, first 0, last length
  int first_segment = 0;

  // The point at distance s_m along the wire; exactly the corner at a corner's distance.
  Vec3 PointAt(double s_m) const {
    size_t leg = 0;
    while (leg + 2 < corners.size() && s_m >= corner_m[leg + 1]) ++leg;
    if (s_m == corner_m[leg]) return corners[leg];
    const Vec3 dir = (corners[leg + 1] - corners[leg]) / (corner_m[leg + 1] - corner_m[leg]);
    return corners[leg] + dir * (s_m - corner_m[leg]);
  }
};

// A node of a wire: its index in WireLayout::nodes_m.
struct NodeRef {
  int wire = 0;
  int node = 0;
};

// The index of the node nearest to the distance s_m along a wire.
int NearestNode(const std::vector<double>& nodes_m, double s_m) {
  int k = 0;
  for (size_t i = 0; i < nodes_m.size(); ++i) {
    if (std::abs(nodes_m[i] - s_m) < std::abs(nodes_m[k] - s_m)) k = static_cast<int>(i);
  }
  return k;
}

int FindWire(const Model& model, const std::string& name, const SourceLocation& where) {
  for (size_t i = 0; i < model.wires.size(); ++i) {
    if (model.wires[i].name == name) return static_cast<int>(i);
  }
  throw InputError(where, fmt::format("unknown wire '{}'", name));
}

// Splits [0, length] at the required interior positions and at the bends into `count`
// segments, giving each interval a share proportional to its length (at least one segment
// each). A required position within merge_tol_m of a bend is the bend.
std::vector<double> PlaceNodes(double length_m, std::vector<double> required_m,
                               const std::vector<double>& bends_m, int count, double merge_tol_m) {
  std::sort(required_m.begin(), required_m.end());
  auto near_bend = [&](double r) {
    return std::any_of(bends_m.begin(), bends_m.end(),
                       [&](double b) { return std::abs(r - b) <= merge_tol_m; });
  };
  std::vector<double> breaks{0.0};
  size_t next_bend = 0;
  for (double r : required_m) {
    if (near_bend(r)) continue;
    while (next_bend < bends_m.size() && bends_m[next_bend] < r) {
      breaks.push_back(bends_m[next_bend++]);
    }
    if (r > merge_tol_m && r < length_m - merge_tol_m && r - breaks.back() > merge_tol_m) {
      breaks.push_back(r);
    }
  }
  while (next_bend < bends_m.size()) breaks.push_back(bends_m[next_bend++]);
  breaks.push_back(length_m);
  const int intervals = static_cast<int>(breaks.size()) - 1;
  count = std::max(count, intervals);
  // Largest-remainder apportionment of `count` segments over the intervals.
  std::vector<int> share(intervals, 1);
  int left = count - intervals;
  std::vector<double> want(intervals);
  for (int i = 0; i < intervals; ++i) {
    want[i] = (breaks[i + 1] - breaks[i]) / length_m * count - 1.0;
  }
  while (left > 0) {
    int best = 0;
    for (int i = 1; i < intervals; ++i) {
      if (want[i] - share[i] > want[best] - share[best]) best = i;
    }
    ++share[best];
    --left;
  }
  std::vector<double> nodes{0.0};
  for (int i = 0; i < intervals; ++i) {
    for (int k = 1; k < share[i]; ++k) {
      nodes.push_back(breaks[i] + (breaks[i + 1] - breaks[i]) * k / share[i]);
    }
    nodes.push_back(breaks[i + 1]);
  }
  nodes.back() = length_m;
  return nodes;
}

// The shortest interval between consecutive node positions.
double ShortestInterval(const std::vector<double>& nodes_m) {
  double shortest = INFINITY;
  for (size_t k = 0; k + 1 < nodes_m.size(); ++k) {
    shortest = std::min(shortest, nodes_m[k + 1] - nodes_m[k]);
  }
  return shortest;
}

}  // namespace

double MatrixBytes(long long unknowns) {
  return 16.0 * static_cast<double>(unknowns) * static_cast<double>(unknowns);
}

double SegmentDistance(const Vec3& p0, const Vec3& p1, const Vec3& q0, const Vec3& q1,
                       Vec3* closest_midpoint) {
  // Closest points of two segments (clamped line-line solution).
  const Vec3 d1 = p1 - p0, d2 = q1 - q0, r = p0 - q0;
  const double a = d1.squaredNorm(), e = d2.squaredNorm(), f = d2.dot(r);
  double s = 0.0, t = 0.0;
  const double c = d1.dot(r), b = d1.dot(d2);
  const double denom = a * e - b * b;
  s = denom > 1e-300 ? std::clamp((b * f - c * e) / denom, 0.0, 1.0) : 0.0;
  t = (b * s + f) / e;
  if (t < 0.0) {
    t = 0.0;
    s = std::clamp(-c / a, 0.0, 1.0);
  } else if (t > 1.0) {
    t = 1.0;
    s = std::clamp((b - c) / a, 0.0, 1.0);
  }
  const Vec3 cp = p0 + d1 * s, cq = q0 + d2 * t;
  if (closest_midpoint) *closest_midpoint = 0.5 * (cp + cq);
  return (cp - cq).norm();
}

namespace {

// The stretch over which two straight legs run along each other closer than `reach` (the sum
// of their radii): the part of one leg covered by the projection of the other, when both ends
// of the other lie within `reach` of its line. 0 for legs that cross, meet at an angle or only
// touch end to end. from and to: the ends of the stretch.
double OverlapLength(const Vec3& p0, const Vec3& p1, const Vec3& q0, const Vec3& q1, double reach,
                     Vec3* from, Vec3* to) {
  auto along = [&](const Vec3& a0, const Vec3& a1, const Vec3& b0, const Vec3& b1) {
    const double length = (a1 - a0).norm();
    const Vec3 u = (a1 - a0) / length;
    auto off_line = [&](const Vec3& x) { return ((x - a0) - (x - a0).dot(u) * u).norm(); };
    if (off_line(b0) > reach || off_line(b1) > reach) return 0.0;
    const double t0 = (b0 - a0).dot(u), t1 = (b1 - a0).dot(u);
    const double lo = std::max(0.0, std::min(t0, t1)), hi = std::min(length, std::max(t0, t1));
    if (hi <= lo) return 0.0;
    *from = a0 + lo * u;
    *to = a0 + hi * u;
    return hi - lo;
  };
  const double on_p = along(p0, p1, q0, q1);
  return on_p > 0.0 ? on_p : along(q0, q1, p0, p1);
}

// Below this height in wavelengths the reflection-coefficient approximation of a real ground
// errs by more than a few percent in the self-interaction of a wire (docs/numerics.md).
constexpr double kRealGroundWarnHeightWavelengths = 0.2;

// What a mixture of the exact ground (below exact_below) and the reflection coefficients
// (above it) did to two models whose wires span the height, against the exact ground for every
// pair (tests/validation/exact_ground_everywhere_test.cpp).
constexpr const char* kMixedGroundMeasured =
    "4.0% on a vertical half-wave dipole for 7.1 MHz from 1 m to 21.3 m over average ground, 1.2% "
    "on a 14.2 MHz end-fed sloper from 2 m to 9 m over medium dry ground, with exact_below at 0.3 "
    "wavelength";

// The thin-coating approximation of an insulated wire takes the field across the jacket as
// static, which needs the jacket thin against the wavelength in the plastic: at a hundredth of
// it, k t = 0.063 (docs/numerics.md, "Insulated wire").
constexpr double kMaxCoatingWavelengths = 0.01;

// An insulated wire whose jacket is not thin against the wavelength in it: say so.
void InsulationWarning(const WireSpec& spec, double frequency_hz, std::vector<Warning>* warnings) {
  if (!spec.insulation) return;
  const InsulationSpec& jacket = *spec.insulation;
  const double wavelength_m =
      core::kSpeedOfLight_m_per_s / (frequency_hz * std::sqrt(jacket.relative_permittivity));
  if (jacket.thickness_m <= kMaxCoatingWavelengths * wavelength_m) return;
  warnings->push_back(
      {jacket.location,
       fmt::format("wire '{}': the insulation, {:.3g} m thick, is {:.3g} of the wavelength in "
                   "it at {:.6g} MHz (more than {:g}): the thin-coating approximation needs a "
                   "jacket thin against that wavelength; check the thickness",
                   spec.name, jacket.thickness_m, jacket.thickness_m / wavelength_m,
                   frequency_hz / 1e6, kMaxCoatingWavelengths)});
}

// A wire low over a real ground, or connected to it: say what the model misses. exact_m:
// the height below which the matrix uses the exact half-space (0 when it does not).
void RealGroundWarning(const WireSpec& spec, bool connected, double zmin_m, double wavelength_m,
                       double frequency_hz, double exact_m, std::vector<Warning>* warnings) {
  const bool exact = zmin_m < exact_m;
  if (connected) {
    warnings->push_back(
        {spec.location,
         fmt::format("wire '{}' connects to the real ground: the connection is an ideal ground "
                     "stake (no stake or radial loss){}; treat the impedance and the ground loss "
                     "as estimates",
                     spec.name,
                     exact ? ""
                           : ", and the reflection-coefficient approximation is weak for wires "
                             "this close to the ground")});
    return;
  }
  const double h = zmin_m / wavelength_m;
  if (h >= kRealGroundWarnHeightWavelengths || exact) return;
  warnings->push_back(
      {spec.location,
       fmt::format("wire '{}' comes down to {:.3g} wavelength ({:.3g} m at {:.4g} MHz) above the "
                   "real ground, where the reflection-coefficient approximation is weak (its "
                   "self-interaction error is a few percent at 0.2 wavelength and tens of percent "
                   "at 0.1 wavelength); treat the impedance and the ground loss as estimates, or "
                   "use the exact ground (ground real ... method=exact)",
                   spec.name, h, zmin_m, frequency_hz / 1e6)});
}

// An explicit exact_below that some pairs of segments fall below and others not: the matrix
// mixes the two ground methods, which on wires spanning the height is worse than either.
void MixedGroundWarning(const Mesh& mesh, std::vector<Warning>* warnings) {
  const GroundSpec& g = mesh.ground;
  if (g.kind != GroundKind::kReal || g.method != GroundMethod::kExact || !g.exact_below_m ||
      *g.exact_below_m <= 0.0 || mesh.segments.empty()) {
    return;
  }
  double low = INFINITY, high = -INFINITY;
  for (const Segment& s : mesh.segments) {
    low = std::min({low, s.start.z(), s.end.z()});
    high = std::max({high, s.start.z(), s.end.z()});
  }
  if (!(low < *g.exact_below_m && high > *g.exact_below_m)) return;
  warnings->push_back(
      {g.location,
       fmt::format("ground real: exact_below={:.4g} m mixes two ground methods in one matrix: the "
                   "exact half-space for pairs of segments below that mean height, the "
                   "reflection-coefficient approximation above it; on wires that span the height "
                   "(this model reaches from {:.3g} m to {:.3g} m) the mixture can be several "
                   "percent off the exact ground everywhere (measured: {}); remove exact_below "
                   "for the exact ground everywhere (the default), or use method=reflection for "
                   "the fast approximation",
                   *g.exact_below_m, low, high, kMixedGroundMeasured)});
}

}  // namespace

Mesh BuildMesh(const Model& model, const MeshOptions& options) {
  Mesh mesh;
  const SourceLocation file_location{model.file, 0, 0};
  if (model.wires.empty())
    throw InputError(file_location,
                     "the model has no wire; add 'wire NAME from (X, Y, Z) to (X, Y, Z) radius R'");
  if (model.feeds.empty())
    throw InputError(file_location, "the model has no feed; add 'feed NAME at WIRE@POS'");
  const bool has_ground = model.ground.kind != GroundKind::kFree;
  mesh.ground_images = has_ground;
  mesh.ground = model.ground;
  const double wavelength_m = core::kSpeedOfLight_m_per_s / options.max_frequency_hz;

  const int wire_count = static_cast<int>(model.wires.size());
  std::vector<WireLayout> layout(wire_count);
  double shortest_m = INFINITY;
  for (int w = 0; w < wire_count; ++w) {
    WireLayout& wl = layout[w];
    wl.from = ToVec(model.wires[w].from_m);
    wl.to = ToVec(model.wires[w].to_m);
    for (const Point& p : WirePath(model.wires[w])) wl.corners.push_back(ToVec(p));
    wl.corner_m.push_back(0.0);
    for (size_t i = 0; i + 1 < wl.corners.size(); ++i) {
      const double leg_m = (wl.corners[i + 1] - wl.corners[i]).norm();
      if (!(leg_m > 0.0)) {
        throw InputError(model.wires[w].location,
                         wl.corners.size() == 2
                             ? fmt::format("wire '{}' has zero length; give it different end "
                                           "points",
                                           model.wires[w].name)
                             : fmt::format("wire '{}': its leg {} has zero length; give its "
                                           "corners different points",
                                           model.wires[w].name, i + 1));
      }
      wl.corner_m.push_back(wl.corner_m.back() + leg_m);
    }
    layout[w].length_m = wl.corner_m.back();
    if (!(model.wires[w].radius_m >= kMinRadiusOfLength * layout[w].length_m)) {
      throw InputError(
          model.wires[w].location,
          fmt::format("wire '{}' has a radius of {:.3g} m, below {:g} of its "
                      "length: no real wire is that thin; give the real radius",
                      model.wires[w].name, model.wires[w].radius_m, kMinRadiusOfLength));
    }
    shortest_m = std::min(shortest_m, layout[w].length_m);
  }
  const double join_tol_m = kJoinRelativeTolerance * shortest_m;

  // Positions that need a node: feeds and loads.
  std::vector<std::vector<double>> required(wire_count);
  auto require = [&](const WirePointSpec& at) {
    const int w = FindWire(model, at.wire, at.location);
    required[w].push_back(PositionAlong(at, layout[w].length_m));
  };
  for (const auto& f : model.feeds) require(f.at);
  for (const auto& l : model.loads) require(l.at);
  // And the points inside an earlier wire where a wire's corner was written as WIRE@POS.
  for (const WireSpec& spec : model.wires) {
    for (const WireTap& tap : spec.taps) {
      const int h = FindWire(model, tap.on.wire, tap.on.location);
      const double s_m = PositionAlong(tap.on, layout[h].length_m);
      if (s_m > 0.0 && s_m < layout[h].length_m) required[h].push_back(s_m);
    }
  }

  // The thin-wire kernel needs wires thin against the wavelength (k a << 1): a radius above
  // model::kMaxRadiusOfWavelength of the shortest wavelength is refused at the radius value,
  // with a hint when it looks written in the wrong unit.
  for (int w = 0; w < wire_count; ++w) {
    const WireSpec& spec = model.wires[w];
    const double max_radius_m = model::kMaxRadiusOfWavelength * wavelength_m;
    if (spec.radius_m > max_radius_m) {
      throw InputError(
          model::RadiusLocation(spec),
          fmt::format("wire '{}': the radius {:.3g} m is {:.3g}% of the wavelength ({:.3g} m at "
                      "{:.6g} MHz); the thin-wire model needs a radius under {:g}% of the "
                      "wavelength; use a thinner wire or a lower frequency{}",
                      spec.name, spec.radius_m, 100.0 * spec.radius_m / wavelength_m, wavelength_m,
                      options.max_frequency_hz / 1e6, 100.0 * model::kMaxRadiusOfWavelength,
                      model::RadiusUnitHint(spec, max_radius_m)));
    }
  }

  // Segment counts: given, or enough for the highest frequency. Check the size before any
  // large allocation happens.
  long long total_segments = 0;
  std::vector<int> counts(wire_count);
  for (int w = 0; w < wire_count; ++w) {
    const WireSpec& spec = model.wires[w];
    long long n = spec.segments;
    if (n <= 0) {
      const double wanted =
          std::ceil(layout[w].length_m / wavelength_m * options.segments_per_wavelength);
      double chosen = std::max<double>(options.min_segments_per_wire, std::min(wanted, 1e12));
      // Keep automatic segments at least kMinSegmentRadii radii long where possible.
      const double radii_cap = std::floor(layout[w].length_m / (kMinSegmentRadii * spec.radius_m));
      if (radii_cap >= 1.0 && chosen > radii_cap) chosen = radii_cap;
      n = static_cast<long long>(chosen);
    }
    n = std::max<long long>(n, static_cast<long long>(layout[w].corners.size()) - 1);
    if (n > kMaxUnknowns) {
      throw InputError(spec.location,
                       fmt::format("wire '{}' would need {} segments; the matrix would take "
                                   "{:.1f} GiB: give fewer segments or a lower frequency "
                                   "(at most {} unknowns)",
                                   spec.name, n, GiB(MatrixBytes(n)), kMaxUnknowns));
    }
    counts[w] = static_cast<int>(n);
    total_segments += n;
  }
  if (total_segments > kMaxUnknowns || MatrixBytes(total_segments) > options.max_matrix_bytes) {
    throw InputError(
        file_location,
        fmt::format("the model needs about {} unknowns; the matrix would take "
                    "{:.2f} GiB, more than the {:.2f} GiB this run may use: give "
                    "fewer segments or solve at a lower frequency",
                    total_segments, GiB(MatrixBytes(total_segments)),
                    GiB(std::min(options.max_matrix_bytes, MatrixBytes(kMaxUnknowns)))));
  }

  // Nodes and segments.
  for (int w = 0; w < wire_count; ++w) {
    const WireSpec& spec = model.wires[w];
    const std::vector<double> bends(layout[w].corner_m.begin() + 1, layout[w].corner_m.end() - 1);
    layout[w].nodes_m = PlaceNodes(layout[w].length_m, required[w], bends, counts[w], join_tol_m);
    const double shortest_allowed_m = kMinSegmentOfRadius * spec.radius_m;
    auto long_enough = [&](const std::vector<double>& nodes_m) {
      return ShortestInterval(nodes_m) >= shortest_allowed_m * (1.0 - kSegmentBoundSlack);
    };
    if (!long_enough(layout[w].nodes_m)) {
      // Below the radius the kernel fails: refuse the model with the largest count that keeps
      // every segment long enough. An automatic count is already capped at kMinSegmentRadii
      // radii, and the largest-remainder shares then never cut a stretch of at least one
      // radius below it: it comes here only where the feeds, loads or bends leave a stretch
      // shorter than the radius, which no count mends.
      int fewer = static_cast<int>(std::min<double>(
          counts[w] - 1,
          std::floor(layout[w].length_m / shortest_allowed_m * (1.0 + kSegmentBoundSlack))));
      bool found = false;
      for (int tries = 0; fewer >= 1 && tries < kMaxRemeshTries; ++tries, --fewer) {
        found = long_enough(PlaceNodes(layout[w].length_m, required[w], bends, fewer, join_tol_m));
        if (found) break;
      }
      const std::string what = fmt::format(
          "wire '{}': segments as short as {:.3g} m are shorter than its radius ({:.3g} m), "
          "where the thin-wire kernel fails (measured: 5.6% off at one radius, 67% at half of "
          "it; docs/numerics.md)",
          spec.name, ShortestInterval(layout[w].nodes_m), spec.radius_m);
      if (spec.segments > 0 && found) {
        throw InputError(spec.location,
                         fmt::format("{}; the shortest segment allowed is {:.3g} m: give at most "
                                     "{} segments, or leave 'segments' out",
                                     what, shortest_allowed_m, fewer));
      }
      throw InputError(spec.location,
                       fmt::format("{}; its feeds, loads and bends leave a stretch shorter than "
                                   "that whatever the segment count: move them at least {:.3g} m "
                                   "apart, or give a thinner wire",
                                   what, shortest_allowed_m));
    }
    layout[w].first_segment = static_cast<int>(mesh.segments.size());
    for (size_t k = 0; k + 1 < layout[w].nodes_m.size(); ++k) {
      Segment s;
      s.start = layout[w].PointAt(layout[w].nodes_m[k]);
      s.end = layout[w].PointAt(layout[w].nodes_m[k + 1]);
      if (k + 2 == layout[w].nodes_m.size()) s.end = layout[w].to;
      s.radius_m = spec.radius_m;
      s.wire = w;
      mesh.segments.push_back(s);
    }
    const int used = static_cast<int>(layout[w].nodes_m.size()) - 1;
    mesh.wires.push_back({spec.name, spec.segments, used});
  }
  auto segment_at = [&](int w, bool at_end) {
    return at_end ? layout[w].first_segment + static_cast<int>(layout[w].nodes_m.size()) - 2
                  : layout[w].first_segment;
  };

  // Joints: cluster wire ends, and join the nodes of taps; each joint of m pieces (one per end
  // and two per node inside a wire) gets m - 1 bases through its first piece.
  std::vector<std::vector<EndRef>> joints;
  std::vector<int> end_joint(2 * static_cast<size_t>(wire_count),
                             -1);  // index 2w + at_end -> joint
  for (int w = 0; w < wire_count; ++w) {
    for (int e = 0; e < 2; ++e) {
      const Vec3 p = e ? layout[w].to : layout[w].from;
      int found = -1;
      for (size_t j = 0; j < joints.size() && found < 0; ++j) {
        const EndRef& r = joints[j].front();
        const Vec3 q = r.at_end ? layout[r.wire].to : layout[r.wire].from;
        if ((p - q).norm() <= join_tol_m) found = static_cast<int>(j);
      }
      if (found < 0) {
        found = static_cast<int>(joints.size());
        joints.push_back({});
      }
      joints[found].push_back({w, e == 1});
      end_joint[2 * w + e] = found;
    }
  }
  // Taps: a corner written as WIRE@POS joins the wire named there. Where both are wire ends
  // they coincide and are clustered above; a node inside a wire joins as a mid node, whose two
  // pieces take the place of its own triangle basis, so that the current may turn into the
  // other wire (a T-junction).
  std::vector<std::vector<NodeRef>> joint_mids(joints.size());
  std::set<std::pair<int, int>> mid_nodes;
  auto joint_of = [&](const NodeRef& r) {
    const int last = static_cast<int>(layout[r.wire].nodes_m.size()) - 1;
    if (r.node == 0 || r.node == last) return end_joint[2 * r.wire + (r.node == last ? 1 : 0)];
    for (size_t j = 0; j < joint_mids.size(); ++j) {
      for (const NodeRef& m : joint_mids[j]) {
        if (m.wire == r.wire && m.node == r.node) return static_cast<int>(j);
      }
    }
    return -1;
  };
  for (int w = 0; w < wire_count; ++w) {
    for (const WireTap& tap : model.wires[w].taps) {
      const int h = FindWire(model, tap.on.wire, tap.on.location);
      const NodeRef on{h,
                       NearestNode(layout[h].nodes_m, PositionAlong(tap.on, layout[h].length_m))};
      const NodeRef corner{w, NearestNode(layout[w].nodes_m, layout[w].corner_m[tap.corner])};
      int into = std::max(joint_of(on), joint_of(corner));
      if (into < 0) {
        into = static_cast<int>(joints.size());
        joints.emplace_back();
        joint_mids.emplace_back();
      }
      for (const NodeRef& r : {on, corner}) {
        const int j = joint_of(r);
        if (j == into) continue;
        if (j < 0) {
          joint_mids[into].push_back(r);
          mid_nodes.insert({r.wire, r.node});
          continue;
        }
        // Two joints meet: the members of j move into `into`, leaving j empty.
        for (const EndRef& e : joints[j]) {
          joints[into].push_back(e);
          end_joint[2 * e.wire + (e.at_end ? 1 : 0)] = into;
        }
        joint_mids[into].insert(joint_mids[into].end(), joint_mids[j].begin(), joint_mids[j].end());
        joints[j].clear();
        joint_mids[j].clear();
      }
    }
  }

  // Interior nodes: one triangle basis each, current along the wire, but for those in a joint.
  for (int w = 0; w < wire_count; ++w) {
    const int n = static_cast<int>(layout[w].nodes_m.size()) - 1;
    for (int k = 1; k < n; ++k) {
      if (mid_nodes.count({w, k}) != 0) continue;
      Basis b;
      b.pieces[0] = {layout[w].first_segment + k - 1, true, +1.0};
      b.pieces[1] = {layout[w].first_segment + k, false, -1.0};
      b.piece_count = 2;
      mesh.bases.push_back(b);
    }
  }

  std::vector<bool> joint_on_ground(joints.size(), false);
  for (size_t j = 0; j < joints.size(); ++j) {
    const auto& ends = joints[j];
    const auto& mids = joint_mids[j];
    if (ends.empty() && mids.empty()) continue;  // merged into another joint
    const Vec3 p = !ends.empty() ? (ends.front().at_end ? layout[ends.front().wire].to
                                                        : layout[ends.front().wire].from)
                                 : layout[mids.front().wire].PointAt(
                                       layout[mids.front().wire].nodes_m[mids.front().node]);
    joint_on_ground[j] = has_ground && std::abs(p.z()) <= join_tol_m;
    std::vector<Piece> pieces;  // each with sign +1
    for (const EndRef& end : ends) pieces.push_back({segment_at(end.wire, end.at_end), end.at_end});
    for (const NodeRef& m : mids) {
      pieces.push_back({layout[m.wire].first_segment + m.node - 1, true});
      pieces.push_back({layout[m.wire].first_segment + m.node, false});
    }
    if (joint_on_ground[j]) {
      for (const Piece& piece : pieces) {
        Basis b;
        b.pieces[0] = piece;
        b.piece_count = 1;
        mesh.bases.push_back(b);
      }
    } else {
      for (size_t k = 1; k < pieces.size(); ++k) {
        Basis b;
        b.pieces[0] = pieces[0];
        b.pieces[1] = pieces[k];
        b.pieces[1].sign = -1.0;
        b.piece_count = 2;
        mesh.bases.push_back(b);
      }
    }
  }

  // Ports: the bases whose pieces touch the gap, signed by their current along the wire.
  auto make_port = [&](const WirePointSpec& at, const std::string& what, const std::string& name) {
    const int w = FindWire(model, at.wire, at.location);
    const double pos = PositionAlong(at, layout[w].length_m);
    const int k = NearestNode(layout[w].nodes_m, pos);
    const int n = static_cast<int>(layout[w].nodes_m.size()) - 1;
    if (k == 0 || k == n) {
      const bool at_end = k == n;
      const int joint = end_joint[2 * w + (at_end ? 1 : 0)];
      // The wire pieces that meet at the joint: one per end, two per node inside a wire.
      const size_t members = joints[joint].size() + 2 * joint_mids[joint].size();
      if (members < 2 && !joint_on_ground[joint]) {
        // At the WIRE@POS text: the position is what to change.
        throw InputError(at.location,
                         fmt::format("{} '{}' is at the free {} of wire '{}', where nothing is "
                                     "connected: move it inside the wire (for example {}@50%) or "
                                     "join another wire{} there",
                                     what, name, EndName(at_end), model.wires[w].name,
                                     model.wires[w].name, has_ground ? " or the ground" : ""));
      }
      if (what == "feed" && members >= 3) {
        // The gap sits at the end of wire w only: the source drives wire w against all the
        // others joined there. That is meant at a mast's base among radials; it is likely a
        // slip when another wire continues wire w straight through the joint (a dipole's two
        // halves with a third wire hung from the middle).
        auto outward = [&](const EndRef& end) {
          const auto& c = layout[end.wire].corners;
          const Vec3 d = end.at_end ? Vec3(c[c.size() - 2] - c.back()) : Vec3(c[1] - c.front());
          return Vec3(d.normalized());
        };
        const Vec3 own = outward(EndRef{w, at_end});
        std::string straight_on, others;
        for (const EndRef& end : joints[joint]) {
          if (end.wire == w) continue;
          others += fmt::format("{}'{}'", others.empty() ? "" : ", ", model.wires[end.wire].name);
          if (own.dot(outward(end)) < -kStraightThroughCosine) {
            straight_on = model.wires[end.wire].name;
          }
        }
        if (!straight_on.empty()) {
          mesh.warnings.push_back(
              {at.location,
               fmt::format("feed '{}' is at a joint of {} wires; it is in series with wire '{}' "
                           "alone, driving it against {} together, not against '{}' alone, "
                           "which continues it straight on: move the feed inside the wire it "
                           "should drive if that is not what you meant",
                           name, joints[joint].size(), model.wires[w].name, others, straight_on)});
        }
      }
    }
    // The segment beside the gap and the node's side of it.
    const int seg = layout[w].first_segment + (k == 0 ? 0 : k - 1);
    const bool node_at_end = k != 0;
    Port port;
    port.segment = seg;
    for (size_t b = 0; b < mesh.bases.size(); ++b) {
      const Basis& basis = mesh.bases[b];
      for (int p = 0; p < basis.piece_count; ++p) {
        const Piece& piece = basis.pieces[p];
        if (piece.segment == seg && piece.node_at_end == node_at_end) {
          port.bases.emplace_back(static_cast<int>(b), piece.DirectionAtNode());
        }
      }
    }
    if (port.bases.empty()) {
      throw ComputationError(fmt::format("internal: no basis at {} '{}'", what, name));
    }
    return port;
  };
  for (const auto& f : model.feeds) mesh.feed_ports.push_back(make_port(f.at, "feed", f.name));
  for (const auto& l : model.loads) mesh.load_ports.push_back(make_port(l.at, "load", l.name));
  for (size_t i = 0; i < mesh.feed_ports.size(); ++i) {
    for (size_t j = 0; j < i; ++j) {
      if (mesh.feed_ports[i].segment == mesh.feed_ports[j].segment &&
          mesh.feed_ports[i].bases == mesh.feed_ports[j].bases) {
        throw InputError(model.feeds[i].location,
                         fmt::format("feeds '{}' and '{}' are at the same point; give each "
                                     "feed its own place",
                                     model.feeds[j].name, model.feeds[i].name));
      }
    }
  }

  // Warnings: segment length against radius and wavelength.
  for (int w = 0; w < wire_count; ++w) {
    const WireSpec& spec = model.wires[w];
    double shortest_seg = INFINITY, longest_seg = 0.0;
    for (int s = 0; s < mesh.wires[w].segments_used; ++s) {
      const double len = mesh.segments[layout[w].first_segment + s].length_m();
      shortest_seg = std::min(shortest_seg, len);
      longest_seg = std::max(longest_seg, len);
    }
    if (shortest_seg < kMinSegmentRadii * spec.radius_m) {
      mesh.warnings.push_back(
          {spec.location,
           fmt::format("wire '{}': segments as short as {:.3g} m are less than {} radii "
                       "(radius {:.3g} m): the thin-wire model loses accuracy; use fewer "
                       "segments or a thinner wire",
                       spec.name, shortest_seg, kMinSegmentRadii, spec.radius_m)});
    }
    InsulationWarning(spec, options.max_frequency_hz, &mesh.warnings);
    if (longest_seg > kMaxSegmentWavelengths * wavelength_m) {
      mesh.warnings.push_back(
          {spec.location,
           fmt::format("wire '{}': segments up to {:.3g} wavelength long at {:.6g} MHz "
                       "(more than {}): the current is under-resolved; give more segments "
                       "or leave 'segments' out",
                       spec.name, longest_seg / wavelength_m, options.max_frequency_hz / 1e6,
                       kMaxSegmentWavelengths)});
    }
  }
  // The whole antenna far shorter than the wavelength: legal, but dubious.
  int longest_wire = -1;
  double longest_wire_m = 0.0;
  for (int w = 0; w < wire_count; ++w) {
    double length_m = 0.0;
    for (int s = 0; s < mesh.wires[w].segments_used; ++s) {
      length_m += mesh.segments[layout[w].first_segment + s].length_m();
    }
    if (length_m > longest_wire_m) {
      longest_wire_m = length_m;
      longest_wire = w;
    }
  }
  if (longest_wire >= 0 && longest_wire_m < kElectricallySmallWavelengths * wavelength_m) {
    const WireSpec& spec = model.wires[longest_wire];
    mesh.warnings.push_back(
        {spec.location,
         fmt::format("the longest wire, '{}', is {:.3g} wavelengths long at {:.6g} MHz "
                     "({:.3g} m of a {:.3g} m wavelength): the antenna is electrically small, so "
                     "its radiation resistance is tiny and every result is sensitive to losses "
                     "and rounding; check the frequency's unit (kHz or MHz?)",
                     spec.name, longest_wire_m / wavelength_m, options.max_frequency_hz / 1e6,
                     longest_wire_m, wavelength_m)});
  }
  // Wires that cross or touch without a joint, leg by leg: legs that share an end (a bend of
  // one wire, or a joint of two) are connected there and are not a crossing.
  struct Leg {
    int wire = 0;
    Vec3 from, to;
    int from_id = 0, to_id = 0;  // a joint index, or a bend's own id past the joints
    std::vector<int> on_leg;     // the joints at nodes along the leg (of taps)
  };
  std::vector<Leg> legs;
  int next_bend_id = static_cast<int>(joints.size());
  for (int w = 0; w < wire_count; ++w) {
    const auto& corners = layout[w].corners;
    for (size_t i = 0; i + 1 < corners.size(); ++i) {
      Leg leg{w, corners[i], corners[i + 1], 0, 0, {}};
      leg.from_id = i == 0 ? end_joint[2 * static_cast<size_t>(w)] : next_bend_id - 1;
      leg.to_id =
          i + 2 == corners.size() ? end_joint[2 * static_cast<size_t>(w) + 1] : next_bend_id++;
      for (size_t j = 0; j < joint_mids.size(); ++j) {
        for (const NodeRef& m : joint_mids[j]) {
          if (m.wire != w) continue;
          const double s_m = layout[w].nodes_m[m.node];
          if (layout[w].corner_m[i] <= s_m && s_m <= layout[w].corner_m[i + 1]) {
            leg.on_leg.push_back(static_cast<int>(j));
          }
        }
      }
      legs.push_back(leg);
    }
  }
  // Legs that share a joint or a bend are connected there.
  auto joined = [](const Leg& p, const Leg& q) {
    std::vector<int> a = p.on_leg, b = q.on_leg;
    a.insert(a.end(), {p.from_id, p.to_id});
    b.insert(b.end(), {q.from_id, q.to_id});
    return std::find_first_of(a.begin(), a.end(), b.begin(), b.end()) != a.end();
  };
  std::set<std::pair<int, int>> warned;  // wire pairs already flagged
  for (size_t i = 0; i < legs.size(); ++i) {
    for (size_t j = i + 1; j < legs.size(); ++j) {
      const Leg& p = legs[i];
      const Leg& q = legs[j];
      // Legs that run along each other are two conductors in one place, whether or not they
      // share an end (a wire that folds back on itself, or on the wire it joins): refuse them,
      // at the later wire. Touching end to end is a joint and legal.
      const double reach = model.wires[p.wire].radius_m + model.wires[q.wire].radius_m;
      Vec3 lap_from, lap_to;
      const double lap_m = OverlapLength(p.from, p.to, q.from, q.to, reach, &lap_from, &lap_to);
      if (lap_m > std::max(reach, join_tol_m)) {
        const std::string& first = model.wires[p.wire].name;
        const std::string& later = model.wires[q.wire].name;
        throw InputError(
            model.wires[q.wire].location,
            fmt::format(
                "{} along {:.3g} m, from ({:.3g}, {:.3g}, {:.3g}) to ({:.3g}, {:.3g}, "
                "{:.3g}) m: two conductors in one place have no thin-wire solution; "
                "{}",
                p.wire == q.wire ? fmt::format("wire '{}' folds back onto itself", later)
                                 : fmt::format("wires '{}' and '{}' overlap", first, later),
                lap_m, lap_from.x(), lap_from.y(), lap_from.z(), lap_to.x(), lap_to.y(), lap_to.z(),
                p.wire == q.wire ? "move its corners so that its legs do not run over each other"
                                 : fmt::format("shorten '{}' so that it ends where '{}' ends (a "
                                               "joint), or move it apart",
                                               later, first)));
      }
      if (joined(p, q)) continue;
      const int a = p.wire, b = q.wire;
      if (warned.count({a, b}) != 0) continue;
      Vec3 where;
      const double d = SegmentDistance(p.from, p.to, q.from, q.to, &where);
      if (d > model.wires[a].radius_m + model.wires[b].radius_m) continue;
      warned.insert({a, b});
      if (a == b) {
        mesh.warnings.push_back(
            {model.wires[a].location,
             fmt::format("wire '{}' crosses or touches itself near ({:.3g}, {:.3g}, {:.3g}) m: "
                         "no current passes between its legs there; move its corners apart",
                         model.wires[a].name, where.x(), where.y(), where.z())});
      } else {
        mesh.warnings.push_back(
            {model.wires[b].location,
             fmt::format("wires '{}' and '{}' cross or touch near ({:.3g}, {:.3g}, {:.3g}) m "
                         "without a joint: no current passes between them there; split the "
                         "wires so that their ends meet, or move them apart",
                         model.wires[a].name, model.wires[b].name, where.x(), where.y(),
                         where.z())});
      }
    }
  }
  // Ground clearance, leg by leg: a wire end on the ground is connected to it; a leg lying
  // along the ground, or passing closer to it than the radius elsewhere, is not modelled.
  if (has_ground) {
    for (int w = 0; w < wire_count; ++w) {
      const WireSpec& spec = model.wires[w];
      const auto& corners = layout[w].corners;
      double zmin = INFINITY;
      size_t lowest = 0;
      bool too_close = false, connected = false;
      for (size_t i = 0; i < corners.size(); ++i) {
        if (corners[i].z() < zmin) {
          zmin = corners[i].z();
          lowest = i;
        }
        if (i + 1 == corners.size()) break;
        auto on_ground = [&](size_t c) {
          return (c == 0 || c + 1 == corners.size()) && std::abs(corners[c].z()) <= join_tol_m;
        };
        const bool from_on = on_ground(i), to_on = on_ground(i + 1);
        connected |= from_on || to_on;
        too_close |=
            (from_on && to_on) ||
            (!from_on && !to_on && std::min(corners[i].z(), corners[i + 1].z()) < spec.radius_m);
      }
      const bool real = model.ground.kind == GroundKind::kReal;
      if (zmin < -join_tol_m || too_close) {
        // A wire in or on the ground would be computed wrongly (the fill assumes both ends of
        // every pair in the air, and the image of a wire lying on a perfect ground cancels it,
        // leaving a singular matrix): refuse it over either kind of ground.
        // Below the ground: at the lowest point as written, when the model wrote it.
        const SourceLocation& where = zmin < -join_tol_m && lowest < spec.point_locations.size()
                                          ? spec.point_locations[lowest]
                                          : spec.location;
        const char* ground_name = real ? "real ground" : "perfect ground";
        throw InputError(
            where,
            zmin < -join_tol_m
                ? fmt::format("wire '{}' goes below the {} (z = {:.3g} m): wirefield "
                              "models wires in the air above z = 0 only, {}; raise the wire "
                              "above the ground",
                              spec.name, ground_name, zmin,
                              real ? "not buried radials or wires in the soil"
                                   : "not wires through the ground plane")
                : fmt::format("wire '{}' lies on the {} or runs closer to it than its "
                              "radius ({:.3g} m): wirefield models wires in the air only, not "
                              "wires on the ground; raise it by at least its radius (a wire end "
                              "may touch the ground: that is a ground connection)",
                              spec.name, ground_name, spec.radius_m));
      }
      if (real) {
        const double exact_m = model.ground.method == GroundMethod::kExact
                                   ? model.ground.exact_below_m.value_or(INFINITY)
                                   : 0.0;
        RealGroundWarning(spec, connected, zmin, wavelength_m, options.max_frequency_hz, exact_m,
                          &mesh.warnings);
      }
    }
  }
  MixedGroundWarning(mesh, &mesh.warnings);
  return mesh;
}

}  // namespace wirefield::geometry
