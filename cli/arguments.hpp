// Command-line program: reading the text of a flag. Quantities go through the library's own
// reader (wirefield::ReadQuantity) and its problems are reported at the flag, exactly like a
// bad value in a model file; the library's option checks name fields, which are said here as
// the flags that set them. Inputs: flag text; outputs: SI numbers, enums, or InputError.
#pragma once

#include <optional>
#include <string>
#include <string_view>
#include <vector>

#include "wirefield/batch.hpp"
#include "wirefield/wirefield.hpp"

namespace wirefield::cli {

// Throws InputError about `option` (as the file, at 1:1) with `message`.
[[noreturn]] void FailOption(const std::string& option, const std::string& message);

// A whole number of the whole text, within [low, high]; else InputError naming the option.
int WholeNumber(const std::string& text, const std::string& option, long low, long high,
                const std::string& what);

// An angle option: a plain number of degrees, optionally followed by `deg` ("2", "2.5deg");
// InputError naming the option, with `example`, otherwise.
double ParseDegrees(const std::string& text, const std::string& option, const std::string& example);

// A share in (0, 1] as a plain number ("0.5"); InputError naming the option, with `what` ("a
// duty factor"), otherwise.
double ShareFlag(const std::string& text, const std::string& option, const std::string& what);

// A frequency such as "14.2MHz", "14.2 MHz" or "14200000" (bare = Hz); InputError naming
// `option` when it is malformed, not a frequency, not positive or out of range.
double ParseFrequencyArgument(const std::string& text, const std::string& option);

// A resistance such as "50", "50ohm" or "1.2kohm" (bare = ohm); must be > 0.
double ParseResistanceArgument(const std::string& text, const std::string& option);

// A length such as "28.5mm", "1.1 in" or "0.0285" (bare = metre); must be > 0.
double ParseLengthArgument(const std::string& text, const std::string& option);

// An inductance such as "20uH" or "2e-5" (bare = henry); must be > 0.
double ParseInductanceArgument(const std::string& text, const std::string& option);

// A voltage such as "500V", "2kV" or "750" (bare = volt); must be > 0.
double ParseVoltageArgument(const std::string& text, const std::string& option);

// A value for `variable`: an expression of its dimension, or a bare number in its SI unit
// (only a bare number for a plain variable); may be zero or negative.
double ParseVariableArgument(const std::string& text, const std::string& option,
                             const VariableSpec& variable);

// A power such as "100W", "500 mW" or "1.5kW"; the unit is required. InputError naming
// `option` when it is malformed, unitless, not positive or out of range.
double ParsePowerArgument(const std::string& text, const std::string& option);

// The emission of that name (ssb, cw, fm, digital, carrier); InputError naming `option`.
TransmitMode ParseTransmitMode(const std::string& text, const std::string& option);

// "resonance" / "min-swr"; "auto" / "series" / "parallel"; empty for other text.
std::optional<TuneGoal> ParseTuneGoal(const std::string& text);
std::optional<ResonanceKind> ParseResonanceKind(const std::string& text);

// The --set flags, each "NAME=VALUE", as overrides whose errors name "--set NAME". InputError
// at "--set" when a text has no '=' or its name is not a variable name, at "--set NAME" when
// the value is empty or a name is set twice.
std::vector<Override> ParseOverrides(const std::vector<std::string>& texts);

// A --grounds list: "all" (every ground preset) or comma-separated names, each a ground preset,
// "free" or "perfect". InputError (file "--grounds") listing the names for an unknown or
// repeated name.
std::vector<BatchGround> ParseGroundList(const std::string& text);

// A --vary NAME=A:B:STEP (A, A+STEP, ... up to B) or NAME=V1,V2,... , each value a constant of
// the model language with its unit (19.5m, 7.1MHz, 2.5). InputError (file "--vary" or
// "--vary NAME") saying what to change.
BatchVariable ParseVary(const std::string& text);

// A field of a library options struct and the flag that sets it.
struct FieldFlag {
  std::string_view field;  // "step_deg", or the start of a file name: "variables NAME"
  std::string_view flag;   // "--step", "--vary NAME"
};

// The error, said about the flag of its field when its file is one of the fields (or begins
// with one and a space): the flag becomes the file, and a message that begins with the field's
// name begins with the flag's instead. A field the message names in backquotes (`min_si`),
// whatever the file, becomes its flag (--min). Else the error unchanged.
InputError AboutFlag(const InputError& error, const std::vector<FieldFlag>& fields);

// The text with every field it names in backquotes (`min_si`) said as its flag (--min).
std::string SayFlags(std::string text, const std::vector<FieldFlag>& fields);

// Runs `work`, its InputErrors said about the flags of their fields (AboutFlag) and its
// ComputationErrors with their fields in backquotes said as flags (SayFlags).
template <typename Work>
decltype(auto) NamingFlags(const std::vector<FieldFlag>& fields, Work&& work) {
  try {
    return work();
  } catch (const InputError& error) {
    throw AboutFlag(error, fields);
  } catch (const ComputationError& error) {
    throw ComputationError(SayFlags(error.what(), fields));
  }
}

}  // namespace wirefield::cli
