// Report stage: the ground and its method, in words and in JSON.
#include "report/ground_text.hpp"

#include <fmt/format.h>

namespace wirefield::report {
namespace {

std::string MethodText(const GroundSpec& ground) {
  if (ground.method == GroundMethod::kReflection ||
      (ground.exact_below_m && *ground.exact_below_m == 0.0)) {
    return "reflection-coefficient approximation";
  }
  if (!ground.exact_below_m) {
    return "exact half-space (Sommerfeld integrals) for every pair of segments, reflection "
           "coefficients in the far field";
  }
  return fmt::format(
      "exact half-space (Sommerfeld integrals) for segment pairs below a mean height of {:.4g} m, "
      "reflection coefficients above it and in the far field",
      *ground.exact_below_m);
}

}  // namespace

std::string GroundText(const GroundSpec& ground) {
  switch (ground.kind) {
    case GroundKind::kFree:
      return "none (free space)";
    case GroundKind::kPerfect:
      return "perfectly conducting plane z = 0 (exact image)";
    case GroundKind::kReal:
      return fmt::format("real, plane z = 0: {}relative permittivity {:.6g}, {:.6g} S/m ({})",
                         ground.preset.empty() ? "" : ground.preset + ", ", ground.permittivity,
                         ground.conductivity_s_per_m, MethodText(ground));
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
      if (ground.method == GroundMethod::kReflection ||
          (ground.exact_below_m && *ground.exact_below_m == 0.0)) {
        g["method"] = "reflection_coefficient";
      } else {
        g["method"] = "exact_half_space";
        // Every pair by default; an explicit exact_below keeps the mixture below/above it.
        if (ground.exact_below_m) g["exact_below_m"] = *ground.exact_below_m;
        g["far_field_method"] = "reflection_coefficient";
      }
      g["permittivity"] = ground.permittivity;
      g["conductivity_s_per_m"] = ground.conductivity_s_per_m;
      if (!ground.preset.empty()) g["preset"] = ground.preset;
      break;
  }
  return g;
}

}  // namespace wirefield::report
