// Touchstone stage: a measured one-port file beside a computed sweep. Input: a SweepResult and
// the parsed file; output: measured SWR (against the sweep's z0) and the predicted SWR,
// interpolated linearly in frequency, at each measured frequency, and the shift of the
// frequency of lowest SWR (measured minus predicted).
#include <fmt/format.h>

#include <algorithm>
#include <cmath>
#include <string>
#include <vector>

#include "network/reflection.hpp"
#include "wirefield/touchstone.hpp"

namespace wirefield {

MeasuredComparison CompareMeasured(const SweepResult& sweep, const TouchstoneData& measured,
                                   const std::vector<std::pair<double, double>>& ranges_hz) {
  MeasuredComparison out;
  out.file = measured.file;
  out.reference_ohm = measured.reference_ohm;
  const double z0_ohm = sweep.z0_ohm;
  const std::vector<SweepPoint>& points = sweep.points;
  for (const TouchstonePoint& m : measured.points) {
    bool inside = false;
    for (const auto& [low_hz, high_hz] : ranges_hz) {
      if (m.frequency_hz >= low_hz && m.frequency_hz <= high_hz) inside = true;
    }
    if (!inside || points.empty()) {
      ++out.points_outside;
      continue;
    }
    // Re-referenced reflection: with Z = R (1 + S) / (1 - S), Gamma = (Z - z0) / (Z + z0) =
    // (R (1 + S) - z0 (1 - S)) / (R (1 + S) + z0 (1 - S)), finite even for an open (S = 1).
    const double r_ohm = measured.reference_ohm;
    const Complex s = m.s11;
    const Complex gamma =
        (r_ohm * (1.0 + s) - z0_ohm * (1.0 - s)) / (r_ohm * (1.0 + s) + z0_ohm * (1.0 - s));
    const double magnitude = std::abs(gamma);
    if (!(magnitude < 1.0)) {
      throw InputError(SourceLocation{measured.file, m.line, 1},
                       fmt::format("|S11| is {:.6g} here (against {:.6g} ohm): an antenna "
                                   "reflects less than all the power, so this gives no SWR; "
                                   "check the format word of the option line (RI, MA or DB)",
                                   std::abs(s), z0_ohm));
    }
    MeasuredPoint row;
    row.frequency_hz = m.frequency_hz;
    row.measured_z_ohm =
        std::abs(1.0 - s) > 0.0 ? ImpedanceFromReflection(s, r_ohm) : Complex(0.0, 0.0);
    row.measured_swr = network::SwrFromMagnitude(magnitude);
    // Linear interpolation between the two sweep points around the measured frequency.
    auto above =
        std::lower_bound(points.begin(), points.end(), m.frequency_hz,
                         [](const SweepPoint& p, double f_hz) { return p.frequency_hz < f_hz; });
    if (above == points.end()) {
      row.predicted_swr = points.back().swr;
    } else if (above == points.begin() || above->frequency_hz == m.frequency_hz) {
      row.predicted_swr = above->swr;
    } else {
      const SweepPoint& low = *(above - 1);
      const double t =
          (m.frequency_hz - low.frequency_hz) / (above->frequency_hz - low.frequency_hz);
      row.predicted_swr = low.swr + t * (above->swr - low.swr);
    }
    out.points.push_back(row);
  }
  if (out.points.empty()) {
    throw InputError(SourceLocation{measured.file, 0, 0},
                     fmt::format("none of its {} measured frequencies lies inside the sweep; "
                                 "sweep over the measured range (its first point is {:.6g} MHz, "
                                 "its last {:.6g} MHz)",
                                 measured.points.size(), measured.points.front().frequency_hz / 1e6,
                                 measured.points.back().frequency_hz / 1e6));
  }
  const MeasuredPoint& lowest = *std::min_element(
      out.points.begin(), out.points.end(), [](const MeasuredPoint& a, const MeasuredPoint& b) {
        return a.measured_swr < b.measured_swr;
      });
  out.measured_min_swr = lowest.measured_swr;
  out.measured_min_swr_frequency_hz = lowest.frequency_hz;
  const double first_hz = out.points.front().frequency_hz;
  const double last_hz = out.points.back().frequency_hz;
  bool found = false;
  for (const SweepPoint& p : points) {
    if (p.frequency_hz < first_hz || p.frequency_hz > last_hz) continue;
    if (!found || p.swr < out.predicted_min_swr) {
      out.predicted_min_swr = p.swr;
      out.predicted_min_swr_frequency_hz = p.frequency_hz;
      found = true;
    }
  }
  if (!found) {  // the measured points all fall between two sweep points
    out.predicted_min_swr = out.points.front().predicted_swr;
    out.predicted_min_swr_frequency_hz = first_hz;
    for (const MeasuredPoint& row : out.points) {
      if (row.predicted_swr < out.predicted_min_swr) {
        out.predicted_min_swr = row.predicted_swr;
        out.predicted_min_swr_frequency_hz = row.frequency_hz;
      }
    }
  }
  out.shift_hz = out.measured_min_swr_frequency_hz - out.predicted_min_swr_frequency_hz;
  return out;
}

}  // namespace wirefield
