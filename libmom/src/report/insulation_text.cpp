// Report stage: the insulated wires of a model, in words and in JSON (insulation_text.hpp).
#include "report/insulation_text.hpp"

#include <fmt/format.h>

#include <algorithm>

namespace wirefield::report {

bool AnyInsulation(const std::vector<WireSpec>& wires) {
  return std::any_of(wires.begin(), wires.end(),
                     [](const WireSpec& w) { return w.insulation.has_value(); });
}

std::string InsulationLines(const std::vector<WireSpec>& wires) {
  std::string out;
  for (const WireSpec& wire : wires) {
    if (!wire.insulation) continue;
    const InsulationSpec& jacket = *wire.insulation;
    out += fmt::format(
        "  {:<16}{}: {}{:.4g} mm thick, relative permittivity {:.4g}, loss "
        "tangent {:.4g} (thin-coating approximation)\n",
        out.empty() ? "insulation" : "", wire.name,
        jacket.preset.empty() ? "" : jacket.preset + ", ", jacket.thickness_m * 1e3,
        jacket.relative_permittivity, jacket.loss_tangent);
  }
  return out;
}

nlohmann::json InsulationJson(const std::vector<WireSpec>& wires) {
  nlohmann::json list = nlohmann::json::array();
  for (const WireSpec& wire : wires) {
    if (!wire.insulation) continue;
    const InsulationSpec& jacket = *wire.insulation;
    list.push_back({{"wire", wire.name},
                    {"preset", jacket.preset.empty() ? nlohmann::json(nullptr)
                                                     : nlohmann::json(jacket.preset)},
                    {"thickness_m", jacket.thickness_m},
                    {"relative_permittivity", jacket.relative_permittivity},
                    {"loss_tangent", jacket.loss_tangent}});
  }
  return list;
}

}  // namespace wirefield::report
