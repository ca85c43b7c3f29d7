// wirefield public API, part 1: the parsed model and the errors every stage reports.
// A Model is what the model language says, resolved to SI numbers (metres, hertz, ohm,
// henry, farad, volt, S/m), with the source location of each statement kept for diagnostics.
// Standard types only; see docs/model-language.md for the language itself.
#pragma once

#include <array>
#include <optional>
#include <stdexcept>
#include <string>
#include <vector>

#include "wirefield/coil.hpp"
#include "wirefield/core.hpp"

namespace wirefield {

// Where a piece of input came from. file is the model path as given (or "<command line>").
struct SourceLocation {
  std::string file;
  int line = 0;    // 1-based; 0 when unknown
  int column = 0;  // 1-based; 0 when unknown
};

// Formats a location as "FILE:LINE:COLUMN" (or just FILE when line is 0), the file name
// made Printable.
std::string ToString(const SourceLocation& location);

// Returns `text` safe to print on a terminal: valid UTF-8 (RFC 3629) passes unchanged except
// control characters (C0, DEL, C1), which become \t, \n, \r or \xNN, as does every byte
// that is not part of valid UTF-8 (\xFF) and a backslash itself (\\). Every message that
// prints a name or a path from the user passes it through here.
std::string Printable(std::string_view text);

// Decodes one UTF-8 sequence of `text` at byte i (RFC 3629: shortest form, no surrogates,
// at most U+10FFFF); returns the code point and sets *length, or returns -1 (length 1).
long DecodeUtf8(std::string_view text, size_t i, size_t* length);

// The user's input is wrong (exit code 2). what() is "FILE:LINE:COLUMN: error: MESSAGE".
class InputError : public std::runtime_error {
 public:
  InputError(SourceLocation location, const std::string& message);
  const SourceLocation& location() const { return location_; }
  const std::string& message() const { return message_; }

 private:
  SourceLocation location_;
  std::string message_;
};

// The computation failed although the input was well formed (exit code 1):
// a singular matrix, a non-finite result, a broken internal invariant.
class ComputationError : public std::runtime_error {
 public:
  using std::runtime_error::runtime_error;
};

// A numerically dubious but runnable model. Printed to stderr as
// "FILE:LINE:COLUMN: warning: MESSAGE"; the run goes on.
struct Warning {
  SourceLocation location;
  std::string message;
};
std::string ToString(const Warning& warning);

using Point = std::array<double, 3>;  // Cartesian, metres, z up

enum class PointKind { kStart, kEnd, kDistance, kPercent };

// WIRE@POS: a point on a wire. value is metres from the start (kDistance) or percent
// of the length (kPercent); unused for kStart and kEnd.
struct WirePointSpec {
  std::string wire;
  PointKind kind = PointKind::kStart;
  double value = 0.0;
  SourceLocation location;  // of the WIRE@POS text
};

// A plastic jacket on a wire, read from the `insulation` clause of `wire` and `shape`; the
// solve adds its thin-coating series impedance along the wire (docs/numerics.md).
struct InsulationSpec {
  std::string preset;                  // "pvc", "pe" or "ptfe" as written; empty when given by hand
  double thickness_m = 0.0;            // radial: the jacket's outer radius minus the conductor's
  double relative_permittivity = 1.0;  // real part, at HF
  double loss_tangent = 0.0;           // tan delta, at HF; 0 for a lossless jacket
  SourceLocation location;             // of the word `insulation`
};

// A corner of a wire written as a point on an earlier wire (`from rad@60%`): the corner's
// index in WirePath order (0 is from_m) and the point it names. The mesher joins the two wires
// there, also in the middle of the earlier wire (a T-junction).
struct WireTap {
  size_t corner = 0;
  WirePointSpec on;
};

struct WireSpec {
  std::string name;
  Point from_m{};  // the start (the first point of a bent wire)
  Point to_m{};    // the end (the last point of a bent wire)
  // The interior corners of a bent wire (`wire NAME through ...`, `shape`), in order from
  // from_m to to_m; empty for a straight wire. The current runs on through every corner.
  std::vector<Point> bends_m;
  double radius_m = 0.0;
  // Where the radius was written (the value after `radius`, or after `diameter`, which gives
  // twice the radius), for the thin-wire checks that need the frequency (the mesh stage).
  // radius_clause is "radius" or "diameter" as written; radius_written_number is the number
  // as written when the value is one number with or without a length unit ("1", "2mm"),
  // for a hint at the unit it was meant in.
  SourceLocation radius_location;
  std::string radius_clause = "radius";
  std::optional<double> radius_written_number;
  int segments = 0;  // 0: the mesher chooses
  // A stranded conductor (`strands=N`, concentric lay): the count of its round strands, 1 for
  // a solid wire. radius_m is then the equivalent radius of the bundle for the thin-wire
  // kernel, and loss_radius_m its outer radius, at which the skin-effect loss is computed
  // (docs/numerics.md, "Stranded wire").
  int strands = 1;
  std::optional<double> loss_radius_m;
  // The cross-section of the metal, m^2, when the wire was given by it (`size 1.5mm2`).
  std::optional<double> cross_section_m2;
  // Conductor: empty material and no conductivity = perfect conductor (the default).
  std::string material;                        // e.g. "copper", as written in the model
  std::optional<double> conductivity_s_per_m;  // set for any lossy conductor
  double relative_permeability = 1.0;          // steel > 1
  std::optional<InsulationSpec> insulation;    // empty: a bare wire
  SourceLocation location;
  // Where each corner of WirePath was written (the '(' of its point), in path order; empty
  // when the corners were computed (a `shape`).
  std::vector<SourceLocation> point_locations;
  // The corners written as WIRE@POS, in path order.
  std::vector<WireTap> taps;
};

// The corners of a wire from its start to its end: from_m, the bends, to_m.
std::vector<Point> WirePath(const WireSpec& wire);
// The length of a wire along its path, metres (the sum of its legs).
double WireLength(const WireSpec& wire);
// The distance from a wire's start, metres, of a WIRE@POS point on a wire of that length.
double PositionAlong(const WirePointSpec& at, double length_m);
// The point at distance s_m along a wire's path from its start: exactly its start, end or a
// corner at their distances.
Point PointAlong(const WireSpec& wire, double s_m);
// The radius the skin-effect loss of a wire is computed at (loss_radius_m, else radius_m).
double LossRadius(const WireSpec& wire);

// Segment counts per wire: what the model gave (0 = none) and what the mesher used
// (Simulation::wire_mesh, wirefield/simulation.hpp).
struct WireMeshInfo {
  std::string name;
  int segments_given = 0;
  int segments_used = 0;
};

struct FeedSpec {
  std::string name;
  WirePointSpec at;
  double voltage_v = 1.0;  // peak amplitude of the delta-gap source, phase 0
  SourceLocation location;
};

enum class LoadTopology { kSeries, kParallel };

// One measured or published point of a choke's series impedance, R + jX at a frequency.
struct ChokePoint {
  double frequency_hz = 0.0;
  double resistance_ohm = 0.0;  // R >= 0: the loss of the core and winding
  double reactance_ohm = 0.0;   // X, either sign
};

// A choke on a wire (a coax shield's outside, a counterpoise): a series impedance that holds
// back the current through it, given by points of its impedance curve or by its winding on a
// ferrite core. With points, the impedance between two points is interpolated linearly in
// frequency (R and X each); one point holds at every frequency; with two or more, a run outside
// them is an InputError. With a winding, L = turns^2 * A_L and Z = X / Q + jX, X = 2 pi f L.
struct ChokeSpec {
  std::vector<ChokePoint> points;  // increasing frequency; empty for a winding
  double turns = 0.0;              // winding: turns through the core
  double al_nh = 0.0;              // winding: the core's A_L, nH per turn^2
  std::optional<double> q;         // winding: the Q of its inductance; none: lossless
};

// A lumped load: the present elements of R, L, C in series or in parallel, a physical coil
// (then R, L, C are absent and the coil's L, R_ac and self-capacitance are computed at each
// frequency, wirefield/coil.hpp), or a choke (ChokeSpec).
struct LoadSpec {
  std::string name;
  WirePointSpec at;
  LoadTopology topology = LoadTopology::kSeries;
  std::optional<double> resistance_ohm;
  std::optional<double> inductance_h;
  std::optional<double> capacitance_f;
  std::optional<CoilSpec> coil;
  std::optional<ChokeSpec> choke;
  SourceLocation location;
};

enum class GroundKind { kFree, kPerfect, kReal };

// How the matrix treats a real ground (the far field always uses the Fresnel reflection, which
// is exact there). kExact: the Sommerfeld half-space solution for every pair of segments (unless
// exact_below_m is given: then only for the pairs whose mean height is below it, the
// reflection-coefficient approximation above it). kReflection: the approximation everywhere
// (faster, weak below about 0.2 wavelength).
enum class GroundMethod { kExact, kReflection };

struct GroundSpec {
  GroundKind kind = GroundKind::kFree;
  double permittivity = 1.0;                   // relative, real ground only
  double conductivity_s_per_m = 0.0;           // real ground only
  std::string preset;                          // the preset's name when given as preset=NAME
  GroundMethod method = GroundMethod::kExact;  // real ground only
  // Real ground, kExact: unset (the default) gives every pair of segments the exact half-space.
  // Set, only the pairs whose mean height is below it get it and the others the reflection
  // coefficients: a mixture kept for models written with it, which on wires spanning the height
  // can be several percent off both methods (the mesher warns; docs/numerics.md, "Real
  // ground"); 0 gives the reflection coefficients everywhere.
  std::optional<double> exact_below_m;
  // Real ground, kExact: false integrates the half-space correction at every quadrature point
  // instead of interpolating it from the table built once per frequency; the fill then costs
  // some hundred times more. For checking what the table adds (not in the model language).
  bool half_space_table = true;
  SourceLocation location;
};

// A named ground of the kind ITU-R Recommendation P.527 describes (or of common practice),
// usable as `ground real preset=NAME`. Values are those flat across HF (1.8-30 MHz).
struct GroundPreset {
  std::string name;     // as written in a model, e.g. "medium_dry"
  double permittivity;  // relative
  double conductivity_s_per_m;
  std::string description;  // e.g. "medium dry ground (pasture on loam)"
  std::string source;       // where the values come from
};

// Every preset, in the order of the ITU-R P.527 classes (wettest first), then the others.
const std::vector<GroundPreset>& GroundPresets();
// The preset of that name, or nullptr.
const GroundPreset* FindGroundPreset(const std::string& name);
// A GroundSpec of kind kReal from a preset.
GroundSpec RealGround(const GroundPreset& preset);

// A transformer at a feed (an end-fed wire's step-up transformer, a balun): turns
// primary:secondary (transmitter side : antenna side), impedance ratio (secondary/primary)^2.
struct TransformerSpec {
  std::string name;
  std::string feed;  // the feed it sits at
  double primary_turns = 1.0;
  double secondary_turns = 1.0;
  std::optional<double> magnetizing_inductance_h;    // primary side; absent = ideal (infinite)
  std::optional<double> al_nh_per_turn2;             // core A_L; with primary turns gives L
  double leakage_inductance_h = 0.0;                 // series, primary side
  std::optional<double> compensation_capacitance_f;  // shunt, transmitter side
  std::optional<double> core_loss_resistance_ohm;    // shunt, primary side
  std::optional<double> core_q;                      // alternative: Q of the magnetizing L
  SourceLocation location;
};

// A feed line between a feed (or its transformer) and the transmitter.
struct FeedLineSpec {
  std::string name;
  std::string feed;
  double length_m = 0.0;
  std::string cable;  // a named cable of the built-in table, or empty
  double z0_ohm = 50.0;
  double velocity_factor = 0.66;
  // Matched loss at two frequencies (dB per 100 m); the attenuation is fitted as
  // alpha(f) = a sqrt(f) + b f through them (conductor and dielectric loss), see
  // docs/numerics.md, "Feed chain". Both zero: a lossless line.
  double loss1_db_per_100m = 0.0;
  double loss1_frequency_hz = 10e6;
  double loss2_db_per_100m = 0.0;
  double loss2_frequency_hz = 30e6;
  // How many of the loss points above are given: 2 (the fit above), 1 (loss1 alone, scaled
  // as sqrt(f)) or 0 (a lossless line).
  int loss_points = 2;
  SourceLocation location;
};

// A `let` variable as the model defines it (after any --set override): its value in SI and
// its dimension, for commands that vary it (`tune`).
struct VariableSpec {
  std::string name;
  double value_si = 0.0;
  // Exponents of m, kg, s, A; all zero for a plain number.
  std::array<int, 4> dimension{};
  // The SI unit of the dimension when the language names it: "m", "Hz", "ohm", "H", "F",
  // "V"; "" for a plain number or an unnamed dimension (see quantity).
  std::string unit;
  // "a length (m)", "a plain number", ... as in diagnostics.
  std::string quantity;
  SourceLocation location;  // of the name in its `let`
};

struct Model {
  std::string file;  // as given by the caller
  std::vector<WireSpec> wires;
  std::vector<FeedSpec> feeds;
  std::vector<LoadSpec> loads;
  GroundSpec ground;
  std::optional<double> frequency_hz;
  SourceLocation frequency_location;
  std::optional<double> z0_ohm;               // reference impedance for SWR; 50 ohm when absent
  std::vector<TransformerSpec> transformers;  // at most one per feed
  std::vector<FeedLineSpec> feed_lines;       // at most one per feed
  std::vector<Warning> warnings;              // raised while parsing
  std::vector<std::string> variables;         // the names of its `let` statements, in order
  std::vector<VariableSpec> variable_specs;   // the same variables with values, in order
};

// A value given to a `let` from outside the model text (the command line's --set, a grid's
// row): `expression` is an expression of the model language and replaces the model's own.
struct Override {
  std::string name;
  std::string expression;
  // Where the value comes from, named as the "file" of its errors (the command line gives
  // "--set NAME"); empty: "override NAME".
  std::string origin = {};
};

// Reads and parses a model file. Throws InputError for any defect of the input.
Model ParseModelFile(const std::string& path, const std::vector<Override>& overrides = {});

// Reads a model file's text whole (at most a few MiB). Throws InputError naming the file when
// it cannot be read or is too large to be a model.
std::string ReadModelFileText(const std::string& path);

// Parses model text; file_name is used in diagnostics only.
Model ParseModelText(const std::string& text, const std::string& file_name,
                     const std::vector<Override>& overrides = {});

// The quantities ReadQuantity reads, each an expression of the model language with its unit
// (a bare number is in the SI unit).
enum class QuantityKind {
  kFrequency,   // "14.2MHz", "14200000" (Hz)
  kResistance,  // "50", "1.2kohm" (ohm)
  kLength,      // "28.5mm", "1.1 in" (m)
  kInductance,  // "20uH", "2e-5" (H)
  kVoltage,     // "500V", "2kV" (V)
};

// What is wrong with the text of a value, without naming where the text came from.
struct ValueProblem {
  int line = 0;    // 1 when `column` points into the text; 0 when the text as a whole is at fault
  int column = 0;  // 1-based column in the text of the fault (0 with line 0)
  std::string message;
  // True when `message` is said of the value and reads after its name ("must be positive;
  // got -5 Hz"); false when it stands alone ("unexpected ')' after the value").
  bool after_name = false;
};

// A value read from text: its SI number, or what is wrong with the text.
struct ValueReading {
  double si = 0.0;
  std::optional<ValueProblem> problem;
};

// Reads a quantity of `kind` from text: one expression of the model language, positive and
// within the allowed range of its kind (docs/model-language.md "Allowed ranges").
ValueReading ReadQuantity(const std::string& text, QuantityKind kind);

// Reads a value for `variable`: an expression of its dimension, or a bare number in its SI
// unit (only a bare number for a plain variable); may be zero or negative.
ValueReading ReadVariableValue(const std::string& text, const VariableSpec& variable);

}  // namespace wirefield
