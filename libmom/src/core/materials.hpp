// Core: the tables of wire conductor materials (`material copper`) and of jacket plastics
// (`insulation pvc`) that the model language names.
// Each entry gives the conductivity (S/m) and relative permeability that the skin-effect
// impedance (conductor/wire_impedance.hpp) uses at HF, with its source. Input: a name as written in
// a model; output: the entry, or nullptr. The table and its sources are in docs/model-language.md.
#pragma once

#include <string>
#include <string_view>
#include <vector>

namespace wirefield::core {

struct Material {
  const char* name;              // as written in a model: lower case, '_' between words
  double conductivity_s_per_m;   // at room temperature (about 20 degC)
  double relative_permeability;  // at HF; 1 for all but steel
  const char* source;            // where the figures come from, and what they assume
};

// Returns the entry for name (exact, case-sensitive; "aluminum" is accepted for "aluminium"),
// or nullptr when the table has no such material.
const Material* FindMaterial(std::string_view name);

// Returns every name FindMaterial accepts, table order, the alternative spellings last.
std::vector<std::string> MaterialNames();

// A wire jacket's plastic, as the `insulation` clause names it (`insulation pvc`): relative
// permittivity and loss tangent at HF, with their source.
struct Dielectric {
  const char* name;              // as written in a model: lower case
  double relative_permittivity;  // real part, at HF and room temperature
  double loss_tangent;           // tan delta at HF
  const char* source;            // where the figures come from, and what they assume
};

// Returns the entry for name (exact, case-sensitive), or nullptr when the table has none.
const Dielectric* FindDielectric(std::string_view name);

// Returns every name FindDielectric accepts, in table order.
std::vector<std::string> DielectricNames();

}  // namespace wirefield::core
