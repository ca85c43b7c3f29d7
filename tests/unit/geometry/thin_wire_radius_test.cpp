// Unit tests of the geometry stage's thin-wire bound on the radius against the wavelength
// (libmom/src/geometry/mesh.cpp, model/thin_wire.hpp): checked at the mesh's frequency, refused
// at the radius value with the unit it was likely meant in, and silent for the wires the
// bundled models and the trade use.
#include <gtest/gtest.h>

#include <string>

#include "geometry/mesh.hpp"
#include "unit/error_text.hpp"

namespace wirefield::geometry {
namespace {

Mesh MeshOf(const std::string& text, double frequency_hz) {
  MeshOptions options;
  options.max_frequency_hz = frequency_hz;
  return BuildMesh(ParseModelText(text, "kit.wire"), options);
}

std::string ErrorOf(const std::string& text, double frequency_hz) {
  return testing::ErrorText([&] { MeshOf(text, frequency_hz); });
}

// A 40 m wire: long enough that no radius below 4 m meets the bound against the length.
std::string Wire(const std::string& size) {
  return "units m\nwire long from (0, 0, 10) to (40, 0, 10) " + size + "\nfeed f at long@50%\n";
}

// The wavelength is c / f with c = 299 792 458 m/s exactly (SI); 1% of it at 14.2 MHz is
// 0.2111 m, at 3.6 MHz 0.8328 m, at 3.8 MHz 0.7889 m.
TEST(ThinWireRadius, OverOnePercentOfTheWavelengthIsRefusedAtTheValue) {
  EXPECT_EQ(ErrorOf(Wire("radius 1"), 14.2e6),
            "kit.wire:2:49: error: wire 'long': the radius 1 m is 4.74% of the wavelength (21.1 m "
            "at 14.2 MHz); the thin-wire model needs a radius under 1% of the wavelength; use a "
            "thinner wire or a lower frequency (did you mean radius 1mm?)");
  EXPECT_EQ(ErrorOf(Wire("diameter 0.5"), 14.2e6),
            "kit.wire:2:51: error: wire 'long': the radius 0.25 m is 1.18% of the wavelength "
            "(21.1 m at 14.2 MHz); the thin-wire model needs a radius under 1% of the "
            "wavelength; use a thinner wire or a lower frequency (did you mean diameter 0.5mm?)");
}

TEST(ThinWireRadius, TheBoundFollowsTheFrequencyOfTheMesh) {
  EXPECT_NO_THROW(MeshOf(Wire("radius 0.8"), 3.6e6));
  EXPECT_NE(ErrorOf(Wire("radius 0.8"), 3.8e6), "no error");  // 1% is 0.789 m at 3.8 MHz
  EXPECT_NO_THROW(MeshOf(Wire("radius 0.21"), 14.2e6));
  EXPECT_NE(ErrorOf(Wire("radius 0.22"), 14.2e6), "no error");
}

TEST(ThinWireRadius, TheTradesThickConductorsPass) {
  // A 50 mm mast tube (25 mm radius) at 30 MHz, the top of HF: 0.25% of the wavelength; a
  // 4 mm tower leg of 100 mm radius at 7.1 MHz: 0.24%.
  EXPECT_NO_THROW(MeshOf(Wire("radius 25mm"), 30e6));
  EXPECT_NO_THROW(MeshOf(Wire("radius 100mm"), 7.1e6));
}

TEST(ThinWireRadius, AnExpressionGetsNoUnitHint) {
  EXPECT_EQ(ErrorOf("units m\nlet r = 1\nwire long from (0, 0, 10) to (40, 0, 10) radius r\n"
                    "feed f at long@50%\n",
                    14.2e6),
            "kit.wire:3:49: error: wire 'long': the radius 1 m is 4.74% of the wavelength (21.1 m "
            "at 14.2 MHz); the thin-wire model needs a radius under 1% of the wavelength; use a "
            "thinner wire or a lower frequency");
}

}  // namespace
}  // namespace wirefield::geometry
