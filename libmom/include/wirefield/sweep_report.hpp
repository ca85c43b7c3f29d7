// wirefield public API, part 9: a frequency sweep for people and scripts: a text table with a
// summary per band, the JSON document of `sweep` (CONTRACT.md keys plus additions), CSV, one
// SVG picture (SWR curve and Smith chart) and a Touchstone .s1p of S11 at the transmitter.
// Implemented in libmom/src/report/sweep_*.cpp.
#pragma once

#include <optional>
#include <string>
#include <vector>

#include "wirefield/bands.hpp"
#include "wirefield/sweep.hpp"
#include "wirefield/touchstone.hpp"

namespace wirefield {

// Everything a sweep report shows, gathered by the caller.
struct SweepReport {
  std::string model_file;
  std::string feed_name;  // the first feed, whose points these are
  GroundSpec ground;      // the model's ground, stated in the report
  SweepResult sweep;
  std::vector<SweepSpan> spans;      // how the frequencies were chosen, in order
  std::vector<BandSummary> bands;    // one per --band, in the order given (empty for a range)
  std::optional<BandSummary> range;  // the whole --from/--to range (empty for bands)
  int region = 1;
  bool region_given = false;  // false: region 1 was assumed
  std::optional<MeasuredComparison> measured;
  // The first feed's mesh error estimate at the centre of each band (or of the range), in
  // order; only at the centres, not at every point (empty with --no-mesh-estimate).
  std::vector<FeedMeshEstimateAt> mesh_estimates;
  std::vector<Warning> warnings;
};

// A readable report: header, per-point table (MHz, R, X, |Z| at the transmitter, SWR, return
// loss), per-band summary, measured comparison, and a safety note.
std::string FormatSweepText(const SweepReport& report);
// The JSON document of `sweep` (docs/commands.md). Always valid JSON, finite numbers only.
std::string FormatSweepJson(const SweepReport& report);
// One CSV row per point; header row with units.
std::string FormatSweepCsv(const SweepReport& report);
// One self-contained SVG: SWR against frequency (bands shaded, 2:1 line, resonances, the
// measured curve dashed) and a Smith chart of the impedance at the transmitter.
std::string FormatSweepSvg(const SweepReport& report);
// A Touchstone 1.1 one-port file of S11 at the transmitter against z0.
std::string FormatSweepTouchstone(const SweepReport& report);

}  // namespace wirefield
