// Model stage: field-deployment shapes (`shape NAME sloper|inverted-l|inverted-v|horizontal`).
// Input: the support's top height, the wire length, the low end's height, the direction and
// the support's place, each with where it was written; output: the corners of the wire, or an
// InputError at the clause whose number makes the shape impossible. Elementary geometry only.
#pragma once

#include <optional>
#include <string>
#include <vector>

#include "wirefield/model.hpp"

namespace wirefield::model {

enum class ShapeKind { kSloper, kInvertedL, kInvertedV, kHorizontal };

// The spellings of the kinds in the language, in the order of ShapeKind.
const std::vector<std::string>& ShapeKindNames();

// A number of a shape statement and where it was written (for messages).
struct ShapeNumber {
  double value = 0.0;
  SourceLocation location;
};

struct ShapeRequest {
  std::string context;  // "shape 'kit'", for messages
  ShapeKind kind = ShapeKind::kSloper;
  ShapeNumber top_m;                 // height of the support's top (the attachment point)
  ShapeNumber length_m;              // the wire's whole length
  std::optional<ShapeNumber> low_m;  // height of the low end(s); absent: 0 (the ground)
  double toward_rad = 0.0;           // azimuth from +x toward +y
  double support_x_m = 0.0;
  double support_y_m = 0.0;
};

// The corners of the shape's wire from its start to its end:
// sloper: the low end (toward the azimuth) up to the support's top;
// inverted-l: the foot of the support, up to its top, then level toward the azimuth;
// inverted-v: the end away from the azimuth, the apex on the support's top, the end toward it;
// horizontal: the support's top, then level toward the azimuth.
// Throws InputError when the numbers cannot make the shape.
std::vector<Point> ShapeCorners(const ShapeRequest& request);

}  // namespace wirefield::model
