// wirefield public API, part 7: the amateur HF bands (160 m to 10 m) per ITU region, the
// frequency plan of a sweep over bands or a range, and the per-band summary of a sweep
// (minimum SWR, resonances, SWR bandwidths, coverage). Implemented in libmom/src/bands/ (RunSpans
// in libmom/src/study/sweep_spans.cpp).
#pragma once

#include <functional>
#include <string>
#include <utility>
#include <vector>

#include "wirefield/sweep.hpp"

namespace wirefield {

// One amateur band in one ITU region: its edges and how the Radio Regulations allocate it.
struct Band {
  std::string name;  // "160m", "80m", ..., "10m"
  int region = 1;    // ITU region 1, 2 or 3
  double from_hz = 0.0;
  double to_hz = 0.0;
  std::string allocation;  // e.g. "primary", "secondary", or the parts of a split band
};

// The band names in order of frequency: "160m", "80m", "60m", "40m", "30m", "20m", "17m",
// "15m", "12m", "10m".
const std::vector<std::string>& BandNames();

// The bands of one ITU region (1, 2 or 3), lowest first.
std::vector<Band> BandTable(int region);

// The band `name` in `region`. Accepts "40m", "40M" and "40 m". Throws InputError (file
// "band") listing the names for an unknown name, (file "region", the message beginning with
// "region") for a region not 1..3.
Band FindBand(const std::string& name, int region);

// The frequencies of one contiguous stretch of a sweep (a band or a --from/--to range).
struct SweepSpan {
  std::string name;  // the band's name, or "range"
  std::vector<double> frequencies_hz;
  std::string how;  // how the points were chosen, e.g. "1 kHz steps, 201 points"
};

// Points of a band sweep: 1 kHz steps when that gives at most kMaxBandPoints points, else
// kMaxBandPoints points spread evenly over the band, both edges included.
inline constexpr int kMaxBandPoints = 401;
SweepSpan BandSpan(const Band& band);

// Solves every span (each on its own, so no resonance is interpolated across a gap between
// bands) and merges the results in order: points in span order, resonances of all spans,
// the lowest SWR of all. `progress(done, total)` is called after each chunk of points.
SweepResult RunSpans(const Simulation& simulation, const std::vector<SweepSpan>& spans,
                     const SweepOptions& options,
                     const std::function<void(int, int)>& progress = {});

// What a sweep says about one band (or the whole range): the points inside its edges only.
struct BandSummary {
  Band band;
  int points = 0;  // sweep points inside the band
  double min_swr = 0.0;
  double min_swr_frequency_hz = 0.0;
  std::vector<double> resonances_hz;              // X = 0 at the feed terminals, inside the band
  std::vector<double> transmitter_resonances_hz;  // X = 0 at the transmitter, inside the band
  std::vector<std::pair<double, double>> swr_2_ranges_hz;  // SWR <= 2, clipped to the band
  std::vector<std::pair<double, double>> swr_1_5_ranges_hz;
  double bandwidth_2_hz = 0.0;  // widest SWR <= 2 range inside the band
  double bandwidth_1_5_hz = 0.0;
  bool covered = false;  // SWR <= 2 from edge to edge
};

// Summarises `sweep` inside band.from_hz..band.to_hz. Throws InputError when no point of the
// sweep falls inside the band.
BandSummary SummarizeBand(const SweepResult& sweep, const Band& band);

}  // namespace wirefield
