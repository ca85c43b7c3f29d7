// Network stage: the feed chain (see chain.hpp) and EvaluateFeedChain of the public API.
// Powers come from the voltages and currents at each interface of the cascade, so the line
// and transformer losses are exact for the circuit model, whatever the mismatch.
#include "network/chain.hpp"

#include <fmt/format.h>

#include <cmath>

#include "core/constants.hpp"
#include "network/line.hpp"
#include "network/reflection.hpp"

namespace wirefield::network {

std::optional<double> MagnetizingInductanceH(const TransformerSpec& t) {
  if (t.magnetizing_inductance_h) return *t.magnetizing_inductance_h;
  if (t.al_nh_per_turn2) return *t.al_nh_per_turn2 * 1e-9 * t.primary_turns * t.primary_turns;
  return std::nullopt;
}

Abcd TransformerAbcd(const TransformerSpec& t, double frequency_hz) {
  const double omega = 2.0 * core::kPi * frequency_hz;
  const Complex j{0.0, 1.0};
  Abcd m = Through();
  if (t.compensation_capacitance_f)
    m = m * ShuntAdmittance(j * omega * *t.compensation_capacitance_f);
  if (t.leakage_inductance_h > 0.0) m = m * SeriesImpedance(j * omega * t.leakage_inductance_h);
  Complex core_y{0.0, 0.0};
  const std::optional<double> l_m = MagnetizingInductanceH(t);
  if (l_m) core_y += 1.0 / (j * omega * *l_m);
  if (t.core_loss_resistance_ohm) {
    core_y += 1.0 / *t.core_loss_resistance_ohm;
  } else if (t.core_q && l_m) {
    core_y += 1.0 / (*t.core_q * omega * *l_m);  // R = Q w L
  }
  if (core_y != Complex{0.0, 0.0}) m = m * ShuntAdmittance(core_y);
  return m * IdealTransformer(t.secondary_turns / t.primary_turns);
}

const TransformerSpec* FindTransformer(const Model& model, const std::string& feed) {
  for (const TransformerSpec& t : model.transformers) {
    if (t.feed == feed) return &t;
  }
  return nullptr;
}

const FeedLineSpec* FindFeedLine(const Model& model, const std::string& feed) {
  for (const FeedLineSpec& l : model.feed_lines) {
    if (l.feed == feed) return &l;
  }
  return nullptr;
}

ChainResult EvaluateChain(const TransformerSpec* transformer, const FeedLineSpec* line,
                          Complex z_antenna_ohm, double frequency_hz, double z0_ohm) {
  if (!(frequency_hz > 0.0) || !(z0_ohm > 0.0) || !std::isfinite(z_antenna_ohm.real()) ||
      !std::isfinite(z_antenna_ohm.imag())) {
    throw ComputationError(
        fmt::format("feed chain: needs a positive frequency, a positive Z0 and a "
                    "finite antenna impedance; got {} Hz, {} ohm, {}{:+}j ohm",
                    frequency_hz, z0_ohm, z_antenna_ohm.real(), z_antenna_ohm.imag()));
  }
  const Abcd m_transformer = transformer ? TransformerAbcd(*transformer, frequency_hz) : Through();
  const Abcd m_line = line ? LineAbcd(*line, frequency_hz) : Through();

  // 1 A into the antenna; only ratios of powers are reported, so the scale does not matter.
  const PortState at_antenna{z_antenna_ohm, Complex{1.0, 0.0}};
  const PortState at_transformer = Apply(m_transformer, at_antenna);  // its transmitter side
  const PortState at_transmitter = Apply(m_line, at_transformer);

  ChainResult r;
  r.transmitter_impedance_ohm = InputImpedance(m_line * m_transformer, z_antenna_ohm);
  const double g = std::abs(ReflectionCoefficient(r.transmitter_impedance_ohm, z0_ohm));
  r.swr = SwrFromMagnitude(g);
  r.return_loss_db = ReturnLossDb(g);
  r.mismatch_loss_db = MismatchLossDb(g);

  const double p_in = Power(at_transmitter);
  const double p_transformer_in = Power(at_transformer);
  const double p_antenna = Power(at_antenna);
  if (p_in > 0.0) {
    r.line_loss_fraction = (p_in - p_transformer_in) / p_in;
    r.transformer_loss_fraction = (p_transformer_in - p_antenna) / p_in;
    r.antenna_power_fraction = p_antenna / p_in;
  } else {
    // No real power enters (a lossless chain into a purely reactive antenna): nothing is
    // lost, and the fractions keep their sum of 1 by this convention.
    r.line_loss_fraction = 0.0;
    r.transformer_loss_fraction = 0.0;
    r.antenna_power_fraction = 1.0;
  }
  for (const double v : {r.transmitter_impedance_ohm.real(), r.transmitter_impedance_ohm.imag(),
                         r.swr, r.return_loss_db, r.mismatch_loss_db, r.line_loss_fraction,
                         r.transformer_loss_fraction, r.antenna_power_fraction}) {
    if (!std::isfinite(v)) {
      // The antenna impedance is finite (checked above): the overflow is in the chain.
      throw ComputationError(fmt::format(
          "feed chain at {} Hz: the figures at the transmitter overflow double precision "
          "(for an antenna impedance of {}{:+}j ohm){}",
          frequency_hz, z_antenna_ohm.real(), z_antenna_ohm.imag(),
          line ? fmt::format("; feed line '{}' has a total loss too large to carry through "
                             "(thousands of dB): shorten it or lower its loss",
                             line->name)
               : ""));
    }
  }
  return r;
}

}  // namespace wirefield::network

namespace wirefield {

ChainResult EvaluateFeedChain(const Model& model, int feed_index, Complex z_antenna_ohm,
                              double frequency_hz, double z0_ohm) {
  if (feed_index < 0 || static_cast<size_t>(feed_index) >= model.feeds.size()) {
    throw ComputationError(
        fmt::format("EvaluateFeedChain: feed index {} is out of range (the "
                    "model has {} feeds)",
                    feed_index, model.feeds.size()));
  }
  const std::string& feed = model.feeds[static_cast<size_t>(feed_index)].name;
  return network::EvaluateChain(network::FindTransformer(model, feed),
                                network::FindFeedLine(model, feed), z_antenna_ohm, frequency_hz,
                                z0_ohm);
}

}  // namespace wirefield
