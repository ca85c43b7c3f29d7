// Report stage: the ground and its method, in words and in JSON.
#include "report/ground_text.hpp"

#include <fmt/format.h>

namespace wirefield::report {

std::string GroundText(const GroundSpec& ground) {
  switch (ground.kind) {
    case GroundKind::kFree:
      return "none (free space)";
    case GroundKind::kPerfect:
      return "perfectly conducting plane z = 0 (exact image)";
    case GroundKind::kReal:
      return fmt::format(
          "real, plane z = 0: {}relative permittivity {:.6g}, {:.6g} S/m "
          "(reflection-coefficient approximation)",
          ground.preset.empty() ? "" : ground.preset + ", ", ground.permittivity,
          ground.conductivity_s_per_m);
  }
  return "?";
}

nlohmann::json GroundJson(const GroundSpec& ground) {
  nlohmann::json g;
  switch (ground.kind) {
    case GroundKind::kFree:
      g["kind"] = "free";
      g["method"] = "none";
      break;
    case GroundKind::kPerfect:
      g["kind"] = "perfect";
      g["method"] = "image";
      break;
    case GroundKind::kReal:
      g["kind"] = "real";
      g["method"] = "reflection_coefficient";
      g["permittivity"] = ground.permittivity;
      g["conductivity_s_per_m"] = ground.conductivity_s_per_m;
      if (!ground.preset.empty()) g["preset"] = ground.preset;
      break;
  }
  return g;
}

}  // namespace wirefield::report
