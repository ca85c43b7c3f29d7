// CLI tests: malformed input never crashes or hangs the program. Random bytes, random token
// soup, truncated copies of the bundled models, huge numbers and deep nesting all end with
// exit code 0, 1 or 2 (never a signal, never the time limit), and stdout never shows a
// non-finite number. Inputs are generated from fixed seeds, so every run is the same.
#include <gtest/gtest.h>

#include <filesystem>
#include <nlohmann/json.hpp>
#include <random>
#include <regex>
#include <string>
#include <vector>

#include "cli/program_runner.hpp"

namespace wirefield::cli_test {
namespace {

// Runs `solve FILE --json` (plus extra args) on the given text and checks the outcome.
void ExpectNoCrash(const std::string& name, const std::string& text,
                   const std::vector<std::string>& extra_args = {}) {
  const std::string path = WriteScratchFile(name, text);
  std::vector<std::string> args{"solve", path, "--json"};
  args.insert(args.end(), extra_args.begin(), extra_args.end());
  const ProgramRun run = RunWirefield(args);
  ASSERT_TRUE(run.exited) << name << ": " << Describe(run) << "\ninput:\n" << text.substr(0, 600);
  EXPECT_TRUE(run.exit_code == 0 || run.exit_code == 1 || run.exit_code == 2)
      << name << ": " << Describe(run);
  EXPECT_FALSE(
      std::regex_search(run.out, std::regex("\\b(nan|inf|infinity)\\b", std::regex::icase)))
      << name << ": " << run.out;
  if (run.exit_code == 0) {
    EXPECT_TRUE(nlohmann::json::accept(run.out)) << name << ": " << run.out;
  } else {
    EXPECT_EQ(run.out, "") << name << ": a failed run must leave stdout empty";
    EXPECT_FALSE(run.err.empty()) << name << ": a failed run must say why";
  }
}

TEST(Robustness, RandomBytesNeverCrash) {
  std::mt19937 rng(20261201);  // fixed seed: reproducible inputs
  std::uniform_int_distribution<int> byte(0, 255);
  std::uniform_int_distribution<int> length(0, 300);
  for (int i = 0; i < 25; ++i) {
    std::string text(static_cast<std::size_t>(length(rng)), '\0');
    for (char& c : text) c = static_cast<char>(byte(rng));
    ExpectNoCrash("random_bytes_" + std::to_string(i) + ".wire", text);
  }
}

TEST(Robustness, RandomTokenSoupNeverCrashes) {
  const std::vector<std::string> tokens = {"units",
                                           "m",
                                           "mm",
                                           "let",
                                           "x",
                                           "=",
                                           "wire",
                                           "w",
                                           "from",
                                           "to",
                                           "(",
                                           ")",
                                           ",",
                                           "radius",
                                           "segments",
                                           "feed",
                                           "f",
                                           "at",
                                           "w@",
                                           "@",
                                           "start",
                                           "end",
                                           "50%",
                                           "%",
                                           "load",
                                           "series",
                                           "parallel",
                                           "R=",
                                           "L=",
                                           "C=",
                                           "ground",
                                           "free",
                                           "perfect",
                                           "real",
                                           "permittivity=",
                                           "conductivity=",
                                           "frequency",
                                           "z0",
                                           "1",
                                           "0",
                                           "-1",
                                           "1e308",
                                           "1e-308",
                                           "14.2MHz",
                                           "2uH",
                                           "10pF",
                                           "sqrt",
                                           "atan2",
                                           "^",
                                           "*",
                                           "/",
                                           "+",
                                           "-",
                                           "pi",
                                           "30deg",
                                           "#",
                                           "\n",
                                           "\n",
                                           "\t"};
  std::mt19937 rng(777);  // fixed seed: reproducible inputs
  std::uniform_int_distribution<std::size_t> pick(0, tokens.size() - 1);
  std::uniform_int_distribution<int> count(1, 80);
  for (int i = 0; i < 25; ++i) {
    std::string text;
    const int n = count(rng);
    for (int k = 0; k < n; ++k) text += tokens[pick(rng)] + " ";
    ExpectNoCrash("token_soup_" + std::to_string(i) + ".wire", text);
  }
}

TEST(Robustness, TruncatedBundledModelsNeverCrash) {
  for (const auto& entry : std::filesystem::directory_iterator(ModelsDir())) {
    if (entry.path().extension() != ".wire") continue;
    const std::string text = ReadFile(entry.path().string());
    const std::size_t cuts = 6;
    for (std::size_t k = 1; k <= cuts; ++k) {
      // Cut points spread through the statements, which follow the comment header.
      const std::size_t body = text.find("\nunits");
      const std::size_t from = body == std::string::npos ? 0 : body;
      const std::size_t at = from + (text.size() - from) * k / (cuts + 1);
      ExpectNoCrash("cut_" + std::to_string(k) + "_" + entry.path().filename().string(),
                    text.substr(0, at));
    }
  }
}

TEST(Robustness, HugeAndTinyNumbersNeverCrash) {
  const std::string wire_head = "wire w from (-5, 0, 10) to (5, 0, 10) radius ";
  const std::string tail = "feed f at w@50%\nfrequency 14.2MHz\n";
  const std::vector<std::pair<std::string, std::string>> cases = {
      {"radius_huge", wire_head + "1e308\n" + tail},
      {"radius_overflow", wire_head + "1e400\n" + tail},
      {"radius_small", wire_head + "1e-30\n" + tail},
      {"coordinates_huge", "wire w from (-1e308, 0, 0) to (1e308, 0, 0) radius 1mm\n" + tail},
      {"coordinates_overflow", "wire w from (-1e308*10, 0, 0) to (5, 0, 0) radius 1mm\n" + tail},
      {"segments_huge", wire_head + "1mm segments 1e12\n" + tail},
      {"segments_int_overflow", wire_head + "1mm segments 2147483648\n" + tail},
      {"segments_many", wire_head + "1mm segments 100000\n" + tail},
      {"frequency_huge", wire_head + "1mm\nfeed f at w@50%\nfrequency 1e300Hz\n"},
      {"frequency_tiny", wire_head + "1mm\nfeed f at w@50%\nfrequency 1e-300Hz\n"},
      {"let_overflow", "let x = 1e200 * 1e200\n" + wire_head + "x\n" + tail},
      {"power_overflow", "let x = 10 ^ 400\n" + wire_head + "1mm\n" + tail},
      {"divide_by_zero", "let x = 1 / 0\n" + wire_head + "1mm * x\n" + tail},
      {"zero_over_zero", wire_head + "(0 / 0) * 1mm\n" + tail},
      {"load_huge", wire_head + "1mm\nfeed f at w@50%\nload l at w@25% series R=1e308\n"
                                "frequency 14.2MHz\n"},
      {"load_tiny_c", wire_head + "1mm\nfeed f at w@50%\nload l at w@25% series C=1e-300\n"
                                  "frequency 14.2MHz\n"},
      {"voltage_huge", wire_head + "1mm\nfeed f at w@50% voltage 1e308\nfrequency 14.2MHz\n"},
      {"long_number", wire_head + "0." + std::string(5000, '0') + "1\n" + tail},
  };
  for (const auto& [name, text] : cases) ExpectNoCrash(name + ".wire", text);
}

TEST(Robustness, VanishingRadiusEndsWithinTheTimeLimit) {
  // A radius of 1e-300 m is well formed (the thin-wire model only asks for radius << length)
  // and must end like any other input: solved, refused (2) or failed (1), never a hang.
  ExpectNoCrash("radius_vanishing.wire",
                "wire w from (-5, 0, 10) to (5, 0, 10) radius 1e-300\n"
                "feed f at w@50%\nfrequency 14.2MHz\n");
}

TEST(Robustness, HugeOptionValuesNeverCrash) {
  const std::string model =
      "wire w from (-5, 0, 10) to (5, 0, 10) radius 1mm\nfeed f at w@50%\nfrequency 14.2MHz\n";
  ExpectNoCrash("option_freq_huge.wire", model, {"--freq", "1e308Hz"});
  ExpectNoCrash("option_freq_overflow.wire", model, {"--freq", "1e400"});
  ExpectNoCrash("option_freq_tiny.wire", model, {"--freq", "1e-300Hz"});
  ExpectNoCrash("option_z0_huge.wire", model, {"--z0", "1e308"});
  ExpectNoCrash("option_z0_tiny.wire", model, {"--z0", "1e-308"});
  ExpectNoCrash("option_set_deep.wire", "let x = 1\n" + model,
                {"--set", "x=" + std::string(30000, '(') + "1" + std::string(30000, ')')});
}

TEST(Robustness, DeepNestingNeverCrashes) {
  const std::string tail =
      "wire w from (-5, 0, 10) to (5, 0, 10) radius 1mm\nfeed f at w@50%\nfrequency 14.2MHz\n";
  const std::size_t depth = 100000;
  ExpectNoCrash("deep_parens.wire",
                "let x = " + std::string(depth, '(') + "1" + std::string(depth, ')') + "\n" + tail);
  ExpectNoCrash("deep_unbalanced.wire", "let x = " + std::string(depth, '(') + "1\n" + tail);
  ExpectNoCrash("deep_closing.wire", "let x = 1" + std::string(depth, ')') + "\n" + tail);
  ExpectNoCrash("deep_minus.wire", "let x = " + std::string(depth, '-') + "1\n" + tail);
  std::string calls;
  for (std::size_t i = 0; i < 20000; ++i) calls += "sqrt(";
  ExpectNoCrash("deep_calls.wire",
                "let x = " + calls + "1" + std::string(20000, ')') + "\n" + tail);
  std::string powers = "let x = 2";
  for (std::size_t i = 0; i < 50000; ++i) powers += "^2";
  ExpectNoCrash("long_power_chain.wire", powers + "\n" + tail);
  ExpectNoCrash("long_line.wire", "let x = 1" + std::string(200000, ' ') + "+ 1\n" + tail);
}

}  // namespace
}  // namespace wirefield::cli_test
