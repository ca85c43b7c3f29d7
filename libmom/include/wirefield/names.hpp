// wirefield public API: the "did you mean" hint of the model language's diagnostics, for
// front ends that check names of their own (the program's command names). Implemented in
// libmom/src/study/names.cpp on the model stage's nearest-name rule.
#pragma once

#include <string>
#include <string_view>
#include <vector>

namespace wirefield {

// " (did you mean 'X'?)" when one candidate is close to `word` (the same letters ignoring
// case, or an edit distance of at most a third of its length, at least 1), else "".
std::string DidYouMeanAside(std::string_view word, const std::vector<std::string>& candidates);

}  // namespace wirefield
