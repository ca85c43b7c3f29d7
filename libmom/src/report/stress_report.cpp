// Report stage: stress at a transmitter power, its highest values over a sweep, and the RF
// exposure estimate, as text sections and JSON objects (wirefield/stress.hpp). Every value
// is peak and RMS with units; the safety cautions are printed with the numbers.
#include <fmt/format.h>

#include <cmath>
#include <nlohmann/json.hpp>
#include <string>

#include "report/json_values.hpp"
#include "report/text_table.hpp"
#include "wirefield/report.hpp"
#include "wirefield/stress.hpp"

namespace wirefield {
namespace report {
namespace {

std::string Fixed(double value, int decimals) { return fmt::format("{:.{}f}", value, decimals); }

// Volts and amperes with a sensible number of decimals for their size.
std::string V(double v) { return Fixed(v, v >= 100.0 ? 0 : (v >= 1.0 ? 1 : 3)); }
std::string A(double a) { return Fixed(a, a >= 10.0 ? 2 : 3); }
std::string W(double w) { return Fixed(w, w >= 100.0 ? 1 : (w >= 1.0 ? 2 : 4)); }

nlohmann::json AmplitudeJson(const Amplitude& a, const std::string& unit) {
  return {{"peak_" + unit, a.peak}, {"rms_" + unit, a.rms}};
}

std::string CautionLines(const std::vector<std::string>& cautions) {
  std::string out;
  for (const std::string& c : cautions) {
    out += "  Caution: " + c + (!c.empty() && c.back() == '.' ? "\n" : ".\n");
  }
  return out;
}

// Where the free ends' caution starts (wirefield/stress.hpp, kHighVoltageRmsV).
std::string HighVoltageNote() {
  return fmt::format(
      "  A free end above {:.0f} V RMS ({:.1f} V peak) gets the high-voltage caution below.\n",
      kHighVoltageRmsV, kHighVoltageRmsV * std::sqrt(2.0));
}

constexpr const char* kDefer =
    "  These are estimates of the model. High RF voltage burns and arcs: keep people clear "
    "while\n  transmitting, and follow local rules and licensed practice.\n";

}  // namespace
}  // namespace report

std::string FormatStressText(const StressResult& stress) {
  using report::A;
  using report::Align;
  using report::TextTable;
  using report::V;
  std::string out;
  out += fmt::format(
      "\nStress at {} W from the transmitter ({:.6f} MHz; the solved values x {:.6g})\n",
      report::W(stress.power_w), stress.frequency_hz / 1e6, stress.scale);
  TextTable feeds;
  feeds.AddColumns({{"feed", Align::kLeft},
                    {"P tx (W)"},
                    {"P antenna (W)"},
                    {"V antenna peak (V)"},
                    {"V antenna RMS (V)"},
                    {"I antenna RMS (A)"},
                    {"V xfmr tx side peak (V)"},
                    {"V comp. C peak (V)"},
                    {"V at tx peak (V)"}});
  for (const FeedStress& f : stress.feeds) {
    feeds.AddRow({f.name, report::W(f.transmitter_power_w), report::W(f.antenna_power_w),
                  V(f.antenna_voltage_v.peak), V(f.antenna_voltage_v.rms),
                  A(f.antenna_current_a.rms),
                  f.has_transformer ? V(f.transformer_transmitter_voltage_v.peak) : "-",
                  f.compensation_voltage_v ? V(f.compensation_voltage_v->peak) : "-",
                  V(f.transmitter_voltage_v.peak)});
  }
  out += feeds.Render(2);
  if (!stress.loads.empty()) {
    TextTable loads;
    loads.AddColumns({{"load", Align::kLeft},
                      {"V peak (V)"},
                      {"V RMS (V)"},
                      {"I RMS (A)"},
                      {"P (W)"},
                      {"V capacitor peak (V)"},
                      {"rating (V peak)", Align::kLeft}});
    for (const LoadStress& l : stress.loads) {
      std::string rating;
      if (l.open) rating = "open: voltage not computed";
      if (l.capacitor_voltage_v) {
        rating = fmt::format("C {:.0f}{}", stress.capacitor_rating_v,
                             l.capacitor_over_rating ? " EXCEEDED" : " ok");
      }
      if (l.has_coil_or_other) {
        rating += fmt::format("{}load {:.0f}{}", rating.empty() ? "" : ", ", stress.load_rating_v,
                              l.over_rating ? " EXCEEDED" : " ok");
      }
      loads.AddRow({l.name, l.open ? "-" : V(l.voltage_v.peak), l.open ? "-" : V(l.voltage_v.rms),
                    A(l.current_a.rms), report::W(l.power_w),
                    l.capacitor_voltage_v ? V(l.capacitor_voltage_v->peak) : "-", rating});
    }
    out += "\n" + loads.Render(2);
  }
  if (!stress.free_ends.empty()) {
    TextTable ends;
    ends.AddColumns({{"free end", Align::kLeft}, {"V peak (V)"}, {"V RMS (V)"}});
    for (const FreeEndStress& e : stress.free_ends) {
      ends.AddRow({e.wire + "@" + e.end, V(e.voltage_v.peak), V(e.voltage_v.rms)});
    }
    out += "\n" + ends.Render(2);
    out +=
        "  Free-end voltage: the potential of the segment charges against far away, at the "
        "last\n  segment of the wire (docs/numerics.md §7c).\n";
    out += report::HighVoltageNote();
  }
  out += report::CautionLines(stress.cautions);
  out += report::kDefer;
  return out;
}

std::string FormatStressJson(const StressResult& stress) {
  nlohmann::json doc;
  doc["power_w"] = stress.power_w;
  doc["frequency_hz"] = stress.frequency_hz;
  doc["scale"] = stress.scale;
  doc["capacitor_rating_peak_v"] = stress.capacitor_rating_v;
  doc["load_rating_peak_v"] = stress.load_rating_v;
  doc["feeds"] = nlohmann::json::array();
  for (const FeedStress& f : stress.feeds) {
    nlohmann::json j;
    j["name"] = f.name;
    j["transmitter_power_w"] = f.transmitter_power_w;
    j["antenna_power_w"] = f.antenna_power_w;
    j["antenna_voltage"] = report::AmplitudeJson(f.antenna_voltage_v, "v");
    j["antenna_current"] = report::AmplitudeJson(f.antenna_current_a, "a");
    j["transformer"] =
        f.has_transformer
            ? nlohmann::json{{"transmitter_side_voltage",
                              report::AmplitudeJson(f.transformer_transmitter_voltage_v, "v")},
                             {"transmitter_side_current",
                              report::AmplitudeJson(f.transformer_transmitter_current_a, "a")},
                             {"antenna_side_voltage",
                              report::AmplitudeJson(f.antenna_voltage_v, "v")}}
            : nlohmann::json(nullptr);
    j["compensation_capacitor_voltage"] =
        f.compensation_voltage_v ? report::AmplitudeJson(*f.compensation_voltage_v, "v")
                                 : nlohmann::json(nullptr);
    j["compensation_over_rating"] = f.compensation_over_rating;
    j["transmitter_voltage"] = report::AmplitudeJson(f.transmitter_voltage_v, "v");
    j["transmitter_current"] = report::AmplitudeJson(f.transmitter_current_a, "a");
    doc["feeds"].push_back(j);
  }
  doc["loads"] = nlohmann::json::array();
  for (const LoadStress& l : stress.loads) {
    nlohmann::json j;
    j["name"] = l.name;
    j["open"] = l.open;
    j["voltage"] = l.open ? nlohmann::json(nullptr) : report::AmplitudeJson(l.voltage_v, "v");
    j["current"] = report::AmplitudeJson(l.current_a, "a");
    j["power_w"] = l.power_w;
    j["capacitor_voltage"] = l.capacitor_voltage_v
                                 ? report::AmplitudeJson(*l.capacitor_voltage_v, "v")
                                 : nlohmann::json(nullptr);
    j["capacitor_over_rating"] = l.capacitor_over_rating;
    j["over_rating"] = l.over_rating;
    doc["loads"].push_back(j);
  }
  doc["free_ends"] = nlohmann::json::array();
  for (const FreeEndStress& e : stress.free_ends) {
    doc["free_ends"].push_back({{"wire", e.wire},
                                {"end", e.end},
                                {"at_m", {e.at_m[0], e.at_m[1], e.at_m[2]}},
                                {"voltage", report::AmplitudeJson(e.voltage_v, "v")},
                                {"high_voltage", e.high_voltage}});
  }
  doc["cautions"] = stress.cautions;
  return doc.dump();
}

std::string FormatStressPeaksText(const std::vector<StressPeak>& peaks, double power_w) {
  using report::Align;
  using report::TextTable;
  std::string out = fmt::format("\nHighest stress over the sweep at {} W from the transmitter\n",
                                report::W(power_w));
  TextTable table;
  table.AddColumns({{"where", Align::kLeft},
                    {"V peak (V)"},
                    {"V RMS (V)"},
                    {"at (MHz)"},
                    {"rating (V peak)", Align::kLeft}});
  std::vector<std::string> cautions;
  for (const StressPeak& p : peaks) {
    table.AddRow({p.what, report::V(p.peak_v), report::V(p.rms_v),
                  fmt::format("{:.6f}", p.frequency_hz / 1e6),
                  p.rating_v > 0.0
                      ? fmt::format("{:.0f}{}", p.rating_v, p.over_rating ? " EXCEEDED" : " ok")
                      : "-"});
    if (p.over_rating) {
      cautions.push_back(
          fmt::format("{} reaches {:.0f} V peak at {:.6f} MHz, above its {:.0f} V "
                      "rating",
                      p.what, p.peak_v, p.frequency_hz / 1e6, p.rating_v));
    }
    if (p.what.rfind("free end", 0) == 0 && p.rms_v > kHighVoltageRmsV) {
      cautions.push_back(fmt::format(
          "{} reaches about {:.0f} V peak (high voltage): keep the wire end out of reach and "
          "insulated",
          p.what, p.peak_v));
    }
  }
  out += table.Render(2);
  out += report::CautionLines(cautions);
  out += report::kDefer;
  return out;
}

std::string FormatStressPeaksJson(const std::vector<StressPeak>& peaks, double power_w) {
  nlohmann::json doc;
  doc["power_w"] = power_w;
  doc["highest"] = nlohmann::json::array();
  for (const StressPeak& p : peaks) {
    doc["highest"].push_back(
        {{"what", p.what},
         {"peak_v", p.peak_v},
         {"rms_v", p.rms_v},
         {"frequency_hz", p.frequency_hz},
         {"rating_peak_v", p.rating_v > 0.0 ? nlohmann::json(p.rating_v) : nlohmann::json(nullptr)},
         {"over_rating", p.over_rating}});
  }
  return doc.dump();
}

std::string FormatExposureText(const ExposureResult& e) {
  std::string out;
  out += fmt::format(
      "\nRF exposure estimate at {} W ({}: duty {:.2f}, transmitting {:.0f}% of the time; "
      "average {} W)\n",
      report::W(e.power_w), e.mode, e.duty, e.transmit_fraction * 100.0,
      report::W(e.average_power_w));
  out += fmt::format("  gain used       {:.2f} dBi (the maximum; {:.3f} numeric)\n", e.gain_dbi,
                     e.gain_numeric);
  out +=
      "  formula         S = 2.56 P_avg G / (4 pi R^2) (FCC OET Bulletin 65, with the "
      "ground-reflection factor)\n";
  auto line = [&out](const std::string& name, const std::optional<double>& limit,
                     const std::optional<double>& distance) {
    if (limit && distance) {
      out += fmt::format("  {:<15} limit {:.4g} W/m^2 ({:.4g} mW/cm^2): keep at least {:.1f} m\n",
                         name, *limit, *limit / 10.0, *distance);
    } else {
      out += fmt::format("  {:<15} no limit in its table at this frequency\n", name);
    }
  };
  line("47 CFR 1.1310", e.fcc_limit_w_per_m2, e.fcc_distance_m);
  line("ICNIRP 2020", e.icnirp_limit_w_per_m2, e.icnirp_distance_m);
  out += "  (general public / uncontrolled, whole body, averaged over 30 min)\n";
  out += report::CautionLines(e.cautions);
  return out;
}

std::string FormatExposureJson(const ExposureResult& e) {
  nlohmann::json doc;
  doc["frequency_hz"] = e.frequency_hz;
  doc["power_w"] = e.power_w;
  doc["mode"] = e.mode;
  doc["duty"] = e.duty;
  doc["transmit_fraction"] = e.transmit_fraction;
  doc["average_power_w"] = e.average_power_w;
  doc["gain_dbi"] = e.gain_dbi;
  doc["gain_numeric"] = e.gain_numeric;
  doc["fcc_limit_w_per_m2"] = report::OptionalJson(e.fcc_limit_w_per_m2);
  doc["fcc_distance_m"] = report::OptionalJson(e.fcc_distance_m);
  doc["icnirp_limit_w_per_m2"] = report::OptionalJson(e.icnirp_limit_w_per_m2);
  doc["icnirp_distance_m"] = report::OptionalJson(e.icnirp_distance_m);
  doc["cautions"] = e.cautions;
  return doc.dump();
}

}  // namespace wirefield
