// Model stage: the path of a wire, straight or bent. WirePath/WireLength (public API) give a
// wire's corners and its length along them, PositionAlong/PointAlong a WIRE@POS point on it;
// CheckWirePath refuses paths the mesher cannot
// use, with the location of the offending point. See docs/model-language.md, "Bent wires".
#include "model/wire_path.hpp"

#include <fmt/format.h>

#include <cmath>

#include "model/expression.hpp"

namespace wirefield {

std::vector<Point> WirePath(const WireSpec& wire) {
  std::vector<Point> path;
  path.reserve(wire.bends_m.size() + 2);
  path.push_back(wire.from_m);
  path.insert(path.end(), wire.bends_m.begin(), wire.bends_m.end());
  path.push_back(wire.to_m);
  return path;
}

double WireLength(const WireSpec& wire) {
  const std::vector<Point> path = WirePath(wire);
  double length_m = 0.0;
  for (size_t i = 0; i + 1 < path.size(); ++i) {
    length_m += std::hypot(path[i + 1][0] - path[i][0], path[i + 1][1] - path[i][1],
                           path[i + 1][2] - path[i][2]);
  }
  return length_m;
}

double PositionAlong(const WirePointSpec& at, double length_m) {
  switch (at.kind) {
    case PointKind::kStart:
      return 0.0;
    case PointKind::kEnd:
      return length_m;
    case PointKind::kDistance:
      return at.value;
    case PointKind::kPercent:
      return at.value / 100.0 * length_m;
  }
  return 0.0;
}

Point PointAlong(const WireSpec& wire, double s_m) {
  const std::vector<Point> path = WirePath(wire);
  double start_m = 0.0;  // the distance of path[i] from the start
  for (size_t i = 0; i + 1 < path.size(); ++i) {
    const Point& a = path[i];
    const Point& b = path[i + 1];
    if (s_m == start_m) return a;
    const double leg_m = std::hypot(b[0] - a[0], b[1] - a[1], b[2] - a[2]);
    if (s_m < start_m + leg_m || i + 2 == path.size()) {
      if (s_m >= start_m + leg_m) return b;
      const double t = (s_m - start_m) / leg_m;
      return Point{a[0] + t * (b[0] - a[0]), a[1] + t * (b[1] - a[1]), a[2] + t * (b[2] - a[2])};
    }
    start_m += leg_m;
  }
  return path.back();
}

double LossRadius(const WireSpec& wire) { return wire.loss_radius_m.value_or(wire.radius_m); }

namespace model {
namespace {

// Two legs turn straight back when the sine of the angle between them is below this: far
// below any real bend (1e-9 rad is a millimetre's offset over a thousand kilometres) and well
// above the rounding of the cross product of coordinates (a few 1e-16 relative).
constexpr double kReversalSine = 1e-9;

std::string Format(const Point& p) {
  return fmt::format("({}, {}, {}) m", FormatNumber(p[0]), FormatNumber(p[1]), FormatNumber(p[2]));
}

}  // namespace

std::string Ordinal(size_t n) {
  const size_t tens = n % 100;
  const char* suffix = "th";
  if (tens < 11 || tens > 13) {
    if (n % 10 == 1) suffix = "st";
    if (n % 10 == 2) suffix = "nd";
    if (n % 10 == 3) suffix = "rd";
  }
  return fmt::format("{}{}", n, suffix);
}

void CheckWirePath(const std::vector<Point>& points, const std::vector<SourceLocation>& locations,
                   const std::string& context) {
  auto leg = [&](size_t i) {
    return std::array<double, 3>{points[i + 1][0] - points[i][0], points[i + 1][1] - points[i][1],
                                 points[i + 1][2] - points[i][2]};
  };
  for (size_t i = 0; i + 1 < points.size(); ++i) {
    auto d = leg(i);
    const double length_m = std::hypot(d[0], d[1], d[2]);
    if (!std::isfinite(length_m)) {
      throw InputError(locations[i + 1],
                       fmt::format("{}: the leg to the {} point is not a finite length", context,
                                   Ordinal(i + 2)));
    }
    if (length_m == 0.0) {
      throw InputError(locations[i + 1],
                       fmt::format("{}: the {} point {} is the {} point again, so the leg "
                                   "between them has zero length; remove one of them",
                                   context, Ordinal(i + 2), Format(points[i + 1]), Ordinal(i + 1)));
    }
    if (i == 0) continue;
    // Unit directions of the leg before and this one (no overflow for huge coordinates).
    auto e = leg(i - 1);
    const double before_m = std::hypot(e[0], e[1], e[2]);
    for (size_t k = 0; k < 3; ++k) {
      e[k] /= before_m;
      d[k] /= length_m;
    }
    const double cross =
        std::hypot(e[1] * d[2] - e[2] * d[1], e[2] * d[0] - e[0] * d[2], e[0] * d[1] - e[1] * d[0]);
    const double dot = e[0] * d[0] + e[1] * d[1] + e[2] * d[2];
    if (dot < 0.0 && cross <= kReversalSine) {
      throw InputError(
          locations[i + 1],
          fmt::format("{}: the {} point {} takes the wire straight back along the leg before "
                      "it (a 180-degree bend at the {} point), so the two legs would lie on "
                      "each other; move the {} point, or end the wire at the {} point",
                      context, Ordinal(i + 2), Format(points[i + 1]), Ordinal(i + 1),
                      Ordinal(i + 2), Ordinal(i + 1)));
    }
  }
}

void SetWirePath(const std::vector<Point>& points, WireSpec* wire) {
  wire->from_m = points.front();
  wire->to_m = points.back();
  wire->bends_m.assign(points.begin() + 1, points.end() - 1);
}

}  // namespace model
}  // namespace wirefield
