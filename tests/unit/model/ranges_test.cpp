// Unit tests of the model stage's table of allowed ranges (model/ranges.hpp): every kind of
// value has one row, the bounds are inclusive, and NaN or infinity is outside every range.
#include "model/ranges.hpp"

#include <gtest/gtest.h>

#include <cmath>
#include <limits>
#include <set>

namespace wirefield::model {
namespace {

TEST(ValueRanges, EveryKindHasExactlyOneRow) {
  std::set<ValueKind> kinds;
  for (const ValueRange& r : ValueRanges()) {
    EXPECT_TRUE(kinds.insert(r.kind).second) << r.name;
    EXPECT_LE(r.min_si, r.max_si) << r.name;
    EXPECT_TRUE(std::isfinite(r.max_si)) << r.name;
  }
  EXPECT_EQ(RangeOf(ValueKind::kQuality).kind, ValueKind::kQuality);
  EXPECT_EQ(RangeOf(ValueKind::kCoordinateM).kind, ValueKind::kCoordinateM);
}

TEST(ValueRanges, BoundsAreInsideAndTheirNeighboursOutside) {
  for (const ValueRange& r : ValueRanges()) {
    EXPECT_FALSE(OutOfRange(r.kind, r.min_si, "x")) << r.name;
    EXPECT_FALSE(OutOfRange(r.kind, r.max_si, "x")) << r.name;
    EXPECT_TRUE(OutOfRange(r.kind, std::nextafter(r.max_si, INFINITY), "x")) << r.name;
    if (r.min_si > 0.0) {
      EXPECT_TRUE(OutOfRange(r.kind, std::nextafter(r.min_si, 0.0), "x")) << r.name;
    }
  }
}

TEST(ValueRanges, NonFiniteValuesAreOutsideEveryRange) {
  for (const ValueRange& r : ValueRanges()) {
    EXPECT_TRUE(OutOfRange(r.kind, std::numeric_limits<double>::quiet_NaN(), "x")) << r.name;
    EXPECT_TRUE(OutOfRange(r.kind, INFINITY, "x")) << r.name;
    EXPECT_TRUE(OutOfRange(r.kind, -INFINITY, "x")) << r.name;
  }
}

TEST(ValueRanges, ASignedValueIsBoundedInMagnitude) {
  EXPECT_FALSE(OutOfRange(ValueKind::kVoltageV, -2.0, "v"));
  EXPECT_FALSE(OutOfRange(ValueKind::kCoordinateM, -99999.0, "x"));
  EXPECT_EQ(*OutOfRange(ValueKind::kVoltageV, -2e6, "voltage"),
            "voltage must be 1e-06 V to 1e+06 V in magnitude, either sign; got -2e+06 V");
  EXPECT_EQ(*OutOfRange(ValueKind::kCoordinateM, 2e5, "the X coordinate"),
            "the X coordinate must be -100000 m to 100000 m; got 200000 m");
}

TEST(ValueRanges, AUnitlessValueIsPrintedWithoutAUnit) {
  EXPECT_EQ(*OutOfRange(ValueKind::kPermittivity, 0.5, "permittivity"),
            "permittivity must be 1 to 1000; got 0.5");
}

}  // namespace
}  // namespace wirefield::model
