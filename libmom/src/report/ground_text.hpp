// Report stage: how every report states the ground and the method used for it.
#pragma once

#include <nlohmann/json.hpp>
#include <string>

#include "wirefield/model.hpp"

namespace wirefield::report {

// One line, e.g. "real, plane z = 0: medium_dry, relative permittivity 15, 0.001 S/m
// (reflection-coefficient approximation)".
std::string GroundText(const GroundSpec& ground);
// {"kind": "real", "preset": .., "permittivity": .., "conductivity_s_per_m": ..,
//  "method": "exact_half_space" (every pair of segments; with "exact_below_m": .. only the
//  pairs below that mean height), "far_field_method": "reflection_coefficient"}; method
//  "reflection_coefficient" for the
//  approximation, "image" for a perfect ground, "none" in free space.
nlohmann::json GroundJson(const GroundSpec& ground);

}  // namespace wirefield::report
