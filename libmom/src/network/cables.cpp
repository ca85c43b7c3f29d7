// Network stage: the built-in cable table (CableTable), the one place where cable figures
// live. Input: none; output: Z0, velocity factor and matched loss at 10 and 30 MHz for the
// generic RG designations of REFERENCES.md §5.1, each with the status of its figures.
#include "wirefield/network.hpp"

namespace wirefield {

const std::vector<CableInfo>& CableTable() {
  // REFERENCES.md §5.1. RG numbers are generic; makers differ by +-20% or more. Loss in dB
  // per 100 m; 10 MHz figures are the middle of the ranges given there.
  static const std::vector<CableInfo> kCables = {
      {"RG-58", 50.0, 0.66, 4.25, 10e6, 8.1, 30e6,
       "30 MHz figure: handbook table (confirmed in REFERENCES); 10 MHz: (from memory), a "
       "compiled table gives 3.9-4.6 dB/100 m; velocity factor 0.66 confirmed (compiled table)"},
      {"RG-174", 50.0, 0.66, 10.8, 10e6, 15.0, 30e6,
       "30 MHz figure: handbook table (confirmed in REFERENCES); 10 MHz: (from memory); "
       "velocity factor 0.66 confirmed (compiled table)"},
      {"RG-213", 50.0, 0.66, 2.0, 10e6, 3.5, 30e6,
       "30 MHz figure: handbook table (confirmed in REFERENCES); 10 MHz: (from memory); "
       "velocity factor 0.66 (from memory)"},
      {"RG-316", 50.0, 0.695, 9.0, 10e6, 15.0, 30e6,
       "maker datasheets (from memory) for both loss figures and the velocity factor 0.695"},
  };
  return kCables;
}

}  // namespace wirefield
