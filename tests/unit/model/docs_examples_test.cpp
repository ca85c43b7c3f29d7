// Tests that the examples of docs/model-language.md are valid models: every fenced block
// holding both a `wire` and a `feed` line is parsed as it stands, so the reference cannot
// drift from the parser. (Shorter snippets of single statements are not whole models.)
#include <gtest/gtest.h>

#include <fstream>
#include <sstream>
#include <string>
#include <vector>

#include "wirefield/model.hpp"

namespace wirefield {
namespace {

std::vector<std::string> ModelBlocks(const std::string& markdown) {
  std::vector<std::string> blocks;
  std::istringstream in(markdown);
  std::string line, block;
  bool inside = false;
  while (std::getline(in, line)) {
    if (line.rfind("```", 0) == 0) {
      if (inside && block.find("\nfeed ") != std::string::npos &&
          block.find("\nwire ") != std::string::npos) {
        blocks.push_back(block);
      }
      inside = !inside;
      block.assign(1, '\n');
      continue;
    }
    if (inside) {
      block.append(line);
      block.push_back('\n');
    }
  }
  return blocks;
}

TEST(DocsExamples, EveryModelInTheLanguageReferenceParses) {
  const std::string path = std::string(WIREFIELD_SOURCE_DIR) + "/docs/model-language.md";
  std::ifstream file(path);
  ASSERT_TRUE(file) << path;
  std::stringstream text;
  text << file.rdbuf();
  const std::vector<std::string> blocks = ModelBlocks(text.str());
  EXPECT_GE(blocks.size(), 2u);  // the field kit dipole and the campsite mast
  for (const std::string& block : blocks) {
    EXPECT_NO_THROW(ParseModelText(block, "docs")) << block;
    const Model m = ParseModelText(block, "docs");
    EXPECT_FALSE(m.wires.empty());
    EXPECT_TRUE(m.warnings.empty()) << ToString(m.warnings.front());
  }
}

TEST(DocsExamples, TheEndFedKitExampleHasItsTransformerAndLine) {
  // The feed-chain section's example must really exercise both statements.
  const std::string path = std::string(WIREFIELD_SOURCE_DIR) + "/docs/model-language.md";
  std::ifstream file(path);
  ASSERT_TRUE(file) << path;
  std::stringstream text;
  text << file.rdbuf();
  int with_chain = 0;
  for (const std::string& block : ModelBlocks(text.str())) {
    const Model m = ParseModelText(block, "docs");
    if (!m.transformers.empty() && !m.feed_lines.empty()) {
      ++with_chain;
      EXPECT_EQ(m.transformers[0].feed, m.feed_lines[0].feed);
      EXPECT_EQ(m.feed_lines[0].cable, "RG-58");
    }
  }
  EXPECT_EQ(with_chain, 1);
}

}  // namespace
}  // namespace wirefield
