// wirefield public API: the model language's rules for names and quoted text in diagnostics,
// for front ends that read text of their own (the program's command names and flags), so that
// their messages read like the model's. Implemented in libmom/src/study/names.cpp on the model
// stage's rules.
#pragma once

#include <string>
#include <string_view>
#include <vector>

namespace wirefield {

// " (did you mean 'X'?)" when one candidate is close to `word` (the same letters ignoring
// case, or an edit distance of at most a third of its length, at least 1), else "".
std::string DidYouMeanAside(std::string_view word, const std::vector<std::string>& candidates);
// The same hint for the end of a message: "; did you mean 'X'?", else "".
std::string DidYouMean(std::string_view word, const std::vector<std::string>& candidates);

// True for a name of the model language: [A-Za-z_][A-Za-z0-9_]* (a `let` variable, a wire).
bool IsModelName(std::string_view text);

// Text as a message quotes it: long text cut to its start with "...".
std::string ShortenForMessage(std::string_view text);

}  // namespace wirefield
