// Model stage: the path of a bent wire (a polyline) as written, checked before it reaches the
// mesher. Input: the corners of `wire NAME through ...` or of a `shape`, with where each was
// written; output: nothing, or an InputError at the offending point (zero-length leg,
// a leg running straight back along the one before it).
#pragma once

#include <string>
#include <vector>

#include "wirefield/model.hpp"

namespace wirefield::model {

// "1st", "2nd", "3rd", "4th", ... for messages about the points of a wire.
std::string Ordinal(size_t n);

// Checks every leg of the path points[0] -> points[1] -> ...: longer than zero and not turning
// straight back along the leg before it (a 180-degree bend). locations[i] is where points[i]
// was written, context names the statement ("wire 'top'"). Throws InputError.
void CheckWirePath(const std::vector<Point>& points, const std::vector<SourceLocation>& locations,
                   const std::string& context);

// A wire whose path is the given corners: the first and last become from_m and to_m, those
// between become bends_m.
void SetWirePath(const std::vector<Point>& points, WireSpec* wire);

}  // namespace wirefield::model
