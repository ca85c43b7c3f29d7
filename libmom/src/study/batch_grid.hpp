// Study layer: what batch_grid.cpp offers the batch's run (batch_run.cpp). Not part of the
// public API.
#pragma once

#include <string>

#include "wirefield/batch.hpp"
#include "wirefield/model.hpp"

namespace wirefield::study {

// The name a model's own ground is shown under: its preset, or its kind.
std::string OwnGroundName(const GroundSpec& ground);

// The grid's size as a product: "1 ground x 101 values of total x 20 values of height".
std::string GridFactors(const BatchOptions& options);

// Every check that needs no row: InputError before any work.
void CheckBatchOptions(const BatchOptions& options, const Model& base);

}  // namespace wirefield::study
