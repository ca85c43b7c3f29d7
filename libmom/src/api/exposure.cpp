// API: the transmit mode given on the command line (wirefield/stress.hpp). The exposure
// estimate itself is post-processing of a pattern (post/exposure.cpp).
#include <fmt/format.h>

#include "wirefield/stress.hpp"

namespace wirefield {

TransmitMode ParseTransmitMode(const std::string& text, const std::string& option_name) {
  for (TransmitMode m : {TransmitMode::kSsb, TransmitMode::kCw, TransmitMode::kFm,
                         TransmitMode::kDigital, TransmitMode::kCarrier}) {
    if (text == ToString(m)) return m;
  }
  throw InputError(
      SourceLocation{option_name, 1, 1},
      fmt::format("{} must be one of ssb, cw, fm, digital, carrier; got '{}'", option_name, text));
}

}  // namespace wirefield
