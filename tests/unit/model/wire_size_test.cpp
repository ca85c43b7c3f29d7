// Tests of a wire's conductor given by its cross-section and its strands (libmom/src/model/
// parse_wires.cpp, thin_wire.cpp): `size A` in mm2, cm2 or m2, `strands=N` with `size`,
// `diameter`, `radius` or `strand=d`, the radii they give, and the text and FILE:LINE:COLUMN of
// their input errors. Expected values come from the AWG table of ASTM B258, the concentric-lay
// factors of ASTM B8 and the equivalent radius of wires on a circle (sources beside each test).
#include <gtest/gtest.h>

#include <cmath>
#include <numbers>
#include <string>

#include "model/thin_wire.hpp"
#include "unit/error_text.hpp"
#include "wirefield/model.hpp"

namespace wirefield {
namespace {

Model Parse(const std::string& text) { return ParseModelText(text, "kit.wire"); }

std::string ErrorOf(const std::string& text) {
  return testing::ErrorText([&] { Parse(text); });
}

// One wire of the kit, 10 m long, with the size clauses given, fed in the middle.
WireSpec KitWire(const std::string& size) {
  return Parse("wire kit from (0, 0, 5) to (10, 0, 5) " + size + "\nfeed src at kit@50%\n")
      .wires.at(0);
}

TEST(WireSize, CrossSectionGivesTheRadiusOfARoundConductor) {
  // A solid round conductor of cross-section A has the radius sqrt(A / pi) (the area of a
  // circle). 1.5 mm2: r = 0.690988 mm.
  const WireSpec w = KitWire("size 1.5mm2");
  EXPECT_DOUBLE_EQ(w.radius_m, std::sqrt(1.5e-6 / std::numbers::pi));
  ASSERT_TRUE(w.cross_section_m2.has_value());
  EXPECT_DOUBLE_EQ(*w.cross_section_m2, 1.5e-6);
  EXPECT_EQ(w.strands, 1);
  EXPECT_FALSE(w.loss_radius_m.has_value());
  EXPECT_DOUBLE_EQ(LossRadius(w), w.radius_m);
  EXPECT_EQ(w.radius_clause, "size");
}

TEST(WireSize, AreaUnitsAndExpressionsAgree) {
  const double r = KitWire("size 1.5mm2").radius_m;
  EXPECT_DOUBLE_EQ(KitWire("size 0.015cm2").radius_m, r);
  EXPECT_DOUBLE_EQ(KitWire("size 1.5e-6m2").radius_m, r);
  EXPECT_DOUBLE_EQ(KitWire("size 1.5 mm2").radius_m, r);
  // An area is also a length squared: pi r^2 of the same radius gives it back.
  EXPECT_NEAR(KitWire("size pi*(0.690988mm)^2").radius_m, 0.690988e-3, 1e-12);
}

TEST(WireSize, AwgCrossSectionsMatchTheirGauges) {
  // AWG cross-sections as the trade tables print them (from memory), each the area of the
  // ASTM B258 diameter d_n = 0.127 mm * 92^((36 - n)/39) rounded to 3 digits: AWG 10 is
  // 5.26 mm2, 12 is 3.31, 14 is 2.08, 16 is 1.31, 18 is 0.823, 20 is 0.518 and 22 is 0.326.
  // The rounding to 3 digits moves the area by at most 0.25%, the radius by half of that.
  const struct {
    int gauge;
    const char* size;
  } kTable[] = {{10, "5.26mm2"},  {12, "3.31mm2"},  {14, "2.08mm2"}, {16, "1.31mm2"},
                {18, "0.823mm2"}, {20, "0.518mm2"}, {22, "0.326mm2"}};
  for (const auto& row : kTable) {
    const double by_size = KitWire(std::string("size ") + row.size).radius_m;
    const double by_gauge = KitWire("diameter awg(" + std::to_string(row.gauge) + ")").radius_m;
    EXPECT_NEAR(by_size / by_gauge, 1.0, 0.0013) << "AWG " << row.gauge;
  }
}

TEST(WireSize, IecNominalCrossSectionsGiveTheirSolidDiameters) {
  // IEC 60228 nominal cross-sections 0.5, 1.5 and 2.5 mm2 (from memory) as solid round wire:
  // d = sqrt(4 A / pi) = 0.7979, 1.3820 and 1.7841 mm (computed here).
  EXPECT_NEAR(2.0 * KitWire("size 0.5mm2").radius_m, 0.7979e-3, 1e-7);
  EXPECT_NEAR(2.0 * KitWire("size 1.5mm2").radius_m, 1.3820e-3, 1e-7);
  EXPECT_NEAR(2.0 * KitWire("size 2.5mm2").radius_m, 1.7841e-3, 1e-7);
}

TEST(WireSize, SevenStrandsShareTheCrossSection) {
  // 1.5 mm2 in 7 strands: each strand d = sqrt(4 A / (7 pi)) = 0.52231 mm. Concentric lay
  // puts 6 round the centre one, 3 strand diameters across (ASTM B8 factor 3.000, from
  // memory). The kernel sees the 6 outer strands, radius b = d/2 on a circle of radius d:
  // a_e = (6 b d^5)^(1/6) for 6 equal wires on a circle (Balanis, Antenna Theory, 3rd ed.,
  // table 9.3, from memory) = 3^(1/6) d.
  const WireSpec w = KitWire("size 1.5mm2 strands=7");
  const double d = std::sqrt(4.0 * 1.5e-6 / (7.0 * std::numbers::pi));
  EXPECT_EQ(w.strands, 7);
  ASSERT_TRUE(w.loss_radius_m.has_value());
  EXPECT_NEAR(*w.loss_radius_m, 1.5 * d, 1e-15);
  EXPECT_NEAR(w.radius_m, std::pow(6.0 * (d / 2.0) * std::pow(d, 5.0), 1.0 / 6.0), 1e-15);
  EXPECT_NEAR(w.radius_m, std::pow(3.0, 1.0 / 6.0) * d, 1e-15);
  EXPECT_DOUBLE_EQ(*w.cross_section_m2, 1.5e-6);
  // It lies between the circle of the outer strands' centres and the outer radius: 0.80 of
  // the outer radius.
  EXPECT_GT(w.radius_m, d);
  EXPECT_LT(w.radius_m, *w.loss_radius_m);
}

TEST(WireSize, NineteenStrandsByOuterDiameter) {
  // 19 strands: 5 strand diameters across (ASTM B8 factor 5.000, from memory), so
  // `diameter 2.5mm` means strands of 0.5 mm; the outer layer is 12 strands on a circle of
  // radius 2 d: a_e = (12 (d/2) (2d)^11)^(1/12) (Balanis table 9.3, from memory).
  const WireSpec w = KitWire("diameter 2.5mm strands=19");
  const double d = 0.5e-3;
  EXPECT_NEAR(*w.loss_radius_m, 1.25e-3, 1e-15);
  EXPECT_NEAR(w.radius_m, std::pow(12.0 * (d / 2.0) * std::pow(2.0 * d, 11.0), 1.0 / 12.0), 1e-15);
  EXPECT_NEAR(*w.cross_section_m2, 19.0 * std::numbers::pi * d * d / 4.0, 1e-18);
  // The same bundle by its strands, and by its outer radius.
  EXPECT_DOUBLE_EQ(KitWire("strands=19 strand=0.5mm").radius_m, w.radius_m);
  EXPECT_DOUBLE_EQ(KitWire("radius 1.25mm strands=19").radius_m, w.radius_m);
}

TEST(WireSize, ConcentricLayCounts) {
  // 1 + 3 L (L + 1) strands in L layers: 1, 7, 19, 37, 61, 91, 127 (ASTM B8, from memory).
  const int kCounts[] = {1, 7, 19, 37, 61, 91, 127};
  for (int layers = 0; layers < 7; ++layers) {
    EXPECT_EQ(model::StrandCount(layers), kCounts[layers]);
    EXPECT_EQ(model::StrandLayers(kCounts[layers]), layers);
  }
  EXPECT_EQ(model::StrandLayers(8), -1);
  // strands=1 is the solid wire.
  EXPECT_DOUBLE_EQ(KitWire("size 1.5mm2 strands=1").radius_m, KitWire("size 1.5mm2").radius_m);
  EXPECT_DOUBLE_EQ(model::StrandedEquivalentRadius(1, 2e-3), 1e-3);
}

TEST(WireSize, EquivalentRadiusApproachesTheOuterRadiusWithMoreLayers) {
  // On a circle of radius R = L d, M = 6 L strands of radius d/2 have a_e = R (3)^(1/M)
  // (Balanis table 9.3, from memory), which closes on R as the layers grow: the outer layer
  // becomes a tube. Against the outer radius (L + 1/2) d the ratio rises towards 1.
  double previous = 0.0;
  for (int layers = 1; layers <= 6; ++layers) {
    const double a_e = model::StrandedEquivalentRadius(model::StrandCount(layers), 1.0);
    EXPECT_NEAR(a_e, layers * std::pow(3.0, 1.0 / (6.0 * layers)), 1e-13) << layers;
    const double of_outer = a_e / (layers + 0.5);
    EXPECT_GT(of_outer, previous);
    EXPECT_LT(of_outer, 1.0);
    previous = of_outer;
  }
  EXPECT_GT(previous, 0.95);
}

TEST(WireSizeError, MessagesNameTheClause) {
  EXPECT_EQ(ErrorOf("wire kit from (0, 0, 5) to (10, 0, 5) size 1.5\n"),
            "kit.wire:1:44: error: wire 'kit': size is the cross-section of the metal and takes "
            "an area unit (mm2, cm2, m2): write size 1.5mm2");
  EXPECT_EQ(ErrorOf("wire kit from (0, 0, 5) to (10, 0, 5) size 1.5mm\n"),
            "kit.wire:1:44: error: wire 'kit': size needs an area (mm2, cm2, m2); got a length "
            "(m)");
  EXPECT_EQ(ErrorOf("wire kit from (0, 0, 5) to (10, 0, 5) size -1mm2\n"),
            "kit.wire:1:44: error: wire 'kit': the size must be positive; got -1e-06 m^2");
  EXPECT_EQ(ErrorOf("wire kit from (0, 0, 5) to (10, 0, 5) radius 1mm size 1.5mm2\n"),
            "kit.wire:1:50: error: wire 'kit': give one of 'radius R', 'diameter D', 'size A' or "
            "'strand=d', not two: radius gives the size already");
  EXPECT_EQ(ErrorOf("wire kit from (0, 0, 5) to (10, 0, 5) size 1mm2 size 1.5mm2\n"),
            "kit.wire:1:49: error: wire 'kit': size is given twice");
  EXPECT_EQ(ErrorOf("wire kit from (0, 0, 5) to (10, 0, 5) size 1.5mm2 strands=8\n"),
            "kit.wire:1:59: error: wire 'kit': strands=8 is not a count of strands in "
            "concentric lay; use 1 (solid), 7, 19, 37, 61, 91 or 127 (a centre strand and L "
            "layers of 6, 12, 18, ... round it: 1 + 3 L (L + 1), up to 1261)");
  EXPECT_EQ(ErrorOf("wire kit from (0, 0, 5) to (10, 0, 5) size 1mm2 strands=7 strands=7\n"),
            "kit.wire:1:59: error: wire 'kit': strands is given twice");
  EXPECT_EQ(ErrorOf("wire kit from (0, 0, 5) to (10, 0, 5) strand=0.3mm\n"),
            "kit.wire:1:39: error: wire 'kit': strand=d is the diameter of one strand of a "
            "stranded wire; give strands=N beside it, or 'diameter D' for a solid wire");
}

TEST(WireSizeError, ThinWireBoundUsesTheEquivalentRadius) {
  // A 0.2 m wire takes a radius of at most 20 mm (a tenth of its length). 7 strands of 20 mm
  // (60 mm across) have the equivalent radius 3^(1/6) 20 mm = 24.0187 mm: refused, at the
  // size clause, with that radius; 7 strands of 15 mm (18.01 mm) pass, though their outer
  // radius is 22.5 mm.
  EXPECT_EQ(
      ErrorOf("wire kit from (0, 0, 5) to (0.2, 0, 5) diameter 60mm strands=7\n").substr(0, 81),
      "kit.wire:1:49: error: wire 'kit': the radius 0.0240187 m is not small against the");
  EXPECT_EQ(ErrorOf("wire kit from (0, 0, 5) to (0.2, 0, 5) strands=7 strand=15mm\n"
                    "feed src at kit@50%\n"),
            "no error");
}

TEST(WireSize, ShapesTakeTheSizeClauses) {
  const Model m = Parse(
      "shape kit sloper top=8m length=12m size 2.5mm2 strands=7\nfeed src at kit@start\n"
      "ground perfect\n");
  EXPECT_EQ(m.wires.at(0).strands, 7);
  EXPECT_DOUBLE_EQ(*m.wires.at(0).cross_section_m2, 2.5e-6);
}

}  // namespace
}  // namespace wirefield
