// Report stage: text that several text reports end with: the list of warnings and the caution
// about high RF voltage, exposure and power lines. Input: warnings; output: lines of text.
#pragma once

#include <string>
#include <vector>

#include "wirefield/model.hpp"

namespace wirefield::report {

// "\nWarnings\n" and one indented line per warning; empty when there are none.
std::string WarningsSection(const std::vector<Warning>& warnings);

// The caution on high voltage, RF exposure and power lines that ends the sweep and batch
// reports (three lines, each ending in '\n').
std::string TransmitCaution();

}  // namespace wirefield::report
