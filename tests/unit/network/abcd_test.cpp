// Tests of the network stage's two-port elements (libmom/src/network/abcd.cpp): the ideal
// transformer's turns-ratio law and uniform lines against the textbook input-impedance
// formulas of REFERENCES.md §5.
#include "network/abcd.hpp"

#include <gtest/gtest.h>

#include <cmath>
#include <numbers>

#include "network/line.hpp"

namespace wirefield::network {
namespace {

// The ideal element is exact up to a few roundings of 1e-16: REFERENCES §5 asks 1e-12.
constexpr double kIdealRelative = 1e-12;
// Line formulas: cosh/sinh of an argument near pi/2 lose a few digits; REFERENCES §5 asks 1e-9.
constexpr double kLineRelative = 1e-9;

constexpr double kC_m_per_s = 299792458.0;  // SI definition of the metre

void ExpectNear(Complex got, Complex want, double relative) {
  EXPECT_LE(std::abs(got - want), relative * std::max(1.0, std::abs(want)))
      << "got " << got << ", want " << want;
}

TEST(IdealTransformer, TwoToSixteenTurnsPresentsOneSixtyFourthOfTheLoad) {
  // Turns-ratio law Z_pri = Z_sec (N_pri/N_sec)^2: 2 and 16 turns give 64:1
  // (REFERENCES §5, any circuits text, from memory); 3200 ohm -> 50 ohm.
  const Abcd m = IdealTransformer(16.0 / 2.0);
  for (const Complex z : {Complex{3200.0, 0.0}, Complex{2400.0, -900.0}, Complex{10.0, 77.0}}) {
    ExpectNear(InputImpedance(m, z), z / 64.0, kIdealRelative);
  }
  ExpectNear(InputImpedance(m, 3200.0), 50.0, kIdealRelative);
}

TEST(IdealTransformer, ThreeToTwentyOneTurnsPresentsOneFortyNinthOfTheLoad) {
  // 3 and 21 turns: 49:1, 2450 ohm -> 50 ohm (REFERENCES §5).
  const Abcd m = IdealTransformer(21.0 / 3.0);
  ExpectNear(InputImpedance(m, 2450.0), 50.0, kIdealRelative);
  ExpectNear(InputImpedance(m, Complex{1800.0, 650.0}), Complex{1800.0, 650.0} / 49.0,
             kIdealRelative);
}

TEST(IdealTransformer, IsLossless) {
  // An ideal transformer passes all power: V1 I1* = (V2/n)(n I2)* (circuit theory).
  const PortState out{Complex{3000.0, 400.0}, Complex{0.7, -0.2}};
  const PortState in = Apply(IdealTransformer(8.0), out);
  EXPECT_NEAR(Power(in), Power(out), kIdealRelative * Power(out));
}

// A lossless line of the given electrical length in wavelengths at 10 MHz, vf 0.66.
Abcd LosslessLine(double wavelengths, double z0_ohm) {
  const double f_hz = 10e6, vf = 0.66;
  const double beta = 2.0 * std::numbers::pi * f_hz / (vf * kC_m_per_s);
  const double lambda_m = vf * kC_m_per_s / f_hz;
  return TransmissionLine(Complex{0.0, beta}, z0_ohm, wavelengths * lambda_m);
}

TEST(LosslessLine, QuarterWaveOfFiftyOhmTurnsOneHundredIntoTwentyFive) {
  // Z_in = Z0^2 / Z_L for a quarter wave: 50^2 / 100 = 25 ohm (REFERENCES §5, Ramo et al.).
  ExpectNear(InputImpedance(LosslessLine(0.25, 50.0), 100.0), 25.0, kLineRelative);
}

TEST(LosslessLine, HalfWaveRepeatsTheLoad) {
  // tan(beta l) = 0 for a half wave: Z_in = Z_L (REFERENCES §5).
  for (const Complex z : {Complex{100.0, 0.0}, Complex{30.0, -40.0}, Complex{3200.0, 900.0}}) {
    ExpectNear(InputImpedance(LosslessLine(0.5, 50.0), z), z, kLineRelative);
  }
}

TEST(LosslessLine, ShortedEighthWaveStubIsPlusJFifty) {
  // Z_in = j Z0 tan(pi/4) = +j50 ohm for a shorted lambda/8 of 50 ohm (REFERENCES §5).
  ExpectNear(InputImpedance(LosslessLine(0.125, 50.0), 0.0), Complex{0.0, 50.0}, kLineRelative);
}

TEST(LosslessLine, AgreesWithTheTanFormulaAtAnyLength) {
  // Z_in = Z0 (Z_L + j Z0 tan bl) / (Z0 + j Z_L tan bl) (REFERENCES §5).
  const Complex j{0.0, 1.0};
  const Complex zl{75.0, 20.0};
  const double z0 = 50.0;
  for (const double wl : {0.03, 0.17, 0.31, 0.62, 1.37}) {
    const double t = std::tan(2.0 * std::numbers::pi * wl);
    ExpectNear(InputImpedance(LosslessLine(wl, z0), zl), z0 * (zl + j * z0 * t) / (z0 + j * zl * t),
               kLineRelative);
  }
}

TEST(LossyLine, AgreesWithTheTanhFormula) {
  // Z_in = Z0 (Z_L + Z0 tanh gl) / (Z0 + Z_L tanh gl) with gamma = alpha + j beta
  // (REFERENCES §5, lossy line; from memory for the textbook).
  FeedLineSpec line;
  line.length_m = 23.7;
  line.z0_ohm = 50.0;
  line.velocity_factor = 0.66;
  line.loss1_db_per_100m = 4.25;
  line.loss1_frequency_hz = 10e6;
  line.loss2_db_per_100m = 8.1;
  line.loss2_frequency_hz = 30e6;
  for (const double f_hz : {1.85e6, 7.1e6, 14.2e6, 28.5e6}) {
    const Complex gl = PropagationConstant(line, f_hz) * line.length_m;
    EXPECT_GT(gl.real(), 0.0);
    for (const Complex zl : {Complex{3.0, 0.0}, Complex{120.0, -75.0}, Complex{1800.0, 400.0}}) {
      const Complex t = std::tanh(gl);
      const Complex want = 50.0 * (zl + 50.0 * t) / (50.0 + zl * t);
      ExpectNear(InputImpedance(LineAbcd(line, f_hz), zl), want, kLineRelative);
    }
  }
}

}  // namespace
}  // namespace wirefield::network
