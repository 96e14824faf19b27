// The files `edgeflux solve` writes besides JSON: VTU read back by an independent reader (meshio),
// the interior-surface CSV, SVG and PNG drawings; and bad output paths. Runs the real program.
#include <doctest/doctest.h>

#include <nlohmann/json.hpp>

#include <cmath>
#include <filesystem>
#include <sstream>

#include "../test_support.h"
#include "report/field_quantities.h"
#include "solver/error_indicator.h"
#include "report_test_support.h"

namespace fs = std::filesystem;
using namespace edgeflux;
using namespace edgeflux::test;

namespace {

std::vector<std::string> split(const std::string& line, char sep) {
  std::vector<std::string> out;
  std::string field;
  std::istringstream s(line);
  while (std::getline(s, field, sep)) out.push_back(field);
  return out;
}

}  // namespace

TEST_CASE("the VTU file reads back in meshio with the solver's mesh, temperatures, materials and flux") {
  const fs::path folder = scratch_folder("vtu");
  const fs::path vtu = folder / "floor.vtu";
  const std::string input = source_path("examples/intermediate-floor.xml");
  const ProgramRun run = run_edgeflux("solve -q " + shell_quoted(input) + " --vtu " + shell_quoted(vtu));
  INFO(run.output);
  REQUIRE(run.exit_code == 0);

  const ProgramRun read = run_command(std::string(debian_python) + " " + shell_quoted(source_path("tests/report/read_vtu.py")) + " " + shell_quoted(vtu));
  INFO("reader output: " << read.output.substr(0, 2000));
  REQUIRE_MESSAGE(read.exit_code == 0, "the independent VTU reader (meshio, Debian python3-meshio) failed");
  const auto vtk = nlohmann::json::parse(read.output);

  // The same calculation in this process is the reference (the solver is deterministic).
  const Calculation calc = solve_file("examples/intermediate-floor.xml");
  REQUIRE(vtk["points"].size() == calc.mesh.points.size());
  REQUIRE(vtk["triangles"].size() == calc.mesh.triangles.size());
  for (std::size_t i = 0; i < calc.mesh.points.size(); ++i) {
    CHECK(std::abs(vtk["points"][i][0].get<double>() - calc.mesh.points[i].x) < 1e-12);
    CHECK(std::abs(vtk["points"][i][1].get<double>() - calc.mesh.points[i].y) < 1e-12);
    CHECK(vtk["points"][i][2].get<double>() == 0.0);
  }
  for (std::size_t t = 0; t < calc.mesh.triangles.size(); ++t)
    for (int k = 0; k < 3; ++k) CHECK(vtk["triangles"][t][k].get<int>() == calc.mesh.triangles[t][k]);
  // Temperatures to 1e-9 K (the brief's tolerance; the file holds 17 significant digits).
  const auto& heat_loss = vtk["point_data"]["temperature_heat_loss_run_c"];
  const auto& surface_run = vtk["point_data"]["temperature_surface_run_c"];
  REQUIRE(heat_loss.size() == calc.heat_loss.temperature.size());
  REQUIRE(surface_run.size() == calc.surface_temperature.temperature.size());
  for (std::size_t i = 0; i < calc.heat_loss.temperature.size(); ++i) {
    CHECK(std::abs(heat_loss[i].get<double>() - calc.heat_loss.temperature[i]) < 1e-9);
    CHECK(std::abs(surface_run[i].get<double>() - calc.surface_temperature.temperature[i]) < 1e-9);
  }
  // The two runs differ (interior Rsi 0.25 instead of 0.10–0.17), so the file does not repeat one.
  double largest_difference = 0;
  for (std::size_t i = 0; i < heat_loss.size(); ++i)
    largest_difference = std::max(largest_difference, std::abs(heat_loss[i].get<double>() - surface_run[i].get<double>()));
  CHECK(largest_difference > 0.1);

  const auto flux = triangle_heat_flux(calc.mesh, calc.heat_loss.problem.triangle_conductivity, calc.heat_loss.temperature);
  const auto& material = vtk["cell_data"]["material_id"];
  const auto& q = vtk["cell_data"]["heat_flux_w_per_m2"];
  REQUIRE(material.size() == calc.mesh.triangles.size());
  REQUIRE(q.size() == calc.mesh.triangles.size());
  for (std::size_t t = 0; t < calc.mesh.triangles.size(); ++t) {
    CHECK(material[t].get<int>() == calc.mesh.triangle_material[t]);
    REQUIRE(q[t].size() == 3);
    CHECK(std::abs(q[t][0].get<double>() - flux[t].x) < 1e-9 * std::max(1.0, std::abs(flux[t].x)));
    CHECK(std::abs(q[t][1].get<double>() - flux[t].y) < 1e-9 * std::max(1.0, std::abs(flux[t].y)));
    CHECK(q[t][2].get<double>() == 0.0);
  }
  fs::remove_all(folder);
}

TEST_CASE("the surface CSV lists the interior surface nodes of the surface-temperature run") {
  const fs::path folder = scratch_folder("csv");
  const fs::path csv = folder / "surface.csv", json = folder / "results.json";
  const std::string input = source_path("examples/intermediate-floor.xml");
  const ProgramRun run = run_edgeflux("solve -q " + shell_quoted(input) + " --surface-csv " + shell_quoted(csv) + " --json " + shell_quoted(json));
  INFO(run.output);
  REQUIRE(run.exit_code == 0);
  std::istringstream lines(read_text(csv));
  std::string line;
  std::getline(lines, line);
  CHECK(line == "distance_m,x_m,y_m,temperature_c,environment,surface");

  const CrossSection section = read_detail_file(input);
  const Calculation calc = calculate(section, {});
  const auto walk = interior_surface_walk(section, calc.mesh);
  std::size_t row = 0;
  double coldest = 1e300;
  while (std::getline(lines, line)) {
    const auto f = split(line, ',');
    REQUIRE(f.size() == 6);
    REQUIRE(row < walk.size());
    const SurfaceSample& s = walk[row];
    CHECK(std::stod(f[0]) == doctest::Approx(s.distance).epsilon(1e-15));
    CHECK(std::abs(std::stod(f[1]) - s.at.x) < 1e-12);
    CHECK(std::abs(std::stod(f[2]) - s.at.y) < 1e-12);
    CHECK(std::abs(std::stod(f[3]) - calc.surface_temperature.temperature[s.node]) < 1e-9);
    CHECK(f[4] == "rooms");
    CHECK(f[5] == section.surfaces[s.surface].name);
    coldest = std::min(coldest, std::stod(f[3]));
    ++row;
  }
  CHECK(row == walk.size());
  // The coldest row is θsi,min of the JSON results (same run, same nodes).
  const auto results = nlohmann::json::parse(read_text(json));
  CHECK(std::abs(coldest - results["min_interior_surface"]["temperature_c"].get<double>()) < 1e-9);
  fs::remove_all(folder);
}

TEST_CASE("SVG and PNG drawings: one of each per figure, well-formed, with real pixels") {
  const fs::path folder = scratch_folder("drawings");
  const fs::path svg = folder / "svg", png = folder / "png";  // neither exists yet: both are created
  const std::string input = source_path("examples/garage-partition.xml");
  const ProgramRun run = run_edgeflux("solve -q " + shell_quoted(input) + " --svg-dir " + shell_quoted(svg) + " --png-dir " + shell_quoted(png));
  INFO(run.output);
  REQUIRE(run.exit_code == 0);
  for (const char* name : {"detail", "mesh", "temperature", "heat-flux", "surface-temperature"}) {
    CAPTURE(name);
    const std::string text = read_text(svg / (std::string(name) + ".svg"));
    CHECK(text.rfind("<?xml", 0) == 0);
    CHECK(text.find("xmlns=\"http://www.w3.org/2000/svg\"") != std::string::npos);
    // Well-formed XML by an independent parser (Python's expat).
    const ProgramRun parse = run_command(std::string(debian_python) + " -c 'import sys, xml.dom.minidom; xml.dom.minidom.parse(sys.argv[1])' " +
                                         shell_quoted(svg / (std::string(name) + ".svg")));
    CHECK_MESSAGE(parse.exit_code == 0, parse.output);
    // PNG signature and an IHDR with a non-zero size (PNG specification §5.2, §11.2.2).
    const std::string bytes = read_text(png / (std::string(name) + ".png"));
    REQUIRE(bytes.size() > 33);
    CHECK(bytes.substr(0, 8) == std::string("\x89PNG\r\n\x1a\n", 8));
    CHECK(bytes.substr(12, 4) == "IHDR");
    auto be32 = [&](std::size_t at) {
      return (std::uint32_t(std::uint8_t(bytes[at])) << 24) | (std::uint32_t(std::uint8_t(bytes[at + 1])) << 16) |
             (std::uint32_t(std::uint8_t(bytes[at + 2])) << 8) | std::uint32_t(std::uint8_t(bytes[at + 3]));
    };
    CHECK(be32(16) > 100);  // width, px
    CHECK(be32(20) > 100);  // height, px
  }
  fs::remove_all(folder);
}

TEST_CASE("bad output paths: exit code 2, one message, and no file written at all") {
  const fs::path folder = scratch_folder("bad-paths");
  const std::string input = shell_quoted(source_path("examples/intermediate-floor.xml"));
  const fs::path json = folder / "results.json", csv = folder / "surface.csv";
  struct Case { const char* what; std::string arguments; std::string fragment; };
  const std::vector<Case> cases = {
      {"report in a missing folder", "--report " + shell_quoted(folder / "missing" / "r.html"), "does not exist"},
      {"VTU onto a folder", "--vtu " + shell_quoted(folder), "is a folder"},
      {"SVG folder two levels deep", "--svg-dir " + shell_quoted(folder / "a" / "b"), "does not exist"},
      {"CSV in a missing folder", "--surface-csv " + shell_quoted(folder / "nope" / "s.csv"), "does not exist"},
  };
  for (const Case& c : cases) {
    CAPTURE(c.what);
    // Good JSON and CSV paths alongside: they must not be written either.
    const bool csv_is_good = c.arguments.find("--surface-csv") == std::string::npos;
    const ProgramRun run = run_edgeflux("solve -q " + input + " --json " + shell_quoted(json) + " " + c.arguments +
                                        (csv_is_good ? " --surface-csv " + shell_quoted(csv) : std::string()));
    CAPTURE(run.output);
    CHECK(run.exit_code == 2);
    CHECK(run.output.rfind("edgeflux: error: ", 0) == 0);
    CHECK(run.output.find(c.fragment) != std::string::npos);
    CHECK(std::count(run.output.begin(), run.output.end(), '\n') == 1);
    // Nothing at all in the folder, not even a temporary file.
    CHECK(fs::is_empty(folder));
  }
  fs::remove_all(folder);
}
