// Coil stage: the published formulas (see formulas.hpp): Nagaoka's coefficient exact and by
// Lundin's approximation, the current-sheet inductance, Rosa's round-wire correction,
// Wheeler's formula and Medhurst's tables of self-capacitance and proximity factor.
// Inputs: SI sizes and counts; outputs: henry, pF/cm or plain factors.
#include "coil/formulas.hpp"

#include <algorithm>
#include <array>
#include <boost/math/special_functions/ellint_1.hpp>
#include <boost/math/special_functions/ellint_2.hpp>
#include <cmath>
#include <cstddef>

#include "core/constants.hpp"

namespace wirefield::coil {
namespace {

constexpr double kMetresPerInch = 0.0254;  // exact (international inch, 1959)

// Medhurst's self-capacitance table: H in pF per cm of coil diameter against l/D
// (Medhurst, "H.F. resistance and self-capacitance of single-layer solenoids", Wireless
// Engineer 24, 1947; table confirmed in secondary transcriptions, REFERENCES.md section 4).
constexpr std::array<double, 15> kHLengthOverDiameter = {0.1, 0.2, 0.3, 0.5,  0.7,  1.0,  1.5, 2.0,
                                                         3.0, 4.0, 5.0, 10.0, 20.0, 30.0, 50.0};
constexpr std::array<double, 15> kH_pf_per_cm = {0.96, 0.70, 0.60, 0.50, 0.47, 0.46, 0.47, 0.50,
                                                 0.61, 0.72, 0.81, 1.32, 2.36, 3.40, 5.8};

// Medhurst's proximity factor Phi = R_coil / R_straight wire, measured at high frequency
// (wire many skin depths thick), same paper; values confirmed in a secondary transcription.
// Rows: l/D = 0, 0.2, 0.4, 0.6, 0.8, 1, 2, 4, 6, 8, 10 and infinity. Columns: d/p = 1, 0.9,
// 0.8, 0.7, 0.6, 0.5, 0.4, 0.3, 0.2, 0.1 and 0 (Medhurst tabulates p/d = 1 ... 10, infinity).
constexpr std::size_t kPhiRows = 12;
constexpr std::size_t kPhiColumns = 11;
constexpr std::array<double, kPhiRows - 1> kPhiLengthOverDiameter = {0.0, 0.2, 0.4, 0.6, 0.8, 1.0,
                                                                     2.0, 4.0, 6.0, 8.0, 10.0};
constexpr std::array<double, kPhiColumns> kPhiWireOverPitch = {1.0, 0.9, 0.8, 0.7, 0.6, 0.5,
                                                               0.4, 0.3, 0.2, 0.1, 0.0};
constexpr double kPhi[kPhiRows][kPhiColumns] = {
    {5.31, 3.73, 2.74, 2.12, 1.74, 1.44, 1.20, 1.16, 1.07, 1.02, 1.00},
    {5.45, 3.84, 2.83, 2.20, 1.77, 1.48, 1.29, 1.19, 1.08, 1.02, 1.00},
    {5.65, 3.99, 2.97, 2.28, 1.83, 1.54, 1.33, 1.21, 1.08, 1.03, 1.00},
    {5.80, 4.11, 3.10, 2.38, 1.89, 1.60, 1.38, 1.22, 1.10, 1.03, 1.00},
    {5.80, 4.17, 3.20, 2.44, 1.92, 1.64, 1.42, 1.23, 1.10, 1.03, 1.00},
    {5.55, 4.10, 3.17, 2.47, 1.94, 1.67, 1.45, 1.24, 1.10, 1.03, 1.00},
    {4.10, 3.36, 2.74, 2.32, 1.98, 1.74, 1.50, 1.28, 1.13, 1.04, 1.00},
    {3.54, 3.05, 2.60, 2.27, 2.01, 1.78, 1.54, 1.32, 1.15, 1.04, 1.00},
    {3.31, 2.92, 2.60, 2.29, 2.03, 1.80, 1.56, 1.34, 1.16, 1.04, 1.00},
    {3.20, 2.90, 2.62, 2.34, 2.08, 1.81, 1.57, 1.34, 1.165, 1.04, 1.00},
    {3.23, 2.93, 2.65, 2.27, 2.10, 1.83, 1.58, 1.35, 1.17, 1.04, 1.00},
    {3.41, 3.11, 2.815, 2.51, 2.22, 1.93, 1.65, 1.395, 1.19, 1.05, 1.00},
};

// Where x falls in the sorted (ascending or descending) grid: the lower index i and the
// weight t of grid[i + 1], with x clamped to the grid's span.
template <std::size_t n>
std::pair<std::size_t, double> Bracket(const std::array<double, n>& grid, double x) {
  const bool ascending = grid.front() < grid.back();
  const double lo = ascending ? grid.front() : grid.back();
  const double hi = ascending ? grid.back() : grid.front();
  x = std::clamp(x, lo, hi);
  std::size_t i = 0;
  while (i + 2 < n && (ascending ? x > grid[i + 1] : x < grid[i + 1])) ++i;
  return {i, (x - grid[i]) / (grid[i + 1] - grid[i])};
}

// One row of Phi at d/p, linear in d/p.
double PhiRow(std::size_t row, double wire_over_pitch) {
  const auto [j, t] = Bracket(kPhiWireOverPitch, wire_over_pitch);
  return (1.0 - t) * kPhi[row][j] + t * kPhi[row][j + 1];
}

}  // namespace

double NagaokaCoefficient(double diameter_m, double length_m) {
  const double hyp = std::hypot(diameter_m, length_m);
  const double k = diameter_m / hyp;
  const double kp = length_m / hyp;
  const double big_k = boost::math::ellint_1(k);
  const double big_e = boost::math::ellint_2(k);
  return 4.0 / (3.0 * core::kPi * kp) * ((kp * kp) / (k * k) * (big_k - big_e) + big_e - k);
}

double LundinNagaokaCoefficient(double diameter_m, double length_m) {
  const double x = diameter_m / length_m;
  auto f1 = [](double z) { return (1.0 + 0.383901 * z + 0.017108 * z * z) / (1.0 + 0.258952 * z); };
  auto f2 = [](double z) { return 0.093842 * z + 0.002029 * z * z - 0.000801 * z * z * z; };
  if (x <= 1.0) return f1(x * x) - 4.0 * x / (3.0 * core::kPi);
  const double z = 1.0 / (x * x);
  return 2.0 / (core::kPi * x) * ((std::log(4.0 * x) - 0.5) * f1(z) + f2(z));
}

double SheetInductance_h(double turns, double diameter_m, double length_m) {
  const double r = 0.5 * diameter_m;
  return core::kMu0_h_per_m * core::kPi * r * r * turns * turns *
         NagaokaCoefficient(diameter_m, length_m) / length_m;
}

double RosaCorrection_h(double turns, double diameter_m, double pitch_m, double wire_diameter_m) {
  const double k_s = 1.25 - std::log(2.0 * pitch_m / wire_diameter_m);
  const double k_m =
      std::log(2.0 * core::kPi) - 1.5 - std::log(turns) / (6.0 * turns) - 0.3308 / turns;
  return core::kMu0_h_per_m * 0.5 * diameter_m * turns * (k_s + k_m);
}

double WheelerInductance_h(double turns, double diameter_m, double length_m) {
  const double d_in = diameter_m / kMetresPerInch;
  const double l_in = length_m / kMetresPerInch;
  return 1e-6 * d_in * d_in * turns * turns / (18.0 * d_in + 40.0 * l_in);
}

double MedhurstH_pf_per_cm(double length_over_diameter, bool* outside) {
  if (outside != nullptr) {
    *outside = length_over_diameter < kHLengthOverDiameter.front() ||
               length_over_diameter > kHLengthOverDiameter.back();
  }
  const auto [i, t] = Bracket(kHLengthOverDiameter, length_over_diameter);
  return (1.0 - t) * kH_pf_per_cm[i] + t * kH_pf_per_cm[i + 1];
}

double MedhurstProximityFactor(double length_over_diameter, double wire_over_pitch) {
  const double x = std::max(length_over_diameter, 0.0);
  if (x <= kPhiLengthOverDiameter.back()) {
    const auto [i, t] = Bracket(kPhiLengthOverDiameter, x);
    return (1.0 - t) * PhiRow(i, wire_over_pitch) + t * PhiRow(i + 1, wire_over_pitch);
  }
  // Beyond l/D = 10: linear in D/l between the l/D = 10 row (D/l = 0.1) and the infinite one.
  const double t = 1.0 - (1.0 / x) / (1.0 / kPhiLengthOverDiameter.back());
  return (1.0 - t) * PhiRow(kPhiRows - 2, wire_over_pitch) +
         t * PhiRow(kPhiRows - 1, wire_over_pitch);
}

}  // namespace wirefield::coil
