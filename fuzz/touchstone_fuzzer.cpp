// Fuzz target: Touchstone text -> reader. libFuzzer feeds arbitrary bytes; each input must end
// in TouchstoneData whose numbers are all finite, or in an InputError, never in another
// exception, a crash, a sanitizer report or a hang. Inputs: bytes; outputs: none.
// Built with WIREFIELD_FUZZ=ON (see README.md).
#include <cmath>
#include <cstddef>
#include <cstdint>
#include <cstdlib>
#include <string>

#include "wirefield/touchstone.hpp"

namespace {
// Largest input tried: a measured sweep of a few thousand points is under 200 kB.
constexpr size_t kMaxInputBytes = 256 * 1024;
}  // namespace

extern "C" int LLVMFuzzerTestOneInput(const uint8_t* data, size_t size) {
  if (size > kMaxInputBytes) return 0;
  const std::string text(reinterpret_cast<const char*>(data), size);
  try {
    const wirefield::TouchstoneData parsed = wirefield::ParseTouchstone(text, "fuzz.s1p");
    // The reader promises finite numbers and increasing frequencies: a broken promise is a
    // finding, so abort for libFuzzer to report it.
    if (!std::isfinite(parsed.reference_ohm)) std::abort();
    double previous_hz = -1.0;
    for (const wirefield::TouchstonePoint& p : parsed.points) {
      if (!std::isfinite(p.frequency_hz) || !std::isfinite(p.s11.real()) ||
          !std::isfinite(p.s11.imag()) || !(p.frequency_hz > previous_hz)) {
        std::abort();
      }
      previous_hz = p.frequency_hz;
    }
  } catch (const wirefield::InputError&) {
  }
  return 0;
}
