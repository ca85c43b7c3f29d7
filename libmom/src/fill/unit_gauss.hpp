// Fill stage: the N-point Gauss-Legendre rule mapped to [0, 1] (nodes in increasing order),
// built once per N from Boost's table and shared by the free-space and half-space integrals.
#pragma once

#include <array>
#include <boost/math/quadrature/gauss.hpp>

namespace wirefield::fill {

// Nodes x and weights w of the N-point rule on [0, 1]; the weights sum to 1.
template <int N>
struct UnitGauss {
  std::array<double, N> x{}, w{};
  UnitGauss() {
    using G = boost::math::quadrature::gauss<double, N>;
    const auto& abs = G::abscissa();
    const auto& wts = G::weights();
    // Boost stores the non-negative half of the symmetric rule.
    int k = 0;
    const int half = static_cast<int>(abs.size());
    for (int i = half - 1; i >= 0; --i) {
      if (abs[i] == 0.0) continue;
      x[k] = 0.5 * (1.0 - abs[i]);
      w[k++] = 0.5 * wts[i];
    }
    for (int i = 0; i < half; ++i) {
      x[k] = 0.5 * (1.0 + abs[i]);
      w[k++] = 0.5 * wts[i];
    }
  }
};

// The N-point rule, built on first use.
template <int N>
const UnitGauss<N>& Gauss() {
  static const UnitGauss<N> rule;
  return rule;
}

}  // namespace wirefield::fill
