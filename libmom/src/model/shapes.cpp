// Model stage: the corners of the field-deployment shapes from the support's height, the wire
// length, the low end's height and the direction, by Pythagoras' theorem (a leg of length l
// that drops by h reaches sqrt(l^2 - h^2) away). See docs/model-language.md, "shape".
#include "model/shapes.hpp"

#include <fmt/format.h>

#include <cmath>

#include "model/expression.hpp"

namespace wirefield::model {
namespace {

std::string M(double metres) { return FormatNumber(metres) + " m"; }

// How far a leg of length leg_m that drops drop_m reaches sideways: Pythagoras' theorem,
// sqrt(l^2 - h^2), written as sqrt((l - h)(l + h)) so that large numbers do not overflow.
double Reach(double leg_m, double drop_m) { return std::sqrt((leg_m - drop_m) * (leg_m + drop_m)); }

// The corners, or an InputError when numbers too large for double precision made one infinite.
std::vector<Point> Finite(const ShapeRequest& r, std::vector<Point> corners) {
  for (const Point& p : corners) {
    for (double c : p) {
      if (!std::isfinite(c)) {
        throw InputError(r.length_m.location,
                         fmt::format("{}: the corners of the wire are not finite numbers; give "
                                     "top=, length=, low= and at in metres of a real support",
                                     r.context));
      }
    }
  }
  return corners;
}

// The shape's name with its article: "a sloper", "an inverted-l".
std::string WithArticle(ShapeKind kind) {
  return (kind == ShapeKind::kSloper ? "a " : "an ") + ShapeKindNames()[static_cast<size_t>(kind)];
}

// The InputError of a length too short for its shape, at the length: "CONTEXT: a SHAPE of
// length=L PROBLEM: give a length BOUND, or raise low=".
[[noreturn]] void LengthTooShort(const ShapeRequest& r, const std::string& problem,
                                 const std::string& bound) {
  throw InputError(r.length_m.location,
                   fmt::format("{}: {} of length={} {}: give a length {}, or raise low=", r.context,
                               WithArticle(r.kind), M(r.length_m.value), problem, bound));
}

}  // namespace

const std::vector<std::string>& ShapeKindNames() {
  static const std::vector<std::string> kNames = {"sloper", "inverted-l", "inverted-v",
                                                  "horizontal"};
  return kNames;
}

std::vector<Point> ShapeCorners(const ShapeRequest& r) {
  const std::string& context = r.context;
  const double top = r.top_m.value;
  const double length = r.length_m.value;
  if (!(top > 0.0)) {
    throw InputError(r.top_m.location,
                     fmt::format("{}: top={} is not above the ground; top is the height of the "
                                 "support's top above z = 0: give it positive",
                                 context, M(top)));
  }
  if (!(length > 0.0)) {
    throw InputError(r.length_m.location,
                     fmt::format("{}: length must be positive; got {}", context, M(length)));
  }
  const double ux = std::cos(r.toward_rad), uy = std::sin(r.toward_rad);
  const double x = r.support_x_m, y = r.support_y_m;
  auto away = [&](double distance_m, double z_m) {
    return Point{x + distance_m * ux, y + distance_m * uy, z_m};
  };
  const Point apex{x, y, top};
  if (r.kind == ShapeKind::kHorizontal) {
    if (r.low_m) {
      throw InputError(r.low_m->location,
                       fmt::format("{}: a horizontal wire has no low end; remove low= (the "
                                   "wire runs level at top={})",
                                   context, M(top)));
    }
    return Finite(r, {apex, away(length, top)});
  }
  const double low = r.low_m ? r.low_m->value : 0.0;
  const SourceLocation low_at = r.low_m ? r.low_m->location : r.top_m.location;
  if (low < 0.0) {
    throw InputError(low_at, fmt::format("{}: low={} is below the ground (z = 0); heights are "
                                         "measured up from the ground: give low= of 0 m or more",
                                         context, M(low)));
  }
  if (low >= top) {
    throw InputError(low_at, fmt::format("{}: low={} is not below top={}; the low end of {} hangs "
                                         "below the support's top: lower low= or raise top= (for a "
                                         "level wire use 'horizontal')",
                                         context, M(low), M(top), WithArticle(r.kind)));
  }
  const double drop = top - low;
  switch (r.kind) {
    case ShapeKind::kSloper: {
      if (length < drop) {
        LengthTooShort(r,
                       fmt::format("cannot reach from top={} down to low={} (a drop of {})", M(top),
                                   M(low), M(drop)),
                       "of at least " + M(drop));
      }
      return Finite(r, {away(Reach(length, drop), low), apex});
    }
    case ShapeKind::kInvertedL: {
      if (length <= drop) {
        LengthTooShort(r,
                       fmt::format("is used up by the vertical part from low={} to top={} ({}), "
                                   "leaving nothing to run level",
                                   M(low), M(top), M(drop)),
                       "above " + M(drop));
      }
      return Finite(r, {Point{x, y, low}, apex, away(length - drop, top)});
    }
    case ShapeKind::kInvertedV: {
      const double leg = length / 2.0;
      if (leg <= drop) {
        LengthTooShort(r,
                       fmt::format("has legs of {}, too short to slope from the apex at top={} "
                                   "down to low={} (a drop of {}) and away from the support",
                                   M(leg), M(top), M(low), M(drop)),
                       "above " + M(2.0 * drop));
      }
      const double run = Reach(leg, drop);
      return Finite(r, {away(-run, low), apex, away(run, low)});
    }
    case ShapeKind::kHorizontal:
      break;
  }
  return {};
}

}  // namespace wirefield::model
