// wirefield public API, part 3: results to text, JSON and CSV for people and scripts.
// The command-line program prints what these return; the JSON follows /work/shared CONTRACT.md.
#pragma once

#include <string>

#include "wirefield/simulation.hpp"
#include "wirefield/stress.hpp"

namespace wirefield {

// A readable report of one solve: frequency, unknowns, each feed (R + jX, |Z|, SWR, current)
// and each load (current, voltage, dissipated power), with units.
// With `stress` (a --power run), a section of voltages, currents and cautions at that power.
std::string FormatSolveText(const Simulation& simulation, const SolveResult& result,
                            const StressResult* stress = nullptr);

// The contract's JSON document for `solve` (one line or pretty-printed, always valid JSON).
// With `stress`, the key "stress" (docs/commands.md).
std::string FormatSolveJson(const Simulation& simulation, const SolveResult& result,
                            const StressResult* stress = nullptr);

}  // namespace wirefield
