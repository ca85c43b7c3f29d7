// The optimised fill against the plain one: the parallel fill (2 and 3 threads) equals the
// one-thread fill entry by entry to 1e-9 relative, and so do the feed impedances solved from
// them, on a dipole, bent wires, a model over real ground and a loaded model. The plain fill
// is the reference (the same sums in one order); the physics of both is checked against
// published values in tests/validation/.
#include <gtest/gtest.h>

#include <string>

#include "fill/assemble.hpp"
#include "geometry/mesh.hpp"
#include "validation/test_models.hpp"
#include "wirefield/wirefield.hpp"

namespace wirefield::fill {
namespace {

// The parallel fill sums the same terms grouped per thread: rounding (1e-16 per term) is far
// below this; a wrong block edge or a lost spill row is of the order of the entry itself.
constexpr double kRelative = 1e-9;

struct Case {
  std::string name;
  std::string text;
};

std::vector<Case> Cases() {
  return {
      {"dipole",
       "wire top from (-5.1, 0, 10) to (5.1, 0, 10) radius 1mm segments 41\n"
       "feed src at top@50%\nfrequency 14.2MHz\n"},
      {"bent wires",
       "wire up from (0, 0, 0.5) to (0, 0, 6) radius 1mm segments 17\n"
       "wire across from (0, 0, 6) to (4, 3, 7) radius 1mm segments 15\n"
       "wire back from (4, 3, 7) to (6, -1, 5) radius 1.5mm segments 13\n"
       "feed src at up@20%\nfrequency 14.2MHz\n"},
      {"real ground",
       "wire mast from (0, 0, 0) to (0, 0, 5.2) radius 5mm segments 21\n"
       "feed base at mast@start\n"
       "wire top from (-5.1, 3, 6) to (5.1, 3, 6) radius 1mm segments 31\n"
       "ground real permittivity=13 conductivity=0.005\nfrequency 14.2MHz\n"},
      {"loads",
       "wire top from (-5.1, 0, 10) to (5.1, 0, 10) radius 1mm segments 41\n"
       "feed src at top@50%\n"
       "load trap at top@20% parallel L=4uH C=30pF R=20kohm\n"
       "load tip at top@80% series R=5ohm L=1uH\n"
       "ground perfect\nfrequency 14.2MHz\n"},
  };
}

TEST(OptimisedFill, ParallelFillEqualsTheOneThreadFillEntryByEntry) {
  for (const Case& c : Cases()) {
    const Model model = ParseModelText(c.text, c.name + ".wire");
    geometry::MeshOptions o;
    o.max_frequency_hz = *model.frequency_hz;
    const geometry::Mesh mesh = geometry::BuildMesh(model, o);
    const NearFieldCache cache = BuildNearFieldCache(mesh);
    const Eigen::MatrixXcd plain = AssembleImpedance(mesh, *model.frequency_hz, cache, 1);
    for (const int threads : {2, 3}) {
      const Eigen::MatrixXcd z = AssembleImpedance(mesh, *model.frequency_hz, cache, threads);
      const double floor = 1e-15 * plain.cwiseAbs().maxCoeff();  // for entries near zero
      for (Eigen::Index col = 0; col < z.cols(); ++col) {
        for (Eigen::Index row = 0; row < z.rows(); ++row) {
          ASSERT_LE(std::abs(z(row, col) - plain(row, col)),
                    kRelative * std::abs(plain(row, col)) + floor)
              << c.name << ", " << threads << " threads, entry " << row << "," << col;
        }
      }
    }
  }
}

TEST(OptimisedFill, FeedImpedanceDoesNotDependOnTheFillThreads) {
  for (const Case& c : Cases()) {
    SimulationOptions one, two;
    one.fill_threads = 1;
    two.fill_threads = 2;
    const Model model = ParseModelText(c.text, c.name + ".wire");
    const Complex z1 = Simulation(model, one).Solve(*model.frequency_hz).feeds[0].impedance_ohm;
    const Complex z2 = Simulation(model, two).Solve(*model.frequency_hz).feeds[0].impedance_ohm;
    EXPECT_LE(std::abs(z2 - z1), kRelative * std::abs(z1)) << c.name;
  }
}

}  // namespace
}  // namespace wirefield::fill
