// Command-line program: `wirefield coil`: a single-layer loading coil from its turns, former,
// winding and wire (inductance, self-capacitance, self-resonance, AC resistance and Q at a
// frequency), or, with --inductance, the turns that give a target inductance.
// Flags -> CoilSpec -> AnalyzeCoil / DesignCoilTurns -> FormatCoilText / FormatCoilJson.
#include <fmt/format.h>

#include <exception>
#include <optional>
#include <string>

#include "command.hpp"

namespace wirefield::cli {

namespace {

// What `wirefield coil --help` says besides its flags.
const CommandHelp kCoilHelp{
    "coil",
    "A single-layer air-core loading coil: inductance (Nagaoka with Rosa's round-wire "
    "correction, and Wheeler's formula), Medhurst's self-capacitance, self-resonance, AC "
    "resistance with the proximity effect, and Q; or, with --inductance, the turns for a "
    "target inductance.",
    R"(Examples:
  wirefield coil --turns 50 --diameter 28.5mm --pitch 1mm --wire-diameter 0.9mm --insulation 0.05mm
  wirefield coil --inductance 20uH --diameter 40mm --close-wound --wire-diameter 1.2mm --freq 7.1MHz --json)"};

struct CoilFlags {
  std::string turns, inductance, diameter, length, pitch, wire, insulation, material = "copper";
  std::string frequency = "14.2MHz";
  bool close_wound = false;
  bool json = false;
  CLI::Option* turns_option = nullptr;
  CLI::Option* inductance_option = nullptr;
  CLI::Option* length_option = nullptr;
  CLI::Option* pitch_option = nullptr;
  CLI::Option* insulation_option = nullptr;
};

[[noreturn]] void Fail(const std::string& where, const std::string& message) {
  throw InputError(SourceLocation{where, 0, 0}, message);
}

// A plain number of turns, from 1 to kMaxDesignTurns (need not be whole).
double Turns(const std::string& text) {
  std::size_t used = 0;
  double turns = 0.0;
  try {
    turns = std::stod(text, &used);
  } catch (const std::exception&) {
    used = 0;
  }
  if (used == 0 || used != text.size()) {
    Fail("--turns", fmt::format("--turns needs a number of turns such as 50; got '{}'", text));
  }
  if (!(turns >= 1.0) || turns > kMaxDesignTurns) {
    Fail("--turns", fmt::format("--turns must be from 1 to {:.0f}; got {}", kMaxDesignTurns, text));
  }
  return turns;
}

int RunCoil(const CoilFlags& flags) {
  const bool design = Given(flags.inductance_option);
  if (design == Given(flags.turns_option)) {
    Fail("coil",
         "give either --turns N (analyse a coil) or --inductance L (find the turns for it), "
         "exactly one");
  }
  const int windings =
      int{Given(flags.length_option)} + int{Given(flags.pitch_option)} + int{flags.close_wound};
  if (windings != 1) {
    Fail("coil", design ? "give the winding by --pitch P or --close-wound, exactly one"
                        : "give the winding by --length L, --pitch P or --close-wound, exactly "
                          "one");
  }
  if (design && Given(flags.length_option)) {
    Fail("--length",
         "--length fixes the winding, so it cannot go with --inductance; give --pitch P or "
         "--close-wound and the turns (and length) are found");
  }
  CoilSpec coil;
  coil.former_diameter_m = ParseLengthArgument(flags.diameter, "--diameter");
  coil.wire_diameter_m = ParseLengthArgument(flags.wire, "--wire-diameter");
  if (Given(flags.insulation_option) && flags.insulation != "0") {
    coil.insulation_m = ParseLengthArgument(flags.insulation, "--insulation");
  }
  SetCoilMaterial(&coil, flags.material, "--material");
  if (Given(flags.length_option)) coil.length_m = ParseLengthArgument(flags.length, "--length");
  if (Given(flags.pitch_option)) coil.pitch_m = ParseLengthArgument(flags.pitch, "--pitch");
  if (flags.close_wound) coil.pitch_m = coil.wire_diameter_m + 2.0 * coil.insulation_m;
  const double frequency_hz = ParseFrequencyArgument(flags.frequency, "--freq");
  std::optional<double> target_h;
  if (design) {
    target_h = ParseInductanceArgument(flags.inductance, "--inductance");
    coil = DesignCoilTurns(coil, *target_h);
  } else {
    coil.turns = Turns(flags.turns);
    const std::string problem = CoilProblem(coil);
    if (!problem.empty()) Fail("coil", problem);
  }
  const CoilAnalysis analysis = AnalyzeCoil(coil, frequency_hz);
  const std::string output = flags.json ? FormatCoilJson(coil, analysis, target_h)
                                        : FormatCoilText(coil, analysis, target_h);
  WriteStdout(output);
  return 0;
}

// Adds the flags of `coil` to app, kept in `flags`.
void AddCoilFlags(CLI::App& app, CoilFlags& flags) {
  auto add = [&](const char* name, std::string& target, const char* type, const char* help) {
    return AddTextOption(app, name, target, type, help);
  };
  flags.turns_option = add("--turns", flags.turns, "N",
                           "Number of turns, at least 1 (need not be whole). Default: none; "
                           "give --turns or --inductance.");
  flags.inductance_option =
      add("--inductance", flags.inductance, "L",
          "Target inductance: find the turns that give it, e.g. 20uH (units H, mH, uH, nH; a "
          "bare number is in H). Needs --pitch or --close-wound. Default: none.");
  add("--diameter", flags.diameter, "D",
      "Outside diameter of the former the wire is wound on, e.g. 28.5mm (units m, cm, mm, ft, "
      "in; a bare number is in m). The current sheet is taken at the wire centres. Required.")
      ->required();
  flags.length_option = add("--length", flags.length, "L",
                            "Winding length, end turn centre to end turn centre plus one "
                            "pitch (= turns x pitch), e.g. 50mm. Default: none.");
  flags.pitch_option = add("--pitch", flags.pitch, "P",
                           "Distance between the centres of adjacent turns, e.g. 1mm; at least "
                           "the wire's overall diameter. Default: none.");
  app.add_flag("--close-wound", flags.close_wound,
               "Turns touching: pitch = wire diameter + 2 x insulation. Default: off.");
  add("--wire-diameter", flags.wire, "d",
      "Bare conductor diameter, e.g. 0.9mm (length units as --diameter). Required.")
      ->required();
  flags.insulation_option = add("--insulation", flags.insulation, "T",
                                "Radial thickness of the wire's insulation, e.g. 0.05mm; it "
                                "sets the close-wound pitch and the wire-centre diameter. "
                                "Default: 0.");
  add("--material", flags.material, "NAME",
      "Wire material from the conductor table (copper, hard_drawn_copper, aluminium, "
      "copper_clad_steel, steel, stainless_steel, brass). Default: copper.");
  add("--freq", flags.frequency, "F",
      "Frequency of the AC resistance, Q and terminal impedance, e.g. 7.1MHz (units Hz, kHz, "
      "MHz, GHz; a bare number is in Hz). Default: 14.2MHz.");
  AddJsonFlag(app, flags.json, "the text");
}

}  // namespace

Command AddCoilCommand(CLI::App& program) {
  return NewCommand(program, kCoilHelp, AddCoilFlags, RunCoil);
}

}  // namespace wirefield::cli
