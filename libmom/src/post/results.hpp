// Post stage: what the solved basis currents say at the model's ports and along its wires:
// each feed's impedance, SWR and power (through its transformer and line, if any), each load's
// current, voltage and power, the current at both ends of every segment, and the skin-effect
// loss of the wires.
#pragma once

#include <Eigen/Core>
#include <vector>

#include "geometry/mesh.hpp"
#include "wirefield/simulation.hpp"

namespace wirefield::post {

// One result per feed of `model`, in its order, at frequency_hz. Throws ComputationError when
// a feed carries no current.
std::vector<FeedResult> FeedResults(const Model& model, const geometry::Mesh& mesh,
                                    const Eigen::VectorXcd& currents, double frequency_hz);

// One result per load of `model`, in its order, at frequency_hz.
std::vector<LoadResult> LoadResults(const Model& model, const geometry::Mesh& mesh,
                                    const Eigen::VectorXcd& currents, double frequency_hz);

// The current at both ends and the middle of each segment of `mesh`, in its order: each piece
// carries alpha + beta t times its basis current.
std::vector<SegmentCurrent> SegmentCurrents(const geometry::Mesh& mesh,
                                            const Eigen::VectorXcd& currents);

// The loss along the wires, watts: the skin effect of those with a conductivity and the
// dielectric loss of their jackets, 0.5 Re(Z') L int_0^1 |I(t)|^2 dt for the linear current of
// each segment, Z' the wire's series impedance per metre (conductor/coating.hpp), with
// `segment_currents` as SegmentCurrents gives them.
double WireLossW(const Model& model, const geometry::Mesh& mesh,
                 const std::vector<SegmentCurrent>& segment_currents, double frequency_hz);

}  // namespace wirefield::post
