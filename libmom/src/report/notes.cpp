// Report stage: the warnings section and the transmitting caution shared by the text reports
// (see notes.hpp).
#include "report/notes.hpp"

namespace wirefield::report {

std::string WarningsSection(const std::vector<Warning>& warnings) {
  if (warnings.empty()) return "";
  std::string out = "\nWarnings\n";
  for (const Warning& warning : warnings) {
    out += "  ";
    out += ToString(warning);
    out += '\n';
  }
  return out;
}

std::string TransmitCaution() {
  return "Caution: at transmitting power the wire ends, loads and matching parts carry high RF "
         "voltage,\nand the field near the antenna can exceed exposure limits. Keep people "
         "clear, keep masts\nand wires well away from power lines, and follow local rules and "
         "licensed practice.\n";
}

}  // namespace wirefield::report
