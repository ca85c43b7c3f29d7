// Network stage: ABCD matrix elements, cascade and port quantities (see abcd.hpp).
#include "network/abcd.hpp"

namespace wirefield::network {

Abcd operator*(const Abcd& first, const Abcd& second) {
  return Abcd{first.a * second.a + first.b * second.c, first.a * second.b + first.b * second.d,
              first.c * second.a + first.d * second.c, first.c * second.b + first.d * second.d};
}

Abcd Through() { return Abcd{}; }

Abcd SeriesImpedance(Complex z_ohm) { return Abcd{1.0, z_ohm, 0.0, 1.0}; }

Abcd ShuntAdmittance(Complex y_s) { return Abcd{1.0, 0.0, y_s, 1.0}; }

Abcd IdealTransformer(double turns_ratio) { return Abcd{1.0 / turns_ratio, 0.0, 0.0, turns_ratio}; }

Abcd TransmissionLine(Complex gamma_per_m, Complex z0_ohm, double length_m) {
  const Complex gl = gamma_per_m * length_m;
  const Complex ch = std::cosh(gl);
  const Complex sh = std::sinh(gl);
  return Abcd{ch, z0_ohm * sh, sh / z0_ohm, ch};
}

PortState Apply(const Abcd& m, const PortState& s) {
  return PortState{m.a * s.voltage_v + m.b * s.current_a, m.c * s.voltage_v + m.d * s.current_a};
}

Complex InputImpedance(const Abcd& m, Complex z_load_ohm) {
  return (m.a * z_load_ohm + m.b) / (m.c * z_load_ohm + m.d);
}

double Power(const PortState& s) { return 0.5 * std::real(s.voltage_v * std::conj(s.current_a)); }

}  // namespace wirefield::network
