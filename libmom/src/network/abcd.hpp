// Network stage: 2x2 complex ABCD (chain) matrices of two-ports and their cascade.
// Port 1 is the transmitter side, port 2 the antenna side: (V1, I1) = M (V2, I2) with I2
// flowing out of port 2 into the load. Inputs: element values in SI; outputs: matrices,
// input impedances and the port quantities through a cascade. See docs/numerics.md, "Feed chain".
#pragma once

#include <complex>

#include "wirefield/core.hpp"

namespace wirefield::network {

// [[a, b], [c, d]]: V1 = a V2 + b I2, I1 = c V2 + d I2.
struct Abcd {
  Complex a{1.0, 0.0};
  Complex b{0.0, 0.0};
  Complex c{0.0, 0.0};
  Complex d{1.0, 0.0};
};

// Voltage and current at one port (peak phasors; current flowing toward the antenna).
struct PortState {
  Complex voltage_v;
  Complex current_a;
};

// Cascades two two-ports: first (transmitter side) then second (antenna side).
Abcd operator*(const Abcd& first, const Abcd& second);

// The identity two-port (a through connection).
Abcd Through();
// A series impedance between the ports: [[1, Z], [0, 1]].
Abcd SeriesImpedance(Complex z_ohm);
// A shunt admittance across the line: [[1, 0], [Y, 1]].
Abcd ShuntAdmittance(Complex y_s);
// An ideal transformer with turns ratio n = N_antenna / N_transmitter: [[1/n, 0], [0, n]],
// so Z at port 1 is Z at port 2 divided by n^2.
Abcd IdealTransformer(double turns_ratio);
// A uniform line of length l with propagation constant gamma (1/m) and characteristic
// impedance Z0: [[cosh gl, Z0 sinh gl], [sinh gl / Z0, cosh gl]].
Abcd TransmissionLine(Complex gamma_per_m, Complex z0_ohm, double length_m);

// The state at port 1 for a given state at port 2.
PortState Apply(const Abcd& m, const PortState& at_port2);
// Z at port 1 when port 2 is terminated in z_load_ohm: (a Z + b) / (c Z + d).
Complex InputImpedance(const Abcd& m, Complex z_load_ohm);
// Time-averaged power through a port, 1/2 Re(V I*), in watts.
double Power(const PortState& s);

}  // namespace wirefield::network
