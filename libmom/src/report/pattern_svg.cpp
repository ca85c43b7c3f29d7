// Report stage: a computed radiation pattern as one self-contained SVG document (no scripts,
// no external fonts): the elevation cut (a half-disc, horizon at the sides, zenith up) and the
// azimuth cut (a full circle, 0 deg = +x to the right, counterclockwise toward +y) side by
// side on a dB scale; no label is drawn over another, and a long ground description wraps
// (the picture grows to hold it). Input: PatternResult and the model; output: SVG text.
#include <fmt/format.h>

#include <algorithm>
#include <cmath>
#include <string>
#include <vector>

#include "core/constants.hpp"
#include "report/pattern_format.hpp"
#include "report/svg_text.hpp"
#include "wirefield/pattern.hpp"
#include "wirefield/report.hpp"

namespace wirefield {
namespace report {
namespace {

// The plot: outer ring at the maximum rounded up to the next 5 dB, rings every 10 dB down to
// 40 dB below it; weaker gains clip to the centre (the range a polar gain plot needs to show
// nulls and side lobes without crowding the main lobe: common practice).
constexpr double kScaleStep_db = 5.0;
constexpr double kRingSpacing_db = 10.0;
constexpr double kRange_db = 40.0;

constexpr double kWidth_px = 1100.0;
constexpr double kHeight_px = 660.0;
constexpr double kRadius_px = 205.0;
constexpr double kLeftCentreX_px = 285.0;
constexpr double kRightCentreX_px = 815.0;
constexpr double kFullCentreY_px = 372.0;  // a full circle (azimuth cut)
constexpr double kHalfCentreY_px = 470.0;  // the horizon line of a half-disc (elevation cut)
constexpr double kCaptionY_px = 614.0;

const char* const kTotalColour = "#b3261e";
const char* const kVerticalColour = "#1d5fa6";
const char* const kHorizontalColour = "#2f7d3a";
const char* const kGridColour = "#b8b8b8";
const char* const kTextColour = "#222222";

struct Polar {
  double centre_x_px;
  double centre_y_px;
  double outer_dbi;
  bool half;                  // upper half-disc only
  bool signed_below = false;  // label angles past 270 deg as negative (free-space elevation)

  double RadiusOf(double gain_dbi) const {
    if (IsNoGain(gain_dbi)) return 0.0;
    const double fraction = (gain_dbi - (outer_dbi - kRange_db)) / kRange_db;
    return kRadius_px * std::clamp(fraction, 0.0, 1.0);
  }
  double X(double radius_px, double angle_deg) const {
    return centre_x_px + radius_px * std::cos(angle_deg * core::kPi / 180.0);
  }
  double Y(double radius_px, double angle_deg) const {
    return centre_y_px - radius_px * std::sin(angle_deg * core::kPi / 180.0);
  }
};

double OuterRing(const PatternResult& pattern) {
  double max_dbi = kNoGainDbi;
  auto take = [&](double g) {
    if (!IsNoGain(g)) max_dbi = std::max(max_dbi, g);
  };
  take(pattern.max_gain_dbi);
  for (const PatternCut* cut : {&pattern.elevation_cut, &pattern.azimuth_cut}) {
    for (double g : cut->gain_dbi) take(g);
  }
  if (IsNoGain(max_dbi)) return 0.0;
  return kScaleStep_db * std::ceil(max_dbi / kScaleStep_db - 1e-9);
}

std::string TracePath(const Polar& polar, const PatternCut& cut, const std::vector<double>& gains) {
  std::string d;
  for (std::size_t i = 0; i < cut.angle_deg.size(); ++i) {
    const double r = polar.RadiusOf(gains[i]);
    d += fmt::format("{}{},{} ", i == 0 ? "M" : "L", Px(polar.X(r, cut.angle_deg[i])),
                     Px(polar.Y(r, cut.angle_deg[i])));
  }
  return d;
}

std::string Grid(const Polar& polar, bool ground_below, LabelSpace& space) {
  std::string out = "<g class=\"grid\">\n";
  const double cx = polar.centre_x_px;
  const double cy = polar.centre_y_px;
  if (polar.half && ground_below) {
    out += fmt::format(
        "<rect x=\"{}\" y=\"{}\" width=\"{}\" height=\"14\" fill=\"#e9e2d6\"/>\n"
        "<text x=\"{}\" y=\"{}\" font-size=\"11\" fill=\"#7a6a52\" text-anchor=\"end\">ground"
        "</text>\n",
        Px(cx - kRadius_px - 10), Px(cy), Px(2 * kRadius_px + 20), Px(cx + kRadius_px + 10),
        Px(cy + 44));
    space.Take(BoxOfText(cx + kRadius_px + 10, cy + 44, "ground", 11, "end"));
  }
  // Rings, outer first, labelled in dBi.
  for (double below_db = 0.0; below_db < kRange_db - 1e-9; below_db += kRingSpacing_db) {
    const double r = kRadius_px * (kRange_db - below_db) / kRange_db;
    const bool outer = below_db == 0.0;
    const std::string style = fmt::format("fill=\"none\" stroke=\"{}\" stroke-width=\"{}\"",
                                          outer ? "#777777" : kGridColour, outer ? 1.4 : 0.8);
    if (polar.half) {
      out += fmt::format("<path d=\"M{},{} A{},{} 0 0 1 {},{}\" {}/>\n", Px(cx - r), Px(cy), Px(r),
                         Px(r), Px(cx + r), Px(cy), style);
    } else {
      out +=
          fmt::format("<circle cx=\"{}\" cy=\"{}\" r=\"{}\" {}/>\n", Px(cx), Px(cy), Px(r), style);
    }
    const std::string label = fmt::format("{:.0f} dBi", polar.outer_dbi - below_db + 0.0);
    if (polar.half) {
      // Under the horizon line, clear of every trace.
      out += fmt::format(
          "<text x=\"{}\" y=\"{}\" font-size=\"11\" fill=\"#555555\" "
          "text-anchor=\"middle\">{}</text>\n",
          Px(cx + r), Px(cy + 28), label);
      space.Take(BoxOfText(cx + r, cy + 28, label, 11, "middle"));
    } else {
      const double angle_deg = 285.0;  // lower right, away from the 0 deg label
      out += fmt::format(
          "<text x=\"{}\" y=\"{}\" font-size=\"11\" fill=\"#555555\" text-anchor=\"start\" "
          "stroke=\"#ffffff\" stroke-width=\"3\" paint-order=\"stroke\">{}</text>\n",
          Px(polar.X(r, angle_deg) + 3), Px(polar.Y(r, angle_deg) + 4), label);
      space.Take(
          BoxOfText(polar.X(r, angle_deg) + 3, polar.Y(r, angle_deg) + 4, label, 11, "start"));
    }
  }
  // Radial lines every 30 deg, labelled in degrees.
  const int last_deg = polar.half ? 180 : 330;
  for (int angle = 0; angle <= last_deg; angle += 30) {
    const double a = angle;
    out += fmt::format(
        "<line x1=\"{}\" y1=\"{}\" x2=\"{}\" y2=\"{}\" stroke=\"{}\" stroke-width=\"0.8\"/>\n",
        Px(cx), Px(cy), Px(polar.X(kRadius_px, a)), Px(polar.Y(kRadius_px, a)), kGridColour);
    const double label_r = kRadius_px + 17.0;
    const double c = std::cos(a * core::kPi / 180.0);
    const char* anchor = c > 0.3 ? "start" : (c < -0.3 ? "end" : "middle");
    double y = polar.Y(label_r, a) + 4.0;
    if (polar.half && (angle == 0 || angle == 180)) y = cy - 6.0;  // above the horizon line
    const double x =
        polar.X(label_r - (polar.half && (angle == 0 || angle == 180) ? 12.0 : 0.0), a);
    const std::string text =
        fmt::format("{}&#176;", polar.signed_below && angle > 270 ? angle - 360 : angle);
    out += fmt::format(
        "<text x=\"{}\" y=\"{}\" font-size=\"12\" fill=\"{}\" text-anchor=\"{}\">{}</text>\n",
        Px(x), Px(y), kTextColour, anchor, text);
    space.Take(BoxOfText(x, y, text, 12, anchor));
  }
  out += "</g>\n";
  return out;
}

std::string Traces(const Polar& polar, const PatternCut& cut, LabelSpace& space) {
  std::string out;
  out += fmt::format(
      "<path d=\"{}\" fill=\"none\" stroke=\"{}\" stroke-width=\"1.4\" "
      "stroke-dasharray=\"7 4\"/>\n",
      TracePath(polar, cut, cut.gain_vertical_dbi), kVerticalColour);
  out += fmt::format(
      "<path d=\"{}\" fill=\"none\" stroke=\"{}\" stroke-width=\"1.4\" "
      "stroke-dasharray=\"2 3\"/>\n",
      TracePath(polar, cut, cut.gain_horizontal_dbi), kHorizontalColour);
  out += fmt::format(
      "<path d=\"{}\" fill=\"none\" stroke=\"{}\" stroke-width=\"2.8\" "
      "stroke-linejoin=\"round\"/>\n",
      TracePath(polar, cut, cut.gain_dbi), kTotalColour);
  // The maximum of this cut: a dot and its value.
  std::size_t best = cut.gain_dbi.size();
  for (std::size_t i = 0; i < cut.gain_dbi.size(); ++i) {
    if (IsNoGain(cut.gain_dbi[i])) continue;
    if (best == cut.gain_dbi.size() || cut.gain_dbi[i] > cut.gain_dbi[best]) best = i;
  }
  if (best == cut.gain_dbi.size()) {
    out += fmt::format(
        "<text x=\"{}\" y=\"{}\" font-size=\"13\" fill=\"{}\" text-anchor=\"middle\">no "
        "radiation in this cut</text>\n",
        Px(polar.centre_x_px), Px(polar.centre_y_px - 30), kTextColour);
    return out;
  }
  const double angle = cut.angle_deg[best];
  const double r = polar.RadiusOf(cut.gain_dbi[best]);
  const double x = polar.X(r, angle);
  const double y = polar.Y(r, angle);
  out += fmt::format(
      "<circle class=\"max-marker\" cx=\"{}\" cy=\"{}\" r=\"5\" fill=\"#000000\" "
      "stroke=\"#ffffff\" stroke-width=\"1.5\"/>\n",
      Px(x), Px(y));
  // The value beside the dot: the first place around it, nearest first, that is clear of
  // every label drawn and inside the picture (above and to the right preferred).
  const std::string label =
      fmt::format("max {} dBi at {}&#176;", GainText(cut.gain_dbi[best]), AngleText(angle));
  struct Place {
    double dx;
    double dy;
    const char* anchor;
  };
  constexpr Place kPlaces[] = {{9, -9, "start"}, {-9, -9, "end"},    {9, 19, "start"},
                               {-9, 19, "end"},  {0, -14, "middle"}, {0, 26, "middle"}};
  for (double scale : {1.0, 2.0, 3.0, 4.5}) {
    for (const Place& place : kPlaces) {
      const double lx = x + place.dx * scale;
      const double ly = y + (place.dy < 0 ? place.dy * scale : place.dy + 13.0 * (scale - 1.0));
      const TextBox box = BoxOfText(lx, ly, label, 13, place.anchor, true);
      if (!space.TakeIfFree(box)) continue;
      out += fmt::format(
          "<text x=\"{}\" y=\"{}\" font-size=\"13\" font-weight=\"bold\" fill=\"#000000\" "
          "text-anchor=\"{}\" stroke=\"#ffffff\" stroke-width=\"4\" paint-order=\"stroke\">"
          "{}</text>\n",
          Px(lx), Px(ly), place.anchor, label);
      return out;
    }
  }
  return out;  // no room near the dot: the subtitle gives the maximum
}

std::string BeamwidthCaption(const PatternCut& cut) {
  if (!cut.beamwidth_deg) return "&#8722;3 dB beamwidth: not defined (the lobe does not close)";
  if (*cut.beamwidth_deg >= 360.0 - 1e-6) {
    return "&#8722;3 dB beamwidth: 360&#176; (within 3 dB all round)";
  }
  return fmt::format("&#8722;3 dB beamwidth: {}&#176;",
                     AngleText(std::round(*cut.beamwidth_deg * 10.0) / 10.0));
}

bool FitsHalfDisc(const PatternCut& cut) {
  return std::all_of(cut.angle_deg.begin(), cut.angle_deg.end(),
                     [](double a) { return a >= -1e-9 && a <= 180.0 + 1e-9; });
}

std::string Panel(const Polar& polar, const PatternCut& cut, bool ground_below,
                  const std::string& heading, const std::string& note, LabelSpace& space) {
  std::string out = "<g>\n";
  const double top_px = polar.half ? polar.centre_y_px - kRadius_px : kFullCentreY_px - kRadius_px;
  out += fmt::format(
      "<text x=\"{}\" y=\"{}\" font-size=\"15\" font-weight=\"bold\" fill=\"{}\" "
      "text-anchor=\"middle\">{}</text>\n",
      Px(polar.centre_x_px), Px(top_px - 36), kTextColour, heading);
  space.Take(BoxOfText(polar.centre_x_px, top_px - 36, heading, 15, "middle", true));
  space.Take(BoxOfText(polar.centre_x_px, kCaptionY_px, BeamwidthCaption(cut), 14, "middle", true));
  space.Take(BoxOfText(polar.centre_x_px, kCaptionY_px + 18, note, 11, "middle"));
  out += Grid(polar, ground_below, space);
  out += Traces(polar, cut, space);
  out += fmt::format(
      "<text x=\"{}\" y=\"{}\" font-size=\"14\" font-weight=\"bold\" fill=\"{}\" "
      "text-anchor=\"middle\">{}</text>\n",
      Px(polar.centre_x_px), Px(kCaptionY_px), kTextColour, BeamwidthCaption(cut));
  out += fmt::format(
      "<text x=\"{}\" y=\"{}\" font-size=\"11\" fill=\"#555555\" text-anchor=\"middle\">{}"
      "</text>\n",
      Px(polar.centre_x_px), Px(kCaptionY_px + 18), note);
  out += "</g>\n";
  return out;
}

}  // namespace
}  // namespace report

std::string FormatPatternSvg(const Simulation& simulation, const PatternResult& pattern) {
  using report::AngleText;
  using report::Px;
  report::CheckPattern(pattern);
  const Model& model = simulation.model();
  const double outer_dbi = report::OuterRing(pattern);
  const bool ground_below = model.ground.kind != GroundKind::kFree;
  const PatternCut& elevation = pattern.elevation_cut;
  const PatternCut& azimuth = pattern.azimuth_cut;
  const bool half = report::FitsHalfDisc(elevation);
  const report::Polar elevation_polar{report::kLeftCentreX_px,
                                      half ? report::kHalfCentreY_px : report::kFullCentreY_px,
                                      outer_dbi, half, !half};
  const report::Polar azimuth_polar{report::kRightCentreX_px, report::kFullCentreY_px, outer_dbi,
                                    false};
  const std::string title =
      fmt::format("{}: radiation pattern at {:.3f} MHz", report::ModelFileName(model.file),
                  pattern.frequency_hz / 1e6);

  // The header: the title (shrunk to the width when longer), the maximum, then the ground's
  // description wrapped to the width; the plots below move down by the lines it adds.
  const double usable_px = report::kWidth_px - 30.0;
  const std::string summary =
      fmt::format("maximum {} dBi at elevation {}&#176;, azimuth {}&#176;; grid step {}&#176;",
                  report::GainText(pattern.max_gain_dbi), AngleText(pattern.max_gain_elevation_deg),
                  AngleText(pattern.max_gain_azimuth_deg), AngleText(pattern.step_deg));
  const std::vector<std::string> ground_lines =
      report::WrapText("ground: " + report::GroundText(model.ground), 13, usable_px);
  constexpr double kLine_px = 16.0;
  const double shift_px = kLine_px * static_cast<double>(ground_lines.size());
  const double height_px = report::kHeight_px + shift_px;

  std::string out;
  // No XML declaration: an SVG file is UTF-8 by default and opens with <svg.
  out += fmt::format(
      "<svg xmlns=\"http://www.w3.org/2000/svg\" width=\"{0:.0f}\" height=\"{1:.0f}\" "
      "viewBox=\"0 0 {0:.0f} {1:.0f}\" font-family=\"{2}\">\n",
      report::kWidth_px, height_px, report::kFontFamily);
  out += fmt::format("<title>{}</title>\n", report::Escape(title));
  out += fmt::format("<rect width=\"{:.0f}\" height=\"{:.0f}\" fill=\"#ffffff\"/>\n",
                     report::kWidth_px, height_px);
  out += fmt::format(
      "<text x=\"{}\" y=\"30\" font-size=\"{:g}\" font-weight=\"bold\" fill=\"{}\" "
      "text-anchor=\"middle\">{}</text>\n",
      Px(report::kWidth_px / 2), report::FitSize(title, 19, usable_px, true), report::kTextColour,
      report::Escape(title));
  out += fmt::format(
      "<text x=\"{}\" y=\"52\" font-size=\"13\" fill=\"#444444\" text-anchor=\"middle\">{}"
      "</text>\n",
      Px(report::kWidth_px / 2), summary);
  double y = 52.0 + kLine_px;
  for (const std::string& line : ground_lines) {
    out += fmt::format(
        "<text x=\"{}\" y=\"{}\" font-size=\"13\" fill=\"#444444\" text-anchor=\"middle\">{}"
        "</text>\n",
        Px(report::kWidth_px / 2), Px(y), report::Escape(line));
    y += kLine_px;
  }

  // Legend, centred.
  const double legend_y = y + 10.0;
  struct Entry {
    const char* colour;
    double width;
    const char* dash;
    const char* label;
  };
  const Entry entries[] = {{report::kTotalColour, 2.8, "none", "total gain"},
                           {report::kVerticalColour, 1.4, "7 4", "vertical polarization"},
                           {report::kHorizontalColour, 1.4, "2 3", "horizontal polarization"}};
  constexpr double kGapAfter_px = 36.0;
  double legend_width = -kGapAfter_px;
  for (const Entry& entry : entries) {
    legend_width += 40.0 + report::TextWidth(entry.label, 13) + kGapAfter_px;
  }
  double x = (report::kWidth_px - legend_width) / 2.0;
  for (const Entry& entry : entries) {
    out += fmt::format(
        "<line x1=\"{}\" y1=\"{}\" x2=\"{}\" y2=\"{}\" stroke=\"{}\" stroke-width=\"{}\" "
        "stroke-dasharray=\"{}\"/>\n"
        "<text x=\"{}\" y=\"{}\" font-size=\"13\" fill=\"{}\">{}</text>\n",
        Px(x), Px(legend_y), Px(x + 34), Px(legend_y), entry.colour, entry.width, entry.dash,
        Px(x + 40), Px(legend_y + 4), report::kTextColour, entry.label);
    x += 40.0 + report::TextWidth(entry.label, 13) + kGapAfter_px;
  }

  // The two plots and the footnote, below the header.
  report::LabelSpace space(report::kWidth_px, report::kHeight_px);
  out += fmt::format("<g transform=\"translate(0 {})\">\n", Px(shift_px));
  out += report::Panel(
      elevation_polar, elevation, ground_below,
      fmt::format("Elevation cut through azimuth {}&#176;", AngleText(elevation.fixed_angle_deg)),
      fmt::format("0&#176; = horizon toward azimuth {}&#176;, 90&#176; = zenith, 180&#176; = "
                  "horizon behind{}",
                  AngleText(elevation.fixed_angle_deg), half ? "" : ", negative = below"),
      space);
  out += report::Panel(
      azimuth_polar, azimuth, ground_below,
      fmt::format("Azimuth cut at elevation {}&#176;", AngleText(azimuth.fixed_angle_deg)),
      "azimuth from +x (0&#176;, right) counterclockwise toward +y (90&#176;, up)", space);
  out += fmt::format(
      "<text x=\"{}\" y=\"{}\" font-size=\"11\" fill=\"#555555\" text-anchor=\"middle\">"
      "Gain in dBi, relative to the power at the feed terminals. Rings every {:.0f} dB; gains more "
      "than {:.0f} dB below the outer ring ({:.0f} dBi) are drawn at the centre.</text>\n",
      Px(report::kWidth_px / 2), Px(report::kHeight_px - 10), report::kRingSpacing_db,
      report::kRange_db, outer_dbi + 0.0);
  out += "</g>\n</svg>\n";
  return out;
}

}  // namespace wirefield
