// Report stage: a frequency sweep as one self-contained SVG document (no scripts, no external
// fonts): on the left the SWR at the transmitter against frequency (one panel per swept band,
// bands shaded, the 2:1 line, resonances and the lowest SWR marked, a measured curve dashed),
// on the right a Smith chart of the impedance at the transmitter normalised to z0.
// Input: SweepReport; output: SVG text.
#include <fmt/format.h>

#include <algorithm>
#include <cmath>
#include <complex>
#include <string>
#include <vector>

#include "report/svg_text.hpp"
#include "report/sweep_format.hpp"
#include "wirefield/sweep_report.hpp"

namespace wirefield {
namespace report {
namespace {

constexpr double kPi = 3.14159265358979323846;

constexpr double kWidth_px = 1300.0;
constexpr double kHeight_px = 700.0;
// SWR panel.
constexpr double kPlotLeft_px = 70.0;
constexpr double kPlotRight_px = 760.0;
constexpr double kPlotTop_px = 110.0;
constexpr double kPlotBottom_px = 590.0;
constexpr double kPanelGap_px = 18.0;
// Smith chart.
constexpr double kSmithX_px = 1035.0;
constexpr double kSmithY_px = 360.0;
constexpr double kSmithR_px = 215.0;
// The SWR axis runs on a log scale from 1 to 10: the region from 1 to 3 where a transmitter's
// match matters gets half the height (common practice for SWR plots).
constexpr double kMaxSwr = 10.0;

const char* const kTraceColour = "#1d5fa6";
const char* const kMeasuredColour = "#b3261e";
const char* const kLimitColour = "#c0392b";
const char* const kGridColour = "#cfcfcf";
const char* const kTextColour = "#222222";
const char* const kBandFill = "#e8f1e4";
const char* const kResonanceColour = "#6a3d9a";
const char* const kResonanceDash = "2 3";
const char* const kAntennaResonanceColour = "#8c510a";
const char* const kAntennaResonanceDash = "8 3 2 3";

std::string Text(double x, double y, const std::string& text, int size, const char* anchor,
                 const char* colour = kTextColour, const std::string& extra = "") {
  return fmt::format(
      "<text x=\"{}\" y=\"{}\" font-size=\"{}\" fill=\"{}\" text-anchor=\"{}\"{}>{}</text>\n",
      Px(x), Px(y), size, colour, anchor, extra, Escape(text));
}

double SwrY(double swr) {
  const double clipped = std::clamp(swr, 1.0, kMaxSwr);
  const double fraction = std::log10(clipped) / std::log10(kMaxSwr);
  return kPlotBottom_px - fraction * (kPlotBottom_px - kPlotTop_px);
}

// A step of 1, 2 or 5 times a power of ten that gives about `wanted` ticks over `span`.
double NiceStep(double span, int wanted) {
  const double raw = span / wanted;
  const double power = std::pow(10.0, std::floor(std::log10(raw)));
  for (double m : {1.0, 2.0, 5.0, 10.0}) {
    if (m * power >= raw) return m * power;
  }
  return 10.0 * power;
}

// The decimals that show a tick step in MHz ("7.05" for a 50 kHz step).
int Decimals(double step_mhz) {
  int decimals = 0;
  while (decimals < 4 && std::abs(step_mhz * std::pow(10.0, decimals) -
                                  std::round(step_mhz * std::pow(10.0, decimals))) > 1e-6) {
    ++decimals;
  }
  return decimals;
}

// One horizontal panel of the SWR plot: a frequency stretch mapped to [left, right].
struct Panel {
  std::string name;
  double from_hz;
  double to_hz;
  double left_px;
  double right_px;
  double X(double f_hz) const {
    const double width = to_hz > from_hz ? to_hz - from_hz : 1.0;
    return left_px + (f_hz - from_hz) / width * (right_px - left_px);
  }
  bool Holds(double f_hz) const {
    const double tolerance_hz = 1e-9 * to_hz;
    return f_hz >= from_hz - tolerance_hz && f_hz <= to_hz + tolerance_hz;
  }
};

std::vector<Panel> Panels(const SweepReport& report) {
  std::vector<Panel> panels;
  const std::size_t count = report.spans.size();
  const double width =
      (kPlotRight_px - kPlotLeft_px - kPanelGap_px * double(count - 1)) / double(count);
  for (std::size_t i = 0; i < count; ++i) {
    const SweepSpan& span = report.spans[i];
    const double left = kPlotLeft_px + double(i) * (width + kPanelGap_px);
    panels.push_back(Panel{span.name, span.frequencies_hz.front(), span.frequencies_hz.back(), left,
                           left + width});
  }
  return panels;
}

std::string PolylinePath(const std::vector<std::pair<double, double>>& xy) {
  std::string d;
  for (std::size_t i = 0; i < xy.size(); ++i) {
    d += fmt::format("{}{},{} ", i == 0 ? "M" : "L", Px(xy[i].first), Px(xy[i].second));
  }
  return d;
}

std::string SwrPlot(const SweepReport& report) {
  std::string out = "<g class=\"swr\">\n";
  const std::vector<Panel> panels = Panels(report);
  out += Text((kPlotLeft_px + kPlotRight_px) / 2.0, kPlotTop_px - 34.0, "SWR at the transmitter",
              15, "middle", kTextColour, " font-weight=\"bold\"");
  // Amateur bands inside a --from/--to range, shaded; a band sweep's panel is the band.
  std::vector<Band> shaded;
  if (report.bands.empty()) {
    for (const Band& band : BandTable(report.region)) shaded.push_back(band);
  }
  for (const Panel& panel : panels) {
    if (!report.bands.empty()) {
      out += fmt::format("<rect x=\"{}\" y=\"{}\" width=\"{}\" height=\"{}\" fill=\"{}\"/>\n",
                         Px(panel.left_px), Px(kPlotTop_px), Px(panel.right_px - panel.left_px),
                         Px(kPlotBottom_px - kPlotTop_px), kBandFill);
    }
    for (const Band& band : shaded) {
      const double low = std::max(band.from_hz, panel.from_hz);
      const double high = std::min(band.to_hz, panel.to_hz);
      if (high <= low) continue;
      const double x0 = panel.X(low);
      const double x1 = panel.X(high);
      out += fmt::format("<rect x=\"{}\" y=\"{}\" width=\"{}\" height=\"{}\" fill=\"{}\"/>\n",
                         Px(x0), Px(kPlotTop_px), Px(std::max(x1 - x0, 1.0)),
                         Px(kPlotBottom_px - kPlotTop_px), kBandFill);
      out += Text((x0 + x1) / 2.0, kPlotTop_px + 14.0, band.name, 11, "middle", "#4b7a3c");
    }
    // Horizontal grid at the labelled SWR values.
    for (double swr : {1.0, 1.5, 2.0, 3.0, 5.0, 10.0}) {
      out += fmt::format(
          "<line x1=\"{}\" y1=\"{}\" x2=\"{}\" y2=\"{}\" stroke=\"{}\" stroke-width=\"0.8\"/>\n",
          Px(panel.left_px), Px(SwrY(swr)), Px(panel.right_px), Px(SwrY(swr)), kGridColour);
    }
    // Frequency ticks.
    const double span_mhz = (panel.to_hz - panel.from_hz) / 1e6;
    const int wanted = std::max(2, static_cast<int>((panel.right_px - panel.left_px) / 70.0));
    if (span_mhz > 0.0) {
      const double step_mhz = NiceStep(span_mhz, wanted);
      const int decimals = Decimals(step_mhz);
      for (double tick = std::ceil(panel.from_hz / 1e6 / step_mhz - 1e-9) * step_mhz;
           tick <= panel.to_hz / 1e6 + 1e-9; tick += step_mhz) {
        const double x = panel.X(tick * 1e6);
        out += fmt::format(
            "<line x1=\"{}\" y1=\"{}\" x2=\"{}\" y2=\"{}\" stroke=\"{}\" stroke-width=\"0.8\"/>\n",
            Px(x), Px(kPlotTop_px), Px(x), Px(kPlotBottom_px), kGridColour);
        out += Text(x, kPlotBottom_px + 16.0, fmt::format("{:.{}f}", tick, decimals), 11, "middle");
      }
    }
    out += fmt::format(
        "<rect x=\"{}\" y=\"{}\" width=\"{}\" height=\"{}\" fill=\"none\" stroke=\"#777777\"/>\n",
        Px(panel.left_px), Px(kPlotTop_px), Px(panel.right_px - panel.left_px),
        Px(kPlotBottom_px - kPlotTop_px));
    if (!report.bands.empty()) {
      out += Text((panel.left_px + panel.right_px) / 2.0, kPlotTop_px - 8.0, panel.name, 13,
                  "middle", kTextColour, " font-weight=\"bold\"");
    }
  }
  // SWR axis labels (left of the first panel).
  for (double swr : {1.0, 1.5, 2.0, 3.0, 5.0, 10.0}) {
    out += Text(kPlotLeft_px - 8.0, SwrY(swr) + 4.0, fmt::format("{:g}", swr), 12, "end");
  }
  out += Text(
      22.0, (kPlotTop_px + kPlotBottom_px) / 2.0, "SWR (log scale, clipped at 10)", 12, "middle",
      kTextColour,
      fmt::format(" transform=\"rotate(-90 22 {})\"", Px((kPlotTop_px + kPlotBottom_px) / 2.0)));
  out += Text((kPlotLeft_px + kPlotRight_px) / 2.0, kPlotBottom_px + 38.0, "frequency (MHz)", 12,
              "middle");
  // The 2:1 line across every panel.
  for (const Panel& panel : panels) {
    out += fmt::format(
        "<line x1=\"{}\" y1=\"{}\" x2=\"{}\" y2=\"{}\" stroke=\"{}\" stroke-width=\"1.4\" "
        "stroke-dasharray=\"8 4\"/>\n",
        Px(panel.left_px), Px(SwrY(2.0)), Px(panel.right_px), Px(SwrY(2.0)), kLimitColour);
  }
  out += Text(panels.back().right_px - 4.0, SwrY(2.0) - 5.0, "2:1", 12, "end", kLimitColour);

  // Resonances: a vertical line per zero crossing of X and its frequency near the top of the
  // panel (at a resonance the SWR is usually low, so the curve is far below). X = 0 at the
  // transmitter dotted; with a transformer or line, X = 0 at the antenna terminals dash-dotted
  // in another colour, its label lower down so the two never cover each other.
  const bool chain = HasFeedChain(report.sweep);
  auto resonance_marks = [&](const std::vector<double>& list_hz, const char* colour,
                             const char* dash, const char* where, double label_y) {
    for (double f_hz : list_hz) {
      for (const Panel& panel : panels) {
        if (!panel.Holds(f_hz)) continue;
        const double x = panel.X(f_hz);
        out += fmt::format(
            "<line x1=\"{}\" y1=\"{}\" x2=\"{}\" y2=\"{}\" stroke=\"{}\" stroke-width=\"1.2\" "
            "stroke-dasharray=\"{}\"/>\n",
            Px(x), Px(kPlotTop_px), Px(x), Px(kPlotBottom_px), colour, dash);
        out += Text(x + 4.0, label_y, fmt::format("X = 0{} at {:.4f} MHz", where, f_hz / 1e6), 11,
                    "end", colour,
                    fmt::format(" transform=\"rotate(-90 {} {})\" stroke=\"#ffffff\" "
                                "stroke-width=\"3\" paint-order=\"stroke\"",
                                Px(x + 4.0), Px(label_y)));
      }
    }
  };
  resonance_marks(report.sweep.transmitter_resonances_hz, kResonanceColour, kResonanceDash,
                  chain ? " (transmitter)" : "", kPlotTop_px + 24.0);
  if (chain) {
    resonance_marks(report.sweep.resonances_hz, kAntennaResonanceColour, kAntennaResonanceDash,
                    " (antenna)", kPlotTop_px + 230.0);
  }
  // The predicted curve, one path per panel.
  for (const Panel& panel : panels) {
    std::vector<std::pair<double, double>> xy;
    for (const SweepPoint& p : report.sweep.points) {
      if (panel.Holds(p.frequency_hz)) xy.emplace_back(panel.X(p.frequency_hz), SwrY(p.swr));
    }
    if (xy.size() == 1) xy.push_back({xy[0].first + 1.0, xy[0].second});
    bool clipped = false;
    for (const SweepPoint& p : report.sweep.points) {
      if (panel.Holds(p.frequency_hz) && p.swr > kMaxSwr) clipped = true;
    }
    if (clipped) {
      out += Text((panel.left_px + panel.right_px) / 2.0, kPlotTop_px + 32.0,
                  "SWR above 10 drawn on the top edge", 11, "middle", kTraceColour,
                  " stroke=\"#ffffff\" stroke-width=\"3\" paint-order=\"stroke\"");
    }
    out += fmt::format(
        "<path d=\"{}\" fill=\"none\" stroke=\"{}\" stroke-width=\"2.4\" "
        "stroke-linejoin=\"round\"/>\n",
        PolylinePath(xy), kTraceColour);
  }
  // The measured curve, dashed.
  if (report.measured) {
    for (const Panel& panel : panels) {
      std::vector<std::pair<double, double>> xy;
      for (const MeasuredPoint& row : report.measured->points) {
        if (panel.Holds(row.frequency_hz)) {
          xy.emplace_back(panel.X(row.frequency_hz), SwrY(row.measured_swr));
        }
      }
      if (xy.empty()) continue;
      out += fmt::format(
          "<path d=\"{}\" fill=\"none\" stroke=\"{}\" stroke-width=\"2\" "
          "stroke-dasharray=\"7 4\"/>\n",
          PolylinePath(xy), kMeasuredColour);
    }
  }
  // The lowest SWR: a dot and its value.
  for (const Panel& panel : panels) {
    if (!panel.Holds(report.sweep.min_swr_frequency_hz)) continue;
    const double x = panel.X(report.sweep.min_swr_frequency_hz);
    const double y = SwrY(report.sweep.min_swr);
    out += fmt::format("<circle cx=\"{}\" cy=\"{}\" r=\"4\" fill=\"{}\"/>\n", Px(x), Px(y),
                       kTraceColour);
    // Below the dot: the curve lies above its lowest point everywhere else.
    const bool right_half = x > (panel.left_px + panel.right_px) / 2.0;
    const double label_y = y + 22.0 < kPlotBottom_px - 6.0 ? y + 22.0 : y - 12.0;
    out += Text(x + (right_half ? -8.0 : 8.0), label_y,
                fmt::format("SWR {:.2f} at {:.4f} MHz", report.sweep.min_swr,
                            report.sweep.min_swr_frequency_hz / 1e6),
                12, right_half ? "end" : "start", kTraceColour,
                " stroke=\"#ffffff\" stroke-width=\"3\" paint-order=\"stroke\"");
    break;
  }
  // Legend.
  const double ly = kPlotBottom_px + 62.0;
  out += fmt::format(
      "<line x1=\"{}\" y1=\"{}\" x2=\"{}\" y2=\"{}\" stroke=\"{}\" stroke-width=\"2.4\"/>\n",
      Px(kPlotLeft_px), Px(ly), Px(kPlotLeft_px + 30), Px(ly), kTraceColour);
  out += Text(kPlotLeft_px + 36, ly + 4, "predicted", 12, "start");
  double lx = kPlotLeft_px + 120;
  if (report.measured) {
    out += fmt::format(
        "<line x1=\"{}\" y1=\"{}\" x2=\"{}\" y2=\"{}\" stroke=\"{}\" stroke-width=\"2\" "
        "stroke-dasharray=\"7 4\"/>\n",
        Px(lx), Px(ly), Px(lx + 30), Px(ly), kMeasuredColour);
    out += Text(lx + 36, ly + 4, "measured", 12, "start");
    lx += 110;
  }
  out += fmt::format("<rect x=\"{}\" y=\"{}\" width=\"24\" height=\"10\" fill=\"{}\"/>\n", Px(lx),
                     Px(ly - 5), kBandFill);
  out += Text(lx + 30, ly + 4, "amateur band (ITU)", 12, "start");
  lx += 175;
  auto resonance_legend = [&](const char* colour, const char* dash, const char* label) {
    out += fmt::format(
        "<line x1=\"{}\" y1=\"{}\" x2=\"{}\" y2=\"{}\" stroke=\"{}\" stroke-width=\"1.2\" "
        "stroke-dasharray=\"{}\"/>\n",
        Px(lx), Px(ly), Px(lx + 30), Px(ly), colour, dash);
    out += Text(lx + 36, ly + 4, label, 12, "start");
  };
  if (chain) {
    resonance_legend(kResonanceColour, kResonanceDash, "X = 0 at the transmitter");
    lx += 200;
    resonance_legend(kAntennaResonanceColour, kAntennaResonanceDash,
                     "X = 0 at the antenna terminals");
  } else {
    resonance_legend(kResonanceColour, kResonanceDash, "resonance (X = 0)");
  }
  out += "</g>\n";
  return out;
}

struct Smith {
  double X(Complex gamma) const { return kSmithX_px + kSmithR_px * gamma.real(); }
  double Y(Complex gamma) const { return kSmithY_px - kSmithR_px * gamma.imag(); }
};

Complex Gamma(Complex z_normalised) { return (z_normalised - 1.0) / (z_normalised + 1.0); }

std::string SmithChart(const SweepReport& report) {
  const Smith s;
  const double z0_ohm = report.sweep.z0_ohm;
  std::string out = "<g class=\"smith\">\n";
  out += Text(kSmithX_px, kPlotTop_px - 34.0,
              fmt::format("Impedance at the transmitter, normalised to {:g} ohm", z0_ohm), 15,
              "middle", kTextColour, " font-weight=\"bold\"");
  out += fmt::format(
      "<circle cx=\"{}\" cy=\"{}\" r=\"{}\" fill=\"#fbfbfb\" stroke=\"#666666\" "
      "stroke-width=\"1.4\"/>\n",
      Px(kSmithX_px), Px(kSmithY_px), Px(kSmithR_px));
  // Constant-resistance circles: centre r/(1+r), radius 1/(1+r) in the reflection plane.
  for (double r : {0.2, 0.5, 1.0, 2.0, 5.0}) {
    const double centre = r / (1.0 + r);
    const double radius = 1.0 / (1.0 + r);
    out += fmt::format(
        "<circle cx=\"{}\" cy=\"{}\" r=\"{}\" fill=\"none\" stroke=\"{}\" stroke-width=\"{}\"/>\n",
        Px(kSmithX_px + kSmithR_px * centre), Px(kSmithY_px), Px(kSmithR_px * radius),
        r == 1.0 ? "#9a9a9a" : kGridColour, r == 1.0 ? 1.2 : 0.8);
  }
  // Constant-reactance arcs, traced point by point over r = 0 .. infinity (r = tan t).
  for (double x : {0.2, 0.5, 1.0, 2.0, 5.0}) {
    for (double sign : {1.0, -1.0}) {
      std::vector<std::pair<double, double>> xy;
      constexpr int kSamples = 160;
      for (int i = 0; i < kSamples; ++i) {
        const double t = (kPi / 2.0) * i / kSamples;
        const Complex g = Gamma(Complex(std::tan(t), sign * x));
        xy.emplace_back(s.X(g), s.Y(g));
      }
      xy.emplace_back(s.X(Complex(1.0, 0.0)), s.Y(Complex(1.0, 0.0)));
      out += fmt::format("<path d=\"{}\" fill=\"none\" stroke=\"{}\" stroke-width=\"0.8\"/>\n",
                         PolylinePath(xy), kGridColour);
      const Complex edge = Gamma(Complex(0.0, sign * x)) * 1.07;
      const double c = edge.real();
      out += Text(s.X(edge), s.Y(edge) + 4.0, fmt::format("{}j{:g}", sign > 0 ? "+" : "-", x), 11,
                  c > 0.3 ? "start" : (c < -0.3 ? "end" : "middle"), "#555555");
    }
  }
  // The real axis and its resistance labels.
  out += fmt::format(
      "<line x1=\"{}\" y1=\"{}\" x2=\"{}\" y2=\"{}\" stroke=\"{}\" stroke-width=\"0.8\"/>\n",
      Px(kSmithX_px - kSmithR_px), Px(kSmithY_px), Px(kSmithX_px + kSmithR_px), Px(kSmithY_px),
      "#9a9a9a");
  for (double r : {0.0, 0.2, 0.5, 1.0, 2.0, 5.0}) {
    const Complex g = Gamma(Complex(r, 0.0));
    out += Text(s.X(g) + 3.0, kSmithY_px - 4.0, fmt::format("{:g}", r), 11, "start", "#555555",
                " stroke=\"#fbfbfb\" stroke-width=\"3\" paint-order=\"stroke\"");
  }
  // The SWR 2 circle: |Gamma| = (2 - 1) / (2 + 1) = 1/3.
  out += fmt::format(
      "<circle cx=\"{}\" cy=\"{}\" r=\"{}\" fill=\"none\" stroke=\"{}\" stroke-width=\"1.4\" "
      "stroke-dasharray=\"8 4\"/>\n",
      Px(kSmithX_px), Px(kSmithY_px), Px(kSmithR_px / 3.0), kLimitColour);
  out += Text(kSmithX_px, kSmithY_px + kSmithR_px / 3.0 + 14.0, "SWR 2", 11, "middle", kLimitColour,
              " stroke=\"#fbfbfb\" stroke-width=\"3\" paint-order=\"stroke\"");
  // The traces, one per span, with start and end frequencies.
  const std::vector<Panel> panels = Panels(report);
  for (const Panel& panel : panels) {
    std::vector<std::pair<double, double>> xy;
    std::vector<const SweepPoint*> inside;
    for (const SweepPoint& p : report.sweep.points) {
      if (!panel.Holds(p.frequency_hz)) continue;
      const Complex g = Gamma(p.transmitter_impedance_ohm / z0_ohm);
      xy.emplace_back(s.X(g), s.Y(g));
      inside.push_back(&p);
    }
    if (xy.empty()) continue;
    out += fmt::format(
        "<path d=\"{}\" fill=\"none\" stroke=\"{}\" stroke-width=\"2.2\" "
        "stroke-linejoin=\"round\"/>\n",
        PolylinePath(xy), kTraceColour);
    out += fmt::format(
        "<circle cx=\"{}\" cy=\"{}\" r=\"4\" fill=\"#ffffff\" stroke=\"{}\" stroke-width=\"2\"/>\n",
        Px(xy.front().first), Px(xy.front().second), kTraceColour);
    out += fmt::format("<circle cx=\"{}\" cy=\"{}\" r=\"4\" fill=\"{}\"/>\n", Px(xy.back().first),
                       Px(xy.back().second), kTraceColour);
    // Start and end labels pushed outward from the chart's centre, away from the trace.
    const std::string halo = " stroke=\"#fbfbfb\" stroke-width=\"3\" paint-order=\"stroke\"";
    auto label = [&](std::pair<double, double> at, double f_hz) {
      double dx = at.first - kSmithX_px;
      double dy = at.second - kSmithY_px;
      const double length = std::hypot(dx, dy);
      if (length < 1.0) {
        dx = 1.0;
        dy = 0.0;
      } else {
        dx /= length;
        dy /= length;
      }
      const char* anchor = dx > 0.3 ? "start" : (dx < -0.3 ? "end" : "middle");
      // Keep the label on the canvas: near the right edge it goes left of the point.
      constexpr double kLabelWidth_px = 75.0;
      if (at.first + 12.0 * dx + kLabelWidth_px > kWidth_px - 4.0) {
        anchor = "end";
        dx = -std::abs(dx);
        dy = dy < 0.0 ? -1.0 : 1.0;
      }
      return Text(at.first + 12.0 * dx, at.second + 12.0 * dy + 4.0,
                  fmt::format("{:.4f} MHz", f_hz / 1e6), 11, anchor, kTraceColour, halo);
    };
    out += label(xy.front(), inside.front()->frequency_hz);
    out += label(xy.back(), inside.back()->frequency_hz);
  }
  if (report.measured) {
    std::vector<std::pair<double, double>> xy;
    for (const MeasuredPoint& row : report.measured->points) {
      const Complex g = Gamma(row.measured_z_ohm / z0_ohm);
      xy.emplace_back(s.X(g), s.Y(g));
    }
    out += fmt::format(
        "<path d=\"{}\" fill=\"none\" stroke=\"{}\" stroke-width=\"1.8\" "
        "stroke-dasharray=\"7 4\"/>\n",
        PolylinePath(xy), kMeasuredColour);
  }
  out += Text(kSmithX_px, kSmithY_px + kSmithR_px + 34.0,
              "open circle: first frequency; filled circle: last", 11, "middle", "#555555");
  out += Text(kSmithX_px, kSmithY_px + kSmithR_px + 50.0,
              "circles of constant resistance 0, 0.2, 0.5, 1, 2, 5; arcs of reactance +-j", 11,
              "middle", "#555555");
  out += "</g>\n";
  return out;
}

}  // namespace
}  // namespace report

std::string FormatSweepSvg(const SweepReport& report) {
  report::CheckSweepReport(report);
  if (report.spans.empty()) throw ComputationError("FormatSweepSvg: the report has no spans");
  std::string out = fmt::format(
      "<svg xmlns=\"http://www.w3.org/2000/svg\" width=\"{0}\" height=\"{1}\" "
      "viewBox=\"0 0 {0} {1}\" font-family=\"DejaVu Sans, Liberation Sans, Arial, sans-serif\">\n",
      report::kWidth_px, report::kHeight_px);
  out += fmt::format("<rect width=\"{}\" height=\"{}\" fill=\"#ffffff\"/>\n", report::kWidth_px,
                     report::kHeight_px);
  std::string model = report.model_file;
  const std::size_t slash = model.find_last_of('/');
  if (slash != std::string::npos) model = model.substr(slash + 1);
  out +=
      report::Text(report::kWidth_px / 2.0, 30.0,
                   fmt::format("wirefield sweep: {}  |  feed {}  |  z0 {:g} ohm  |  {}", model,
                               report.feed_name, report.sweep.z0_ohm, report::SweepTitle(report)),
                   17, "middle", report::kTextColour, " font-weight=\"bold\"");
  out += report::Text(report::kWidth_px / 2.0, 52.0,
                      "Band edges: ITU Radio Regulations Article 5 (2020); national rules may be "
                      "narrower. High RF voltage at wire ends: keep clear of people and power "
                      "lines.",
                      12, "middle", "#555555");
  out += report::SwrPlot(report);
  out += report::SmithChart(report);
  out += "</svg>\n";
  return out;
}

}  // namespace wirefield
