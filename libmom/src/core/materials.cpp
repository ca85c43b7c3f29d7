// Core: the conductor material table and the jacket plastics' table. Figures are handbook and
// standard values for wire at about 20 degC; those not checked against the document cited are
// marked "(from memory)". See docs/model-language.md ("Conductor materials", "Insulation") for
// the tables as users read them.
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

// Jacket plastics at HF (1 to 30 MHz), room temperature. All from memory: handbook tables of
// plastics give these at 1 MHz and they change little across HF, except PVC, whose
// plasticiser sets both figures.
constexpr std::array<Dielectric, 3> kDielectrics = {{
    // Plasticised PVC (from memory): relative permittivity about 3 to 5 and loss tangent
    // about 0.02 to 0.1 at 1 to 10 MHz, depending on the plasticiser; a mid value of each.
    {"pvc", 4.0, 0.05,
     "plasticised PVC, relative permittivity about 4 and loss tangent about 0.05 at HF; "
     "the plasticiser moves them within about 3 to 5 and 0.02 to 0.1 (from memory)"},
    // Solid low-density polyethylene (from memory): 2.3 and about 3e-4, flat across HF.
    {"pe", 2.3, 3e-4,
     "solid polyethylene, relative permittivity 2.3, loss tangent about 0.0003 at HF "
     "(from memory)"},
    // Solid PTFE (from memory): 2.1 and about 2e-4, flat across HF.
    {"ptfe", 2.1, 2e-4,
     "solid PTFE, relative permittivity 2.1, loss tangent about 0.0002 at HF (from memory)"},
}};

}  // namespace

const Dielectric* FindDielectric(std::string_view name) {
  for (const Dielectric& d : kDielectrics) {
    if (name == d.name) return &d;
  }
  return nullptr;
}

std::vector<std::string> DielectricNames() {
  std::vector<std::string> names;
  names.reserve(kDielectrics.size());
  for (const Dielectric& d : kDielectrics) names.emplace_back(d.name);
  return names;
}

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
