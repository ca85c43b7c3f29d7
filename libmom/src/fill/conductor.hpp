// Fill stage: the internal impedance per metre of a lossy wire, which the fill adds along each
// segment, as the conductor physics gives it (conductor/wire_impedance.hpp, shared with the
// coil calculator).
#pragma once

#include "conductor/wire_impedance.hpp"

namespace wirefield::fill {

using conductor::WireImpedancePerMetre;

}  // namespace wirefield::fill
