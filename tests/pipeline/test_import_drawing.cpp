// `edgeflux import`: the layers of a drawing, the regions its mapping makes, the outline's runs
// between corners as candidate surfaces, and a starting detail file that solves once the user has
// filled in λ and picked the surfaces.
#include <doctest/doctest.h>

#include <algorithm>
#include <cmath>
#include <fstream>
#include <regex>

#include "../support/run_program.h"
#include "../test_support.h"
#include "core/error.h"
#include "pipeline/import_drawing.h"
#include "report/import_files.h"
#include "report/import_picture.h"

using namespace edgeflux;
namespace fs = std::filesystem;

namespace {

std::string drawing(const std::string& name) { return test::source_path("tests/data/drawings/" + name); }

/// What a user does with the starting detail: λ for each "?" material, and the runs given in
/// `surfaces` (run number → environment and resistance) uncommented.
std::string filled_in(std::string xml, const std::map<std::string, std::string>& conductivity,
                      const std::map<int, std::pair<std::string, std::string>>& surfaces) {
  for (const auto& [id, lambda] : conductivity) {
    const std::string from = "<material id=\"" + id + "\" conductivity=\"?\" source=\"?\"/>";
    REQUIRE_MESSAGE(xml.find(from) != std::string::npos, "no placeholder for " << id);
    xml.replace(xml.find(from), from.size(), "<material id=\"" + id + "\" conductivity=\"" + lambda + "\" source=\"test\"/>");
  }
  for (const auto& [run, how] : surfaces) {
    const std::string from = "<!-- <surface name=\"S" + std::to_string(run) + "\" environment=\"?\" resistance=\"?\"";
    const auto at = xml.find(from);
    REQUIRE_MESSAGE(at != std::string::npos, "no candidate S" << run);
    const auto end = xml.find("/> -->", at);
    std::string line = xml.substr(at + 5, end + 2 - at - 5);
    line.replace(line.find("environment=\"?\""), 15, "environment=\"" + how.first + "\"");
    line.replace(line.find("resistance=\"?\""), 14, "resistance=\"" + how.second + "\"");
    xml.replace(at, end + 6 - at, line);
  }
  return xml;
}

}  // namespace

TEST_CASE("import of the turned floor drawing: layers, regions, and the eight runs of its outline with their "
          "lengths (exact geometry of the drawing, to its 0.001 mm rounding and the 0.01 mm grid)") {
  const DrawingImport import = import_drawing(drawing("turned-floor.dxf"), {});
  // Without a mapping every layer with closed outlines is a material named after it.
  CHECK(import.materials.size() == 7);
  CHECK(import.section.regions.size() == 9);
  CHECK(import.mapped_layers.size() == 7);
  REQUIRE(import.runs.size() == 8);
  // The demo's outline (examples/intermediate-floor.xml): outside face, lower cut-off, lower wall
  // face, ceiling, slab cut-off, floor, upper wall face, upper cut-off.
  const double lengths[] = {2680, 340, 1200, 1160, 280, 1160, 1200, 340};
  double total = 0.0;
  for (std::size_t k = 0; k < 8; ++k) {
    CAPTURE(k);
    CHECK(std::abs(import.runs[k].length * 1000.0 - lengths[k]) < 0.02);
    CHECK(import.runs[k].points.size() == 2);  // straight: only its ends after grid rounding
    CHECK(!import.runs[k].closed);
    total += import.runs[k].length;
  }
  CHECK(total == doctest::Approx(2 * (1.5 + 2.68)).epsilon(1e-5));  // the perimeter, exact
  // Consecutive runs meet: the end of one is the start of the next.
  for (std::size_t k = 0; k < 8; ++k)
    CHECK(distance(import.runs[k].points.back(), import.runs[(k + 1) % 8].points.front()) == 0.0);
  // Every region has a label point inside its outline's box.
  for (std::size_t r = 0; r < import.section.regions.size(); ++r) {
    const auto& outline = import.section.regions[r].outline;
    double x0 = 1e9, x1 = -1e9;
    for (Point p : outline) x0 = std::min(x0, p.x), x1 = std::max(x1, p.x);
    CHECK(import.region_labels[r].x > x0);
    CHECK(import.region_labels[r].x < x1);
  }
}

TEST_CASE("the starting detail, with λ filled in and the surfaces picked by number, solves to the demo's results") {
  const DrawingImport import = import_drawing(
      drawing("turned-floor.dxf"),
      {{"RENDER=render", "EPS=eps", "MASONRY=calcium-silicate-1800", "PLASTER=plaster", "SLAB=concrete:reinforced-concrete-2pct",
        "IMPACT=impact", "SCREED=screed:screed-cement"},
       std::nullopt});
  REQUIRE(import.materials.size() == 7);
  CHECK(import.materials[2].library != nullptr);
  CHECK(import.materials[2].library->conductivity == 0.99);  // materials/library.xml entry, as the demo's λ
  CHECK(import.materials[0].library == nullptr);
  const std::string detail_path = drawing("imported.xml");
  const std::string xml = starting_detail_xml(import, drawing("turned-floor.dxf"), detail_path, "");
  CHECK(xml.find("<drawing file=\"turned-floor.dxf\" units=\"mm\">") != std::string::npos);
  CHECK(xml.find("<material id=\"concrete\" library=\"reinforced-concrete-2pct\"/>") != std::string::npos);
  // As written, the detail is refused for its first "?" with how to fix it.
  try {
    parse_detail_text(xml, detail_path);
    FAIL("a starting detail with λ still to fill in was accepted");
  } catch (const InputError& e) {
    CHECK(std::string(e.what()).find("has no conductivity yet") != std::string::npos);
  }
  // λ as in examples/intermediate-floor.xml; runs S1 outside, S3/S7 walls, S4 ceiling, S6 floor.
  const std::string user = filled_in(xml, {{"render", "1.0"}, {"eps", "0.035"}, {"plaster", "0.80"}, {"impact", "0.035"}},
                                     {{1, {"outside", "rse"}},
                                      {3, {"inside", "rsi-horizontal"}},
                                      {4, {"inside", "rsi-upward"}},
                                      {6, {"inside", "rsi-downward"}},
                                      {7, {"inside", "rsi-horizontal"}}});
  const Calculation imported = calculate(parse_detail_text(user, detail_path), {});
  const Calculation typed = test::solve_file("examples/intermediate-floor.xml");
  const ErrorEstimate a = *imported.convergence.coupling_2d, b = *typed.convergence.coupling_2d;
  // Two estimates of one value agree within their error bars, each at least the target (common practice).
  const double floor = typed.convergence.target.coupling_relative * b.value;
  CHECK(std::abs(a.value - b.value) <= std::max(a.error, floor) + std::max(b.error, floor));
  CHECK(std::abs(*imported.junction.temperature_factor - *typed.junction.temperature_factor) < 1e-3);
}

TEST_CASE("import of the drawing kit: its outer outline is four runs, and the picture numbers every region and run") {
  const DrawingImport import = import_drawing(drawing("kit.dxf"), {});
  CHECK(import.section.regions.size() == 13);
  REQUIRE(import.runs.size() == 4);
  const double lengths[] = {400, 1000, 400, 1000};  // the 400 × 1000 mm wall, exact
  for (std::size_t k = 0; k < 4; ++k) CHECK(import.runs[k].length * 1000.0 == doctest::Approx(lengths[k]).epsilon(1e-9));
  const std::string svg = import_picture_svg(import);
  for (std::size_t r = 1; r <= 13; ++r) CHECK(svg.find(">R" + std::to_string(r) + "<") != std::string::npos);
  for (std::size_t k = 1; k <= 4; ++k) CHECK(svg.find(">S" + std::to_string(k) + "<") != std::string::npos);
  CHECK(svg.find(">R14<") == std::string::npos);
  const std::string summary = import_summary_text(import);
  CHECK(summary.find("1 TEXT") != std::string::npos);
  CHECK(summary.find("FACE-IN") != std::string::npos);
  // The open lines of the face layers are offered as drawing-layer surfaces.
  const std::string xml = starting_detail_xml(import, drawing("kit.dxf"), drawing("kit-imported.xml"), "");
  CHECK(xml.find("drawing-layer=\"FACE-IN\"") != std::string::npos);
}

TEST_CASE("a circle alone is one closed run; a mapping that is wrong is refused with the fix") {
  const DrawingImport import = import_drawing(drawing("kit.dxf"), {{"STEEL=steel"}, std::nullopt});
  // The three steel outlines are apart: the plate, the duct (a rounded square) and the anchor circle.
  REQUIRE(import.runs.size() >= 3);
  const auto closed = std::count_if(import.runs.begin(), import.runs.end(), [](const OutlineRun& r) { return r.closed; });
  CHECK(closed == 1);  // the circle: no corner anywhere
  for (const OutlineRun& r : import.runs)
    if (r.closed) CHECK(r.length == doctest::Approx(2 * M_PI * 0.02).epsilon(1e-3));  // its circumference, chorded
  auto error = [](const std::vector<std::string>& mappings, std::optional<std::string> unit = std::nullopt) {
    try {
      import_drawing(drawing("kit.dxf"), {mappings, unit});
    } catch (const InputError& e) {
      return std::string(e.what());
    }
    return std::string();
  };
  CHECK(error({"STEEL"}).find("is not of the form LAYER=MATERIAL") != std::string::npos);
  CHECK(error({"STEEL=steel:unobtainium"}).find("not in the material library") != std::string::npos);
  CHECK(error({"BRICKS=masonry"}).find("has no layer \"BRICKS\"") != std::string::npos);
  CHECK(error({"STEEL=a", "STEEL=b"}).find("a second time") != std::string::npos);
  CHECK(error({"FACE-IN=x"}).find("do not close into an outline") != std::string::npos);
}

TEST_CASE("edgeflux import on the command line: writes the detail and the picture, or nothing and exit 2") {
  const fs::path folder = test::scratch_folder("import");
  const fs::path detail = folder / "floor.xml", picture = folder / "floor.svg";
  fs::remove(detail), fs::remove(picture);
  const auto ok = test::run_program("import '" + drawing("turned-floor.dxf") + "' -o '" + detail.string() + "' --picture '" +
                                    picture.string() + "'");
  CHECK(ok.exit_code == 0);
  CHECK(ok.output.find("Candidate surfaces: 8 runs") != std::string::npos);
  CHECK(fs::exists(detail));
  CHECK(fs::exists(picture));
  fs::remove(detail), fs::remove(picture);
  const auto bad = test::run_program("import '" + drawing("turned-floor.dxf") + "' --map NOPE=x -o '" + detail.string() +
                                     "' --picture '" + picture.string() + "'");
  CHECK(bad.exit_code == 2);
  CHECK(bad.output.find("has no layer \"NOPE\"") != std::string::npos);
  CHECK(!fs::exists(detail));
  CHECK(!fs::exists(picture));
  const auto help = test::run_program("import --help");
  CHECK(help.exit_code == 0);
  CHECK(help.output.find("--map") != std::string::npos);
  fs::remove_all(folder);
}
