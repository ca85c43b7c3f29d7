// Report stage: the mesh error estimate (SolveResult::mesh_estimate) as text and JSON, shared by
// the solve, sweep, tune and batch reports.
#pragma once

#include <nlohmann/json.hpp>
#include <optional>
#include <string>
#include <vector>

#include "wirefield/simulation.hpp"

namespace wirefield::report {

// "72.1 + j3.4 ohm (mesh +-0.3 ohm)": the impedance with as many decimals as its estimate
// supports; without an estimate "72.10 + j3.40 ohm (mesh not estimated)".
std::string ImpedanceWithMeshError(Complex z_ohm, std::optional<double> error_ohm);

// The text section after the solve's feed table: one line per feed, the coarser meshes used
// and the estimate's notes. Empty without an estimate.
std::string FormatMeshEstimateText(const SolveResult& result);

// {"segments", "half_segments", "quarter_segments", "notes", "feeds": [{"name",
// "mesh_error_ohm", "observed_order", "asymptotic", "half_mesh_z_ohm",
// "quarter_mesh_z_ohm"}]}; every number finite. No time: the solve's JSON is the same
// on every run.
nlohmann::json MeshEstimateJson(const SolveResult& result);

// Adds feeds[].mesh_error_ohm and "mesh_estimate" to a solve document and the estimate's
// warnings to its "warnings". Nothing without an estimate.
void AddMeshEstimateJson(const SolveResult& result, nlohmann::json* doc);

// The sweep summary's lines: the first feed at each band centre with its estimate, saying that
// the points between are not estimated. Empty without estimates.
std::string FormatCentreEstimatesText(const std::string& feed_name,
                                      const std::vector<FeedMeshEstimateAt>& estimates);

// [{"span", "frequency_hz", "z_ohm", "mesh_error_ohm" (null when not estimated), "notes"}].
nlohmann::json CentreEstimatesJson(const std::vector<FeedMeshEstimateAt>& estimates);

}  // namespace wirefield::report
