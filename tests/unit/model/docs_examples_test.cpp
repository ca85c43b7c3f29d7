// Tests that the examples of docs/model-language.md are valid models: every fenced block
// holding both a `wire` and a `feed` line is parsed as it stands, so the reference cannot
// drift from the parser. (Shorter snippets of single statements are not whole models.)
#include <gtest/gtest.h>

#include <fstream>
#include <sstream>
#include <string>
#include <vector>

#include "geometry/mesh.hpp"
#include "wirefield/coil.hpp"
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

// The model blocks of docs/model-language.md (none when it cannot be read, which fails).
std::vector<std::string> DocsModelBlocks() {
  const std::string path = std::string(WIREFIELD_SOURCE_DIR) + "/docs/model-language.md";
  std::ifstream file(path);
  EXPECT_TRUE(file) << path;
  std::stringstream text;
  text << file.rdbuf();
  return ModelBlocks(text.str());
}

TEST(DocsExamples, EveryModelInTheLanguageReferenceParses) {
  const std::vector<std::string> blocks = DocsModelBlocks();
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
  int with_chain = 0;
  for (const std::string& block : DocsModelBlocks()) {
    const Model m = ParseModelText(block, "docs");
    if (!m.transformers.empty() && !m.feed_lines.empty()) {
      ++with_chain;
      EXPECT_EQ(m.transformers[0].feed, m.feed_lines[0].feed);
      EXPECT_EQ(m.feed_lines[0].cable, "RG-58");
    }
  }
  EXPECT_EQ(with_chain, 1);
}

TEST(DocsExamples, EveryModelInTheLanguageReferenceMeshesAtItsFrequency) {
  // The thin-wire bounds on the radius (model/thin_wire.hpp) are checked when a model is
  // meshed; every example must pass them at its own frequency (14.2 MHz when it has none).
  for (const std::string& block : DocsModelBlocks()) {
    const Model m = ParseModelText(block, "docs");
    geometry::MeshOptions options;
    options.max_frequency_hz = m.frequency_hz.value_or(14.2e6);
    EXPECT_NO_THROW(geometry::BuildMesh(m, options)) << block;
  }
}

TEST(DocsExamples, TheCloseWoundCoilExampleHasTheInductanceItIsWoundFor) {
  int close_wound = 0;
  for (const std::string& block : DocsModelBlocks()) {
    if (block.find("close-wound") == std::string::npos) continue;
    ++close_wound;
    const Model m = ParseModelText(block, "docs");
    ASSERT_EQ(m.loads.size(), 1u);
    ASSERT_TRUE(m.loads[0].coil.has_value());
    const CoilSpec& coil = *m.loads[0].coil;
    EXPECT_DOUBLE_EQ(*coil.pitch_m, 1.26e-3);  // 1.2 mm of wire and twice 0.03 mm of enamel
    EXPECT_NEAR(AnalyzeCoil(coil, 7.1e6).inductance_h / 12e-6, 1.0, 1e-9);
  }
  EXPECT_EQ(close_wound, 1);
}

}  // namespace
}  // namespace wirefield
