// Study layer: the summary of a batch's rows (`wirefield batch`): the best row and the spread
// of the figures over the grounds, for the rows' own figures or those of one span.
#include <algorithm>
#include <optional>

#include "wirefield/batch.hpp"

namespace wirefield {

bool BatchHasBandPatterns(const BatchResult& result) {
  return result.spans.size() > 1 && !result.pattern_frequency_hz;
}

namespace {

// The figures a summary compares: the row's own, or those of one of its spans.
struct Figures {
  bool ok = false;
  double gain_at_elevation_dbi = 0.0;
  double min_swr = 0.0;
  const std::vector<double>* resonances_hz = nullptr;
};

Figures FiguresOf(const BatchRow& row, std::optional<int> band) {
  Figures f;
  if (row.error) return f;
  if (!band) {
    f = {true, row.gain_at_elevation_dbi, row.min_swr, &row.resonances_hz};
  } else if (*band >= 0 && static_cast<size_t>(*band) < row.bands.size() &&
             row.bands[static_cast<size_t>(*band)].has_pattern) {
    const BatchBand& b = row.bands[static_cast<size_t>(*band)];
    f = {true, b.gain_at_elevation_dbi, b.min_swr, &b.resonances_hz};
  }
  return f;
}

}  // namespace

BatchSummary SummarizeBatch(const BatchResult& result, std::optional<int> band) {
  BatchSummary summary;
  for (const BatchRow& row : result.rows) {
    const Figures f = FiguresOf(row, band);
    if (!f.ok) continue;
    if (!summary.best_row ||
        f.gain_at_elevation_dbi >
            FiguresOf(result.rows[static_cast<size_t>(*summary.best_row)], band)
                .gain_at_elevation_dbi) {
      summary.best_row = row.index;
    }
  }
  // Rows of one setting differ in the ground only: the grid repeats the settings per ground.
  const size_t ground_count = std::max<size_t>(1, result.grounds.size());
  const size_t per_ground = result.rows.size() / ground_count;
  for (size_t s = 0; s < per_ground; ++s) {
    BatchSetting setting;
    for (const BatchValue& v : result.rows[s].values) setting.labels.push_back(v.label);
    std::optional<double> first_low_hz, first_high_hz;
    int with_resonance = 0;
    for (size_t g = 0; g < ground_count; ++g) {
      const BatchRow& row = result.rows[g * per_ground + s];
      const Figures f = FiguresOf(row, band);
      if (!f.ok) continue;
      const bool first = setting.rows_ok == 0;
      ++setting.rows_ok;
      if (first || f.gain_at_elevation_dbi < setting.worst_gain_dbi) {
        setting.worst_gain_dbi = f.gain_at_elevation_dbi;
        setting.worst_ground = row.ground;
      }
      if (first || f.gain_at_elevation_dbi > setting.best_gain_dbi) {
        setting.best_gain_dbi = f.gain_at_elevation_dbi;
        setting.best_ground = row.ground;
      }
      setting.min_swr_low = first ? f.min_swr : std::min(setting.min_swr_low, f.min_swr);
      setting.min_swr_high = first ? f.min_swr : std::max(setting.min_swr_high, f.min_swr);
      if (!f.resonances_hz->empty()) {
        const double f_hz = f.resonances_hz->front();
        ++with_resonance;
        first_low_hz = std::min(first_low_hz.value_or(f_hz), f_hz);
        first_high_hz = std::max(first_high_hz.value_or(f_hz), f_hz);
      }
    }
    if (with_resonance > 1) {
      setting.resonance_spread_hz = *first_high_hz - *first_low_hz;
    }
    summary.settings.push_back(std::move(setting));
  }
  for (size_t s = 0; s < summary.settings.size(); ++s) {
    const BatchSetting& setting = summary.settings[s];
    if (setting.rows_ok > 0) {
      summary.largest_gain_spread_db =
          std::max(summary.largest_gain_spread_db, setting.best_gain_dbi - setting.worst_gain_dbi);
    }
    if (ground_count < 2 || setting.rows_ok != static_cast<int>(ground_count)) continue;
    if (!summary.robust_setting ||
        setting.worst_gain_dbi > summary.settings[*summary.robust_setting].worst_gain_dbi) {
      summary.robust_setting = static_cast<int>(s);
    }
  }
  return summary;
}

}  // namespace wirefield
