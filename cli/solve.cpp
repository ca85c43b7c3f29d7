// Command-line program: `wirefield solve MODEL`: solve one model at one frequency and print
// its feeds and loads (text table or, with --json, the contract's JSON). Flags -> Model ->
// Simulation -> Simulation::Solve -> FormatSolveText / FormatSolveJson -> stdout.
#include <optional>

#include "command.hpp"
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
  wirefield solve models/end_fed_field_kit.wire --power 100W --rating-cap 1kV)"};

struct SolveFlags {
  ModelFlags model;
  PowerFlags power;
  bool no_mesh_estimate = false;
};

int RunSolve(const SolveFlags& all) {
  const ModelFlags& flags = all.model;
  // Check the flags before the (possibly long) file read and mesh.
  const std::optional<double> frequency_flag_hz = FrequencyFlag(flags);
  const std::optional<StressOptions> stress_options = ChosenStress(all.power);
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
  // Format in full before writing, so a failure never leaves half a document on stdout.
  const std::string output = flags.json ? FormatSolveJson(simulation, result, shown)
                                        : FormatSolveText(simulation, result, shown);
  WriteStdout(output);
  return 0;
}

// Adds the flags of `solve` to app, kept in `flags`.
void AddSolveFlags(CLI::App& app, SolveFlags& flags) {
  AddModelFlags(app, flags.model, /*with_frequency=*/true);
  AddPowerFlags(app, flags.power);
  AddMeshEstimateFlag(app, flags.no_mesh_estimate, "each feed impedance");
}

}  // namespace

Command AddSolveCommand(CLI::App& program) {
  return NewCommand(program, kSolveHelp, AddSolveFlags, RunSolve);
}

}  // namespace wirefield::cli
