// Every bad input of the core gets one clear message naming file, line, object and coordinates,
// exit code 2, and no output file. Runs the real program.
#include <doctest/doctest.h>

#include <cstdio>
#include <cstdlib>
#include <filesystem>
#include <fstream>
#include <sstream>
#include <sys/wait.h>

#include "../support/run_program.h"
#include "../support/fixtures.h"
#include "../test_support.h"

namespace fs = std::filesystem;

namespace {

using Run = edgeflux::test::ProgramRun;
using edgeflux::test::run_program;
fs::path scratch_folder() { return edgeflux::test::scratch_folder("tests"); }

// A good two-layer wall; each case below breaks one thing in it.
const std::string good_body = edgeflux::test::two_layer_wall_body();

std::string replace(std::string text, const std::string& from, const std::string& to) {
  const auto at = text.find(from);
  REQUIRE_MESSAGE(at != std::string::npos, "test setup: text to replace not found: " << from);
  return text.replace(at, from.size(), to);
}

struct BadCase {
  const char* what;
  std::string text;                      // file content (empty: the file is missing)
  std::vector<std::string> fragments;    // all must appear in the message
};

}  // namespace

TEST_CASE("the good wall solves, exit 0, and writes its JSON") {
  const fs::path folder = scratch_folder();
  const fs::path input = folder / "good.xml", json = folder / "good.json";
  std::ofstream(input) << edgeflux::test::detail_xml(good_body);
  const Run run = run_program("solve -q " + input.string() + " --json " + json.string());
  CHECK(run.exit_code == 0);
  CHECK(fs::exists(json));
  fs::remove_all(folder);
}

TEST_CASE("bad input: one clear message, exit code 2, no output file") {
  const std::string good = edgeflux::test::detail_xml(good_body);
  const std::vector<BadCase> cases = {
      {"missing file", "", {"missing.xml", "cannot be opened"}},
      {"XML syntax error", replace(good, "</materials>", "</material>"), {":", "not well-formed XML"}},
      {"unknown material", replace(good, "material=\"eps\"", "material=\"xps\""),
       {":9:", "<rectangle name=\"insulation\">", "material \"xps\" is not defined", "brick, eps"}},
      {"polygon with two points", replace(good, "<rectangle name=\"brick\" material=\"brick\" from=\"0,0\" to=\"200,1000\"/>",
                                          "<polygon name=\"brick\" material=\"brick\" points=\"0,0 200,0\"/>"),
       {":8:", "region 'brick'", "2 points", "at least 3"}},
      {"self-intersecting polygon", replace(good, "<rectangle name=\"brick\" material=\"brick\" from=\"0,0\" to=\"200,1000\"/>",
                                            "<polygon name=\"brick\" material=\"brick\" points=\"0,0 200,1000 200,0 0,1000\"/>"),
       {":8:", "region 'brick'", "crosses itself", "(0, 0) mm", "(200, 1000) mm"}},
      {"odd coordinate count (unclosed pair)", replace(good, "from=\"0,0\" to=\"200,1000\"", "from=\"0,0\" to=\"200\""),
       {":8:", "odd number of coordinates"}},
      {"zero conductivity", replace(good, "conductivity=\"0.8\"", "conductivity=\"0\""),
       {":4:", "material id=\"brick\"", "not positive"}},
      {"negative conductivity", replace(good, "conductivity=\"0.8\"", "conductivity=\"-0.8\""),
       {":4:", "not positive"}},
      {"NaN conductivity", replace(good, "conductivity=\"0.8\"", "conductivity=\"nan\""),
       {":4:", "\"nan\"", "not a finite number"}},
      {"NaN coordinate", replace(good, "to=\"300,1000\"", "to=\"300,NaN\""), {":9:", "not a finite number"}},
      {"uncovered gap", replace(good, "<rectangle name=\"insulation\" material=\"eps\" from=\"200,0\" to=\"300,1000\"/>",
                                "<rectangle material=\"eps\" from=\"200,0\" to=\"300,400\"/>"
                                "<rectangle material=\"eps\" from=\"200,600\" to=\"300,1000\"/>"
                                "<rectangle material=\"eps\" from=\"200,400\" to=\"220,600\"/>"
                                "<rectangle material=\"eps\" from=\"280,400\" to=\"300,600\"/>"),
       {"covered by no region", "between (220, 400) mm and (280, 600) mm", "add a region"}},
      {"surface off the boundary", replace(good, "path=\"300,0 300,1000\"", "path=\"250,0 250,1000\""),
       {":17:", "surface 'outer face'", "(250, 0) mm", "does not lie on the outer boundary"}},
      {"no environment", replace(replace(good, "<environment id=\"in\" temperature=\"20\" side=\"interior\"/>", ""),
                                 "<environment id=\"out\" temperature=\"-5\" side=\"exterior\"/>", ""),
       {":16:", "environment \"in\" is not defined", "<environment id=\"in\""}},
      {"single environment", replace(good, "environment=\"out\"", "environment=\"in\""),
       {":12:", "environment 'in'", "only environment", "at least two environments"}},
      {"no temperature difference", replace(good, "temperature=\"-5\"", "temperature=\"20\""),
       {"all surfaces face environments at 20 °C", "different temperatures"}},
      {"cut-off away from the section", replace(good, "</boundaries>", "</boundaries><flanking-elements>"
                                              "<element id=\"wall\" cut-off=\"0,2000 300,2000\" length-internal=\"1000\"/></flanking-elements>"),
       {":18:", "flanking element 'wall'", "does not lie on the outline", "(0, 2000) mm", "1000.000 mm away"}},
      {"cut-off along a surface", replace(good, "</boundaries>", "</boundaries><flanking-elements>"
                                          "<element id=\"wall\" cut-off=\"0,0 0,1000\" length-internal=\"1000\"/></flanking-elements>"),
       {":18:", "flanking element 'wall'", "not adiabatic", "inner face"}},
      {"cut-off past the end of the boundary", replace(good, "</boundaries>", "</boundaries><flanking-elements>"
                                          "<element id=\"wall\" cut-off=\"0,0 400,0\" length-internal=\"1000\"/></flanking-elements>"),
       {":18:", "does not lie on the outline", "(400, 0) mm", "at (300, 0) mm"}},
      {"length missing for a requested system", replace(good, "</boundaries>", "</boundaries><flanking-elements dimension-systems=\"external\">"
                                          "<element id=\"wall\" cut-off=\"0,0 300,0\" length-internal=\"1000\"/></flanking-elements>"),
       {":18:", "flanking element 'wall'", "no external length", "length-external"}},
      {"relative humidity above 100 %", replace(good, "</boundaries>", "</boundaries><climate interior-temperature=\"20\" "
                                          "interior-humidity=\"120\" exterior-temperature=\"-5\"/>"),
       {":18:", "<climate>", "120 % is outside 0–100 %"}},
      {"climate with equal temperatures", replace(good, "</boundaries>", "</boundaries><climate interior-temperature=\"20\" "
                                          "interior-humidity=\"50\" exterior-temperature=\"20\"/>"),
       {":18:", "<climate>", "temperatures are equal"}},
  };
  const fs::path folder = scratch_folder();
  for (const BadCase& c : cases) {
    CAPTURE(c.what);
    const fs::path input = folder / (c.text.empty() ? "missing.xml" : "bad.xml");
    const fs::path json = folder / "out.json";
    if (!c.text.empty()) std::ofstream(input) << c.text;
    const Run run = run_program("solve -q " + input.string() + " --json " + json.string());
    CAPTURE(run.output);
    CHECK(run.exit_code == 2);
    CHECK_FALSE(fs::exists(json));
    for (const std::string& fragment : c.fragments) CHECK(run.output.find(fragment) != std::string::npos);
    // One message: a single line starting with the program's name.
    CHECK(std::count(run.output.begin(), run.output.end(), '\n') == 1);
    CHECK(run.output.rfind("edgeflux: error: ", 0) == 0);
    fs::remove(input);
  }
  fs::remove_all(folder);
}

TEST_CASE("command-line values: NaN and infinity refused, one parameter varied twice refused, an unknown command named") {
  const std::string detail = "'" + edgeflux::test::source_path("examples/intermediate-floor.xml") + "'";
  for (const std::string& option : {"--target nan", "--target inf", "--psi-target nan", "--temperature-target -nan",
                                    "--density nan", "--density inf"}) {
    CAPTURE(option);
    const Run run = run_program("solve -q " + detail + " " + option);
    CHECK(run.exit_code == 1);  // a usage error
    CHECK(run.output.find("is not a finite number") != std::string::npos);
  }
  const std::string sweep = "'" + edgeflux::test::source_path("details/balcony-slab-connector.xml") + "'";
  Run run = run_program("sweep -q " + sweep + " --vary lambda_connector=0.1:0.2:2 --vary lambda_connector=0.3:0.4:2");
  CHECK(run.exit_code == 2);
  CHECK(run.output.find("varies lambda_connector a second time") != std::string::npos);
  run = run_program("solve -q " + sweep + " --set lambda_connector=0.1 --set lambda_connector=0.2");
  CHECK(run.exit_code == 2);
  CHECK(run.output.find("sets 'lambda_connector' a second time") != std::string::npos);
  run = run_program("slove " + detail);
  CHECK(run.exit_code == 1);
  CHECK(run.output.find("\"slove\" is not a command; the commands are solve") != std::string::npos);
}

TEST_CASE("a huge value in the input is quoted shortened: the message stays one readable line") {
  const fs::path folder = scratch_folder();
  const fs::path input = folder / "huge.xml";
  std::ofstream(input) << edgeflux::test::detail_xml(
      replace(good_body, "conductivity=\"0.8\"", "conductivity=\"" + std::string(1'000'000, '7') + "x\""));
  const Run run = run_program("solve -q '" + input.string() + "'");
  CHECK(run.exit_code == 2);
  CHECK(run.output.size() < 1200);  // common practice: a message a terminal shows in a few lines
  CHECK(run.output.find("characters left out") != std::string::npos);
  CHECK(run.output.find("huge.xml:4:") != std::string::npos);
  // A huge reference to a material: the fix that names it is shortened too.
  std::ofstream(input) << edgeflux::test::detail_xml(
      replace(good_body, "material=\"brick\" from", "material=\"" + std::string(1'000'000, 'b') + "\" from"));
  const Run reference = run_program("solve -q '" + input.string() + "'");
  CHECK(reference.exit_code == 2);
  CHECK(reference.output.size() < 1200);
  // Each quotation of the value keeps at most ~200 of its characters (common practice: a value
  // recognisable by its start and end, not a screenful).
  CHECK(reference.output.find(std::string(201, 'b')) == std::string::npos);
  CHECK(run.output.find(std::string(201, '7')) == std::string::npos);
  fs::remove(input);
}

TEST_CASE("a folder given as the detail file gets its own message") {
  const Run run = run_program("solve -q '" + scratch_folder().string() + "'");
  CHECK(run.exit_code == 2);
  CHECK(run.output.find("detail file: is a folder") != std::string::npos);
}

TEST_CASE("with fixed temperatures on every interior surface, the summary says why there is no θsi,min") {
  const fs::path input = scratch_folder() / "fixed.xml";
  std::ofstream(input) << edgeflux::test::detail_xml(replace(replace(good_body, "resistance=\"rsi-horizontal\"", "resistance=\"0\""),
                                                             "resistance=\"rse\"", "resistance=\"0\""));
  const Run run = run_program("solve -q '" + input.string() + "'");
  CHECK(run.exit_code == 0);
  CHECK(run.output.find("every surface facing the interior is a fixed temperature") != std::string::npos);
  CHECK(run.output.find("mark the room environment") == std::string::npos);  // it is marked
  fs::remove(input);
}
