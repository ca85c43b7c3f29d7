// Study layer: the model stage's name rules (model/lexer.cpp) offered to front ends
// (wirefield/names.hpp): the "did you mean" hint, the name rule and quoted text.
#include "wirefield/names.hpp"

#include "model/lexer.hpp"

namespace wirefield {

std::string DidYouMeanAside(std::string_view word, const std::vector<std::string>& candidates) {
  return model::DidYouMeanAside(word, candidates);
}

std::string DidYouMean(std::string_view word, const std::vector<std::string>& candidates) {
  return model::DidYouMean(word, candidates);
}

bool IsModelName(std::string_view text) { return model::IsName(text); }

std::string ShortenForMessage(std::string_view text) { return model::Shorten(text); }

}  // namespace wirefield
