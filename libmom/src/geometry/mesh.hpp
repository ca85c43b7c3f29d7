// Geometry stage: parsed Model -> Mesh. Splits wires into straight segments with a node at
// every feed and load, joins coincident wire ends, connects ends on a ground plane, and builds
// the piecewise-linear (triangle) current basis functions and the ports where sources and
// loads sit. Raises InputError for inconsistent geometry and Warnings for dubious geometry.
#pragma once

#include <Eigen/Core>
#include <array>
#include <vector>

#include "wirefield/model.hpp"

namespace wirefield::geometry {

using Vec3 = Eigen::Vector3d;

struct Segment {
  Vec3 start;
  Vec3 end;
  double radius_m = 0.0;
  int wire = 0;
  double length_m() const { return (end - start).norm(); }
};

// One half of a basis function on one segment. Along the segment (start -> end, parameter
// t in [0, 1]) the piece carries the current alpha + beta t, with beta = sign and
// alpha = 0 when the basis node is the segment's end, alpha = -sign when it is its start.
// sign = +1: the current flows toward the basis node. Its divergence is sign / length.
struct Piece {
  int segment = 0;
  bool node_at_end = true;
  double sign = 1.0;
  double alpha() const { return node_at_end ? 0.0 : -sign; }
  double beta() const { return sign; }
  // The piece's current at the node, positive along the segment's direction.
  double DirectionAtNode() const { return node_at_end ? sign : -sign; }
};

// A triangle basis across a node (two pieces), or a half triangle at a wire end on the
// ground (one piece; its image completes the triangle).
struct Basis {
  std::array<Piece, 2> pieces{};
  int piece_count = 0;
};

// A gap in a wire at a node: the bases whose current passes through it, each with the sign
// of its current relative to the wire's direction there. Port current = sum(sign * I_b).
struct Port {
  std::vector<std::pair<int, double>> bases;
  int segment = 0;  // the segment on the named wire beside the gap
};

struct Mesh {
  std::vector<Segment> segments;
  std::vector<Basis> bases;
  std::vector<Port> feed_ports;  // one per Model::feeds, same order
  std::vector<Port> load_ports;  // one per Model::loads, same order
  std::vector<WireMeshInfo> wires;
  std::vector<Warning> warnings;
  bool ground_images = false;  // true over a perfect or real ground: add image contributions
  GroundSpec ground;           // the model's ground
};

struct MeshOptions {
  double max_frequency_hz = 0.0;
  double segments_per_wavelength = 80.0;
  int min_segments_per_wire = 3;
  double max_matrix_bytes = 4.0 * 1024 * 1024 * 1024;
};

// Builds the mesh. Throws InputError for geometry the solver cannot accept.
Mesh BuildMesh(const Model& model, const MeshOptions& options);

// Distance between two line segments p0-p1 and q0-q1, and the midpoint of the closest pair.
double SegmentDistance(const Vec3& p0, const Vec3& p1, const Vec3& q0, const Vec3& q1,
                       Vec3* closest_midpoint);

// Bytes a dense complex matrix of n unknowns needs.
double MatrixBytes(long long unknowns);

}  // namespace wirefield::geometry
