// Model stage: the feed-line loss fit (see line_loss.hpp).
#include "model/line_loss.hpp"

#include <algorithm>
#include <cmath>
#include <numbers>

namespace wirefield::model {

double DbPerNeper() { return 20.0 / std::numbers::ln10; }

double NepersPerMetre(double db_per_100m) { return db_per_100m / 100.0 / DbPerNeper(); }

namespace {

// Least squared relative misfit of alpha = s * g(f) through (g_i, alpha_i): minimises
// sum (s k_i - 1)^2 with k_i = g_i / alpha_i, so s = sum k / sum k^2.
double ScaleThrough(double g1, double alpha1, double g2, double alpha2) {
  const double k1 = g1 / alpha1, k2 = g2 / alpha2;
  return (k1 + k2) / (k1 * k1 + k2 * k2);
}

double Misfit(const LossFit& fit, double f_hz, double alpha) {
  return std::abs(AttenuationNepersPerMetre(fit, f_hz) / alpha - 1.0);
}

}  // namespace

LossFit FitLoss(double loss1_db_per_100m, double f1_hz, double loss2_db_per_100m, double f2_hz) {
  LossFit fit;
  const double alpha1 = NepersPerMetre(loss1_db_per_100m);
  const double alpha2 = NepersPerMetre(loss2_db_per_100m);
  if (alpha1 == 0.0 && alpha2 == 0.0) return fit;
  const double s1 = std::sqrt(f1_hz), s2 = std::sqrt(f2_hz);
  // a s1 + b f1 = alpha1, a s2 + b f2 = alpha2 (Cramer's rule).
  const double det = s1 * f2_hz - s2 * f1_hz;
  const double a = (alpha1 * f2_hz - alpha2 * f1_hz) / det;
  const double b = (s1 * alpha2 - s2 * alpha1) / det;
  if (a >= 0.0 && b >= 0.0) {
    fit.a_np_per_m_per_sqrt_hz = a;
    fit.b_np_per_m_per_hz = b;
    return fit;
  }
  fit.exact = false;
  if (b < 0.0) {
    fit.a_np_per_m_per_sqrt_hz = ScaleThrough(s1, alpha1, s2, alpha2);
  } else {
    fit.b_np_per_m_per_hz = ScaleThrough(f1_hz, alpha1, f2_hz, alpha2);
  }
  fit.worst_misfit = std::max(Misfit(fit, f1_hz, alpha1), Misfit(fit, f2_hz, alpha2));
  return fit;
}

LossFit FitLossSqrt(double loss_db_per_100m, double f_hz) {
  LossFit fit;
  fit.a_np_per_m_per_sqrt_hz = NepersPerMetre(loss_db_per_100m) / std::sqrt(f_hz);
  return fit;
}

LossFit FitLoss(const FeedLineSpec& line) {
  if (line.loss_points == 0) return LossFit{};
  if (line.loss_points == 1) return FitLossSqrt(line.loss1_db_per_100m, line.loss1_frequency_hz);
  return FitLoss(line.loss1_db_per_100m, line.loss1_frequency_hz, line.loss2_db_per_100m,
                 line.loss2_frequency_hz);
}

double AttenuationNepersPerMetre(const LossFit& fit, double frequency_hz) {
  return fit.a_np_per_m_per_sqrt_hz * std::sqrt(frequency_hz) +
         fit.b_np_per_m_per_hz * frequency_hz;
}

}  // namespace wirefield::model
