// Post stage: port results, segment currents and wire loss of solved currents (results.hpp).
#include "post/results.hpp"

#include <fmt/format.h>

#include <cmath>

#include "conductor/coating.hpp"
#include "fill/assemble.hpp"
#include "network/chain.hpp"
#include "network/reflection.hpp"
#include "wirefield/network.hpp"

namespace wirefield::post {
namespace {

Complex PortCurrent(const geometry::Port& port, const Eigen::VectorXcd& currents) {
  Complex i = 0.0;
  for (const auto& [b, sign] : port.bases) i += sign * currents(b);
  return i;
}

}  // namespace

std::vector<FeedResult> FeedResults(const Model& model, const geometry::Mesh& mesh,
                                    const Eigen::VectorXcd& currents, double frequency_hz) {
  std::vector<FeedResult> feeds;
  const double z0 = model.z0_ohm.value_or(kDefaultZ0Ohm);
  for (size_t f = 0; f < model.feeds.size(); ++f) {
    FeedResult fr;
    fr.name = model.feeds[f].name;
    fr.voltage_v = model.feeds[f].voltage_v;
    fr.current_a = PortCurrent(mesh.feed_ports[f], currents);
    if (std::abs(fr.current_a) == 0.0) {
      throw ComputationError(fmt::format("feed '{}' carries no current", fr.name));
    }
    fr.impedance_ohm = fr.voltage_v / fr.current_a;
    fr.z0_ohm = z0;
    // What the transmitter sees through the feed's transformer and line (if any).
    const ChainResult chain =
        EvaluateFeedChain(model, static_cast<int>(f), fr.impedance_ohm, frequency_hz, z0);
    fr.transmitter_impedance_ohm = chain.transmitter_impedance_ohm;
    fr.swr = chain.swr;
    fr.return_loss_db = chain.return_loss_db;
    fr.transformer_loss_fraction = chain.transformer_loss_fraction;
    fr.line_loss_fraction = chain.line_loss_fraction;
    fr.power_w = 0.5 * std::real(fr.voltage_v * std::conj(fr.current_a));
    // At the antenna terminals, and the chain's power balance at the solved excitation.
    fr.antenna_swr =
        network::SwrFromMagnitude(std::abs(network::ReflectionCoefficient(fr.impedance_ohm, z0)));
    fr.has_transformer = network::FindTransformer(model, fr.name) != nullptr;
    fr.has_line = network::FindFeedLine(model, fr.name) != nullptr;
    fr.transmitter_power_w = chain.antenna_power_fraction != 0.0
                                 ? fr.power_w / chain.antenna_power_fraction
                                 : fr.power_w;
    fr.line_loss_w = fr.transmitter_power_w * chain.line_loss_fraction;
    fr.transformer_loss_w = fr.transmitter_power_w * chain.transformer_loss_fraction;
    feeds.push_back(fr);
  }
  return feeds;
}

std::vector<LoadResult> LoadResults(const Model& model, const geometry::Mesh& mesh,
                                    const Eigen::VectorXcd& currents, double frequency_hz) {
  std::vector<LoadResult> loads;
  for (size_t l = 0; l < model.loads.size(); ++l) {
    LoadResult lr;
    lr.name = model.loads[l].name;
    lr.impedance_ohm = fill::LoadImpedance(model.loads[l], frequency_hz, &lr.open);
    lr.current_a = PortCurrent(mesh.load_ports[l], currents);
    lr.voltage_v = lr.current_a * lr.impedance_ohm;
    lr.power_w = 0.5 * std::norm(lr.current_a) * std::real(lr.impedance_ohm);
    loads.push_back(lr);
  }
  return loads;
}

std::vector<SegmentCurrent> SegmentCurrents(const geometry::Mesh& mesh,
                                            const Eigen::VectorXcd& currents) {
  std::vector<Complex> at_start(mesh.segments.size(), 0.0), at_end(mesh.segments.size(), 0.0);
  for (size_t b = 0; b < mesh.bases.size(); ++b) {
    const geometry::Basis& basis = mesh.bases[b];
    for (int p = 0; p < basis.piece_count; ++p) {
      const geometry::Piece& piece = basis.pieces[p];
      at_start[piece.segment] += piece.alpha() * currents(b);
      at_end[piece.segment] += (piece.alpha() + piece.beta()) * currents(b);
    }
  }
  std::vector<SegmentCurrent> out;
  for (size_t s = 0; s < mesh.segments.size(); ++s) {
    const geometry::Segment& seg = mesh.segments[s];
    SegmentCurrent c;
    c.wire = seg.wire;
    c.start_m = {seg.start.x(), seg.start.y(), seg.start.z()};
    c.end_m = {seg.end.x(), seg.end.y(), seg.end.z()};
    c.current_start_a = at_start[s];
    c.current_end_a = at_end[s];
    c.current_a = 0.5 * (at_start[s] + at_end[s]);
    out.push_back(c);
  }
  return out;
}

double WireLossW(const Model& model, const geometry::Mesh& mesh,
                 const std::vector<SegmentCurrent>& segment_currents, double frequency_hz) {
  double loss_w = 0.0;
  for (size_t s = 0; s < mesh.segments.size(); ++s) {
    const geometry::Segment& seg = mesh.segments[s];
    const WireSpec& wire = model.wires[seg.wire];
    if (!conductor::HasSeriesImpedance(wire)) continue;
    const Complex at_start = segment_currents[s].current_start_a;
    const Complex at_end = segment_currents[s].current_end_a;
    const double r_per_m =
        std::real(conductor::SeriesImpedancePerMetre(wire, LossRadius(wire), frequency_hz));
    const double mean_square =
        (std::norm(at_start) + std::norm(at_end) + std::real(at_start * std::conj(at_end))) / 3.0;
    loss_w += 0.5 * r_per_m * seg.length_m() * mean_square;
  }
  return loss_w;
}

}  // namespace wirefield::post
