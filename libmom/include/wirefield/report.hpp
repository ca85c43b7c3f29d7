// wirefield public API, part 3: results to text, JSON and CSV for people and scripts.
// The command-line program prints what these return; the JSON follows /work/shared CONTRACT.md.
#pragma once

#include <string>

#include "wirefield/simulation.hpp"

namespace wirefield {

// A readable report of one solve: frequency, unknowns, each feed (R + jX, |Z|, SWR, current)
// and each load (current, voltage, dissipated power), with units.
std::string FormatSolveText(const Simulation& simulation, const SolveResult& result);

// The contract's JSON document for `solve` (one line or pretty-printed, always valid JSON).
std::string FormatSolveJson(const Simulation& simulation, const SolveResult& result);

}  // namespace wirefield
