// Hostile input: every file in tests/hostile/ is solved by the real program, each with its expected
// exit code and message fragments from tests/hostile/expected.tsv, plus a few very large inputs
// made here. Each run has a time limit, so a hang fails the test instead of stalling the suite.
#include <doctest/doctest.h>
#include <nlohmann/json.hpp>

#include <algorithm>
#include <cstdlib>
#include <filesystem>
#include <fstream>
#include <set>
#include <sstream>
#include <string>
#include <sys/wait.h>
#include <unistd.h>
#include <vector>

#include "../support/run_program.h"
#include "../support/fixtures.h"
#include "../test_support.h"

namespace fs = std::filesystem;

namespace {

/// Seconds one run may take before it counts as a hang. The slowest file takes about 3 s in the
/// Release build; the sanitizer build (scripts/test) is several times slower. Common practice.
constexpr int run_time_limit_s = 90;

struct Expectation {
  std::string file;
  int exit_code = 0;
  std::vector<std::string> fragments;  ///< all must appear; none for "-"
  int line = 0;                        ///< in the manifest
  int time_limit_s = 0;                ///< from a "limit=N" field; 0: run_time_limit_s
};

std::string read_text(const fs::path& path) {
  std::ifstream in(path, std::ios::binary);
  std::ostringstream text;
  text << in.rdbuf();
  return text.str();
}

/// The manifest: tab-separated file, exit code, then one or more fragments ("-" for none); a field
/// "limit=N" instead sets the time limit of that run to N s. Blank lines and lines starting with #
/// are skipped.
std::vector<Expectation> read_manifest(const fs::path& path) {
  std::vector<Expectation> out;
  std::istringstream in(read_text(path));
  int n = 0;
  for (std::string line; std::getline(in, line);) {
    ++n;
    if (line.empty() || line[0] == '#') continue;
    std::vector<std::string> fields;
    std::size_t at = 0;
    while (true) {
      const std::size_t tab = line.find('\t', at);
      fields.push_back(line.substr(at, tab == std::string::npos ? std::string::npos : tab - at));
      if (tab == std::string::npos) break;
      at = tab + 1;
    }
    CAPTURE(line);
    REQUIRE_MESSAGE(fields.size() >= 3, path.string() << ":" << n << ": expected file, exit code and fragments separated by tabs");
    Expectation e{fields[0], std::stoi(fields[1]), {}, n};
    for (std::size_t i = 2; i < fields.size(); ++i) {
      if (fields[i].rfind("limit=", 0) == 0) e.time_limit_s = std::stoi(fields[i].substr(6));
      else if (fields[i] != "-" && !fields[i].empty()) e.fragments.push_back(fields[i]);
    }
    out.push_back(std::move(e));
  }
  return out;
}

struct Run {
  int exit_code = -1;  ///< 124: time limit; 128 + n: killed by signal n
  std::string out, err;
};

fs::path scratch_folder() { return edgeflux::test::scratch_folder("hostile"); }

/// `edgeflux solve -q INPUT --json JSON` under coreutils timeout; stdout and stderr kept apart.
/// Sanitized builds run several times slower (scripts/test-sanitized sets EDGEFLUX_TEST_TIME_SCALE);
/// a hang is still a hang at any scale, so every time limit is stretched by that factor.
int time_scale() {
  const char* scale = std::getenv("EDGEFLUX_TEST_TIME_SCALE");
  return scale && std::atoi(scale) > 0 ? std::atoi(scale) : 1;
}

Run solve(const fs::path& input, const fs::path& json, const fs::path& folder, int time_limit_s = run_time_limit_s) {
  time_limit_s *= time_scale();
  const fs::path out = folder / "stdout.txt", err = folder / "stderr.txt";
  const std::string command = "timeout -k 5 " + std::to_string(time_limit_s) + " '" + std::string(EDGEFLUX_BINARY) +
                              "' solve -q '" + input.string() + "' --json '" + json.string() + "' >'" + out.string() +
                              "' 2>'" + err.string() + "'";
  const int status = std::system(command.c_str());
  Run run;
  run.exit_code = WIFEXITED(status) ? WEXITSTATUS(status) : -1;
  run.out = read_text(out);
  run.err = read_text(err);
  return run;
}

/// The checks every hostile input must pass, whatever its content.
void check_run(const Run& run, const Expectation& e, const fs::path& input, const fs::path& json,
               int time_limit_s = run_time_limit_s) {
  CAPTURE(run.err);
  CHECK_MESSAGE(run.exit_code != 124,
                "the program did not finish within " << time_limit_s * time_scale() << " s (a hang)");
  CHECK_MESSAGE(run.exit_code < 128, "the program crashed (signal " << run.exit_code - 128 << ")");
  CHECK(run.exit_code == e.exit_code);
  // A wrong exit code is the finding; the output checks below would only repeat it (and a missing
  // JSON would end the whole test case, hiding the files after this one).
  if (run.exit_code != e.exit_code) return;
  if (e.exit_code == 2) {
    // docs/detail-format.md, Errors: one message on standard error naming the file, nothing written.
    CHECK(std::count(run.err.begin(), run.err.end(), '\n') == 1);
    CHECK(run.err.rfind("edgeflux: error: ", 0) == 0);
    CHECK(run.err.find(input.string()) != std::string::npos);
    CHECK(run.out.empty());
    CHECK_FALSE(fs::exists(json));
    for (const std::string& fragment : e.fragments) {
      CAPTURE(fragment);
      CHECK(run.err.find(fragment) != std::string::npos);
    }
  } else if (e.exit_code == 0) {
    // A warning is printed under WARNINGS as "  ! text" and written to the JSON "warnings".
    CHECK(run.err.empty());
    REQUIRE(fs::exists(json));
    const nlohmann::json results = nlohmann::json::parse(read_text(json));
    const auto& warnings = results.at("warnings");
    CAPTURE(warnings.dump());
    if (e.fragments.empty()) {
      CHECK(warnings.empty());
      CHECK(run.out.find("WARNINGS") == std::string::npos);
    }
    for (const std::string& fragment : e.fragments) {
      CAPTURE(fragment);
      CHECK(run.out.find("\nWARNINGS\n") != std::string::npos);
      CHECK(run.out.find("  ! ") != std::string::npos);
      CHECK(std::any_of(warnings.begin(), warnings.end(),
                        [&](const nlohmann::json& w) { return w.get<std::string>().find(fragment) != std::string::npos; }));
    }
  }
}

void run_manifest(const fs::path& folder_of_files, const fs::path& manifest, bool require_every_file) {
  const std::vector<Expectation> expectations = read_manifest(manifest);
  std::set<std::string> listed;
  for (const Expectation& e : expectations) {
    CAPTURE(e.file);
    CHECK_MESSAGE(listed.insert(e.file).second, "listed twice in " << manifest.string());
  }
  if (require_every_file)
    for (const auto& entry : fs::directory_iterator(folder_of_files))
      if (entry.path().extension() == ".xml")
        CHECK_MESSAGE(listed.count(entry.path().filename().string()) == 1,
                      entry.path().filename().string() << " has no line in " << manifest.string());
  const fs::path scratch = scratch_folder();
  for (const Expectation& e : expectations) {
    const fs::path input = folder_of_files / e.file, json = scratch / "out.json";
    CAPTURE(e.file);
    CAPTURE(e.line);
    REQUIRE_MESSAGE(fs::exists(input), "listed in the manifest but missing");
    fs::remove(json);
    const int limit = e.time_limit_s > 0 ? e.time_limit_s : run_time_limit_s;
    check_run(solve(input, json, scratch, limit), e, input, json, limit);
  }
  fs::remove_all(scratch);
}

std::string good_wall() { return edgeflux::test::detail_xml(edgeflux::test::two_layer_wall_body()); }

std::string replaced(std::string text, const std::string& from, const std::string& to) {
  const auto at = text.find(from);
  REQUIRE_MESSAGE(at != std::string::npos, "test setup: text to replace not found: " << from);
  return text.replace(at, from.size(), to);
}

const std::string brick = R"(<rectangle name="brick" material="brick" from="0,0" to="200,1000"/>)";

/// The brick as an outline of n points whose bottom edge zigzags `depth` mm deep across the 200 mm.
/// Crossing: the outline runs up to the top corners and back down across the zigzag near x = 100 mm.
/// Otherwise it closes along the left face, a simple outline with very sharp corners.
std::string zigzag_polygon(int n, double depth, bool crossing) {
  std::string points;
  const int n_zigzag = n - (crossing ? 3 : 2);
  for (int i = 0; i < n_zigzag; ++i)
    points += std::to_string(200.0 * i / (n_zigzag - 1)) + "," + (i % 2 ? std::to_string(depth) : "0") + " ";
  return "<polygon name=\"brick\" material=\"brick\" points=\"" + points + (crossing ? "200,1000 0,1000 100,-5" : "200,1000 0,1000") +
         "\"/>";
}

struct Generated {
  std::string what;
  std::string text;
  Expectation expected;
  int time_limit_s = run_time_limit_s;
};

void run_generated(const std::vector<Generated>& cases) {
  const fs::path scratch = scratch_folder();
  for (const Generated& g : cases) {
    CAPTURE(g.what);
    const fs::path input = scratch / "big.xml", json = scratch / "out.json";
    std::ofstream(input, std::ios::binary) << g.text;
    fs::remove(json);
    check_run(solve(input, json, scratch, g.time_limit_s), g.expected, input, json, g.time_limit_s);
  }
  fs::remove_all(scratch);
}

}  // namespace

TEST_CASE("hostile input files: expected exit code and message, one error line, nothing written, no crash or hang") {
  const fs::path folder = edgeflux::test::source_path("tests/hostile");
  CHECK(read_manifest(folder / "expected.tsv").size() >= 40);
  run_manifest(folder, folder / "expected.tsv", true);
}

TEST_CASE("hostile input: very large and deeply nested files finish quickly with a clear outcome") {
  const std::string good = good_wall();
  std::string deep, materials;
  for (int i = 0; i < 100000; ++i) deep += "<a>";
  for (int i = 0; i < 100000; ++i) deep += "</a>";
  const std::vector<Generated> cases = {
      {"5 MB of white space between the blocks", replaced(good, "<regions>", std::string(5 << 20, ' ') + "<regions>"), {"", 0, {}}},
      {"elements nested 100000 deep", replaced(good, "<materials>", "<notes>" + deep + "</notes><materials>"),
       {"", 2, {"not well-formed XML"}}},
      {"an expression of 100000 nested parentheses",
       replaced(good, "conductivity=\"0.8\"", "conductivity=\"{" + std::string(50000, '(') + "1" + std::string(50000, ')') + "}\""),
       {"", 2, {"cannot evaluate"}}},
      {"a material reference 1 MB long", replaced(good, "material=\"eps\" from", "material=\"" + std::string(1 << 20, 'x') + "\" from"),
       {"", 2, {"is not defined"}}},
      {"a 2000-point outline that crosses itself", replaced(good, brick, zigzag_polygon(2000, 1.0, true)), {"", 2, {"crosses itself"}}},
      // 5000 corners of 1.15° (0.02 mm pitch, 1 mm deep): each wedge costs about 12/α nodes, so the
      // mesher refuses at once instead of refining for minutes.
      {"a simple 10000-point outline with 1° corners", replaced(good, brick, zigzag_polygon(10000, 1.0, false)),
       {"", 2, {"the sharp corners between region edges (the smallest 1.15° at", "more than the limit of 2000000"}}, 10},
  };
  run_generated(cases);
}

// Inputs that were quadratic somewhere (the self-intersection test and the snapping compared all
// pairs, the duplicate-id check too, and every probe searched every triangle). The time limits are
// what a user may wait for an answer (common practice); today each takes well under a second in
// the Release build except the probes (about 15 s, most of it meshing and solving 100 000 probe
// nodes on three refinement levels).
TEST_CASE("hostile input: 100000 outline points, materials or probes get their answer in time") {
  const std::string good = good_wall();
  std::string materials, probes;
  for (int i = 0; i < 100000; ++i) materials += "<material id=\"m" + std::to_string(i) + "\" conductivity=\"1\"/>";
  for (int i = 0; i < 100000; ++i)
    probes += "<probe name=\"p" + std::to_string(i) + "\" at=\"" + std::to_string(i % 300) + "," + std::to_string(i / 300 % 1000) + "\"/>";
  run_generated({
      // The crossing edge runs from (0, 1000) to (100, -5) through the zigzag: the message names it.
      {"a 100000-point outline that crosses itself", replaced(good, brick, zigzag_polygon(100000, 1.0, true)),
       {"", 2, {"crosses itself", "(100, -5) mm"}}, 10},
      // Zigzag corners 0.004 mm apart along the bottom: the 0.01 mm snapping (docs/detail-format.md,
      // Snapping) merges them and folds the outline, and the message must say that it did.
      {"a simple 100000-point outline with corners 0.004 mm apart", replaced(good, brick, zigzag_polygon(100000, 1.0, false)),
       {"", 2, {"points closer than 0.01 mm were snapped together", "first (0.004, 0) mm onto (0, 0) mm"}}, 10},
      {"100000 materials", replaced(good, "<materials>", "<materials>" + materials), {"", 0, {}}, 10},
      {"100000 materials, the last one repeating the first id",
       replaced(good, "<materials>", "<materials>" + materials + "<material id=\"m0\" conductivity=\"2\"/>"),
       {"", 2, {"material id \"m0\" is already used on line"}}, 10},
      {"100000 probes", replaced(good, "</boundaries>", "</boundaries><probes>" + probes + "</probes>"), {"", 0, {}}},
  });
}
