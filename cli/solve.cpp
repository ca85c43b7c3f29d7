// Command-line program: `wirefield solve MODEL`: solve one model at one frequency and print
// its feeds and loads (text table or, with --json, the contract's JSON). Flags -> Model ->
// Simulation -> Simulation::Solve -> FormatSolveText / FormatSolveJson -> stdout.
#include <fmt/format.h>

#include <optional>
#include <string>
#include <vector>

#include "command.hpp"
#include "output_files.hpp"
#include "wirefield/report.hpp"

namespace wirefield::cli {

namespace {

// What `wirefield solve --help` says besides its flags.
const CommandHelp kSolveHelp{
    "solve",
    "Solve a model at one frequency: feedpoint impedance, SWR, currents and power at each "
    "feed, current, voltage and power at each load.",
    R"(Examples:
  wirefield solve models/hiking_club_dipole.wire
  wirefield solve models/hiking_club_dipole.wire --freq 14.05MHz --z0 75 --json
  wirefield solve models/inverted_v_trail.wire --set apex_height=9m
  wirefield solve models/end_fed_field_kit.wire --power 100W --rating-cap 1kV
  wirefield solve models/campsite_end_fed_choke.wire --power 100W --currents currents.csv)"};

struct SolveFlags {
  ModelFlags model;
  PowerFlags power;
  TextFlag currents;
  bool no_mesh_estimate = false;
};

// True when `path` names a JSON file (it ends in ".json").
bool IsJsonPath(const std::string& path) {
  return path.size() >= 5 && path.compare(path.size() - 5, 5, ".json") == 0;
}

int RunSolve(const SolveFlags& all) {
  const ModelFlags& flags = all.model;
  // Check the flags before the (possibly long) file read and mesh.
  const std::optional<double> frequency_flag_hz = FrequencyFlag(flags);
  const std::optional<StressOptions> stress_options = ChosenStress(all.power);
  const std::vector<InputPath> inputs{{flags.model_path, "model"}};
  if (all.currents.given()) CheckOutputPaths({{all.currents.text, "currents"}}, inputs);
  Model model = LoadModel(flags);
  const double frequency_hz = ChosenFrequency(frequency_flag_hz, model);
  Simulation simulation = NewSimulation(std::move(model), frequency_hz);
  AnnounceLongSolve(simulation);
  const SolveResult result = all.no_mesh_estimate ? simulation.Solve(frequency_hz)
                                                  : SolveWithMeshEstimate(simulation, frequency_hz);
  if (result.mesh_estimate) PrintWarnings(result.mesh_estimate->warnings);
  std::optional<StressResult> stress;
  if (stress_options) stress = StressAt(simulation.model(), result, *stress_options);
  const StressResult* shown = stress ? &*stress : nullptr;
  // Format in full before writing, so a failure never leaves half a document or file.
  std::vector<OutputFile> files;
  if (all.currents.given()) {
    CurrentsScale scale;
    scale.excitation = "1 V peak at each feed (or its model voltage)";
    if (stress) {
      scale.factor = stress->scale;
      scale.excitation = fmt::format("{:g} W from the transmitter", stress->power_w);
    }
    files.push_back({all.currents.text,
                     IsJsonPath(all.currents.text) ? FormatCurrentsJson(simulation, result, scale)
                                                   : FormatCurrentsCsv(simulation, result, scale),
                     "currents"});
  }
  const std::string output = flags.json ? FormatSolveJson(simulation, result, shown)
                                        : FormatSolveText(simulation, result, shown);
  WriteFilesThenReport(files, inputs, output, flags.json);
  return 0;
}

// Adds the flags of `solve` to app, kept in `flags`.
void AddSolveFlags(CLI::App& app, SolveFlags& flags) {
  AddModelFlags(app, flags.model, /*with_frequency=*/true);
  AddPowerFlags(app, flags.power);
  AddMeshEstimateFlag(app, flags.no_mesh_estimate, "each feed impedance");
  AddTextFlag(app, "--currents", flags.currents, "FILE",
              "Also write the current on every segment (each wire from its start: position, "
              "peak magnitude in A and phase at the segment's ends and centre) to FILE: JSON "
              "when FILE ends in .json, else CSV. Scaled to --power at the transmitter when "
              "given, else to the model's feed voltage (1 V peak). Default: not written.");
}

}  // namespace

Command AddSolveCommand(CLI::App& program) {
  return NewCommand(program, kSolveHelp, AddSolveFlags, RunSolve);
}

}  // namespace wirefield::cli
