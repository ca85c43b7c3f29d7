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

}  // namespace

const std::vector<std::string>& ShapeKindNames() {
  static const std::vector<std::string> kNames = {"sloper", "inverted-l", "inverted-v",
                                                  "horizontal"};
  return kNames;
}

std::vector<Point> ShapeCorners(const ShapeRequest& r) {
  const std::string& context = r.context;
  const std::string kind = ShapeKindNames()[static_cast<size_t>(r.kind)];
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
    return {apex, away(length, top)};
  }
  const double low = r.low_m ? r.low_m->value : 0.0;
  const SourceLocation low_at = r.low_m ? r.low_m->location : r.top_m.location;
  if (low < 0.0) {
    throw InputError(low_at, fmt::format("{}: low={} is below the ground (z = 0); heights are "
                                         "measured up from the ground: give low= of 0 m or more",
                                         context, M(low)));
  }
  if (low >= top) {
    throw InputError(
        low_at,
        fmt::format("{}: low={} is not below top={}; the low end of a{} {} hangs "
                    "below the support's top: lower low= or raise top= (for a "
                    "level wire use 'horizontal')",
                    context, M(low), M(top), r.kind == ShapeKind::kSloper ? "" : "n", kind));
  }
  const double drop = top - low;
  switch (r.kind) {
    case ShapeKind::kSloper: {
      if (length < drop) {
        throw InputError(
            r.length_m.location,
            fmt::format("{}: a sloper of length={} cannot reach from top={} down to low={} (a "
                        "drop of {}): give a length of at least {}, or raise low=",
                        context, M(length), M(top), M(low), M(drop), M(drop)));
      }
      const double run = std::sqrt(length * length - drop * drop);
      return {away(run, low), apex};
    }
    case ShapeKind::kInvertedL: {
      if (length <= drop) {
        throw InputError(
            r.length_m.location,
            fmt::format("{}: an inverted-l of length={} is used up by the vertical part from "
                        "low={} to top={} ({}), leaving nothing to run level: give a length "
                        "above {}, or raise low=",
                        context, M(length), M(low), M(top), M(drop), M(drop)));
      }
      return {Point{x, y, low}, apex, away(length - drop, top)};
    }
    case ShapeKind::kInvertedV: {
      const double leg = length / 2.0;
      if (leg <= drop) {
        throw InputError(
            r.length_m.location,
            fmt::format("{}: an inverted-v of length={} has legs of {}, too short to slope "
                        "from the apex at top={} down to low={} (a drop of {}) and away from "
                        "the support: give a length above {}, or raise low=",
                        context, M(length), M(leg), M(top), M(low), M(drop), M(2.0 * drop)));
      }
      const double run = std::sqrt(leg * leg - drop * drop);
      return {away(-run, low), apex, away(run, low)};
    }
    case ShapeKind::kHorizontal:
      break;
  }
  return {};
}

}  // namespace wirefield::model
