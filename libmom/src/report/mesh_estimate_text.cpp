// Report stage: the mesh error estimate as text and JSON (report/mesh_estimate_text.hpp).
#include "report/mesh_estimate_text.hpp"

#include <fmt/format.h>

#include <algorithm>
#include <cmath>

namespace wirefield::report {
namespace {

double Finite(double value) { return std::isfinite(value) ? value : 0.0; }

nlohmann::json ComplexPair(Complex value) {
  return nlohmann::json::array({Finite(value.real()), Finite(value.imag())});
}

}  // namespace

std::string ImpedanceWithMeshError(Complex z_ohm, std::optional<double> error_ohm) {
  const char sign = z_ohm.imag() < 0.0 ? '-' : '+';
  if (!error_ohm || !std::isfinite(*error_ohm)) {
    return fmt::format("{:.2f} {} j{:.2f} ohm (mesh not estimated)", z_ohm.real(), sign,
                       std::abs(z_ohm.imag()));
  }
  // One significant digit of the estimate sets the decimals (1 to 3).
  const int decimals = *error_ohm > 0.0
                           ? std::clamp(static_cast<int>(-std::floor(std::log10(*error_ohm))), 1, 3)
                           : 3;
  return fmt::format("{:.{}f} {} j{:.{}f} ohm (mesh +-{:.{}f} ohm)", z_ohm.real(), decimals, sign,
                     std::abs(z_ohm.imag()), decimals, *error_ohm, decimals);
}

std::string FormatMeshEstimateText(const SolveResult& result) {
  if (!result.mesh_estimate) return "";
  const MeshEstimate& estimate = *result.mesh_estimate;
  std::string out;
  if (estimate.feeds.empty()) {
    out += "\nMesh estimate: none\n";
  } else {
    out += fmt::format(
        "\nMesh estimate at the feed terminals (solved again with {} and {} segments; "
        "docs/numerics.md)\n",
        estimate.half_segments, estimate.quarter_segments);
    for (const FeedResult& feed : result.feeds) {
      out += fmt::format("  feed {}: Z = {}\n", feed.name,
                         ImpedanceWithMeshError(feed.impedance_ohm, feed.mesh_error_ohm));
    }
  }
  for (const std::string& note : estimate.notes) out += fmt::format("  note: {}\n", note);
  return out;
}

nlohmann::json MeshEstimateJson(const SolveResult& result) {
  nlohmann::json out = nlohmann::json::object();
  if (!result.mesh_estimate) return out;
  const MeshEstimate& estimate = *result.mesh_estimate;
  out["segments"] = estimate.segments;
  out["half_segments"] = estimate.half_segments;
  out["quarter_segments"] = estimate.quarter_segments;
  out["notes"] = estimate.notes;
  out["feeds"] = nlohmann::json::array();
  for (size_t f = 0; f < estimate.feeds.size() && f < result.feeds.size(); ++f) {
    const FeedMeshError& e = estimate.feeds[f];
    out["feeds"].push_back({{"name", result.feeds[f].name},
                            {"mesh_error_ohm", Finite(e.error_ohm)},
                            {"observed_order", Finite(e.observed_order)},
                            {"asymptotic", e.asymptotic},
                            {"half_mesh_z_ohm", ComplexPair(e.half_mesh_impedance_ohm)},
                            {"quarter_mesh_z_ohm", ComplexPair(e.quarter_mesh_impedance_ohm)}});
  }
  return out;
}

void AddMeshEstimateJson(const SolveResult& result, nlohmann::json* doc) {
  if (!result.mesh_estimate) return;
  nlohmann::json& feeds = (*doc)["feeds"];
  for (size_t f = 0; f < result.feeds.size() && f < feeds.size(); ++f) {
    if (result.feeds[f].mesh_error_ohm) {
      feeds[f]["mesh_error_ohm"] = Finite(*result.feeds[f].mesh_error_ohm);
    }
  }
  (*doc)["mesh_estimate"] = MeshEstimateJson(result);
  for (const Warning& warning : result.mesh_estimate->warnings) {
    (*doc)["warnings"].push_back(ToString(warning));
  }
}

std::string FormatCentreEstimatesText(const std::string& feed_name,
                                      const std::vector<FeedMeshEstimateAt>& estimates) {
  if (estimates.empty()) return "";
  std::string out =
      "  mesh estimate at the feed terminals, at each band's centre only (not at every point):\n";
  for (const FeedMeshEstimateAt& e : estimates) {
    out += fmt::format("    {} {:.4f} MHz: feed {}: Z = {}\n", e.label, e.frequency_hz / 1e6,
                       feed_name, ImpedanceWithMeshError(e.z_ohm, e.mesh_error_ohm));
    for (const std::string& note : e.notes) out += fmt::format("      note: {}\n", note);
  }
  return out;
}

nlohmann::json CentreEstimatesJson(const std::vector<FeedMeshEstimateAt>& estimates) {
  nlohmann::json out = nlohmann::json::array();
  for (const FeedMeshEstimateAt& e : estimates) {
    out.push_back({{"span", e.label},
                   {"frequency_hz", Finite(e.frequency_hz)},
                   {"z_ohm", ComplexPair(e.z_ohm)},
                   {"mesh_error_ohm", e.mesh_error_ohm ? nlohmann::json(Finite(*e.mesh_error_ohm))
                                                       : nlohmann::json()},
                   {"notes", e.notes}});
  }
  return out;
}

}  // namespace wirefield::report
