// Validation helpers: small models built in code (no parser involved), so that physics tests
// exercise the mesher, fill and solve directly. Lengths in metres, frequencies in hertz.
#pragma once

#include <string>

#include "wirefield/wirefield.hpp"

namespace wirefield::testing {

// Wavelength 1 m: frequencies below are c / 1 m, so lengths read as wavelengths.
inline constexpr double kUnitWavelengthHz = 299792458.0;

inline WireSpec Wire(const std::string& name, Point from, Point to, double radius_m, int segments) {
  WireSpec w;
  w.name = name;
  w.from_m = from;
  w.to_m = to;
  w.radius_m = radius_m;
  w.segments = segments;
  return w;
}

inline FeedSpec Feed(const std::string& name, const std::string& wire, PointKind kind, double value,
                     double voltage_v = 1.0) {
  FeedSpec f;
  f.name = name;
  f.at = {wire, kind, value, {}};
  f.voltage_v = voltage_v;
  return f;
}

// An ideal transformer of `primary_turns`:`secondary_turns` at feed `feed` (no core, no
// leakage: the tests add what they need).
inline TransformerSpec Transformer(const std::string& name, const std::string& feed,
                                   double primary_turns, double secondary_turns) {
  TransformerSpec t;
  t.name = name;
  t.feed = feed;
  t.primary_turns = primary_turns;
  t.secondary_turns = secondary_turns;
  return t;
}

// A feed line of length_m at feed `feed`, with the defaults of FeedLineSpec (50 ohm, velocity
// factor 0.66, lossless): the tests add what they need.
inline FeedLineSpec FeedLine(const std::string& name, const std::string& feed, double length_m) {
  FeedLineSpec l;
  l.name = name;
  l.feed = feed;
  l.length_m = length_m;
  return l;
}

// A centre-fed dipole along z, centred at `centre`, of total length length_m.
inline Model Dipole(double length_m, double radius_m, int segments,
                    Point centre = {0.0, 0.0, 0.0}) {
  Model m;
  m.file = "dipole";
  m.wires.push_back(Wire("dipole", {centre[0], centre[1], centre[2] - length_m / 2},
                         {centre[0], centre[1], centre[2] + length_m / 2}, radius_m, segments));
  m.feeds.push_back(Feed("gap", "dipole", PointKind::kPercent, 50.0));
  m.frequency_hz = kUnitWavelengthHz;
  return m;
}

// A horizontal centre-fed dipole along x at height height_m.
inline Model HorizontalDipole(double length_m, double radius_m, int segments, double height_m) {
  Model m;
  m.file = "horizontal";
  m.wires.push_back(Wire("dipole", {-length_m / 2, 0, height_m}, {length_m / 2, 0, height_m},
                         radius_m, segments));
  m.feeds.push_back(Feed("gap", "dipole", PointKind::kPercent, 50.0));
  m.frequency_hz = kUnitWavelengthHz;
  return m;
}

inline Complex SolveFeedImpedance(const Model& m, double frequency_hz = kUnitWavelengthHz) {
  SimulationOptions o;
  o.max_frequency_hz = frequency_hz;
  return Simulation(m, o).Solve(frequency_hz).feeds.at(0).impedance_ohm;
}

// A model meshed and solved at one frequency (default: wavelength 1 m), kept together so that
// far-field calls can use both.
struct Solved {
  Simulation sim;
  SolveResult result;
};

inline Solved SolveModel(const Model& m, double frequency_hz = kUnitWavelengthHz) {
  SimulationOptions o;
  o.max_frequency_hz = frequency_hz;
  Simulation sim(m, o);
  SolveResult r = sim.Solve(frequency_hz);
  return {std::move(sim), std::move(r)};
}

}  // namespace wirefield::testing
