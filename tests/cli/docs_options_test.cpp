// CLI tests: the documented synopses keep up with the program. For every command, each option
// that `wirefield COMMAND --help` lists must appear in the synopsis of that command in
// docs/commands.md (the block at the top, and the command's own section's block when it has
// one) and in the README's synopsis when the README has one. Reads the built program's help
// and the two Markdown files; fails naming each option a synopsis lacks.
#include <gtest/gtest.h>

#include <cctype>
#include <regex>
#include <sstream>
#include <string>
#include <vector>

#include "cli/program_runner.hpp"

namespace wirefield::cli_test {
namespace {

const std::vector<std::string> kCommands{"solve", "pattern", "sweep", "batch", "coil", "tune"};

std::string SourcePath(const std::string& relative) {
  return std::string(WIREFIELD_SOURCE_DIR) + "/" + relative;
}

std::vector<std::string> Lines(const std::string& text) {
  std::vector<std::string> lines;
  std::istringstream in(text);
  for (std::string line; std::getline(in, line);) lines.push_back(line);
  return lines;
}

// The long options of the "Options:" section of a command's help, one per line that starts
// an option ("  --freq F ..." or "  -h,--help ..."), without --help itself.
std::vector<std::string> HelpOptions(const std::string& help) {
  static const std::regex kOptionLine("^  (?:-[A-Za-z],)?(--[a-z0-9][a-z0-9-]*).*");
  std::vector<std::string> options;
  bool in_options = false;
  for (const std::string& line : Lines(help)) {
    if (line == "Options:") {
      in_options = true;
      continue;
    }
    if (in_options && line.empty()) break;
    std::smatch m;
    if (in_options && std::regex_match(line, m, kOptionLine) && m[1] != "--help") {
      options.push_back(m[1]);
    }
  }
  return options;
}

// The lines of a fenced code block starting at `first` (the line after its ```), up to the
// closing fence.
std::vector<std::string> Block(const std::vector<std::string>& lines, size_t first) {
  std::vector<std::string> block;
  for (size_t i = first; i < lines.size() && lines[i].rfind("```", 0) != 0; ++i) {
    block.push_back(lines[i]);
  }
  return block;
}

// The synopsis of `command` inside a block: each line that starts "wirefield COMMAND " and
// then a placeholder or a bracket ("MODEL", "(", "["), not an example's real value, and the
// indented lines that continue it.
std::string SynopsisIn(const std::vector<std::string>& block, const std::string& command) {
  static const std::regex kSynopsisStart("wirefield ([a-z]+) (MODEL|\\(|\\[).*");
  std::string synopsis;
  bool in_command = false;
  for (const std::string& line : block) {
    std::smatch m;
    if (line.rfind("wirefield ", 0) == 0) {
      in_command = std::regex_match(line, m, kSynopsisStart) && m[1] == command;
    } else if (line.empty() || line.front() != ' ') {
      in_command = false;
    }
    if (in_command) synopsis += line + "\n";
  }
  return synopsis;
}

// Every code block of a Markdown text whose lines include a synopsis of `command`, with the
// heading it sits under.
struct Synopsis {
  std::string where;
  std::string text;
};
std::vector<Synopsis> SynopsesOf(const std::string& markdown, const std::string& file,
                                 const std::string& command) {
  std::vector<Synopsis> found;
  const std::vector<std::string> lines = Lines(markdown);
  std::string heading = "(top)";
  for (size_t i = 0; i < lines.size(); ++i) {
    if (lines[i].rfind("##", 0) == 0) heading = lines[i];  // the title keeps "(top)"
    if (lines[i].rfind("```", 0) != 0) continue;
    const std::vector<std::string> block = Block(lines, i + 1);
    const std::string synopsis = SynopsisIn(block, command);
    if (!synopsis.empty()) found.push_back({file + " under " + heading, synopsis});
    i += block.size() + 1;  // past the closing fence
  }
  return found;
}

// True when `option` appears in `text` as a whole option name (not as the start of a longer
// one: --step is not found in --pattern-step).
bool MentionsOption(const std::string& text, const std::string& option) {
  for (size_t at = text.find(option); at != std::string::npos; at = text.find(option, at + 1)) {
    const size_t end = at + option.size();
    const bool starts = at == 0 || text[at - 1] != '-';
    const bool ends = end == text.size() ||
                      !(std::isalnum(static_cast<unsigned char>(text[end])) || text[end] == '-');
    if (starts && ends) return true;
  }
  return false;
}

class CommandSynopsis : public testing::TestWithParam<std::string> {};

TEST_P(CommandSynopsis, ListsEveryOptionOfTheHelpInCommandsMdAndTheReadme) {
  const std::string& command = GetParam();
  const ProgramRun run = RunWirefield({command, "--help"});
  ASSERT_TRUE(run.exited && run.exit_code == 0) << Describe(run);
  const std::vector<std::string> options = HelpOptions(run.out);
  ASSERT_GE(options.size(), 3u) << "too few options read from the help:\n" << run.out;

  const std::string commands_md = ReadFile(SourcePath("docs/commands.md"));
  ASSERT_FALSE(commands_md.empty());
  std::vector<Synopsis> synopses = SynopsesOf(commands_md, "docs/commands.md", command);
  // The block at the top of docs/commands.md holds every command's synopsis.
  ASSERT_FALSE(synopses.empty()) << "no synopsis of " << command << " in docs/commands.md";
  EXPECT_NE(synopses.front().where.find("(top)"), std::string::npos)
      << "docs/commands.md lacks " << command << " in its top synopsis";
  // The README's synopsis is checked when the README has one.
  const std::string readme = ReadFile(SourcePath("README.md"));
  ASSERT_FALSE(readme.empty());
  for (const Synopsis& s : SynopsesOf(readme, "README.md", command)) synopses.push_back(s);

  for (const Synopsis& synopsis : synopses) {
    for (const std::string& option : options) {
      EXPECT_TRUE(MentionsOption(synopsis.text, option))
          << option << " (in `wirefield " << command << " --help`) is missing from the synopsis "
          << "in " << synopsis.where << ":\n"
          << synopsis.text;
    }
  }
}

std::string CommandName(const testing::TestParamInfo<std::string>& param) { return param.param; }

INSTANTIATE_TEST_SUITE_P(Commands, CommandSynopsis, testing::ValuesIn(kCommands), CommandName);

TEST(CommandSynopsis, HelpOptionsAreReadFromTheOptionsSection) {
  // The reader itself, on a help text of the program's layout.
  const std::string help =
      "Usage: wirefield x [OPTIONS] MODEL\n\nOptions:\n  -h,--help   Print this\n"
      "  --freq F    Frequency; see --set too\n  --mode ssb|cw\n"
      "                              wrapped text --not-an-option\n  --yes-large  Run it\n\n"
      "Examples:\n  --example\n";
  EXPECT_EQ(HelpOptions(help), (std::vector<std::string>{"--freq", "--mode", "--yes-large"}));
  EXPECT_TRUE(MentionsOption("[--step DEG] [--json]", "--step"));
  EXPECT_FALSE(MentionsOption("[--pattern-step DEG]", "--step"));
  EXPECT_FALSE(MentionsOption("[--stepper]", "--step"));
}

}  // namespace
}  // namespace wirefield::cli_test
