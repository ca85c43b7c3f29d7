// Core: the conductor material table. Figures are handbook and standard values for wire at
// about 20 degC; those not checked against the document cited are marked "(from memory)".
// See docs/model-language.md ("Conductor materials") for the table as users read it.
#include "core/materials.hpp"

#include <array>

namespace wirefield::core {
namespace {

// Conductivity of annealed copper, 100% IACS: 1/58 ohm mm^2/m = 58.0 MS/m at 20 degC
// (IEC 60028, the International Annealed Copper Standard; from memory).
constexpr double kIacs_s_per_m = 5.80e7;

constexpr std::array<Material, 7> kMaterials = {{
    // IEC 60028 (from memory): annealed copper is the 100% IACS reference.
    {"copper", kIacs_s_per_m, 1.0,
     "annealed copper, 100% IACS = 58.0 MS/m at 20 degC (IEC 60028, from memory)"},
    // ASTM B1 (from memory): hard-drawn copper wire, about 97% IACS.
    {"hard_drawn_copper", 5.63e7, 1.0,
     "hard-drawn copper wire, about 97% IACS = 56.3 MS/m (ASTM B1, from memory)"},
    // ASTM B230 (from memory): EC grade 1350 aluminium wire, 61% IACS.
    {"aluminium", 3.54e7, 1.0,
     "aluminium wire, EC grade 1350, 61% IACS = 35.4 MS/m (ASTM B230, from memory)"},
    // Copper-clad steel: ASTM B227 grades are 30% and 40% IACS at DC (17.4 and 23.2 MS/m),
    // but that is the steel core and the copper layer in parallel. At HF the current flows
    // within a few skin depths of the surface; with the copper layer several skin depths
    // thick the RF resistance approaches that of solid copper (from memory). So the HF
    // model is copper's conductivity with mu_r 1; it is optimistic at low HF for thin layers.
    {"copper_clad_steel", kIacs_s_per_m, 1.0,
     "HF assumption: the current stays in the copper layer (several skin depths thick), so "
     "copper's 58.0 MS/m and mu_r 1 are used; the DC grades of 30% and 40% IACS (ASTM B227) "
     "are not what HF current sees (from memory)"},
    // Plain carbon steel wire (from memory, both figures). The permeability of steel at HF
    // depends on the alloy, its working and the field strength and varies widely; 100 is a
    // rough estimate of its order only.
    {"steel", 6.0e6, 100.0,
     "plain carbon steel wire, about 6 MS/m, mu_r about 100 at HF (both from memory; the "
     "permeability of steel at HF varies widely and 100 is a rough estimate)"},
    // Austenitic stainless steel (304 class), non-magnetic (from memory).
    {"stainless_steel", 1.4e6, 1.0,
     "austenitic stainless steel, about 1.4 MS/m, mu_r 1 (from memory)"},
    // Brass (copper-zinc), about 26% IACS (from memory).
    {"brass", 1.5e7, 1.0, "brass, about 15 MS/m (from memory)"},
}};

// Other spellings and the table name they stand for.
struct Alias {
  const char* alias;
  const char* name;
};
constexpr std::array<Alias, 1> kAliases = {{{"aluminum", "aluminium"}}};

}  // namespace

const Material* FindMaterial(std::string_view name) {
  for (const Alias& a : kAliases) {
    if (name == a.alias) name = a.name;
  }
  for (const Material& m : kMaterials) {
    if (name == m.name) return &m;
  }
  return nullptr;
}

std::vector<std::string> MaterialNames() {
  std::vector<std::string> names;
  names.reserve(kMaterials.size() + kAliases.size());
  for (const Material& m : kMaterials) names.emplace_back(m.name);
  for (const Alias& a : kAliases) names.emplace_back(a.alias);
  return names;
}

}  // namespace wirefield::core
