// CLI tests: the SVG pictures of `sweep --svg` (one band, two, three and eight bands, a range, a
// measured file) and `pattern --svg` (over real ground, in free space, over perfect ground; a
// vertical and horizontal dipoles), drawn by a real browser (headless Chromium) that measures
// every text as laid out: no text may leave the picture and no two texts may overlap. The
// Smith chart gives each band its own colour, and the measured curve is drawn unlike the 2:1
// line. Chromium is a test dependency (scripts/install-deps.sh installs it): without it these
// tests fail, they do not skip.
#include <gtest/gtest.h>
#include <unistd.h>

#include <cstdlib>
#include <filesystem>
#include <map>
#include <nlohmann/json.hpp>
#include <set>
#include <string>
#include <utility>
#include <vector>

#include "cli/program_runner.hpp"

namespace wirefield::cli_test {
namespace {

// Seconds the browser may take for one page of pictures (about 1 s when measured, on a
// loaded two-core machine) before it is killed and the test fails.
constexpr int kBrowserTimeLimit_s = 90;

struct Picture {
  std::string name;               // also the file name, NAME.svg
  std::vector<std::string> args;  // wirefield's arguments, before --svg FILE
};

std::string Model(const std::string& file) { return ModelsDir() + "/" + file; }

std::string ScratchPath(const std::string& name) { return WriteScratchFile(name, ""); }

// Single-quotes `text` for /bin/sh.
std::string ShellQuote(const std::string& text) {
  std::string out = "'";
  for (char c : text) out += c == '\'' ? std::string("'\\''") : std::string(1, c);
  return out + "'";
}

// The browser: $WIREFIELD_CHROMIUM, else the first of chromium and chromium-browser found on
// PATH; empty when there is none.
std::string FindChromium() {
  if (const char* given = std::getenv("WIREFIELD_CHROMIUM"); given != nullptr && *given) {
    return given;
  }
  const char* path = std::getenv("PATH");
  std::string dirs = path != nullptr ? path : "/usr/bin:/bin";
  for (const char* name : {"chromium", "chromium-browser"}) {
    std::size_t start = 0;
    while (start <= dirs.size()) {
      const std::size_t end = std::min(dirs.find(':', start), dirs.size());
      const std::filesystem::path candidate =
          std::filesystem::path(dirs.substr(start, end - start)) / name;
      if (::access(candidate.c_str(), X_OK) == 0) return candidate.string();
      start = end + 1;
    }
  }
  return "";
}

// Writes each picture with wirefield; returns (name, SVG text) pairs.
std::vector<std::pair<std::string, std::string>> WritePictures(const std::vector<Picture>& list) {
  std::vector<std::pair<std::string, std::string>> out;
  for (const Picture& picture : list) {
    const std::string svg = ScratchPath(picture.name + ".svg");
    std::vector<std::string> args = picture.args;
    args.insert(args.end(), {"--svg", svg});
    const ProgramRun run = RunWirefield(args);
    EXPECT_TRUE(run.exited && run.exit_code == 0) << picture.name << ": " << Describe(run);
    out.emplace_back(picture.name, ReadFile(svg));
    EXPECT_EQ(out.back().second.rfind("<svg", 0), 0u) << picture.name;
  }
  return out;
}

// Embeds the pictures in one page with the layout checker, lets Chromium lay it out and run
// the checker, and returns the checker's report by picture name (each entry: texts, widest,
// problems). Adds a gtest failure when the browser is missing or gives no report.
std::map<std::string, nlohmann::json> MeasureInBrowser(
    const std::vector<std::pair<std::string, std::string>>& pictures) {
  std::map<std::string, nlohmann::json> by_name;
  const std::string chromium = FindChromium();
  if (chromium.empty()) {
    ADD_FAILURE() << "Chromium is needed to check the SVG layout: install it "
                     "(scripts/install-deps.sh installs the Debian package chromium) or set "
                     "WIREFIELD_CHROMIUM to the browser";
    return by_name;
  }
  std::string page =
      "<!DOCTYPE html>\n<html><head><meta charset=\"utf-8\"><title>layout</title>"
      "<style>body{margin:0} div.case{margin:0 0 20px 0; line-height:0}</style></head><body>\n";
  for (const auto& [name, svg] : pictures) {
    page += "<div class=\"case\" data-name=\"" + name + "\">\n" + svg + "</div>\n";
  }
  page += "<pre id=\"result\"></pre>\n<script>\n" +
          ReadFile(std::string(WIREFIELD_SOURCE_DIR) + "/tests/cli/svg_layout_check.js") +
          "</script>\n</body></html>\n";
  const std::string html = WriteScratchFile("svg_layout.html", page);
  const std::string dom = ScratchPath("svg_layout.dom");
  const std::string log = ScratchPath("svg_layout.log");
  const std::filesystem::path profile = std::filesystem::path(html).parent_path() / "chromium";
  std::filesystem::create_directories(profile);
  // Headless, no sandbox (CI runs as root), no GPU, and nothing that reaches the network.
  const std::string command =
      "timeout -k 5 " + std::to_string(kBrowserTimeLimit_s) + " " + ShellQuote(chromium) +
      " --headless --no-sandbox --disable-gpu --disable-dev-shm-usage --disable-quic"
      " --no-first-run --disable-background-networking --disable-component-update"
      " --disable-sync --disable-extensions --user-data-dir=" +
      ShellQuote(profile.string()) + " --dump-dom " + ShellQuote("file://" + html) + " >" +
      ShellQuote(dom) + " 2>" + ShellQuote(log) + " </dev/null";
  const int status = std::system(command.c_str());
  std::filesystem::remove_all(profile);
  const std::string dumped = ReadFile(dom);
  const std::string open_tag = "<pre id=\"result\">";
  const std::size_t start = dumped.find(open_tag);
  const std::size_t end = dumped.find("</pre>", start == std::string::npos ? 0 : start);
  if (start == std::string::npos || end == std::string::npos) {
    ADD_FAILURE() << "the browser gave no layout report (status " << status << "); its messages:\n"
                  << ReadFile(log).substr(0, 4000);
    return by_name;
  }
  // The DOM is serialised as HTML: the report's quotes and ampersands come back escaped.
  std::string report = dumped.substr(start + open_tag.size(), end - start - open_tag.size());
  for (const auto& [entity, plain] : std::vector<std::pair<std::string, std::string>>{
           {"&quot;", "\""}, {"&lt;", "<"}, {"&gt;", ">"}, {"&#39;", "'"}, {"&amp;", "&"}}) {
    for (std::size_t at = report.find(entity); at != std::string::npos;
         at = report.find(entity, at + plain.size())) {
      report.replace(at, entity.size(), plain);
    }
  }
  nlohmann::json doc;
  try {
    doc = nlohmann::json::parse(report);
  } catch (const nlohmann::json::exception& e) {
    ADD_FAILURE() << "the layout report is not JSON: " << e.what() << "\n" << report;
    return by_name;
  }
  for (const nlohmann::json& entry : doc) by_name[entry.at("name").get<std::string>()] = entry;
  return by_name;
}

// Checks every picture: measured, with texts that have a width (the fonts rendered), none
// leaving the picture, no two overlapping.
void ExpectCleanLayout(const std::vector<Picture>& list) {
  const auto pictures = WritePictures(list);
  const auto report = MeasureInBrowser(pictures);
  for (const Picture& picture : list) {
    const auto found = report.find(picture.name);
    if (found == report.end()) {
      ADD_FAILURE() << picture.name << ": not measured by the browser";
      continue;
    }
    const nlohmann::json& entry = found->second;
    EXPECT_GE(entry.at("texts").get<int>(), 20) << picture.name;
    // The title alone is several hundred pixels wide in any sans-serif font.
    EXPECT_GT(entry.at("widest").get<double>(), 300.0) << picture.name;
    for (const nlohmann::json& problem : entry.at("problems")) {
      ADD_FAILURE() << picture.name << ".svg: " << problem.get<std::string>();
    }
  }
}

// The opening tags (from '<' to '>') of the elements of `svg` whose first attribute is
// class="css_class". Plain string search: std::regex recurses once per character matched and
// overflows the stack on a picture this long under the address sanitizer.
std::vector<std::string> TagsOfClass(const std::string& svg, const std::string& css_class) {
  std::vector<std::string> tags;
  const std::string needle = " class=\"" + css_class + "\"";
  for (size_t at = svg.find(needle); at != std::string::npos; at = svg.find(needle, at + 1)) {
    const size_t open = svg.rfind('<', at);
    const size_t close = svg.find('>', at);
    if (open == std::string::npos || close == std::string::npos) continue;
    const std::string name = svg.substr(open + 1, at - open - 1);
    if (name.empty() || name.find_first_not_of("abcdefghijklmnopqrstuvwxyz") != std::string::npos) {
      continue;
    }
    tags.push_back(svg.substr(open, close - open + 1));
  }
  return tags;
}

// The value of attribute `name` in `tag`, or "" when it has none.
std::string AttributeInTag(const std::string& tag, const std::string& name) {
  const std::string key = " " + name + "=\"";
  const size_t at = tag.find(key);
  if (at == std::string::npos) return "";
  const size_t start = at + key.size();
  const size_t end = tag.find('"', start);
  return end == std::string::npos ? "" : tag.substr(start, end - start);
}

// The stroke colours (#rrggbb) of the elements of `svg` whose class attribute is `css_class`.
std::vector<std::string> StrokesOf(const std::string& svg, const std::string& css_class) {
  std::vector<std::string> strokes;
  for (const std::string& tag : TagsOfClass(svg, css_class)) {
    const std::string stroke = AttributeInTag(tag, "stroke");
    if (stroke.size() == 7 && stroke[0] == '#' &&
        stroke.find_first_not_of("0123456789abcdef", 1) == std::string::npos) {
      strokes.push_back(stroke);
    }
  }
  return strokes;
}

// The value of attribute `name` in the first element of class `css_class` that has it.
std::string AttributeOf(const std::string& svg, const std::string& css_class,
                        const std::string& name) {
  for (const std::string& tag : TagsOfClass(svg, css_class)) {
    const std::string value = AttributeInTag(tag, name);
    if (!value.empty()) return value;
  }
  return "";
}

TEST(SvgLayout, SweepPicturesKeepEveryTextInsideAndApart) {
  const std::string measured = ScratchPath("layout_measured.s1p");
  // The "measured" file: the same dipole hung 3 m up instead of 1.2 m, so that its curve
  // differs from the prediction.
  const ProgramRun written =
      RunWirefield({"sweep", Model("hiking_club_dipole.wire"), "--set", "height=3m", "--from",
                    "13.9MHz", "--to", "14.5MHz", "--points", "61", "--s1p", measured});
  ASSERT_EQ(written.exit_code, 0) << Describe(written);
  ExpectCleanLayout({
      {"sweep_one_band", {"sweep", Model("hiking_club_dipole.wire"), "--band", "20m"}},
      {"sweep_two_bands",
       {"sweep", Model("hiking_club_two_band_end_fed.wire"), "--band", "40m", "--band", "20m"}},
      {"sweep_three_bands",
       {"sweep", Model("trap_dipole.wire"), "--band", "40m", "--band", "30m", "--band", "20m"}},
      {"sweep_eight_bands",
       {"sweep", Model("trap_dipole.wire"), "--band", "80m", "--band", "40m", "--band", "30m",
        "--band", "20m", "--band", "17m", "--band", "15m", "--band", "12m", "--band", "10m"}},
      {"sweep_range",
       {"sweep", Model("campsite_vertical.wire"), "--from", "6MHz", "--to", "22MHz", "--points",
        "81"}},
      {"sweep_range_narrow",
       {"sweep", Model("trap_dipole.wire"), "--from", "6.9MHz", "--to", "7.4MHz", "--points", "51",
        "--region", "2"}},
      {"sweep_measured",
       {"sweep", Model("hiking_club_dipole.wire"), "--band", "20m", "--measured", measured}},
  });
}

TEST(SvgLayout, PatternPicturesKeepEveryTextInsideAndApart) {
  ExpectCleanLayout({
      // A sloping end-fed wire over real ground (the longest ground description).
      {"pattern_real_ground", {"pattern", Model("hiking_club_two_band_end_fed.wire")}},
      // A vertical with elevated radials over real ground.
      {"pattern_real_ground_vertical", {"pattern", Model("campsite_elevated_radials.wire")}},
      // A horizontal dipole in free space.
      {"pattern_free_space", {"pattern", Model("hiking_club_dipole.wire")}},
      // A horizontal dipole over perfect ground, its azimuth maximum at 90 deg.
      {"pattern_perfect_ground_horizontal", {"pattern", Model("campsite_mast_dipole.wire")}},
      // A quarter-wave vertical over perfect ground.
      {"pattern_perfect_ground_vertical", {"pattern", Model("campsite_vertical.wire")}},
      // A low inverted V over perfect ground: its elevation maximum at the zenith.
      {"pattern_zenith", {"pattern", Model("inverted_v_trail.wire"), "--step", "2"}},
  });
}

TEST(SvgLayout, CheckerReportsOverlapsAndTextOutsideThePicture) {
  // Two texts drawn on top of each other, one running off the right edge, and one clear of
  // both: the checker must find exactly the first two defects, so a clean report above means
  // something.
  const std::string svg =
      "<svg xmlns=\"http://www.w3.org/2000/svg\" width=\"400\" height=\"100\" "
      "viewBox=\"0 0 400 100\" font-family=\"DejaVu Sans, sans-serif\">"
      "<text x=\"20\" y=\"30\" font-size=\"12\">7.20</text>"
      "<text x=\"40\" y=\"30\" font-size=\"12\">14.0</text>"
      "<text x=\"390\" y=\"80\" font-size=\"12\">off the edge</text>"
      "<text x=\"200\" y=\"60\" font-size=\"12\">alone</text></svg>\n";
  const auto report = MeasureInBrowser({{"bad", svg}});
  ASSERT_EQ(report.count("bad"), 1u);
  const nlohmann::json& problems = report.at("bad").at("problems");
  ASSERT_EQ(problems.size(), 2u) << problems.dump(1);
  std::set<std::string> kinds;
  for (const nlohmann::json& p : problems) {
    const std::string text = p.get<std::string>();
    if (text.find("\"7.20\" and \"14.0\" overlap") != std::string::npos) kinds.insert("overlap");
    if (text.find("\"off the edge\"") != std::string::npos &&
        text.find("leaves the picture") != std::string::npos) {
      kinds.insert("outside");
    }
  }
  EXPECT_EQ(kinds, (std::set<std::string>{"overlap", "outside"})) << problems.dump(1);
}

TEST(SvgLayout, SmithChartGivesEachBandItsOwnColourAndMeasuredIsUnlikeTheLimit) {
  const std::string measured = ScratchPath("colours_measured.s1p");
  const ProgramRun written = RunWirefield(
      {"sweep", Model("trap_dipole.wire"), "--band", "40m", "--band", "20m", "--s1p", measured});
  ASSERT_EQ(written.exit_code, 0) << Describe(written);
  const auto pictures = WritePictures({{"colours",
                                        {"sweep", Model("trap_dipole.wire"), "--band", "40m",
                                         "--band", "20m", "--measured", measured}}});
  const std::string& svg = pictures.at(0).second;
  // One trace per band on the Smith chart, each in a colour of its own, each in the legend.
  const std::vector<std::string> traces = StrokesOf(svg, "smith-trace");
  ASSERT_EQ(traces.size(), 2u) << svg.substr(0, 2000);
  EXPECT_NE(traces[0], traces[1]);
  EXPECT_EQ(StrokesOf(svg, "smith-legend"), traces);
  EXPECT_NE(svg.find(">40m<"), std::string::npos);
  EXPECT_NE(svg.find(">20m<"), std::string::npos);
  // The measured curve differs from the 2:1 line in colour and in dash pattern, and from the
  // predicted curve in colour.
  const std::vector<std::string> measured_strokes = StrokesOf(svg, "measured");
  const std::vector<std::string> limit_strokes = StrokesOf(svg, "limit");
  ASSERT_FALSE(measured_strokes.empty());
  ASSERT_FALSE(limit_strokes.empty());
  EXPECT_NE(measured_strokes[0], limit_strokes[0]);
  EXPECT_NE(AttributeOf(svg, "measured", "stroke-dasharray"),
            AttributeOf(svg, "limit", "stroke-dasharray"));
  for (const std::string& trace : StrokesOf(svg, "predicted")) {
    EXPECT_NE(trace, measured_strokes[0]);
  }
}

}  // namespace
}  // namespace wirefield::cli_test
