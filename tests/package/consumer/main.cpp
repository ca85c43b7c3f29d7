// A program outside wirefield, built against the installed package: parses a centre-fed
// half-wave dipole (wavelength 1 m, radius 1e-6 wavelength) from model text through the
// public API, solves it and prints the feed impedance as "R X" in ohm.
#include <cstdio>
#include <exception>
#include <string>

#include "wirefield/model.hpp"
#include "wirefield/simulation.hpp"
#include "wirefield/version.hpp"

int main() {
  const std::string text =
      "units m\n"
      "wire dipole from (0, 0, -0.25) to (0, 0, 0.25) radius 1e-6 segments 81\n"
      "feed gap at dipole@50%\n"
      "ground free\n"
      "frequency 299.792458MHz\n";
  try {
    const wirefield::Simulation simulation(wirefield::ParseModelText(text, "dipole.wire"));
    const wirefield::SolveResult result = simulation.Solve(simulation.DefaultFrequency());
    const wirefield::Complex z = result.feeds.at(0).impedance_ohm;
    std::printf("wirefield %s (headers %s)\n", wirefield::Version().c_str(),
                wirefield::HeaderVersion());
    std::printf("feed impedance: %.3f %.3f\n", z.real(), z.imag());
  } catch (const std::exception& error) {
    std::fprintf(stderr, "%s\n", error.what());
    return 1;
  }
  return 0;
}
