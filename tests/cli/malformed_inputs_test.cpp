// CLI tests: a table of malformed models, as a new user might type them or a download might
// truncate them. Each must end with exit code 2, nothing on stdout and one diagnostic on
// stderr that starts with FILE:LINE:COLUMN of the offending character (docs/commands.md,
// "Exit codes"; the contract's "No input, however malformed, may crash the program").
// The expected line and column were worked out by hand from the text of each case (columns
// count characters from 1; a tab is one column). Cases found by fuzzing are at the end.
#include <gtest/gtest.h>

#include <cctype>
#include <filesystem>
#include <string>
#include <vector>

#include "cli/program_runner.hpp"

namespace wirefield::cli_test {
namespace {

struct MalformedCase {
  std::string name;      // also the scratch file's name
  std::string text;      // the whole model
  int line = 0;          // expected LINE of the diagnostic
  int column = 0;        // expected COLUMN
  std::string fragment;  // a piece of the message that says what is wrong
};

// Lines of a model that solves; the cases replace or append lines.
const std::string kUnits = "units m\n";
const std::string kWire = "wire dip from (-5, 0, 10) to (5, 0, 10) radius 1mm\n";
const std::string kFeed = "feed src at dip@50%\n";
const std::string kFrequency = "frequency 14.2MHz\n";
const std::string kHead = kUnits + kWire;          // lines 1-2
const std::string kBody = kUnits + kWire + kFeed;  // lines 1-3
const std::string kGood = kBody + kFrequency;      // lines 1-4

// "let x = " followed by `depth` copies of `open`, then "1", then `close` repeated.
std::string Nested(const std::string& open, const std::string& close, int depth) {
  std::string text = "let x = ";
  for (int i = 0; i < depth; ++i) text += open;
  text += "1";
  for (int i = 0; i < depth; ++i) text += close;
  return text + "\n";
}

std::vector<MalformedCase> Cases() {
  // The nesting limit is 256 levels (model/expression.hpp): the 257th opening is refused.
  const int kTooDeep = 300;
  return {
      // ---- truncated lines -------------------------------------------------------------
      {"cut_wire_keyword", kUnits + "wire\n" + kFeed + kFrequency, 2, 5, "missing a wire name"},
      {"cut_wire_after_name", kUnits + "wire dip\n" + kFeed + kFrequency, 2, 9, "missing 'from"},
      {"cut_wire_after_from", kUnits + "wire dip from\n" + kFeed + kFrequency, 2, 14,
       "missing '(' to open the from point"},
      {"cut_wire_in_point", kUnits + "wire dip from (-5, 0\n" + kFeed + kFrequency, 2, 21,
       "missing ',' between coordinates"},
      {"cut_wire_after_to", kUnits + "wire dip from (-5, 0, 10) to\n" + kFeed + kFrequency, 2, 29,
       "missing '(' to open the to point"},
      {"cut_wire_before_radius",
       kUnits + "wire dip from (-5, 0, 10) to (5, 0, 10)\n" + kFeed + kFrequency, 2, 40,
       "missing 'radius R'"},
      {"cut_wire_after_radius",
       kUnits + "wire dip from (-5, 0, 10) to (5, 0, 10) radius\n" + kFeed + kFrequency, 2, 47,
       "missing a value at the end of the line"},
      {"cut_feed_keyword", kHead + "feed\n" + kFrequency, 3, 5, "missing"},
      {"cut_feed_after_at", kHead + "feed src at\n" + kFrequency, 3, 12, "missing a point"},
      {"cut_feed_at_wire", kHead + "feed src at dip\n" + kFrequency, 3, 16, "missing '@'"},
      {"cut_feed_after_sign", kHead + "feed src at dip@\n" + kFrequency, 3, 17, "missing a value"},
      {"cut_let", "let x =\n" + kGood, 1, 8, "missing a value"},
      {"cut_let_name", "let\n" + kGood, 1, 4, "missing a variable name"},
      {"cut_units", "units\n" + kWire + kFeed + kFrequency, 1, 6, "missing the length unit"},
      {"cut_frequency", kBody + "frequency\n", 4, 10, "missing a value"},
      {"cut_ground_real", kGood + "ground real permittivity=\n", 5, 26, "missing a value"},
      {"cut_load_value", kGood + "load l at dip@25% series R=\n", 5, 28, "missing a value"},
      {"cut_expression_operator", "let x = 2 *\n" + kGood, 1, 12, "missing a value"},
      // ---- wrong types -----------------------------------------------------------------
      {"radius_is_a_frequency",
       kUnits + "wire dip from (-5, 0, 10) to (5, 0, 10) radius 1MHz\n" + kFeed + kFrequency, 2, 48,
       "radius needs a length"},
      {"frequency_is_a_length", kBody + "frequency 14.2m\n", 4, 11, "needs a frequency"},
      {"coordinate_is_a_resistance",
       kUnits + "wire dip from (-5, 0, 10ohm) to (5, 0, 10) radius 1mm\n" + kFeed + kFrequency, 2,
       23, "the Z coordinate needs a length"},
      {"segments_not_whole",
       kUnits + "wire dip from (-5, 0, 10) to (5, 0, 10) radius 1mm segments 2.5\n" + kFeed +
           kFrequency,
       2, 61, "positive whole number"},
      {"segments_with_unit",
       kUnits + "wire dip from (-5, 0, 10) to (5, 0, 10) radius 1mm segments 3m\n" + kFeed +
           kFrequency,
       2, 61, "needs a plain number"},
      {"voltage_is_a_resistance", kHead + "feed src at dip@50% voltage 1ohm\n" + kFrequency, 3, 29,
       "voltage"},
      {"load_r_is_an_inductance", kGood + "load l at dip@25% series R=10uH\n", 5, 28,
       "needs a resistance"},
      {"conductivity_is_a_length", kGood + "ground real permittivity=13 conductivity=5mm\n", 5, 42,
       "needs a plain number"},
      {"sine_of_a_length", "let x = sin(1m)\n" + kGood, 1, 13, "sin needs a plain number"},
      {"units_is_a_frequency", "units MHz\n" + kWire + kFeed + kFrequency, 1, 7,
       "not a length unit"},
      {"negative_frequency", kBody + "frequency -14MHz\n", 4, 11, "positive"},
      {"adding_length_to_frequency", "let x = 1m + 1MHz\n" + kGood, 1, 12, "cannot add"},
      {"position_with_frequency", kHead + "feed src at dip@3MHz\n" + kFrequency, 3, 17,
       "needs a length"},
      {"name_is_a_number",
       kUnits + "wire 5 from (-5, 0, 10) to (5, 0, 10) radius 1mm\n" + kFeed + kFrequency, 2, 6,
       "expected a wire name"},
      {"statement_is_a_number", kGood + "5 wire\n", 5, 1, "expected a statement"},
      // ---- unicode and stray characters ------------------------------------------------
      {"unicode_minus",
       kUnits +
           "wire dip from (\xE2\x88\x92"
           "5, 0, 10) to (5, 0, 10) radius 1mm\n" +
           kFeed + kFrequency,
       2, 16, "ASCII minus"},
      {"unicode_micro",
       kUnits + "wire dip from (-5, 0, 10) to (5, 0, 10) radius 1\xC2\xB5m\n" + kFeed + kFrequency,
       2, 49, "write micro as 'u'"},
      {"unicode_times",
       "let x = 2\xC3\x97"
       "3\n" +
           kGood,
       1, 10, "use '*' to multiply"},
      {"unicode_no_break_space",
       "let x =\xC2\xA0"
       "2\n" +
           kGood,
       1, 8, "no-break space"},
      {"unicode_in_name",
       kUnits + "wire d\xC3\xADpole from (-5, 0, 10) to (5, 0, 10) radius 1mm\n" + kFeed +
           kFrequency,
       2, 7, "ASCII only"},
      {"unicode_smart_quote",
       "let x = \xE2\x80\x9C"
       "2\xE2\x80\x9D\n" +
           kGood,
       1, 9, "no quotes"},
      {"unicode_after_comment_then_error",
       "# caf\xC3\xA9 r\xC3\xA9sum\xC3\xA9\n" + kGood + "grond free\n", 6, 1,
       "unknown statement 'grond'"},
      {"invalid_utf8_byte", "let x = 2\xFF\n" + kGood, 1, 10, "not UTF-8"},
      {"truncated_utf8_sequence", "let x = 2\xE2\x88\n" + kGood, 1, 10, "not UTF-8"},
      {"nul_byte", std::string("let x = 2").append(1, '\0') + "\n" + kGood, 1, 10, "NUL byte"},
      {"carriage_return_inside_line", "units m\rwire\n" + kWire + kFeed + kFrequency, 1, 8,
       "carriage return"},
      {"byte_order_mark_then_error",
       "\xEF\xBB\xBF"
       "unitz m\n" +
           kWire + kFeed + kFrequency,
       1, 1, "unknown statement 'unitz'"},
      {"crlf_line_ends_keep_line_numbers",
       "units m\r\nwire dip from (-5, 0, 10) to (5, 0, 10) radius 1mm\r\nfeed src at dip@5O%\r\n",
       3, 18, "unknown unit 'O'"},
      {"tab_counts_one_column", kHead + "feed\tsrc\tat\tdipole@50%\n" + kFrequency, 3, 13,
       "unknown wire 'dipole'"},
      {"semicolon_between_statements", "units m; frequency 14.2MHz\n" + kWire + kFeed, 1, 8,
       "one statement per line"},
      {"square_brackets",
       kUnits + "wire dip from (-5, 0, 10) to (5, 0, 10) radius 1mm [segments 9]\n" + kFeed +
           kFrequency,
       2, 52, "without brackets"},
      {"lone_decimal_point", "let x = 2 * .\n" + kGood, 1, 13, "digit after its point"},
      {"control_character", "let x = 2\x01\n" + kGood, 1, 10, "control character"},
      // ---- very long lines -------------------------------------------------------------
      {"line_too_long", std::string("let x = 1").append(20000, ' ') + "\n" + kGood, 1, 10001,
       "longer than 10000 characters"},
      {"long_unknown_wire_name",
       kHead + "feed src at " + std::string(5000, 'a') + "@50%\n" + kFrequency, 3, 13,
       "unknown wire 'aaaaaaaa"},
      {"long_number_out_of_range", std::string("let x = 1").append(400, '0') + "\n" + kGood, 1, 9,
       "out of the range of double precision"},
      {"long_comment_then_error", std::string("#").append(100000, 'c') + "\nlet x = y\n" + kGood, 2,
       9, "unknown variable 'y'"},
      // ---- deeply nested expressions ---------------------------------------------------
      {"deep_parentheses", Nested("(", ")", kTooDeep) + kGood, 1, 9 + 256, "nested too deeply"},
      {"deep_signs", Nested("-", "", kTooDeep) + kGood, 1, 9 + 256, "nested too deeply"},
      {"deep_calls", Nested("abs(", ")", kTooDeep) + kGood, 1, 9 + 256 * 4 + 3,
       "nested too deeply"},
      {"unclosed_parenthesis", "let x = ((1 + 2)\n" + kGood, 1, 17, "expected ')' to close"},
      {"extra_closing_parenthesis", "let x = (1))\n" + kGood, 1, 12, "unexpected ')'"},
      {"empty_parentheses", "let x = ()\n" + kGood, 1, 10, "expected a value"},
      // ---- NaN, infinity and huge numbers ----------------------------------------------
      {"radius_overflows",
       kUnits + "wire dip from (-5, 0, 10) to (5, 0, 10) radius 1e400\n" + kFeed + kFrequency, 2,
       48, "out of the range"},
      {"product_overflows", "let x = 1e308 * 10\n" + kGood, 1, 15, "not a finite number"},
      {"power_overflows", "let x = 10 ^ 400\n" + kGood, 1, 12, "not a finite number"},
      {"zero_over_zero", "let x = 0 / 0\n" + kGood, 1, 11, "division by zero"},
      {"square_root_of_negative", "let x = sqrt(-1)\n" + kGood, 1, 9, "sqrt of -1"},
      {"log_of_zero", "let x = log(0)\n" + kGood, 1, 9, "log of 0"},
      {"exp_overflows", "let x = exp(1000)\n" + kGood, 1, 9, "overflows"},
      {"asin_out_of_domain", "let x = asin(2)\n" + kGood, 1, 9, "outside [-1, 1]"},
      {"nan_is_not_a_number",
       kUnits + "wire dip from (-5, 0, 10) to (5, 0, 10) radius nan\n" + kFeed + kFrequency, 2, 48,
       "unknown variable 'nan'"},
      {"inf_is_not_a_number", kBody + "frequency inf\n", 4, 11, "unknown variable 'inf'"},
      {"segments_huge",
       kUnits + "wire dip from (-5, 0, 10) to (5, 0, 10) radius 1mm segments 1e12\n" + kFeed +
           kFrequency,
       2, 61, "GiB"},
      {"percent_huge", kHead + "feed src at dip@1e308%\n" + kFrequency, 3, 17,
       "outside 0% to 100%"},
      {"frequency_overflows_with_its_unit", kBody + "frequency 1e308GHz\n", 4, 11,
       "1e308GHz overflows"},
      // ---- duplicate names and statements ----------------------------------------------
      {"duplicate_wire", kGood + kWire, 5, 6, "wire 'dip' is already defined at line 2"},
      {"duplicate_feed", kGood + kFeed, 5, 6, "already defined at line 3"},
      {"duplicate_variable", "let h = 1\nlet h = 2\n" + kGood, 2, 5,
       "variable 'h' is already defined at line 1"},
      {"duplicate_load", kGood + "load l at dip@25% series R=5\nload l at dip@75% series R=5\n", 6,
       6, "already defined at line 5"},
      {"duplicate_frequency", kGood + kFrequency, 5, 1, "already given at line 4"},
      {"duplicate_ground", kGood + "ground free\nground perfect\n", 6, 1,
       "already given at line 5"},
      {"duplicate_radius",
       kUnits + "wire dip from (-5, 0, 10) to (5, 0, 10) radius 1mm radius 2mm\n" + kFeed +
           kFrequency,
       2, 52, "radius is given twice"},
      {"duplicate_load_element", kGood + "load l at dip@25% series R=5 R=6\n", 5, 30,
       "given twice"},
      {"variable_named_like_a_function", "let sqrt = 2\n" + kGood, 1, 5, "choose another name"},
      // ---- impossible geometry ---------------------------------------------------------
      {"zero_length_wire",
       kUnits + "wire dip from (1, 2, 3) to (1, 2, 3) radius 1mm\n" + kFeed + kFrequency, 2, 6,
       "zero length"},
      {"negative_radius",
       kUnits + "wire dip from (-5, 0, 10) to (5, 0, 10) radius -1mm\n" + kFeed + kFrequency, 2, 48,
       "radius must be positive"},
      {"radius_as_thick_as_the_wire",
       kUnits + "wire dip from (-5, 0, 10) to (5, 0, 10) radius 3\n" + kFeed + kFrequency, 2, 48,
       "not small against the wire length"},
      {"feed_beyond_the_end", kHead + "feed src at dip@20m\n" + kFrequency, 3, 17,
       "beyond the end of wire 'dip'"},
      {"feed_before_the_start", kHead + "feed src at dip@-1m\n" + kFrequency, 3, 17,
       "before the start of wire 'dip'"},
      {"feed_percent_over_100", kHead + "feed src at dip@150%\n" + kFrequency, 3, 17,
       "outside 0% to 100%"},
      {"feed_at_a_free_end", kHead + "feed src at dip@start\n" + kFrequency, 3, 13, "free"},
      {"feed_on_a_wire_defined_later",
       kUnits + kFeed + "wire dip from (-5, 0, 10) to (5, 0, 10) radius 1mm\n" + kFrequency, 2, 13,
       "no wire is defined above this line"},
      {"bent_wire_with_one_point", kUnits + "wire dip through (0, 0, 1)\n" + kFeed + kFrequency, 2,
       27, "a second point"},
      {"four_coordinates",
       kUnits + "wire dip from (-5, 0, 10, 1) to (5, 0, 10) radius 1mm\n" + kFeed + kFrequency, 2,
       25, "more than 3 coordinates"},
      {"two_coordinates",
       kUnits + "wire dip from (-5, 0) to (5, 0, 10) radius 1mm\n" + kFeed + kFrequency, 2, 21,
       "needs 3 coordinates"},
      {"wire_folded_back_on_itself",
       kUnits + "wire w through (-5, 0, 10), (5, 0, 10), (-5, 0, 10) radius 1mm\n" +
           "feed src at w@25%\n" + kFrequency,
       2, 41, "straight back along the leg before it"},
      {"missing_comma_between_coordinates",
       kUnits + "wire dip from (-5 0, 10) to (5, 0, 10) radius 1mm\n" + kFeed + kFrequency, 2, 19,
       "missing an operator"},
      // ---- other mistakes of a first model ---------------------------------------------
      {"unknown_statement", kGood + "antenna x\n", 5, 1, "unknown statement 'antenna'"},
      {"unknown_unit",
       kUnits + "wire dip from (-5, 0, 10) to (5, 0, 10) radius 1 furlong\n" + kFeed + kFrequency,
       2, 50, "unknown unit 'furlong'"},
      {"unknown_function", "let x = foo(1)\n" + kGood, 1, 9, "unknown function 'foo'"},
      {"function_without_parentheses", "let x = sqrt 4\n" + kGood, 1, 9, "is a function"},
      {"wrong_argument_count", "let x = atan2(1)\n" + kGood, 1, 9, "atan2 takes 2 arguments"},
      {"missing_operator", "let x = 2 3\n" + kGood, 1, 11, "missing an operator"},
      {"two_units", "let x = 1mm mm\n" + kGood, 1, 13, "a number takes one unit"},
      {"unknown_ground_kind", kGood + "ground mud\n", 5, 8, "unknown kind 'mud'"},
      {"unknown_load_kind", kGood + "load l at dip@25% sideways R=5\n", 5, 19,
       "'series', 'parallel', 'coil' or 'choke'"},
      {"choke_negative_resistance", kGood + "load l at dip@25% choke (7MHz, -5ohm, 100ohm)\n", 5,
       32, "must not be negative"},
      {"choke_points_going_down",
       kGood + "load l at dip@25% choke (14MHz, 5ohm, 100ohm), (7MHz, 5ohm, 100ohm)\n", 5, 48,
       "must go up in frequency"},
      {"choke_winding_without_al", kGood + "load l at dip@25% choke turns=8\n", 5, 32,
       "turns=N al=A_L"},
      {"load_without_elements", kGood + "load l at dip@25% series\n", 5, 25, "none of R, L, C"},
      {"trailing_words", kBody + "frequency 14.2MHz please\n", 4, 19, "unexpected 'please'"},
      {"empty_file", "", 1, 1, "the model has no feed"},
      {"comments_only", "# a model\n# to come\n", 3, 1, "the model has no feed"},
      // ---- a new user's first models (tried by hand, one mistake each) -----------------
      {"close_paren_missing_in_point",
       kUnits + "wire dip from (-5, 0, 10 to (5, 0, 10) radius 1mm\n" + kFeed + kFrequency, 2, 26,
       "expected ')' to close the from point"},
      {"open_paren_missing",
       kUnits + "wire dip from -5, 0, 10) to (5, 0, 10) radius 1mm\n" + kFeed + kFrequency, 2, 15,
       "expected '(' to open the from point"},
      {"radius_given_a_frequency_variable",
       "let f = 14.2MHz\n" + kUnits + "wire dip from (-5, 0, 10) to (5, 0, 10) radius f\n" + kFeed +
           kFrequency,
       3, 48, "radius needs a length"},
      {"z0_given_a_frequency", kGood + "z0 50MHz\n", 5, 4, "z0 needs a resistance"},
      {"voltage_given_a_frequency", kHead + "feed src at dip@50% voltage 1MHz\n" + kFrequency, 3,
       29, "voltage needs a voltage"},
      {"feed_at_the_free_end_of_a_joined_pair",
       kUnits + "wire a from (0, 0, 10) to (5, 0, 10) radius 1mm\n" +
           "wire b from (5, 0, 10) to (10, 0, 10) radius 1mm\nfeed src at b@end\n" + kFrequency,
       4, 13, "move it inside the wire (for example b@50%)"},
      {"tabs_then_misspelt_unit",
       kUnits + "wire\tdip\tfrom\t(-5,\t0,\t10)\tto\t(5,\t0,\t10)\tradius\t1mmm\n" + kFeed +
           kFrequency,
       2, 49, "did you mean 'mm'?"},
      {"crlf_value_missing_at_line_end",
       "units m\r\nwire dip from (-5, 0, 10) to (5, 0, 10) radius 1mm\r\nfeed src at dip@50%\r\n"
       "frequency\r\n",
       4, 10, "missing a value"},
      {"byte_order_mark_not_counted_as_columns",
       "\xEF\xBB\xBF"
       "let x = 2 +\n" +
           kGood,
       1, 12, "missing a value"},
      {"byte_order_mark_inside_a_pasted_file",
       kGood + "\xEF\xBB\xBF"
               "ground perfect\n",
       5, 1, "byte order mark in the middle of the file"},
      {"decimal_comma_in_radius",
       kUnits + "wire dip from (-5, 0, 10) to (5, 0, 10) radius 1,5mm\n" + kFeed + kFrequency, 2,
       49, "write a decimal number with a point: 1.5"},
      {"decimal_comma_in_let", "let h = 10,5\n" + kGood, 1, 11,
       "write a decimal number with a point: 10.5"},
      {"decimal_comma_in_frequency", kBody + "frequency 14,2MHz\n", 4, 13,
       "write a decimal number with a point: 14.2"},
      {"to_point_with_two_coordinates",
       kUnits + "wire dip from (-5, 0, 10) to (5, 10) radius 1mm\n" + kFeed + kFrequency, 2, 36,
       "the to point needs 3 coordinates"},
      {"let_without_a_name", "let = 5\n" + kGood, 1, 5, "expected a variable name"},
      {"let_without_equals", "let x 5\n" + kGood, 1, 7, "expected '= EXPR'"},
      {"name_starting_with_a_digit", "let 2x = 3\n" + kGood, 1, 5,
       "a name starts with a letter or '_'"},
      {"statement_split_before_radius",
       kUnits + "wire dip from (-5, 0, 10) to (5, 0, 10)\n  radius 1mm\n" + kFeed + kFrequency, 2,
       40, "missing 'radius R'"},
      {"statement_split_before_to",
       kUnits + "wire dip from (-5, 0, 10)\n  to (5, 0, 10) radius 1mm\n" + kFeed + kFrequency, 2,
       26, "missing 'to (X, Y, Z)'"},
      {"backslash_line_continuation",
       kUnits + "wire dip from (-5, 0, 10) \\\n  to (5, 0, 10) radius 1mm\n" + kFeed + kFrequency,
       2, 27, "a statement is written on one line"},
      {"unknown_ground_preset", kGood + "ground real preset=swamp\n", 5, 20,
       "unknown preset 'swamp'; the presets are"},
      {"ground_preset_without_real", kGood + "ground medium_dry\n", 5, 8,
       "write 'ground real preset=medium_dry'"},
      {"ground_setting_without_equals", kGood + "ground real permittivity 13 conductivity 0.005\n",
       5, 26, "expected '=' after permittivity"},
      {"negative_segments",
       kUnits + "wire dip from (-5, 0, 10) to (5, 0, 10) radius 1mm segments -5\n" + kFeed +
           kFrequency,
       2, 61, "segments must be a positive whole number; got -5"},
      {"zero_segments",
       kUnits + "wire dip from (-5, 0, 10) to (5, 0, 10) radius 1mm segments 0\n" + kFeed +
           kFrequency,
       2, 61, "segments must be a positive whole number; got 0"},
      {"zero_length_wire_through_a_variable",
       "let x = 5\n" + kUnits + "wire dip from (x, 0, 10) to (5, 0, 10) radius 1mm\n" + kFeed +
           kFrequency,
       3, 6, "zero length"},
      {"capitalised_keyword",
       kUnits + "Wire dip from (-5, 0, 10) to (5, 0, 10) radius 1mm\n" + kFeed + kFrequency, 2, 1,
       "did you mean 'wire'?"},
      {"unit_in_the_wrong_case", kBody + "frequency 14.2Mhz\n", 4, 15, "did you mean 'MHz'?"},
      {"both_radius_and_diameter",
       kUnits + "wire dip from (-5, 0, 10) to (5, 0, 10) radius 1mm diameter 2mm\n" + kFeed +
           kFrequency,
       2, 52, "give either 'radius R' or 'diameter D'"},
      {"feed_without_the_at_sign", kHead + "feed src at dip 50%\n" + kFrequency, 3, 17,
       "expected '@' and a position"},
      {"semicolons_between_coordinates",
       kUnits + "wire dip from (-5; 0; 10) to (5, 0, 10) radius 1mm\n" + kFeed + kFrequency, 2, 18,
       "unexpected character ';'"},
      {"units_spelt_out", "units meters\n" + kWire + kFeed + kFrequency, 1, 7,
       "use m, cm, mm, ft or in"},
      {"two_frequencies_on_one_line", kBody + "frequency 14.2MHz 7.1MHz\n", 4, 19,
       "missing an operator before '7.1'"},
      {"slash_comment", "// my first antenna\n" + kGood, 1, 1, "a comment starts with '#'"},
      {"implicit_multiplication", "let x = 2(3)\n" + kGood, 1, 10, "write '*' to multiply"},
      {"position_as_a_word", kHead + "feed src at dip@middle\n" + kFrequency, 3, 17,
       "unknown variable 'middle'"},
      {"unknown_material",
       kUnits + "wire dip from (-5, 0, 10) to (5, 0, 10) radius 1mm material gold_plated\n" +
           kFeed + kFrequency,
       2, 61, "unknown material 'gold_plated'; the materials are"},
      {"misspelt_wire_name", kHead + "feed src at dp@50%\n" + kFrequency, 3, 13,
       "did you mean 'dip'?"},
      {"percent_without_a_number", kHead + "feed src at dip@%\n" + kFrequency, 3, 17,
       "expected a value"},
      {"frequency_with_equals", kBody + "frequency = 14.2MHz\n", 4, 11, "without '='"},
      {"radius_with_equals",
       kUnits + "wire dip from (-5, 0, 10) to (5, 0, 10) radius=1mm\n" + kFeed + kFrequency, 2, 47,
       "without '='"},
      {"segments_without_a_count",
       kUnits + "wire dip from (-5, 0, 10) to (5, 0, 10) radius 1mm segments\n" + kFeed +
           kFrequency,
       2, 60, "missing a value"},
      {"load_value_without_its_element", kGood + "load l at dip@25% series 50ohm\n", 5, 26,
       "use R=, L= or C="},
      {"unit_in_the_plural", kGood + "load l at dip@25% series R=50ohms\n", 5, 30,
       "did you mean 'ohm'?"},
      // A wire in the soil is refused over a real ground, at the point that goes below it.
      {"bent_wire_into_real_ground",
       kUnits + "wire dip through (0, 0, 10), (5, 0, 10), (5, 0, -1) radius 1mm\n" + kFeed +
           kFrequency + "ground real preset=average\n",
       2, 42, "goes below the real ground (z = -1 m)"},
      {"straight_wire_into_real_ground",
       kUnits + "wire dip from (-5, 0, 10) to (5, 0, -0.5) radius 1mm\n" + kFeed + kFrequency +
           "ground real preset=average\n",
       2, 30, "not buried radials or wires in the soil"},
      // The same over a perfect ground, which once only warned and then solved or not depending
      // on the frequency.
      {"bent_wire_into_perfect_ground",
       kUnits + "wire dip through (0, 0, 10), (5, 0, 10), (5, 0, -1) radius 1mm\n" + kFeed +
           kFrequency + "ground perfect\n",
       2, 42, "goes below the perfect ground (z = -1 m)"},
      // Collinear wires that overlap: at the later wire, both named.
      {"wires_overlapping_along_their_length",
       kHead + "wire tail from (2, 0, 10) to (8, 0, 10) radius 1mm\n" + kFeed + kFrequency, 3, 1,
       "wires 'dip' and 'tail' overlap along 3 m"},
      // Segments shorter than the radius, where the thin-wire kernel fails.
      {"segments_shorter_than_the_radius",
       kUnits + "wire dip from (-5, 0, 10) to (5, 0, 10) radius 5cm segments 1000\n" + kFeed +
           kFrequency,
       2, 1, "the shortest segment allowed is 0.05 m: give at most 200 segments"},
      {"wire_lying_on_perfect_ground",
       kUnits + "wire dip from (-5, 0, 0) to (5, 0, 0) radius 1mm\n" + kFeed + kFrequency +
           "ground perfect\n",
       2, 1, "lies on the perfect ground"},
      // ---- values outside their allowed range (model/ranges.cpp) ---------------------
      {"voltage_past_the_range", kHead + "feed src at dip@50% voltage 1e308V\n" + kFrequency, 3, 29,
       "voltage must be 1e-06 V to 1e+06 V in magnitude, either sign; got 1e+308 V"},
      {"voltage_below_the_range", kHead + "feed src at dip@50% voltage 1e-300V\n" + kFrequency, 3,
       29, "voltage must be 1e-06 V to 1e+06 V in magnitude, either sign; got 1e-300 V"},
      {"ground_permittivity_past_the_range",
       kGood + "ground real permittivity=1e308 conductivity=1e308\n", 5, 26,
       "permittivity must be 1 to 1000; got 1e+308"},
      {"ground_conductivity_past_the_range",
       kGood + "ground real permittivity=13 conductivity=1e308\n", 5, 42,
       "conductivity must be 0 S/m to 1e+09 S/m; got 1e+308 S/m"},
      {"line_length_past_the_range", kGood + "line feeder at src length 1e9 z0=50 velocity=0.66\n",
       5, 27, "length must be 1e-06 m to 100000 m; got 1e+09 m"},
      {"line_loss_past_what_double_precision_carries",
       kGood + "line feeder at src length 1e5 z0=50 velocity=0.66 loss=1000@14MHz\n", 5, 20,
       "a matched loss of 1e+06 dB over its 100000 m is more than 1000 dB"},
      {"coordinate_past_the_range",
       kUnits + "wire dip from (-5e9, 0, 10) to (5, 0, 10) radius 1mm\n" + kFeed + kFrequency, 2,
       16, "the X coordinate must be -100000 m to 100000 m; got -5e+09 m"},
      {"radius_below_the_range",
       kUnits + "wire dip from (-5, 0, 10) to (5, 0, 10) radius 1e-12\n" + kFeed + kFrequency, 2,
       48, "the radius must be 1e-07 m to 10 m; got 1e-12 m"},
      {"load_resistance_past_the_range", kGood + "load l at dip@25% series R=1e15\n", 5, 28,
       "must be 0 ohm to 1e+12 ohm; got 1e+15 ohm"},
      {"frequency_below_the_range", kBody + "frequency 0.5Hz\n", 4, 11,
       "frequency must be 1 Hz to 3e+12 Hz; got 0.5 Hz"},
      {"z0_below_the_range", kGood + "z0 1e-300\n", 5, 4,
       "z0 must be 0.001 ohm to 1e+06 ohm; got 1e-300 ohm"},
      {"coil_turns_past_the_range",
       kGood + "load c at dip@25% coil turns=1e9 diameter=5cm length=10cm wire=1mm\n", 5, 30,
       "turns must be 1 to 1e+06; got 1e+09"},
      // ---- bytes that are not UTF-8 (RFC 3629) are named, never echoed -----------------
      {"utf8_surrogate_in_name",
       kUnits + "wire d\xED\xA0\x80p from (-5, 0, 10) to (5, 0, 10) radius 1mm\n" + kFeed +
           kFrequency,
       2, 7, "unexpected byte 0xED: not UTF-8 text"},
      {"utf8_overlong_slash",
       kUnits + "wire d\xC0\xAFp from (-5, 0, 10) to (5, 0, 10) radius 1mm\n" + kFeed + kFrequency,
       2, 7, "unexpected byte 0xC0: not UTF-8 text"},
      {"c1_control_character",
       kUnits + "wire d\xC2\x9Bp from (-5, 0, 10) to (5, 0, 10) radius 1mm\n" + kFeed + kFrequency,
       2, 7, "unexpected control character U+009B"},
  };
}

TEST(MalformedInputs, EachEndsWithExitTwoAndTheLineAndColumnOfTheMistake) {
  const std::vector<MalformedCase> cases = Cases();
  ASSERT_GE(cases.size(), 60u);  // at least 60 malformed models are required
  for (const MalformedCase& c : cases) {
    SCOPED_TRACE(c.name);
    const std::string path = WriteScratchFile("malformed_" + c.name + ".wire", c.text);
    const ProgramRun run = RunWirefield({"solve", path});
    ASSERT_TRUE(run.exited) << Describe(run);
    EXPECT_EQ(run.exit_code, 2) << Describe(run);
    EXPECT_EQ(run.out, "");
    const std::string where =
        path + ":" + std::to_string(c.line) + ":" + std::to_string(c.column) + ": error: ";
    EXPECT_EQ(run.err.rfind(where, 0), 0u) << "expected [" << where << "...], got " << run.err;
    EXPECT_NE(run.err.find(c.fragment), std::string::npos) << run.err;
    EXPECT_EQ(run.err.find('\n'), run.err.size() - 1) << "one line of diagnostic: " << run.err;
  }
}

// Coarse settings keep the three commands fast: a 3-point sweep without the mesh estimate, a
// pattern on a 10-degree grid (its coarsest).
const std::vector<std::vector<std::string>>& CommandsAndOptions() {
  static const std::vector<std::vector<std::string>> kCommands = {
      {"solve"},
      {"sweep", "--from", "14MHz", "--to", "14.4MHz", "--points", "3", "--no-mesh-estimate"},
      {"pattern", "--step", "10"},
  };
  return kCommands;
}

std::vector<std::string> Args(const std::vector<std::string>& command, const std::string& path) {
  std::vector<std::string> args = {command.front(), path};
  args.insert(args.end(), command.begin() + 1, command.end());
  return args;
}

// True when `text` holds the word nan or inf (any case, any sign) as printf writes them;
// "resonances" or "information" do not count.
bool HasNonFiniteNumber(const std::string& text) {
  std::string word;
  for (size_t i = 0; i <= text.size(); ++i) {
    const char c = i < text.size() ? text[i] : ' ';
    if (std::isalpha(static_cast<unsigned char>(c))) {
      word += static_cast<char>(std::tolower(static_cast<unsigned char>(c)));
      continue;
    }
    if (word == "nan" || word == "inf" || word == "infinity") return true;
    word.clear();
  }
  return false;
}

TEST(MalformedInputs, SweepAndPatternStopAtTheSameLineAndColumnAsSolve) {
  for (const MalformedCase& c : Cases()) {
    const std::string path = WriteScratchFile("malformed_" + c.name + ".wire", c.text);
    const std::string where =
        path + ":" + std::to_string(c.line) + ":" + std::to_string(c.column) + ": error: ";
    for (const std::vector<std::string>& command : CommandsAndOptions()) {
      SCOPED_TRACE(c.name + " with " + command.front());
      const ProgramRun run = RunWirefield(Args(command, path));
      ASSERT_TRUE(run.exited) << Describe(run);
      EXPECT_EQ(run.exit_code, 2) << Describe(run);
      EXPECT_EQ(run.out, "");
      EXPECT_EQ(run.err.rfind(where, 0), 0u) << "expected [" << where << "...], got " << run.err;
    }
  }
}

TEST(BundledModels, SolveSweepAndPatternEachExitZeroWithoutNonFiniteNumbers) {
  std::vector<std::string> models;
  for (const auto& entry : std::filesystem::directory_iterator(ModelsDir())) {
    if (entry.path().extension() == ".wire") models.push_back(entry.path().string());
  }
  ASSERT_GE(models.size(), 10u);  // the bundled models (models/*.wire)
  for (const std::string& model : models) {
    for (const std::vector<std::string>& command : CommandsAndOptions()) {
      SCOPED_TRACE(model + " with " + command.front());
      const ProgramRun run = RunWirefield(Args(command, model));
      ASSERT_TRUE(run.exited) << Describe(run);
      EXPECT_EQ(run.exit_code, 0) << run.err;
      EXPECT_FALSE(HasNonFiniteNumber(run.out)) << run.out;
      EXPECT_FALSE(HasNonFiniteNumber(run.err)) << run.err;
    }
  }
}

TEST(MalformedInputs, TheNonFiniteCheckFindsPrintfsSpellingsOnly) {
  EXPECT_TRUE(HasNonFiniteNumber("R = -nan ohm"));
  EXPECT_TRUE(HasNonFiniteNumber("gain inf dBi"));
  EXPECT_FALSE(HasNonFiniteNumber("resonances at 14.1859 MHz; information"));
}

TEST(MalformedInputs, CaseNamesAreUnique) {
  const std::vector<MalformedCase> cases = Cases();
  for (size_t i = 0; i < cases.size(); ++i) {
    for (size_t j = i + 1; j < cases.size(); ++j) EXPECT_NE(cases[i].name, cases[j].name);
  }
}

}  // namespace
}  // namespace wirefield::cli_test
