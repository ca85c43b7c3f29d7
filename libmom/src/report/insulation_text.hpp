// Report stage: how the reports state the insulated wires of a model (the `insulation` clause),
// in words and in JSON. Input: the model's wires; output: text lines or a JSON array.
#pragma once

#include <nlohmann/json.hpp>
#include <string>
#include <vector>

#include "wirefield/model.hpp"

namespace wirefield::report {

// One line per insulated wire, each "  insulation      dip: pvc, 0.5 mm thick, relative
// permittivity 4, loss tangent 0.05 (thin-coating approximation)\n" (the label on the first
// only); empty when no wire is insulated, so the reports of bare models do not change.
std::string InsulationLines(const std::vector<WireSpec>& wires);
// [{"wire": .., "preset": "pvc" (or null), "thickness_m": .., "relative_permittivity": ..,
//   "loss_tangent": ..}, ...], one per insulated wire in model order.
nlohmann::json InsulationJson(const std::vector<WireSpec>& wires);
// True when some wire of the model is insulated.
bool AnyInsulation(const std::vector<WireSpec>& wires);

}  // namespace wirefield::report
