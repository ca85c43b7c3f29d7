// Command-line program: `wirefield solve MODEL`: solve one model at one frequency and print
// its feeds and loads (text table or, with --json, the contract's JSON). Flags -> Model and
// SimulationOptions -> Simulation::Solve -> FormatSolveText / FormatSolveJson -> stdout.
#include <memory>
#include <optional>

#include "command.hpp"
#include "wirefield/report.hpp"

namespace wirefield::cli {

namespace {

struct SolveFlags {
  ModelFlags model;
  PowerFlags power;
  bool no_mesh_estimate = false;
};

int RunSolve(const SolveFlags& all) {
  const ModelFlags& flags = all.model;
  // Check the flags before the (possibly long) file read and mesh.
  FrequencyFlag(flags);
  const std::optional<StressOptions> stress_options = ChosenStress(all.power);
  Model model = LoadModel(flags);
  const double frequency_hz = ChosenFrequency(flags, model);
  SimulationOptions options;
  options.max_frequency_hz = frequency_hz;
  Simulation simulation(std::move(model), options);
  PrintWarnings(simulation.warnings());
  AnnounceLongSolve(simulation);
  const SolveResult result = all.no_mesh_estimate ? simulation.Solve(frequency_hz)
                                                  : SolveWithMeshEstimate(simulation, frequency_hz);
  if (result.mesh_estimate) PrintWarnings(result.mesh_estimate->warnings);
  std::optional<StressResult> stress;
  if (stress_options) stress = ComputeStress(simulation.model(), result, *stress_options);
  const StressResult* shown = stress ? &*stress : nullptr;
  // Format in full before writing, so a failure never leaves half a document on stdout.
  const std::string output = flags.json ? FormatSolveJson(simulation, result, shown)
                                        : FormatSolveText(simulation, result, shown);
  WriteStdout(output);
  return 0;
}

}  // namespace

Command AddSolveCommand(CLI::App& program) {
  auto flags = std::make_shared<SolveFlags>();
  CLI::App* app = program.add_subcommand(
      "solve",
      "Solve a model at one frequency: feedpoint impedance, SWR, currents and power at each "
      "feed, current, voltage and power at each load.");
  AddModelFlags(*app, flags->model, /*with_frequency=*/true);
  AddPowerFlags(*app, flags->power);
  AddMeshEstimateFlag(*app, flags->no_mesh_estimate, "each feed impedance");
  app->footer(
      "Examples:\n"
      "  wirefield solve models/hiking_club_dipole.wire\n"
      "  wirefield solve models/hiking_club_dipole.wire --freq 14.05MHz --z0 75 --json\n"
      "  wirefield solve models/inverted_v_trail.wire --set apex_height=9m\n"
      "  wirefield solve models/end_fed_field_kit.wire --power 100W --rating-cap 1kV");
  return Command{app, [flags] { return RunSolve(*flags); }};
}

}  // namespace wirefield::cli
