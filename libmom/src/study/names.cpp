// Study layer: the model stage's "did you mean" rule (model/lexer.cpp) offered to front ends
// (wirefield/names.hpp). Input: a word and the names it may be a slip of; output: a hint.
#include "wirefield/names.hpp"

#include "model/lexer.hpp"

namespace wirefield {

std::string DidYouMeanAside(std::string_view word, const std::vector<std::string>& candidates) {
  return model::DidYouMeanAside(word, candidates);
}

}  // namespace wirefield
