// Report stage: a frequency sweep as one self-contained SVG document (no scripts, no external
// fonts): on the left the SWR at the transmitter against frequency (one panel per swept band,
// bands shaded, the 2:1 line, resonances and the lowest SWR marked, a measured curve
// dash-dotted in a colour of its own), on the right a Smith chart of the impedance at the
// transmitter normalised to z0 with one colour per band. No label is drawn over another.
// Input: SweepReport; output: SVG text.
#include <fmt/format.h>

#include <algorithm>
#include <cmath>
#include <complex>
#include <string>
#include <vector>

#include "core/constants.hpp"
#include "report/svg_text.hpp"
#include "report/sweep_format.hpp"
#include "wirefield/report.hpp"

namespace wirefield {
namespace report {
namespace {

constexpr double kWidth_px = 1300.0;
constexpr double kHeight_px = 700.0;
// SWR panel.
constexpr double kPlotLeft_px = 70.0;
constexpr double kPlotRight_px = 760.0;
constexpr double kPlotTop_px = 110.0;
constexpr double kPlotBottom_px = 590.0;
// Wide enough for the last tick label of one band panel and the first of the next.
constexpr double kPanelGap_px = 36.0;
// Smith chart.
constexpr double kSmithX_px = 1035.0;
constexpr double kSmithY_px = 360.0;
constexpr double kSmithR_px = 215.0;
// The SWR axis runs on a log scale from 1 to 10: the region from 1 to 3 where a transmitter's
// match matters gets half the height (common practice for SWR plots).
constexpr double kMaxSwr = 10.0;

const char* const kTraceColour = "#1d5fa6";
// The measured curve: amber and dash-dotted, unlike the red dashed SWR 2 limit.
const char* const kMeasuredColour = "#cc7a00";
const char* const kMeasuredDash = "10 3 2 3";
const char* const kLimitColour = "#c0392b";
const char* const kLimitDash = "8 4";
// One colour per band on the Smith chart, ten for the ten bands a sweep knows (repeated
// past them), the first the SWR plot's trace colour.
const char* const kBandColours[] = {"#1d5fa6", "#178a6d", "#a8326e", "#6b5414", "#4a4ab8",
                                    "#3f7f9f", "#5c7d12", "#2b2b2b", "#8e5bb5", "#0c5c4a"};
const char* const kGridColour = "#cfcfcf";
const char* const kTextColour = "#222222";
const char* const kBandFill = "#e8f1e4";
const char* const kResonanceColour = "#6a3d9a";
const char* const kResonanceDash = "2 3";
const char* const kAntennaResonanceColour = "#8c510a";
const char* const kAntennaResonanceDash = "8 3 2 3";

const char* BandColour(std::size_t index) {
  return kBandColours[index % (sizeof(kBandColours) / sizeof(kBandColours[0]))];
}

const char* const kHalo = " stroke=\"#ffffff\" stroke-width=\"3\" paint-order=\"stroke\"";

std::string Text(double x, double y, const std::string& text, double size, const char* anchor,
                 const char* colour = kTextColour, const std::string& extra = "") {
  return fmt::format(
      "<text x=\"{}\" y=\"{}\" font-size=\"{:g}\" fill=\"{}\" text-anchor=\"{}\"{}>{}</text>\n",
      Px(x), Px(y), size, colour, anchor, extra, Escape(text));
}

// A horizontal text recorded in `space` when it is free there; nothing when it is not.
std::string Label(LabelSpace& space, double x, double y, const std::string& text, double size,
                  const char* anchor, const char* colour = kTextColour,
                  const std::string& extra = "") {
  const bool bold = extra.find("bold") != std::string::npos;
  if (!space.TakeIfFree(BoxOfText(x, y, text, size, anchor, bold))) return "";
  return Text(x, y, text, size, anchor, colour, extra);
}

// The box of a text turned by rotate(-90) about its anchor (x, y): it reads upward, its
// ascent to the left of x.
TextBox BoxOfUpwardText(double x, double y, const std::string& text, double size,
                        const std::string& anchor) {
  const double w = TextWidth(text, size);
  const double bottom = anchor == "end" ? y + w : (anchor == "middle" ? y + w / 2.0 : y);
  return TextBox{x - 0.93 * size, bottom - w, x + 0.24 * size, bottom};
}

// A legend entry: a line `line_px` long in `colour` (dashed by `dash`, "none" for solid),
// then its text; returns the x where the text ends.
double LegendEntry(std::string& out, LabelSpace& space, double x, double y, const char* colour,
                   double width, const char* dash, const std::string& text,
                   const std::string& css_class = "", double line_px = 30.0) {
  out += fmt::format(
      "<line{} x1=\"{}\" y1=\"{}\" x2=\"{}\" y2=\"{}\" stroke=\"{}\" stroke-width=\"{:g}\" "
      "stroke-dasharray=\"{}\"/>\n",
      css_class.empty() ? "" : " class=\"" + css_class + "\"", Px(x), Px(y), Px(x + line_px), Px(y),
      colour, width, dash);
  out += Text(x + line_px + 6, y + 4, text, 12, "start");
  space.Take(BoxOfText(x + line_px + 6, y + 4, text, 12, "start"));
  return x + line_px + 6 + TextWidth(text, 12);
}

// One entry of the Smith chart's legend.
struct SmithLegendItem {
  std::string text;
  const char* colour;
  const char* dash;
  const char* css_class;
};

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

std::string SwrPlot(const SweepReport& report, LabelSpace& space) {
  std::string out = "<g class=\"swr\">\n";
  const std::vector<Panel> panels = Panels(report);
  out += Label(space, (kPlotLeft_px + kPlotRight_px) / 2.0, kPlotTop_px - 34.0,
               "SWR at the transmitter", 15, "middle", kTextColour, " font-weight=\"bold\"");
  // Amateur bands inside a --from/--to range, shaded; a band sweep's panel is the band.
  std::vector<Band> shaded;
  if (report.bands.empty()) {
    for (const Band& band : BandTable(report.region)) shaded.push_back(band);
  }
  // SWR axis labels (left of the first panel), before the frequency ticks that might crowd
  // them.
  for (double swr : {1.0, 1.5, 2.0, 3.0, 5.0, 10.0}) {
    out += Label(space, kPlotLeft_px - 8.0, SwrY(swr) + 4.0, fmt::format("{:g}", swr), 12, "end");
  }
  // Tick labels keep 4 px from each other, 1 px from any other label.
  LabelSpace ticks(kWidth_px, kHeight_px);
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
      out += Label(space, (x0 + x1) / 2.0, kPlotTop_px + 14.0, band.name, 11, "middle", "#4b7a3c");
    }
    // Horizontal grid at the labelled SWR values.
    for (double swr : {1.0, 1.5, 2.0, 3.0, 5.0, 10.0}) {
      out += fmt::format(
          "<line x1=\"{}\" y1=\"{}\" x2=\"{}\" y2=\"{}\" stroke=\"{}\" stroke-width=\"0.8\"/>\n",
          Px(panel.left_px), Px(SwrY(swr)), Px(panel.right_px), Px(SwrY(swr)), kGridColour);
    }
    // Frequency ticks; a label that would touch one already drawn (the last of the panel to
    // the left) is left out, its grid line kept.
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
        const std::string text = fmt::format("{:.{}f}", tick, decimals);
        const TextBox box = BoxOfText(x, kPlotBottom_px + 19.0, text, 11, "middle");
        if (ticks.Free(box, 4.0) && space.Free(box, 1.0)) {
          ticks.Take(box);
          space.Take(box);
          out += Text(x, kPlotBottom_px + 19.0, text, 11, "middle");
        }
      }
    }
    out += fmt::format(
        "<rect x=\"{}\" y=\"{}\" width=\"{}\" height=\"{}\" fill=\"none\" stroke=\"#777777\"/>\n",
        Px(panel.left_px), Px(kPlotTop_px), Px(panel.right_px - panel.left_px),
        Px(kPlotBottom_px - kPlotTop_px));
    if (!report.bands.empty()) {
      out += Label(space, (panel.left_px + panel.right_px) / 2.0, kPlotTop_px - 8.0, panel.name, 13,
                   "middle", kTextColour, " font-weight=\"bold\"");
    }
  }
  const std::string axis_title = "SWR (log scale, clipped at 10)";
  space.Take(BoxOfUpwardText(22.0, (kPlotTop_px + kPlotBottom_px) / 2.0, axis_title, 12, "middle"));
  out += Text(
      22.0, (kPlotTop_px + kPlotBottom_px) / 2.0, axis_title, 12, "middle", kTextColour,
      fmt::format(" transform=\"rotate(-90 22 {})\"", Px((kPlotTop_px + kPlotBottom_px) / 2.0)));
  out += Label(space, (kPlotLeft_px + kPlotRight_px) / 2.0, kPlotBottom_px + 40.0,
               "frequency (MHz)", 12, "middle");
  // The 2:1 line across every panel.
  for (const Panel& panel : panels) {
    out += fmt::format(
        "<line class=\"limit\" x1=\"{}\" y1=\"{}\" x2=\"{}\" y2=\"{}\" stroke=\"{}\" "
        "stroke-width=\"1.4\" stroke-dasharray=\"{}\"/>\n",
        Px(panel.left_px), Px(SwrY(2.0)), Px(panel.right_px), Px(SwrY(2.0)), kLimitColour,
        kLimitDash);
  }
  out +=
      Label(space, panels.back().right_px - 4.0, SwrY(2.0) - 5.0, "2:1", 12, "end", kLimitColour);

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
        const std::string label = fmt::format("X = 0{} at {:.4f} MHz", where, f_hz / 1e6);
        // A resonance too close to a label already drawn keeps its line only.
        if (!space.TakeIfFree(BoxOfUpwardText(x + 4.0, label_y, label, 11, "end"))) continue;
        out += Text(
            x + 4.0, label_y, label, 11, "end", colour,
            fmt::format(" transform=\"rotate(-90 {} {})\"{}", Px(x + 4.0), Px(label_y), kHalo));
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
  bool clipped = false;
  for (const Panel& panel : panels) {
    std::vector<std::pair<double, double>> xy;
    for (const SweepPoint& p : report.sweep.points) {
      if (panel.Holds(p.frequency_hz)) xy.emplace_back(panel.X(p.frequency_hz), SwrY(p.swr));
    }
    if (xy.size() == 1) xy.push_back({xy[0].first + 1.0, xy[0].second});
    for (const SweepPoint& p : report.sweep.points) {
      if (panel.Holds(p.frequency_hz) && p.swr > kMaxSwr) clipped = true;
    }
    out += fmt::format(
        "<path class=\"predicted\" d=\"{}\" fill=\"none\" stroke=\"{}\" stroke-width=\"2.4\" "
        "stroke-linejoin=\"round\"/>\n",
        PolylinePath(xy), kTraceColour);
  }
  // The measured curve, dash-dotted.
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
          "<path class=\"measured\" d=\"{}\" fill=\"none\" stroke=\"{}\" "
          "stroke-width=\"2.2\" "
          "stroke-dasharray=\"{}\"/>\n",
          PolylinePath(xy), kMeasuredColour, kMeasuredDash);
    }
  }
  // The lowest SWR: a dot and its value, below the dot where there is room (the curve lies
  // above its lowest point everywhere else), else above it, on the side toward the panel's
  // middle.
  for (const Panel& panel : panels) {
    if (!panel.Holds(report.sweep.min_swr_frequency_hz)) continue;
    const double x = panel.X(report.sweep.min_swr_frequency_hz);
    const double y = SwrY(report.sweep.min_swr);
    out += fmt::format("<circle cx=\"{}\" cy=\"{}\" r=\"4\" fill=\"{}\"/>\n", Px(x), Px(y),
                       kTraceColour);
    const std::string text = fmt::format("SWR {:.2f} at {:.4f} MHz", report.sweep.min_swr,
                                         report.sweep.min_swr_frequency_hz / 1e6);
    // Beside the dot, toward the panel's middle first, or centred under (over) it and kept
    // inside the panel; inside the panel if it can be, else anywhere free.
    const bool right_half = x > (panel.left_px + panel.right_px) / 2.0;
    const double half_width = TextWidth(text, 12) / 2.0;
    const double centre =
        std::clamp(x, panel.left_px + half_width + 3.0,
                   std::max(panel.left_px + half_width + 3.0, panel.right_px - half_width - 3.0));
    const std::pair<double, const char*> sides[] = {
        {x + (right_half ? -8.0 : 8.0), right_half ? "end" : "start"},
        {x + (right_half ? 8.0 : -8.0), right_half ? "start" : "end"},
        {centre, "middle"}};
    std::string label;
    for (const bool within : {true, false}) {
      for (const double dy : {22.0, -12.0, 38.0, -28.0, -44.0}) {
        if (y + dy > kPlotBottom_px - 4.0 || y + dy < kPlotTop_px + 14.0) continue;
        for (const auto& [lx, anchor] : sides) {
          const TextBox box = BoxOfText(lx, y + dy, text, 12, anchor);
          if (within && (box.x0 < panel.left_px + 2.0 || box.x1 > panel.right_px - 2.0)) continue;
          label = Label(space, lx, y + dy, text, 12, anchor, kTraceColour, kHalo);
          if (!label.empty()) break;
        }
        if (!label.empty()) break;
      }
      if (!label.empty()) break;
    }
    out += label;
    break;
  }
  // Legend.
  const double ly = kPlotBottom_px + 62.0;
  double lx =
      LegendEntry(out, space, kPlotLeft_px, ly, kTraceColour, 2.4, "none", "predicted") + 24;
  if (report.measured) {
    lx = LegendEntry(out, space, lx, ly, kMeasuredColour, 2.2, kMeasuredDash, "measured") + 24;
  }
  out += fmt::format("<rect x=\"{}\" y=\"{}\" width=\"30\" height=\"10\" fill=\"{}\"/>\n", Px(lx),
                     Px(ly - 5), kBandFill);
  out += Label(space, lx + 36, ly + 4, "amateur band (ITU)", 12, "start");
  lx += 36 + TextWidth("amateur band (ITU)", 12) + 24;
  if (chain) {
    lx = LegendEntry(out, space, lx, ly, kResonanceColour, 1.2, kResonanceDash,
                     "X = 0 at the transmitter") +
         24;
    LegendEntry(out, space, lx, ly, kAntennaResonanceColour, 1.2, kAntennaResonanceDash,
                "X = 0 at the antenna terminals");
  } else {
    LegendEntry(out, space, lx, ly, kResonanceColour, 1.2, kResonanceDash, "resonance (X = 0)");
  }
  if (clipped) {
    out += Label(space, kPlotLeft_px, ly + 24.0, "An SWR above 10 is drawn on the top edge.", 12,
                 "start", kTraceColour);
  }
  out += "</g>\n";
  return out;
}

struct Smith {
  double X(Complex gamma) const { return kSmithX_px + kSmithR_px * gamma.real(); }
  double Y(Complex gamma) const { return kSmithY_px - kSmithR_px * gamma.imag(); }
};

Complex Gamma(Complex z_normalised) { return (z_normalised - 1.0) / (z_normalised + 1.0); }

std::string SmithChart(const SweepReport& report, LabelSpace& space) {
  const Smith s;
  const double z0_ohm = report.sweep.z0_ohm;
  const char* const kChartHalo = " stroke=\"#fbfbfb\" stroke-width=\"3\" paint-order=\"stroke\"";
  std::string out = "<g class=\"smith\">\n";
  out += Label(space, kSmithX_px, kPlotTop_px - 34.0,
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
        "<circle cx=\"{}\" cy=\"{}\" r=\"{}\" fill=\"none\" stroke=\"{}\" "
        "stroke-width=\"{}\"/>\n",
        Px(kSmithX_px + kSmithR_px * centre), Px(kSmithY_px), Px(kSmithR_px * radius),
        r == 1.0 ? "#9a9a9a" : kGridColour, r == 1.0 ? 1.2 : 0.8);
  }
  // Constant-reactance arcs, traced point by point over r = 0 .. infinity (r = tan t).
  for (double x : {0.2, 0.5, 1.0, 2.0, 5.0}) {
    for (double sign : {1.0, -1.0}) {
      std::vector<std::pair<double, double>> xy;
      constexpr int kSamples = 160;
      for (int i = 0; i < kSamples; ++i) {
        const double t = (core::kPi / 2.0) * i / kSamples;
        const Complex g = Gamma(Complex(std::tan(t), sign * x));
        xy.emplace_back(s.X(g), s.Y(g));
      }
      xy.emplace_back(s.X(Complex(1.0, 0.0)), s.Y(Complex(1.0, 0.0)));
      out += fmt::format("<path d=\"{}\" fill=\"none\" stroke=\"{}\" stroke-width=\"0.8\"/>\n",
                         PolylinePath(xy), kGridColour);
      const Complex edge = Gamma(Complex(0.0, sign * x)) * 1.07;
      const double c = edge.real();
      out +=
          Label(space, s.X(edge), s.Y(edge) + 4.0, fmt::format("{}j{:g}", sign > 0 ? "+" : "-", x),
                11, c > 0.3 ? "start" : (c < -0.3 ? "end" : "middle"), "#555555");
    }
  }
  // The real axis and its resistance labels.
  out += fmt::format(
      "<line x1=\"{}\" y1=\"{}\" x2=\"{}\" y2=\"{}\" stroke=\"{}\" stroke-width=\"0.8\"/>\n",
      Px(kSmithX_px - kSmithR_px), Px(kSmithY_px), Px(kSmithX_px + kSmithR_px), Px(kSmithY_px),
      "#9a9a9a");
  for (double r : {0.0, 0.2, 0.5, 1.0, 2.0, 5.0}) {
    const Complex g = Gamma(Complex(r, 0.0));
    out += Label(space, s.X(g) + 3.0, kSmithY_px - 4.0, fmt::format("{:g}", r), 11, "start",
                 "#555555", kChartHalo);
  }
  // The SWR 2 circle: |Gamma| = (2 - 1) / (2 + 1) = 1/3.
  out += fmt::format(
      "<circle class=\"limit\" cx=\"{}\" cy=\"{}\" r=\"{}\" fill=\"none\" stroke=\"{}\" "
      "stroke-width=\"1.4\" stroke-dasharray=\"{}\"/>\n",
      Px(kSmithX_px), Px(kSmithY_px), Px(kSmithR_px / 3.0), kLimitColour, kLimitDash);
  out += Label(space, kSmithX_px, kSmithY_px + kSmithR_px / 3.0 + 14.0, "SWR 2", 11, "middle",
               kLimitColour, kChartHalo);
  out += Label(space, kSmithX_px, kSmithY_px + kSmithR_px + 34.0,
               "open circle: first frequency; filled circle: last", 11, "middle", "#555555");
  out += Label(space, kSmithX_px, kSmithY_px + kSmithR_px + 50.0,
               "circles of constant resistance 0, 0.2, 0.5, 1, 2, 5; arcs of reactance +-j", 11,
               "middle", "#555555");
  // The traces, one per span in a colour of its own, with start and end frequencies.
  const std::vector<Panel> panels = Panels(report);
  std::vector<SmithLegendItem> legend;
  for (std::size_t index = 0; index < panels.size(); ++index) {
    const Panel& panel = panels[index];
    const char* colour = BandColour(index);
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
        "<path class=\"smith-trace\" d=\"{}\" fill=\"none\" stroke=\"{}\" stroke-width=\"2.2\" "
        "stroke-linejoin=\"round\"/>\n",
        PolylinePath(xy), colour);
    out += fmt::format(
        "<circle cx=\"{}\" cy=\"{}\" r=\"4\" fill=\"#ffffff\" stroke=\"{}\" "
        "stroke-width=\"2\"/>\n",
        Px(xy.front().first), Px(xy.front().second), colour);
    out += fmt::format("<circle cx=\"{}\" cy=\"{}\" r=\"4\" fill=\"{}\"/>\n", Px(xy.back().first),
                       Px(xy.back().second), colour);
    legend.push_back(
        {report.bands.empty() ? "predicted" : panel.name, colour, "none", "smith-legend"});
    // Start and end labels pushed outward from the chart's centre, away from the trace, or
    // turned about the point until they are clear of every label drawn.
    auto label = [&](std::pair<double, double> at, double f_hz) {
      const double out_angle = std::hypot(at.first - kSmithX_px, at.second - kSmithY_px) < 1.0
                                   ? 0.0
                                   : std::atan2(at.second - kSmithY_px, at.first - kSmithX_px);
      const std::string text = fmt::format("{:.4f} MHz", f_hz / 1e6);
      for (double distance : {12.0, 22.0, 34.0}) {
        for (double turn_deg :
             {0.0, 30.0, -30.0, 60.0, -60.0, 90.0, -90.0, 120.0, -120.0, 150.0, -150.0, 180.0}) {
          const double a = out_angle + turn_deg * core::kPi / 180.0;
          const double dx = std::cos(a);
          const double dy = std::sin(a);
          const char* anchor = dx > 0.3 ? "start" : (dx < -0.3 ? "end" : "middle");
          const std::string placed =
              Label(space, at.first + distance * dx, at.second + distance * dy + 4.0, text, 11,
                    anchor, colour, kChartHalo);
          if (!placed.empty()) return placed;
        }
      }
      return std::string();  // no room: the legend and the other end still say where it is
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
        "<path class=\"measured\" d=\"{}\" fill=\"none\" stroke=\"{}\" stroke-width=\"2\" "
        "stroke-dasharray=\"{}\"/>\n",
        PolylinePath(xy), kMeasuredColour, kMeasuredDash);
  }
  // The legend, above the chart: one entry per trace, then the measured one, in rows no
  // wider than the chart's column, each row centred.
  if (report.measured) legend.push_back({"measured", kMeasuredColour, kMeasuredDash, ""});
  constexpr double kLine_px = 22.0;
  constexpr double kGap_px = 16.0;
  const double column_px = 2.0 * (kWidth_px - kSmithX_px) - 20.0;
  auto item_width = [&](const SmithLegendItem& item) {
    return kLine_px + 6 + TextWidth(item.text, 12);
  };
  std::vector<std::vector<const SmithLegendItem*>> rows(1);
  double row_width = 0.0;
  for (const SmithLegendItem& item : legend) {
    const double wanted = (rows.back().empty() ? 0.0 : row_width + kGap_px) + item_width(item);
    if (!rows.back().empty() && wanted > column_px) {
      rows.emplace_back();
      row_width = item_width(item);
    } else {
      row_width = wanted;
    }
    rows.back().push_back(&item);
  }
  // Two rows fit between the heading and the chart's top label; the rows move up when there
  // are more.
  double ly = kPlotTop_px - 18.0 - 15.0 * std::max(0.0, double(rows.size()) - 2.0);
  for (const auto& row : rows) {
    double width = -kGap_px;
    for (const SmithLegendItem* item : row) width += item_width(*item) + kGap_px;
    double lx = kSmithX_px - width / 2.0;
    for (const SmithLegendItem* item : row) {
      lx = LegendEntry(out, space, lx, ly, item->colour, 2.2, item->dash, item->text,
                       item->css_class, kLine_px) +
           kGap_px;
    }
    ly += 15.0;
  }
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
      "viewBox=\"0 0 {0} {1}\" font-family=\"{2}\">\n",
      report::kWidth_px, report::kHeight_px, report::kFontFamily);
  out += fmt::format("<rect width=\"{}\" height=\"{}\" fill=\"#ffffff\"/>\n", report::kWidth_px,
                     report::kHeight_px);
  std::string model = report.model_file;
  const std::size_t slash = model.find_last_of('/');
  if (slash != std::string::npos) model = model.substr(slash + 1);
  report::LabelSpace space(report::kWidth_px, report::kHeight_px);
  // The title and the note shrink to the width of the picture when they are longer.
  const std::string title =
      fmt::format("wirefield sweep: {}  |  feed {}  |  z0 {:g} ohm  |  {}", model, report.feed_name,
                  report.sweep.z0_ohm, report::SweepTitle(report));
  const double usable_px = report::kWidth_px - 20.0;
  out += report::Label(space, report::kWidth_px / 2.0, 30.0, title,
                       report::FitSize(title, 17, usable_px, true), "middle", report::kTextColour,
                       " font-weight=\"bold\"");
  const std::string note =
      "Band edges: ITU Radio Regulations Article 5 (2020); national rules may be narrower. High "
      "RF voltage at wire ends: keep clear of people and power lines.";
  out += report::Label(space, report::kWidth_px / 2.0, 52.0, note,
                       report::FitSize(note, 12, usable_px), "middle", "#555555");
  out += report::SwrPlot(report, space);
  out += report::SmithChart(report, space);
  out += "</svg>\n";
  return out;
}

}  // namespace wirefield
