// wirefield public API: include this one header.
#pragma once

#include "wirefield/batch.hpp"
#include "wirefield/coil.hpp"
#include "wirefield/core.hpp"
#include "wirefield/model.hpp"
#include "wirefield/network.hpp"
#include "wirefield/pattern.hpp"
#include "wirefield/report.hpp"
#include "wirefield/results.hpp"
#include "wirefield/simulation.hpp"
#include "wirefield/stress.hpp"
#include "wirefield/sweep.hpp"
#include "wirefield/tune.hpp"
