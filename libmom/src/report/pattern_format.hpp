// Report stage: helpers shared by the pattern reports (text, JSON, CSV in pattern_report.cpp,
// SVG in pattern_svg.cpp). Input: a PatternResult; output: checks and short strings (gain
// with "none" for no radiation, the ground in words). Nothing here prints NaN or inf.
#pragma once

#include <string>

#include "report/ground_text.hpp"
#include "wirefield/pattern.hpp"

namespace wirefield::report {

// Throws ComputationError when any number of the pattern (gains, angles, powers, figures of
// merit) is not finite, or when a cut's arrays differ in length.
void CheckPattern(const PatternResult& pattern);

// True when a gain stands for "no radiation" (kNoGainDbi or below).
bool IsNoGain(double gain_dbi);

// A gain with `decimals` decimals, or "none" for no radiation.
std::string GainText(double gain_dbi, int decimals = 2);

// The gain as JSON/CSV write it: no radiation is exactly kNoGainDbi.
double GainValue(double gain_dbi);

// An angle in degrees with the fewest decimals that show it (0.5 step -> "12.5").
std::string AngleText(double angle_deg);

// The ground in a few words ("free space", "perfect ground plane z = 0", ...).

// The model's file name without its folders (the plot title).
std::string ModelFileName(const std::string& path);

}  // namespace wirefield::report
