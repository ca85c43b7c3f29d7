// Report stage: helpers shared by the sweep reports (text, JSON, CSV and Touchstone in
// sweep_report.cpp, SVG in sweep_svg.cpp). Input: a SweepReport; output: checks and the
// picture's title words.
#pragma once

#include <nlohmann/json.hpp>
#include <string>
#include <vector>

#include "report/json_values.hpp"
#include "wirefield/report.hpp"

namespace wirefield::report {

// Throws ComputationError when the sweep has no points or any number it reports is not finite.
void CheckSweepReport(const SweepReport& report);

// Whether a transformer or a feed line sits between the first feed and the transmitter
// (without them the impedances at both places are the same number).
bool HasFeedChain(const SweepResult& sweep);

// The bands swept ("40m, 20m (ITU Region 1)") or the range ("7.0000-7.3000 MHz").
std::string SweepTitle(const SweepReport& report);

// The spans of a sweep as JSON: [{"name", "from_hz", "to_hz", "points", "how"}, ...].
nlohmann::json SpansJson(const std::vector<SweepSpan>& spans);

}  // namespace wirefield::report
