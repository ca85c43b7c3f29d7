// Fuzz target: model text -> parser -> mesher. libFuzzer feeds arbitrary bytes; each input
// must end in a Model and a Mesh, or in an InputError or ComputationError, never in another
// exception, a crash, a sanitizer report or a hang. Inputs: bytes; outputs: none (the checks
// are the sanitizers and the exception filter). Built with WIREFIELD_FUZZ=ON (see README.md).
#include <cstddef>
#include <cstdint>
#include <cstdlib>
#include <string>

#include "geometry/mesh.hpp"
#include "wirefield/model.hpp"

namespace {

// Largest input tried: a real model is a few kB; longer inputs only slow the search.
constexpr size_t kMaxInputBytes = 64 * 1024;
// The mesher is run at the model's frequency when it has one, else at 14.2 MHz (a mid-HF
// frequency; any would do, the mesher only needs a wavelength).
constexpr double kDefaultFrequency_hz = 14.2e6;
// Meshes beyond this many unknowns are refused before allocation, so the fuzzer does not spend
// its time building large meshes (the CLI's own limit is the mesher's, far above this).
constexpr double kFuzzMatrixBytes = 64.0 * 1024 * 1024;

}  // namespace

extern "C" int LLVMFuzzerTestOneInput(const uint8_t* data, size_t size) {
  if (size > kMaxInputBytes) return 0;
  const std::string text(reinterpret_cast<const char*>(data), size);
  try {
    const wirefield::Model model = wirefield::ParseModelText(text, "fuzz.wire");
    wirefield::geometry::MeshOptions options;
    options.max_frequency_hz = model.frequency_hz.value_or(kDefaultFrequency_hz);
    options.max_matrix_bytes = kFuzzMatrixBytes;
    const wirefield::geometry::Mesh mesh = wirefield::geometry::BuildMesh(model, options);
    (void)mesh;
  } catch (const wirefield::InputError&) {
  } catch (const wirefield::ComputationError&) {
  }
  // Any other exception escapes and libFuzzer reports it as a crash.
  return 0;
}
