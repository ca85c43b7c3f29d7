// Unit tests of the fill stage: the fast segment-pair integrals against brute-force
// quadrature and against the closed-form static self term, and the Z matrix's symmetry. The
// fill's fast path (FarMoments: precomputed Gauss points, rule chosen from centre distances,
// series phase) gives the plain path's moments to rounding where the quadrature is the same,
// and every far pair, the 2x2 rule of very distant pairs included, stays within 1e-6 relative
// of a high-order reference quadrature.
#include "fill/kernel.hpp"

#include <fmt/format.h>
#include <gtest/gtest.h>

#include <algorithm>
#include <cmath>
#include <vector>

#include "fill/assemble.hpp"
#include "validation/test_models.hpp"

namespace wirefield::fill {
namespace {

double RelativeError(const PairMoments& a, const PairMoments& b) {
  return std::max(
      {std::abs(a.m00 - b.m00) / std::abs(b.m00), std::abs(a.m10 - b.m10) / std::abs(b.m10),
       std::abs(a.m01 - b.m01) / std::abs(b.m01), std::abs(a.m11 - b.m11) / std::abs(b.m11)});
}

TEST(SegmentPairMoments, SelfTermMatchesClosedFormStaticIntegral) {
  // For k = 0: int_0^L int_0^L dz dz' / sqrt((z - z')^2 + a^2)
  //   = 2 [L asinh(L / a) - sqrt(L^2 + a^2) + a]   (elementary calculus).
  const double length = 0.01, radius = 1e-4;
  const PairMoments m = SegmentPairMoments({0, 0, 0}, {0, 0, length}, {0, 0, 0}, {0, 0, length},
                                           radius * radius, 0.0);
  const double exact = 2.0 *
                       (length * std::asinh(length / radius) -
                        std::sqrt(length * length + radius * radius) + radius) /
                       (length * length);
  EXPECT_NEAR(m.m00.real(), exact, 1e-8 * exact);
}

TEST(SegmentPairMoments, NearAndFarPairsMatchBruteForceQuadrature) {
  // Brute force: 20-point Gauss on 60 sub-intervals of each segment (each about 2 radii long).
  // Tolerance 1e-5: well below the discretisation error of the method itself.
  const double l = 0.0125, a = 1e-4, k = 2.0 * M_PI;
  const Vec3 o(0, 0, 0), z1(0, 0, l);
  const std::vector<std::pair<Vec3, Vec3>> sources = {
      {o, z1},                                     // self
      {z1, Vec3(0, 0, 2 * l)},                     // collinear neighbour
      {z1, Vec3(l, 0, l)},                         // neighbour at a right-angle bend
      {Vec3(0, 0, 2 * l), Vec3(0, 0, 3 * l)},      // next but one
      {Vec3(0.3 * l, 0, 0), Vec3(0.3 * l, 0, l)},  // parallel, close
      {Vec3(0, 0, 6 * l), Vec3(0, 0, 7 * l)},      // far
  };
  for (const auto& [b0, b1] : sources) {
    const PairMoments fast = SegmentPairMoments(o, z1, b0, b1, a * a, k);
    const PairMoments slow = SegmentPairMomentsReference(o, z1, b0, b1, a * a, k, 60);
    EXPECT_LT(RelativeError(fast, slow), 1e-5) << b0.transpose() << " " << b1.transpose();
  }
}

TEST(ImpedanceMatrix, IsSymmetricForGalerkinTestingOverGround) {
  // Galerkin testing with a reciprocal kernel gives Z = Z^T (free space and image ground).
  Model m;
  m.file = "t";
  m.wires.push_back(testing::Wire("a", {0, 0, 0}, {0, 0, 0.3}, 1e-3, 6));
  m.wires.push_back(testing::Wire("b", {0, 0, 0.3}, {0.4, 0.1, 0.5}, 1e-3, 7));
  m.feeds.push_back(testing::Feed("f", "a", PointKind::kStart, 0.0));
  m.ground.kind = GroundKind::kPerfect;
  geometry::MeshOptions o;
  o.max_frequency_hz = testing::kUnitWavelengthHz;
  const geometry::Mesh mesh = geometry::BuildMesh(m, o);
  const Eigen::MatrixXcd z = AssembleImpedance(mesh, testing::kUnitWavelengthHz);
  EXPECT_LT((z - z.transpose()).norm(), 1e-12 * z.norm());
  // Passive: the radiation part (Hermitian part) is positive semi-definite.
  const Eigen::MatrixXcd h = 0.5 * (z + z.adjoint());
  EXPECT_GT(Eigen::SelfAdjointEigenSolver<Eigen::MatrixXcd>(h).eigenvalues().minCoeff(),
            -1e-9 * z.norm());
}

struct Pair {
  Vec3 a0, a1, b0, b1;
};

// Source segments of length 1 at a gap of about `gap` from the observation segment (0,0,0)-
// (0,0,1): side by side, collinear, skew, and oblique both ways.
std::vector<Pair> PairsAt(double gap) {
  const Vec3 a0(0, 0, 0), a1(0, 0, 1);
  return {
      {a0, a1, Vec3(gap, 0, 0), Vec3(gap, 0, 1)},
      {a0, a1, Vec3(0, 0, 1 + gap), Vec3(0, 0, 2 + gap)},
      {a0, a1, Vec3(gap, 0, gap), Vec3(gap + 0.6, 0.8, gap)},
      {a0, a1, Vec3(0.7 * gap, 0.7 * gap, 0.3 * gap),
       Vec3(0.7 * gap, 0.7 * gap + 0.5, 0.3 * gap + 0.866)},
      {a0, a1, Vec3(-0.5 * gap, 0.2 * gap, 0.9 * gap),
       Vec3(-0.5 * gap + 0.3, 0.2 * gap - 0.4, 0.9 * gap + 0.866)},
  };
}

// Segment lengths of k L = 0.01 .. 0.6: from 600 down to 10 segments per wavelength (the
// coarsest a thin-wire model uses (common practice)); 0.6 takes the fallback without series.
const std::vector<double> kPhases{0.01, 0.03, 0.04, 0.1, 0.3, 0.6};

TEST(FarMoments, EqualThePlainQuadratureToRoundingWhereTheRuleIsTheSame) {
  // Only the phase (series about the centres instead of one sine and cosine per point) and
  // the order of a few sums differ: rounding, some 1e-15; 1e-12 leaves room and still
  // catches a wrong rule (1e-9 and more) or a wrong series coefficient.
  constexpr double kRounding = 1e-12;
  const double radius2 = 1e-4;
  int compared = 0;
  for (double gap : {1.05, 2.0, 3.9, 4.1, 6.0, 9.5, 10.5, 15.0, 25.0}) {
    for (double phase : kPhases) {
      for (const Pair& p : PairsAt(gap)) {
        if (IsNearPair(p.a0, p.a1, p.b0, p.b1)) continue;
        // Pairs that take the 2x2 rule (kernel.hpp) are checked against the reference below.
        const double centres = (0.5 * (p.a0 + p.a1 - p.b0 - p.b1)).norm();
        if (centres - 1.0 > kFarthestFactor && phase <= kFarthestPhase) continue;
        const PairMoments fast =
            FarMoments(MakeSegmentNodes(p.a0, p.a1), MakeSegmentNodes(p.b0, p.b1), radius2, phase);
        const PairMoments plain = FrequencyMoments(p.a0, p.a1, p.b0, p.b1, radius2, phase, false);
        EXPECT_LT(RelativeError(fast, plain), kRounding) << "gap " << gap << ", kL " << phase;
        ++compared;
      }
    }
  }
  EXPECT_GT(compared, 200);
}

TEST(FarMoments, FarPairsStayWithinOneMillionthOfTheHighOrderReference) {
  // The fill's accuracy bound for far pairs: 1e-6 relative to a reference of 4 x 20 Gauss
  // points per segment (converged to rounding at these distances), over gaps from one to 300
  // segment lengths, so across the 6-, 4-, 3- and 2-point rules and their switch points.
  constexpr double kFarPairBound = 1e-6;
  const double radius2 = 1e-4;
  double worst = 0.0;
  for (double gap : {1.05, 2.0, 4.1, 9.9, 10.1, 15.0, 29.0, 30.5, 31.5, 50.0, 100.0, 300.0}) {
    for (double phase : kPhases) {
      for (const Pair& p : PairsAt(gap)) {
        if (IsNearPair(p.a0, p.a1, p.b0, p.b1)) continue;
        const PairMoments fast =
            FarMoments(MakeSegmentNodes(p.a0, p.a1), MakeSegmentNodes(p.b0, p.b1), radius2, phase);
        const PairMoments reference =
            SegmentPairMomentsReference(p.a0, p.a1, p.b0, p.b1, radius2, phase, 4);
        const double error = RelativeError(fast, reference);
        worst = std::max(worst, error);
        EXPECT_LT(error, kFarPairBound) << "gap " << gap << ", kL " << phase;
      }
    }
  }
  RecordProperty("worst_relative_error", fmt::format("{:.2e}", worst));
}

}  // namespace
}  // namespace wirefield::fill
