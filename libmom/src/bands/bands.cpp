// Bands stage: the amateur HF allocations 160 m to 10 m in the three ITU regions, looked up by
// name, and the points a band sweep uses. Input: a band name and region; output: its edges
// (Hz) and allocation. Source: ITU Radio Regulations, Article 5, Edition of 2020 (the edges
// as transcribed in the project's reference sheet, REFERENCES.md section 6).
#include "wirefield/bands.hpp"

#include <fmt/format.h>

#include <algorithm>
#include <cctype>
#include <cmath>
#include <string>
#include <vector>

namespace wirefield {
namespace {

struct BandRow {
  const char* name;
  // Edges in kHz for regions 1, 2 and 3, and the allocation in each.
  double from_khz[3];
  double to_khz[3];
  const char* allocation[3];
};

// ITU Radio Regulations, Article 5, Edition of 2020 (with the WRC-19 changes). The
// confirmation status of each row is that of REFERENCES.md section 6:
const BandRow kBands[] = {
    // 160 m: confirmed (a copy of the RR; footnotes 5.97-5.100 on 1810-1830 in parts of
    // Region 1 and the Region 3 Loran note).
    {"160m",
     {1810.0, 1800.0, 1800.0},
     {1850.0, 2000.0, 2000.0},
     {"primary", "1800-1850 kHz primary (amateur only); 1850-2000 kHz primary, shared",
      "primary, shared"}},
    // 80 m: confirmed (a secondary source quoting the RR; footnotes 5.92, 5.119, 5.122,
    // 5.125).
    {"80m",
     {3500.0, 3500.0, 3500.0},
     {3800.0, 4000.0, 3900.0},
     {"primary, shared", "3500-3750 kHz primary; 3750-4000 kHz primary, shared",
      "primary, shared"}},
    // 60 m: confirmed (WRC-15 worldwide secondary allocation, in force 1 January 2017; 15 W
    // e.i.r.p. general limit). The footnote number 5.133B is from memory.
    {"60m",
     {5351.5, 5351.5, 5351.5},
     {5366.5, 5366.5, 5366.5},
     {"secondary (15 W e.i.r.p.)", "secondary (15 W e.i.r.p.)", "secondary (15 W e.i.r.p.)"}},
    // 40 m: confirmed: 7200-7300 kHz in Region 2 (footnote 5.142); 7000-7200 kHz in Regions 1
    // and 3 since 29 March 2009 (WRC-03). Primary status (from memory).
    {"40m",
     {7000.0, 7000.0, 7000.0},
     {7200.0, 7300.0, 7200.0},
     {"primary (from memory)", "primary (from memory)", "primary (from memory)"}},
    // 30 m: confirmed (a national table listing the ITU regions).
    {"30m",
     {10100.0, 10100.0, 10100.0},
     {10150.0, 10150.0, 10150.0},
     {"secondary", "secondary", "secondary"}},
    // 20 m: edges confirmed (a national table by region); primary status (from memory).
    {"20m",
     {14000.0, 14000.0, 14000.0},
     {14350.0, 14350.0, 14350.0},
     {"primary (from memory)", "primary (from memory)", "primary (from memory)"}},
    // 17 m: confirmed (a national table by region); primary status (from memory).
    {"17m",
     {18068.0, 18068.0, 18068.0},
     {18168.0, 18168.0, 18168.0},
     {"primary (from memory)", "primary (from memory)", "primary (from memory)"}},
    // 15 m: confirmed (a national table by region); primary status (from memory).
    {"15m",
     {21000.0, 21000.0, 21000.0},
     {21450.0, 21450.0, 21450.0},
     {"primary (from memory)", "primary (from memory)", "primary (from memory)"}},
    // 12 m: confirmed (a national emission table); primary status (from memory).
    {"12m",
     {24890.0, 24890.0, 24890.0},
     {24990.0, 24990.0, 24990.0},
     {"primary (from memory)", "primary (from memory)", "primary (from memory)"}},
    // 10 m: lower edge confirmed; the upper edge 29700 kHz (from memory); primary status
    // (from memory).
    {"10m",
     {28000.0, 28000.0, 28000.0},
     {29700.0, 29700.0, 29700.0},
     {"primary (from memory)", "primary (from memory)", "primary (from memory)"}},
};

constexpr double kHzPerKhz = 1e3;

void CheckRegion(int region) {
  if (region < 1 || region > 3) {
    throw InputError(SourceLocation{"region", 1, 1},
                     fmt::format("region must be 1, 2 or 3 (the ITU regions: 1 Europe, Africa "
                                 "and the Middle East; 2 the Americas; 3 Asia and the "
                                 "Pacific); got {}",
                                 region));
  }
}

Band FromRow(const BandRow& row, int region) {
  const auto i = static_cast<std::size_t>(region - 1);
  return Band{row.name, region, row.from_khz[i] * kHzPerKhz, row.to_khz[i] * kHzPerKhz,
              row.allocation[i]};
}

}  // namespace

const std::vector<std::string>& BandNames() {
  static const std::vector<std::string> names = [] {
    std::vector<std::string> out;
    for (const BandRow& row : kBands) out.emplace_back(row.name);
    return out;
  }();
  return names;
}

std::vector<Band> BandTable(int region) {
  CheckRegion(region);
  std::vector<Band> out;
  for (const BandRow& row : kBands) out.push_back(FromRow(row, region));
  return out;
}

Band FindBand(const std::string& name, int region) {
  CheckRegion(region);
  std::string key;
  for (char c : name) {
    if (c == ' ' || c == '\t') continue;
    key += static_cast<char>(std::tolower(static_cast<unsigned char>(c)));
  }
  for (const BandRow& row : kBands) {
    if (key == row.name) return FromRow(row, region);
  }
  std::string list;
  for (const std::string& known : BandNames()) list += (list.empty() ? "" : ", ") + known;
  throw InputError(SourceLocation{"band", 1, 1},
                   fmt::format("unknown band '{}'; use one of {} (the amateur bands from "
                               "160 m to 10 m)",
                               name, list));
}

SweepSpan BandSpan(const Band& band) {
  constexpr double kStep_hz = 1e3;  // 1 kHz: finer than any HF antenna's SWR curve needs
  const double width_hz = band.to_hz - band.from_hz;
  const double steps = width_hz / kStep_hz;
  SweepSpan span;
  span.name = band.name;
  const double whole_steps = std::round(steps);
  if (std::abs(steps - whole_steps) < 1e-9 && whole_steps + 1.0 <= kMaxBandPoints) {
    span.frequencies_hz = FrequencyRange(band.from_hz, band.to_hz, kStep_hz);
    span.how = fmt::format("1 kHz steps, {} points", span.frequencies_hz.size());
  } else if (steps + 1.0 <= kMaxBandPoints) {
    // The 60 m band is 15 kHz wide but starts at a half kHz: 1 kHz steps from its lower edge
    // miss the upper edge, so the points are spread evenly, about 1 kHz apart.
    const int points = static_cast<int>(std::ceil(steps)) + 1;
    span.frequencies_hz = FrequencyPoints(band.from_hz, band.to_hz, points);
    span.how =
        fmt::format("{} points, {:.4g} kHz apart", points, width_hz / (points - 1) / kHzPerKhz);
  } else {
    span.frequencies_hz = FrequencyPoints(band.from_hz, band.to_hz, kMaxBandPoints);
    span.how = fmt::format("{} points, {:.4g} kHz apart", kMaxBandPoints,
                           width_hz / (kMaxBandPoints - 1) / kHzPerKhz);
  }
  return span;
}

BandSummary SummarizeBand(const SweepResult& sweep, const Band& band) {
  // Points on an edge count as inside: 1e-9 of the edge covers the rounding of a frequency
  // list built by steps (FrequencyRange is exact to 1e-9 of a step).
  const double tolerance_hz = 1e-9 * band.to_hz;
  SweepResult inside;
  inside.z0_ohm = sweep.z0_ohm;
  for (const SweepPoint& point : sweep.points) {
    if (point.frequency_hz >= band.from_hz - tolerance_hz &&
        point.frequency_hz <= band.to_hz + tolerance_hz) {
      inside.points.push_back(point);
    }
  }
  if (inside.points.empty()) {
    throw InputError(SourceLocation{"band", 1, 1},
                     fmt::format("no sweep point falls inside the {} band ({:.1f}-{:.1f} kHz); "
                                 "sweep over the band itself",
                                 band.name, band.from_hz / kHzPerKhz, band.to_hz / kHzPerKhz));
  }
  BandSummary summary;
  summary.band = band;
  summary.points = static_cast<int>(inside.points.size());
  const SweepPoint& lowest =
      *std::min_element(inside.points.begin(), inside.points.end(),
                        [](const SweepPoint& a, const SweepPoint& b) { return a.swr < b.swr; });
  summary.min_swr = lowest.swr;
  summary.min_swr_frequency_hz = lowest.frequency_hz;
  inside.min_swr = summary.min_swr;
  inside.min_swr_frequency_hz = summary.min_swr_frequency_hz;
  for (double f_hz : sweep.resonances_hz) {
    if (f_hz >= band.from_hz - tolerance_hz && f_hz <= band.to_hz + tolerance_hz) {
      summary.resonances_hz.push_back(f_hz);
      inside.resonances_hz.push_back(f_hz);
    }
  }
  for (double f_hz : sweep.transmitter_resonances_hz) {
    if (f_hz >= band.from_hz - tolerance_hz && f_hz <= band.to_hz + tolerance_hz) {
      summary.transmitter_resonances_hz.push_back(f_hz);
    }
  }
  auto ranges = [&](double limit) {
    std::vector<std::pair<double, double>> out;
    for (auto [low_hz, high_hz] : SwrBandwidths(inside, limit)) {
      low_hz = std::max(low_hz, band.from_hz);
      high_hz = std::min(high_hz, band.to_hz);
      if (high_hz >= low_hz) out.emplace_back(low_hz, high_hz);
    }
    return out;
  };
  auto widest = [](const std::vector<std::pair<double, double>>& list) {
    double best_hz = 0.0;
    for (const auto& [low_hz, high_hz] : list) best_hz = std::max(best_hz, high_hz - low_hz);
    return best_hz;
  };
  summary.swr_2_ranges_hz = ranges(2.0);
  summary.swr_1_5_ranges_hz = ranges(1.5);
  summary.bandwidth_2_hz = widest(summary.swr_2_ranges_hz);
  summary.bandwidth_1_5_hz = widest(summary.swr_1_5_ranges_hz);
  for (const auto& [low_hz, high_hz] : summary.swr_2_ranges_hz) {
    if (low_hz <= band.from_hz + tolerance_hz && high_hz >= band.to_hz - tolerance_hz) {
      summary.covered = true;
    }
  }
  return summary;
}

}  // namespace wirefield
