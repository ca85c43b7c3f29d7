// wirefield public API, part 8: one-port Touchstone files (.s1p, version 1.1 of the open
// Touchstone format): reading a measured S11 against frequency, writing a computed one, and
// comparing a measurement with a sweep. Implemented in libmom/src/touchstone/.
#pragma once

#include <complex>
#include <string>
#include <utility>
#include <vector>

#include "wirefield/model.hpp"
#include "wirefield/sweep.hpp"

namespace wirefield {

// How the file writes a complex number: real and imaginary parts (RI), magnitude and angle
// in degrees (MA), or 20 log10 of the magnitude in dB and angle in degrees (DB).
enum class TouchstoneFormat { kRealImaginary, kMagnitudeAngle, kDecibelAngle };

struct TouchstonePoint {
  double frequency_hz = 0.0;
  Complex s11;   // reflection coefficient against the file's reference resistance
  int line = 0;  // 1-based line of the data line in the file
};

struct TouchstoneData {
  std::string file;                                             // as given
  double reference_ohm = 50.0;                                  // the option line's R (default 50)
  TouchstoneFormat format = TouchstoneFormat::kMagnitudeAngle;  // default MA
  double frequency_unit_hz = 1e9;                               // default GHZ
  std::vector<TouchstonePoint> points;
};

// Parses the text of a one-port Touchstone 1.1 file (file_name is for diagnostics only).
// The option line "# [HZ|KHZ|MHZ|GHZ] [S] [RI|MA|DB] [R n]" may be missing (defaults GHZ, S,
// MA, R 50); `!` starts a comment anywhere; blank lines are skipped; each data line holds a
// frequency and two numbers; frequencies must increase. Throws InputError at
// FILE:LINE:COLUMN saying what to change.
TouchstoneData ParseTouchstone(const std::string& text, const std::string& file_name);

// Reads and parses a file; InputError naming it when it cannot be read.
TouchstoneData ReadTouchstone(const std::string& path);

// Impedance from a reflection coefficient against reference_ohm: Z = R (1 + S) / (1 - S).
// Throws ComputationError for S = 1 (an open circuit has no finite impedance).
Complex ImpedanceFromReflection(Complex s11, double reference_ohm);

// Writes a Touchstone 1.1 one-port file: comment lines ("! ..." each of `comments`), the
// option line "# MHZ S RI R <reference_ohm>", then one line per frequency with S11 of
// impedances_ohm[i] against reference_ohm, in full precision (17 significant digits).
std::string FormatTouchstone(const std::vector<double>& frequencies_hz,
                             const std::vector<Complex>& impedances_ohm, double reference_ohm,
                             const std::vector<std::string>& comments);

// A measurement beside the prediction at the measured frequencies.
struct MeasuredPoint {
  double frequency_hz = 0.0;
  Complex measured_z_ohm;      // from the file's S11 and R
  double measured_swr = 0.0;   // against the sweep's z0
  double predicted_swr = 0.0;  // the sweep's SWR interpolated linearly in frequency
};

struct MeasuredComparison {
  std::string file;
  double reference_ohm = 50.0;        // the file's R
  std::vector<MeasuredPoint> points;  // measured points inside the swept range
  int points_outside = 0;             // measured points outside it, left out
  double measured_min_swr = 0.0;
  double measured_min_swr_frequency_hz = 0.0;
  double predicted_min_swr = 0.0;  // among the compared points
  double predicted_min_swr_frequency_hz = 0.0;
  double shift_hz = 0.0;  // measured minus predicted frequency of the lowest SWR
};

// Compares `measured` with `sweep` (whose points increase in frequency) at the measured
// frequencies that lie inside one of `ranges_hz` (the [first, last] frequencies of each
// stretch the sweep covered without a gap, e.g. each band). The predicted minimum is the
// sweep's lowest SWR among its points from the first to the last compared frequency.
// Throws InputError naming the file's line when a compared |S11| is 1 or more (no SWR), and
// naming the file when no measured point lies inside the sweep.
MeasuredComparison CompareMeasured(const SweepResult& sweep, const TouchstoneData& measured,
                                   const std::vector<std::pair<double, double>>& ranges_hz);

}  // namespace wirefield
