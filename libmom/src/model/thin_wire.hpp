// Model stage: the thin-wire bounds on a wire's radius, shared by the parser (the bound
// against the wire's length, known when the wire is read) and the mesh stage (the bound
// against the wavelength, known once the frequency is), with the hint they give when a radius
// looks written in the wrong unit ("radius 1" under `units m`, meant as 1 mm).
#pragma once

#include <string>

#include "wirefield/model.hpp"

namespace wirefield::model {

// The thin-wire model (the reduced kernel of Pocklington's equation, the current a filament
// on the axis and uniform around the wire) holds for a radius small against the wavelength and
// against the lengths along the wire (Balanis, Antenna Theory, 3rd ed., sec. 8.3: a << lambda;
// Harrington, Field Computation by Moment Methods, sec. 4.2; from memory). A radius above 1%
// of the wavelength (2 pi a / lambda = 0.063) or above a tenth of its wire's length is outside
// it (common practice); no HF wire or tube comes near either bound, so a radius past them is
// almost always one written in the wrong unit.
inline constexpr double kMaxRadiusOfWavelength = 0.01;
inline constexpr double kMaxRadiusOfLength = 0.1;

// " (did you mean radius 1mm?)" when the wire's radius (or diameter) was written as one number
// in another unit than mm and that number in mm would make a radius of at most max_radius_m;
// else "".
std::string RadiusUnitHint(const WireSpec& wire, double max_radius_m);

// Stranded wire in concentric lay: a centre strand and L layers of 6, 12, 18, ... strands
// round it, N = 1 + 3 L (L + 1) strands in all (1, 7, 19, 37, 61, ...), the bundle (2 L + 1)
// strand diameters across (the factors 3, 5, 7, 9 of the concentric-lay tables of ASTM B8;
// from memory). StrandLayers: L for such an N, else -1.
inline constexpr int kMaxStrandLayers = 20;
int StrandCount(int layers);
int StrandLayers(int strands);
// The equivalent radius of a stranded wire for the thin-wire kernel: that of its outer layer,
// M = 6 L strands of radius b = d/2 whose centres lie on a circle of radius R = L d, which is
// (M b R^(M-1))^(1/M), the equivalent radius of M equal round wires evenly spaced on a circle
// (Balanis, Antenna Theory, 3rd ed., table 9.3; Schelkunoff; from memory). The inner layers
// carry no current at HF (skin effect) and are left out. strands = 1 is the solid d / 2.
double StrandedEquivalentRadius(int strands, double strand_diameter_m);

// Where the radius was written: its value when known, else the wire's statement.
const SourceLocation& RadiusLocation(const WireSpec& wire);

}  // namespace wirefield::model
