// Post stage: stress at a transmitter power (wirefield/stress.hpp). SolveResult + Model +
// power -> the scale that makes the transmitter deliver that power into the feed chains
// (network/), then the voltages and currents at every load, at both sides of each transformer
// and across its compensation capacitor, and the potential of each free wire end from the
// segment charges (post/charge_potential). Method: docs/numerics.md §7c.
#include "wirefield/stress.hpp"

#include <fmt/format.h>

#include <algorithm>
#include <cmath>

#include "core/constants.hpp"
#include "network/chain.hpp"
#include "network/line.hpp"
#include "post/charge_potential.hpp"

namespace wirefield {
namespace {

using network::Abcd;
using network::PortState;

// Peak phasor amplitude -> peak and RMS (sinusoidal steady state: RMS = peak / sqrt 2).
Amplitude FromPeak(double peak) { return Amplitude{peak, peak / std::sqrt(2.0)}; }

// Wire ends closer than this share of the shortest wire are one point: the mesher's joining
// rule (geometry/mesh.cpp, kJoinRelativeTolerance).
constexpr double kJoinRelativeTolerance = 1e-6;

void CheckFinite(double value, const std::string& what) {
  if (!std::isfinite(value)) {
    throw ComputationError(fmt::format("stress: a non-finite {} ({})", what, value));
  }
}

double Distance(const Point& a, const Point& b) {
  const double dx = a[0] - b[0], dy = a[1] - b[1], dz = a[2] - b[2];
  return std::sqrt(dx * dx + dy * dy + dz * dz);
}

struct ChainAtFeed {
  Abcd transformer = network::Through();
  Abcd line = network::Through();
  const TransformerSpec* transformer_spec = nullptr;
  const FeedLineSpec* line_spec = nullptr;
};

ChainAtFeed ChainOf(const Model& model, const std::string& feed, double frequency_hz) {
  ChainAtFeed c;
  c.transformer_spec = network::FindTransformer(model, feed);
  c.line_spec = network::FindFeedLine(model, feed);
  if (c.transformer_spec)
    c.transformer = network::TransformerAbcd(*c.transformer_spec, frequency_hz);
  if (c.line_spec) c.line = network::LineAbcd(*c.line_spec, frequency_hz);
  return c;
}

// The wire ends joined to nothing: no other wire end there and not on a ground plane.
struct FreeEnd {
  int wire = 0;
  bool at_end = false;
  Point point{};
};

std::vector<FreeEnd> FreeEnds(const Model& model) {
  double shortest_m = 0.0;
  for (const WireSpec& w : model.wires) {
    const double length_m = WireLength(w);
    if (length_m > 0.0 && (shortest_m == 0.0 || length_m < shortest_m)) shortest_m = length_m;
  }
  const double tol_m = kJoinRelativeTolerance * shortest_m;
  std::vector<Point> ends;
  for (const WireSpec& w : model.wires) {
    ends.push_back(w.from_m);
    ends.push_back(w.to_m);
  }
  std::vector<FreeEnd> free;
  for (size_t w = 0; w < model.wires.size(); ++w) {
    for (int side = 0; side < 2; ++side) {
      const Point& p = ends[2 * w + static_cast<size_t>(side)];
      if (model.ground.kind != GroundKind::kFree && std::abs(p[2]) <= tol_m) continue;
      bool joined = false;
      for (size_t e = 0; e < ends.size() && !joined; ++e) {
        if (e != 2 * w + static_cast<size_t>(side) && Distance(ends[e], p) <= tol_m) joined = true;
      }
      if (!joined) free.push_back(FreeEnd{static_cast<int>(w), side == 1, p});
    }
  }
  return free;
}

std::string Volts(double v) {
  if (v >= 1000.0) return fmt::format("{:.2f} kV", v / 1000.0);
  return fmt::format("{:.0f} V", v);
}

// The caution for a part whose peak voltage exceeds the rating given for it: "SUBJECT<peak> peak
// WHERE, above the <rating> rating given for RATED_AND_ADVICE".
std::string OverRatingCaution(const std::string& subject, double peak_v, const char* where,
                              double rating_v, const char* rated_and_advice) {
  return fmt::format("{}{} peak{}, above the {} rating given for {}", subject, Volts(peak_v), where,
                     Volts(rating_v), rated_and_advice);
}

// What a capacitor above its rating needs.
constexpr const char* kCapacitorRatingAdvice =
    "capacitors (`capacitor_rating_v`); use a capacitor rated well above it";

}  // namespace

StressResult ComputeStress(const Model& model, const SolveResult& solved,
                           const StressOptions& options) {
  options.Validate();
  const double f_hz = solved.frequency_hz;
  const double omega = 2.0 * core::kPi * f_hz;
  StressResult r;
  r.frequency_hz = f_hz;
  r.power_w = options.power_w;
  r.capacitor_rating_v = options.capacitor_rating_v;
  r.load_rating_v = options.load_rating_v;

  // The transmitter's power for the solved excitation: each feed's state at its antenna
  // terminals carried back through its transformer and line.
  std::vector<ChainAtFeed> chains;
  std::vector<PortState> at_antenna, at_primary, at_transmitter;
  double solved_power_w = 0.0;
  for (const FeedResult& feed : solved.feeds) {
    chains.push_back(ChainOf(model, feed.name, f_hz));
    at_antenna.push_back(PortState{feed.voltage_v, feed.current_a});
    at_primary.push_back(network::Apply(chains.back().transformer, at_antenna.back()));
    at_transmitter.push_back(network::Apply(chains.back().line, at_primary.back()));
    solved_power_w += network::Power(at_transmitter.back());
  }
  if (!(solved_power_w > 0.0) || !std::isfinite(solved_power_w)) {
    throw ComputationError(
        fmt::format("stress: no real power enters the feeds at {:.6g} MHz (the solved "
                    "transmitter power is {} W), so no power can be scaled to",
                    f_hz / 1e6, solved_power_w));
  }
  r.scale = std::sqrt(options.power_w / solved_power_w);
  const double s = r.scale;

  for (size_t f = 0; f < solved.feeds.size(); ++f) {
    FeedStress fs;
    fs.name = solved.feeds[f].name;
    fs.transmitter_power_w = network::Power(at_transmitter[f]) * s * s;
    fs.antenna_power_w = network::Power(at_antenna[f]) * s * s;
    fs.antenna_voltage_v = FromPeak(std::abs(at_antenna[f].voltage_v) * s);
    fs.antenna_current_a = FromPeak(std::abs(at_antenna[f].current_a) * s);
    fs.has_transformer = chains[f].transformer_spec != nullptr;
    fs.transformer_transmitter_voltage_v = FromPeak(std::abs(at_primary[f].voltage_v) * s);
    fs.transformer_transmitter_current_a = FromPeak(std::abs(at_primary[f].current_a) * s);
    if (fs.has_transformer && chains[f].transformer_spec->compensation_capacitance_f) {
      // The compensation capacitor is a shunt across the transmitter side of the transformer.
      fs.compensation_voltage_v = fs.transformer_transmitter_voltage_v;
      fs.compensation_over_rating = fs.compensation_voltage_v->peak > r.capacitor_rating_v;
    }
    fs.has_line = chains[f].line_spec != nullptr;
    fs.transmitter_voltage_v = FromPeak(std::abs(at_transmitter[f].voltage_v) * s);
    fs.transmitter_current_a = FromPeak(std::abs(at_transmitter[f].current_a) * s);
    for (double v : {fs.transmitter_power_w, fs.antenna_power_w, fs.antenna_voltage_v.peak,
                     fs.transformer_transmitter_voltage_v.peak, fs.transmitter_voltage_v.peak}) {
      CheckFinite(v, "feed value at '" + fs.name + "'");
    }
    r.feeds.push_back(fs);
  }

  for (size_t l = 0; l < solved.loads.size(); ++l) {
    const LoadResult& load = solved.loads[l];
    const LoadSpec* spec = l < model.loads.size() ? &model.loads[l] : nullptr;
    LoadStress ls;
    ls.name = load.name;
    ls.open = load.open;
    ls.current_a = FromPeak(std::abs(load.current_a) * s);
    ls.voltage_v = FromPeak(load.open ? 0.0 : std::abs(load.voltage_v) * s);
    ls.power_w = load.power_w * s * s;
    if (spec != nullptr && !load.open) {
      ls.has_coil_or_other = spec->coil.has_value() || spec->choke.has_value() ||
                             spec->resistance_ohm.has_value() || spec->inductance_h.has_value();
      if (spec->capacitance_f && !spec->coil) {
        const bool series = spec->topology == LoadTopology::kSeries;
        ls.capacitor_voltage_v =
            series ? FromPeak(ls.current_a.peak / (omega * *spec->capacitance_f)) : ls.voltage_v;
        ls.capacitor_over_rating = ls.capacitor_voltage_v->peak > r.capacitor_rating_v;
      }
      ls.over_rating = ls.has_coil_or_other && ls.voltage_v.peak > r.load_rating_v;
    }
    CheckFinite(ls.voltage_v.peak, "voltage at load '" + ls.name + "'");
    CheckFinite(ls.current_a.peak, "current at load '" + ls.name + "'");
    CheckFinite(ls.power_w, "power at load '" + ls.name + "'");
    r.loads.push_back(ls);
  }

  // Free ends: the potential of all (scaled) segment charges at the last segment's centre.
  std::vector<post::ChargedSegment> charged;
  charged.reserve(solved.currents.size());
  for (const SegmentCurrent& c : solved.currents) {
    SegmentCurrent scaled = c;
    scaled.current_a *= s;
    scaled.current_start_a *= s;
    scaled.current_end_a *= s;
    const double radius_m = static_cast<size_t>(c.wire) < model.wires.size()
                                ? model.wires[static_cast<size_t>(c.wire)].radius_m
                                : 0.0;
    charged.push_back(post::ChargedSegment{scaled, radius_m});
  }
  for (const FreeEnd& end : FreeEnds(model)) {
    const SegmentCurrent* tip = nullptr;
    double nearest_m = 0.0;
    for (const SegmentCurrent& c : solved.currents) {
      if (c.wire != end.wire) continue;
      const double d = std::min(Distance(c.start_m, end.point), Distance(c.end_m, end.point));
      if (tip == nullptr || d < nearest_m) {
        tip = &c;
        nearest_m = d;
      }
    }
    if (tip == nullptr) continue;
    const Point centre{0.5 * (tip->start_m[0] + tip->end_m[0]),
                       0.5 * (tip->start_m[1] + tip->end_m[1]),
                       0.5 * (tip->start_m[2] + tip->end_m[2])};
    FreeEndStress fe;
    fe.wire = model.wires[static_cast<size_t>(end.wire)].name;
    fe.end = end.at_end ? "end" : "start";
    fe.at_m = end.point;
    fe.voltage_v = FromPeak(std::abs(post::ScalarPotential(charged, f_hz, model.ground, centre)));
    CheckFinite(fe.voltage_v.peak, "voltage at the free end " + fe.wire + "@" + fe.end);
    fe.high_voltage = fe.voltage_v.rms > kHighVoltageRmsV;
    r.free_ends.push_back(fe);
  }

  // Cautions: every rating exceeded, then the free ends above kHighVoltageRmsV.
  for (const FeedStress& fs : r.feeds) {
    if (fs.compensation_over_rating) {
      r.cautions.push_back(OverRatingCaution(
          "feed " + fs.name + ": the compensation capacitor carries ",
          fs.compensation_voltage_v->peak, "", r.capacitor_rating_v, kCapacitorRatingAdvice));
    }
  }
  for (const LoadStress& ls : r.loads) {
    if (ls.capacitor_over_rating) {
      r.cautions.push_back(OverRatingCaution("load " + ls.name + ": its capacitor carries ",
                                             ls.capacitor_voltage_v->peak, "", r.capacitor_rating_v,
                                             kCapacitorRatingAdvice));
    }
    if (ls.over_rating) {
      r.cautions.push_back(OverRatingCaution(
          "load " + ls.name + ": ", ls.voltage_v.peak, " across it", r.load_rating_v,
          "coils and other loads (`load_rating_v`); space its turns and leads and insulate it "
          "for this voltage"));
    }
  }
  for (const FreeEndStress& fe : r.free_ends) {
    if (!fe.high_voltage) continue;
    r.cautions.push_back(fmt::format(
        "free end {}@{}: about {} peak (high voltage): keep the wire end out of reach of people "
        "and animals, insulate it for this voltage and keep it clear of anything it could arc "
        "to",
        fe.wire, fe.end, Volts(fe.voltage_v.peak)));
  }
  return r;
}

std::vector<StressPeak> HighestStress(const std::vector<StressResult>& results) {
  std::vector<StressPeak> peaks;
  auto offer = [&peaks](const std::string& what, const Amplitude& v, double f_hz, double rating) {
    for (StressPeak& p : peaks) {
      if (p.what != what) continue;
      if (v.peak > p.peak_v) {
        p.peak_v = v.peak;
        p.rms_v = v.rms;
        p.frequency_hz = f_hz;
        p.over_rating = rating > 0.0 && v.peak > rating;
      }
      return;
    }
    peaks.push_back(StressPeak{what, v.peak, v.rms, f_hz, rating, rating > 0.0 && v.peak > rating});
  };
  for (const StressResult& r : results) {
    for (const FeedStress& fs : r.feeds) {
      offer("feed " + fs.name + " antenna terminals", fs.antenna_voltage_v, r.frequency_hz, 0.0);
      if (fs.has_transformer) {
        offer("feed " + fs.name + " transformer transmitter side",
              fs.transformer_transmitter_voltage_v, r.frequency_hz, 0.0);
      }
      if (fs.compensation_voltage_v) {
        offer("feed " + fs.name + " compensation capacitor", *fs.compensation_voltage_v,
              r.frequency_hz, r.capacitor_rating_v);
      }
    }
    for (const LoadStress& ls : r.loads) {
      if (ls.open) continue;
      offer("load " + ls.name, ls.voltage_v, r.frequency_hz,
            ls.has_coil_or_other ? r.load_rating_v : 0.0);
      if (ls.capacitor_voltage_v) {
        offer("load " + ls.name + " capacitor", *ls.capacitor_voltage_v, r.frequency_hz,
              r.capacitor_rating_v);
      }
    }
    for (const FreeEndStress& fe : r.free_ends) {
      offer("free end " + fe.wire + "@" + fe.end, fe.voltage_v, r.frequency_hz, 0.0);
    }
  }
  return peaks;
}

}  // namespace wirefield
