// Ground stage: Fresnel coefficients and the image weights of the reflection-coefficient
// approximation (see reflection.hpp).
#include "ground/reflection.hpp"

#include <cmath>

#include "core/constants.hpp"

namespace wirefield::ground {
namespace {

// sqrt(eps_c - cos^2 psi), written as sqrt((eps_c - 1) + sin^2 psi): near grazing incidence
// 1 - cos^2 psi cancels to 0 (cos psi rounds to 1 below psi ~ 1e-8), which made the root 0
// against sin psi > 0 and both coefficients +1 over a ground equal to free space.
Complex Root(Complex eps_c, double psi_rad) {
  const double s = std::sin(psi_rad);
  return std::sqrt((eps_c - 1.0) + s * s);  // principal branch: Re >= 0
}

// A ground whose permittivity is that of free space is no interface: nothing reflects at any
// angle, grazing included, where the formulas below are 0 / 0.
bool IsFreeSpace(Complex eps_c) { return eps_c == Complex(1.0, 0.0); }

}  // namespace

Complex ComplexPermittivity(double relative_permittivity, double conductivity_s_per_m,
                            double frequency_hz) {
  const double omega = 2.0 * core::kPi * frequency_hz;
  return {relative_permittivity, -conductivity_s_per_m / (omega * core::kEps0_f_per_m)};
}

Complex FresnelHorizontal(Complex eps_c, double psi_rad) {
  if (IsFreeSpace(eps_c)) return 0.0;
  const double s = std::sin(psi_rad);
  const Complex root = Root(eps_c, psi_rad);
  return (s - root) / (s + root);
}

Complex FresnelVertical(Complex eps_c, double psi_rad) {
  if (IsFreeSpace(eps_c)) return 0.0;
  const double s = std::sin(psi_rad);
  const Complex root = Root(eps_c, psi_rad);
  return (eps_c * s - root) / (eps_c * s + root);
}

Ground::Ground(const GroundSpec& spec, double frequency_hz) : kind_(spec.kind) {
  if (kind_ == GroundKind::kReal) {
    eps_c_ = ComplexPermittivity(spec.permittivity, spec.conductivity_s_per_m, frequency_hz);
  }
}

Complex Ground::Horizontal(double psi_rad) const {
  if (kind_ == GroundKind::kPerfect) return -1.0;
  if (kind_ == GroundKind::kFree) return 0.0;
  return FresnelHorizontal(eps_c_, psi_rad);
}

Complex Ground::Vertical(double psi_rad) const {
  if (kind_ == GroundKind::kPerfect) return 1.0;
  if (kind_ == GroundKind::kFree) return 0.0;
  return FresnelVertical(eps_c_, psi_rad);
}

ImageWeights Ground::Weights(double psi_rad, double rho_x, double rho_y) const {
  const Complex gv = Vertical(psi_rad);
  const Complex gh = Horizontal(psi_rad);
  // M = gv z z - gv rho rho + gh phi phi with phi = z x rho = (-rho_y, rho_x, 0).
  Eigen::Matrix3cd m = Eigen::Matrix3cd::Zero();
  m(0, 0) = -gv * rho_x * rho_x + gh * rho_y * rho_y;
  m(1, 1) = -gv * rho_y * rho_y + gh * rho_x * rho_x;
  m(0, 1) = m(1, 0) = -(gv + gh) * rho_x * rho_y;
  m(2, 2) = gv;
  return {m, -gv};
}

ImageWeights Ground::WeightsBetween(const Vec3& observer, const Vec3& source) const {
  const double dx = observer.x() - source.x(), dy = observer.y() - source.y();
  const double rho = std::hypot(dx, dy);
  const double height = observer.z() + source.z();  // path length vertical part via the image
  const double psi = std::atan2(std::max(height, 0.0), rho);
  // Straight above each other the direction of rho does not matter (Gamma_v = -Gamma_h at
  // normal incidence makes M rotationally symmetric); take +x.
  if (rho <= 0.0) return Weights(psi, 1.0, 0.0);
  return Weights(psi, dx / rho, dy / rho);
}

ImageWeights Ground::WeightsToward(const Vec3& rhat) const {
  const double rho = std::hypot(rhat.x(), rhat.y());
  const double psi = std::atan2(std::max(rhat.z(), 0.0), rho);
  if (rho <= 0.0) return Weights(psi, 1.0, 0.0);
  return Weights(psi, rhat.x() / rho, rhat.y() / rho);
}

}  // namespace wirefield::ground
