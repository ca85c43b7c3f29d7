// Named grounds for `ground real preset=NAME`.
//
// Source: Recommendation ITU-R P.527-3 (1992), "Electrical characteristics of the surface of
// the Earth", Annex 1, Fig. 1: curves of relative permittivity and conductivity against
// frequency for sea water (average salinity, 20 C), fresh water (20 C), wet ground, medium dry
// ground, very dry ground and ice (-1 C and -10 C), among others. Its text states that the
// conductivities are flat up to at least 30 MHz and the permittivities up to a few GHz (confirmed
// from a copy of the text), so one pair per class covers HF. The numbers below are the flat HF
// part of those curves (from memory: the figure itself could not be read in a searchable copy).
// Later editions (P.527-4, 2017; -5, 2019; -6, 2021) replace the curves by models of water, ice
// and soil against frequency, temperature and moisture; at HF they give values of the same
// order. "average" is the ground of amateur modelling practice (common practice), close to the
// "pastoral, medium hills" class of the US broadcast ground-conductivity map.
#include <algorithm>

#include "wirefield/model.hpp"

namespace wirefield {

const std::vector<GroundPreset>& GroundPresets() {
  static const std::vector<GroundPreset> presets = {
      {"sea_water", 70.0, 5.0, "sea water, average salinity, 20 C",
       "ITU-R P.527-3 Fig. 1 (from memory)"},
      {"fresh_water", 80.0, 3e-3, "fresh water (lake, river), 20 C",
       "ITU-R P.527-3 Fig. 1 (from memory)"},
      {"wet_ground", 30.0, 1e-2, "wet ground (wet meadow, marsh)",
       "ITU-R P.527-3 Fig. 1 (from memory)"},
      {"medium_dry", 15.0, 1e-3, "medium dry ground (pasture, farmland)",
       "ITU-R P.527-3 Fig. 1 (from memory)"},
      {"very_dry", 3.0, 1e-4, "very dry ground (dry sand, rock)",
       "ITU-R P.527-3 Fig. 1 (from memory)"},
      {"ice_warm", 3.0, 3e-5, "fresh-water ice at -1 C", "ITU-R P.527-3 Fig. 1 (from memory)"},
      {"ice_cold", 3.0, 1e-5, "fresh-water ice at -10 C", "ITU-R P.527-3 Fig. 1 (from memory)"},
      {"average", 13.0, 5e-3, "average ground of amateur modelling (pasture, medium hills)",
       "common practice"},
  };
  return presets;
}

const GroundPreset* FindGroundPreset(const std::string& name) {
  const auto& all = GroundPresets();
  const auto it =
      std::find_if(all.begin(), all.end(), [&](const GroundPreset& p) { return p.name == name; });
  return it == all.end() ? nullptr : &*it;
}

GroundSpec RealGround(const GroundPreset& preset) {
  GroundSpec g;
  g.kind = GroundKind::kReal;
  g.permittivity = preset.permittivity;
  g.conductivity_s_per_m = preset.conductivity_s_per_m;
  g.preset = preset.name;
  return g;
}

}  // namespace wirefield
