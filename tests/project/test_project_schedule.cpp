// The project schedule: a building's junctions solved together, ψ in the energy method's
// dimension system, ψ·l and H_TB = Σ ψk·lk (ISO 14683), with the same message rules as detail files.
#include <doctest/doctest.h>

#include <filesystem>
#include <cmath>
#include <fstream>
#include <sstream>

#include "../support/run_program.h"
#include "../test_support.h"
#include "project/read_project_file.h"
#include "project/run_project.h"
#include "report/schedule_files.h"

using namespace edgeflux;
namespace fs = std::filesystem;

namespace {

std::string message_of(const std::string& text) {
  try {
    parse_project_text(text, test::source_path("examples/p.xml"));
  } catch (const InputError& e) {
    return e.what();
  }
  return "";
}

std::string project(const std::string& junctions, const std::string& method = "<energy-method dimensions=\"external\"/>") {
  return "<edgeflux-project format=\"1\">\n" + method + "\n" + junctions + "\n</edgeflux-project>\n";
}

const std::string floor_junction =
    R"(<junction reference="J01" detail="../details/intermediate-floor-external-insulation.xml"><length metres="10"/></junction>)";

}  // namespace

TEST_CASE("H_TB is the sum of ψ·l over the junctions, ΔU_TB = H_TB / A (ISO 14683 definition; exact arithmetic)") {
  Schedule s;
  s.project.envelope_area = 200.0;
  auto row = [](double psi, std::vector<double> lengths, std::optional<double> assumed) {
    ScheduleRow r;
    r.psi = psi;
    r.psi_error = 0.001;
    for (double l : lengths) r.junction.lengths.push_back({l, ""});
    r.junction.assumed_psi = assumed;
    return r;
  };
  s.rows = {row(0.10, {10.0, 2.5}, 0.05), row(-0.05, {20.0}, std::nullopt), row(0.20, {4.0}, 0.25)};
  ScheduleRow failed;
  failed.junction.lengths.push_back({7.0, ""});
  failed.error = "no ψ";
  s.rows.push_back(failed);
  sum_schedule(s);
  CHECK(s.rows[0].length == 12.5);
  CHECK(*s.rows[0].psi_length == doctest::Approx(1.25).epsilon(1e-15));
  // 0.10·12.5 − 0.05·20 + 0.20·4 = 1.25 − 1.0 + 0.8 = 1.05 W/K; the failed junction is left out and counted.
  CHECK(s.heat_transfer_coefficient == doctest::Approx(1.05).epsilon(1e-14));
  CHECK(*s.u_surcharge == doctest::Approx(1.05 / 200.0).epsilon(1e-14));
  CHECK(s.heat_transfer_coefficient_error == doctest::Approx(0.001 * (12.5 + 20 + 4)).epsilon(1e-14));
  CHECK(s.failed == 1);
  CHECK(s.rows[0].exceeds_assumed);        // 0.10 > 0.05
  CHECK_FALSE(s.rows[2].exceeds_assumed);  // 0.20 ≤ 0.25
  const std::string text = schedule_text(s);
  CHECK(text.find("H_TB = Σ ψ·l = 1.050 W/K") != std::string::npos);
  CHECK(text.find("INCOMPLETE") != std::string::npos);
}

TEST_CASE("bad project input gets one message with file, line, object and fix") {
  CHECK(message_of(project(R"(<junction reference="J01" detail="nowhere.xml"><length metres="3"/></junction>)")).find("does not exist") !=
        std::string::npos);
  CHECK(message_of(project(R"(<junction reference="J01" detail="../details/parapet.xml"><length metres="0"/></junction>)"))
            .find("p.xml:3: <junction reference=\"J01\">: a length of 0 m") != std::string::npos);
  CHECK(message_of(project(R"(<junction reference="J01" detail="../details/parapet.xml"/>)")).find("has no <length>") != std::string::npos);
  CHECK(message_of(project(floor_junction + floor_junction)).find("this reference is already used") != std::string::npos);
  CHECK(message_of(project(R"(<junction reference="J01" detail="../details/parapet.xml"><length metres="3"/><assumed psi="0.1"/></junction>)"))
            .find("assumed ψ without its source") != std::string::npos);
  CHECK(message_of(project(floor_junction, "")).find("has no <energy-method") != std::string::npos);
  CHECK(message_of(project(floor_junction, "<energy-method dimensions=\"outside\"/>")).find("\"outside\" is not known") != std::string::npos);
  CHECK(message_of(project(floor_junction + "<junktion/>")).find("<junktion>: this element is not part of the project format") !=
        std::string::npos);
}

TEST_CASE("a project runs every junction; one that fails is a row with its reason and the others complete") {
  const fs::path folder = test::scratch_folder("project");
  const fs::path file = folder / "p.xml";
  const std::string details = test::source_path("details");
  std::ofstream(file) << project(
      "<junction reference=\"J01\" detail=\"" + details + "/intermediate-floor-external-insulation.xml\"><length metres=\"10\"/>"
      "<assumed psi=\"0.001\" source=\"test value\"/></junction>\n"
      "<junction reference=\"J02\" detail=\"" + details + "/balcony-slab-connector.xml\"><set name=\"no_such_parameter\" value=\"1\"/>"
      "<length metres=\"4\"/></junction>\n"
      "<junction reference=\"J03\" detail=\"" + details + "/window-reveal.xml\"><length metres=\"5\"/></junction>",
      "<energy-method dimensions=\"overall-internal\" envelope-area=\"100\"/>");
  const Schedule s = run_project(read_project_file(file.string()), {}, 2);
  REQUIRE(s.rows.size() == 3);
  REQUIRE(s.rows[0].psi);
  CHECK(s.rows[0].exceeds_assumed);
  CHECK(s.rows[1].error.find("no_such_parameter") != std::string::npos);
  // The window reveal gives ψ in internal and external dimensions only.
  CHECK(s.rows[2].error.find("not in the project's overall-internal") != std::string::npos);
  CHECK(s.failed == 2);
  CHECK(s.heat_transfer_coefficient == doctest::Approx(*s.rows[0].psi * 10.0).epsilon(1e-14));
  // The command prints the schedule, writes the files, and ends with exit 2 for the failed junctions.
  const auto run = test::run_program("project -q '" + file.string() + "' --json '" + (folder / "s.json").string() + "'");
  CHECK(run.exit_code == 2);
  CHECK(run.output.find("NOT CALCULATED") != std::string::npos);
  CHECK(fs::exists(folder / "s.json"));
  fs::remove_all(folder);
}

TEST_CASE("the example project: H_TB checked by hand from the printed ψ and lengths, and the balcony exceeds its assumed ψ") {
  const Schedule s = run_project(read_project_file(test::source_path("examples/project-house.xml")), {}, 2);
  REQUIRE(s.failed == 0);
  REQUIRE(s.rows.size() == 9);
  const ScheduleRow& balcony = s.rows[6];
  CHECK(balcony.junction.reference == "J07");
  CHECK(balcony.exceeds_assumed);
  // Solved with the project's connector λ, not the detail's default.
  CHECK(balcony.result.parameters.at("lambda_connector") == 0.12);
  // Read the printed schedule as a checker would: ψ (3 decimals) × length (2 decimals) gives each
  // printed ψ·l (3 decimals), and the printed ψ·l add up to the printed H_TB — each within the
  // rounding of the printed digits (exact arithmetic on half a unit of each last digit).
  const std::string text = schedule_text(s);
  std::istringstream lines(text);
  double sum_printed = 0;
  int rows = 0;
  for (std::string line; std::getline(lines, line);) {
    if (line.rfind("  J", 0) != 0) continue;
    std::istringstream fields(line.substr(line.find_first_of("0123456789-", 2 + s.rows[0].junction.reference.size() + 2 + 40)));
    double psi = 0, length = 0, psi_l = 0;
    fields >> psi >> length >> psi_l;
    CAPTURE(line);
    CHECK(std::abs(psi * length - psi_l) <= 0.0005 * length + 0.005 * std::abs(psi) + 0.0005 + 1e-12);
    sum_printed += psi_l;
    ++rows;
  }
  CHECK(rows == 9);
  const std::size_t at = text.find("H_TB = Σ ψ·l = ");
  REQUIRE(at != std::string::npos);
  const double h_tb = std::stod(text.substr(at + std::string("H_TB = Σ ψ·l = ").size()));
  CHECK(std::abs(sum_printed - h_tb) <= 9 * 0.0005 + 0.0005 + 1e-12);
  const std::string csv = schedule_csv(s);
  CHECK(csv.rfind("reference,description,detail,psi_external_w_per_mk", 0) == 0);
}

TEST_CASE("results are cached by their inputs: a re-run reads them back unchanged, and a junction edited in between is the only one solved again") {
  const fs::path folder = test::scratch_folder("project-cache");
  fs::remove_all(folder);
  fs::create_directories(folder);
  for (const char* name : {"intermediate-floor-external-insulation.xml", "external-wall-corner.xml"})
    fs::copy_file(test::source_path(std::string("details/") + name), folder / name);
  const fs::path file = folder / "p.xml";
  std::ofstream(file) << project(
      R"(<junction reference="J01" detail="intermediate-floor-external-insulation.xml"><length metres="10"/></junction>
         <junction reference="J02" detail="external-wall-corner.xml"><length metres="6"/></junction>)");
  const std::string cache = (folder / "cache").string();
  const Schedule first = run_project(read_project_file(file.string()), {}, 1, {}, cache);
  CHECK_FALSE(first.rows[0].from_cache);
  CHECK_FALSE(first.rows[1].from_cache);
  const Schedule second = run_project(read_project_file(file.string()), {}, 1, {}, cache);
  CHECK(second.rows[0].from_cache);
  CHECK(second.rows[1].from_cache);
  CHECK(second.heat_transfer_coefficient == first.heat_transfer_coefficient);  // bit-identical through the cache
  CHECK(second.rows[1].result.verdicts.size() == first.rows[1].result.verdicts.size());
  // Edit the corner's detail file (a comment is enough: the key is its bytes): only J02 is solved again.
  const fs::path corner = folder / "external-wall-corner.xml";
  std::ifstream in(corner);
  std::string text((std::istreambuf_iterator<char>(in)), std::istreambuf_iterator<char>());
  in.close();
  const std::size_t at = text.find("<parameter name=\"");
  REQUIRE(at != std::string::npos);
  text.insert(at, "<!-- edited -->\n    ");
  std::ofstream(corner) << text;
  const Schedule third = run_project(read_project_file(file.string()), {}, 1, {}, cache);
  CHECK(third.rows[0].from_cache);
  CHECK_FALSE(third.rows[1].from_cache);
  // A damaged entry is a miss, not an error.
  for (const auto& entry : fs::directory_iterator(cache)) std::ofstream(entry.path()) << "{ damaged";
  const Schedule fourth = run_project(read_project_file(file.string()), {}, 1, {}, cache);
  CHECK_FALSE(fourth.rows[0].from_cache);
  CHECK(fourth.heat_transfer_coefficient == first.heat_transfer_coefficient);
  fs::remove_all(folder);
}

TEST_CASE("the hand-in set: the schedule page links every junction's report, each a junction sheet of its own") {
  const fs::path folder = test::scratch_folder("project-hand-in");
  fs::remove_all(folder);
  fs::create_directories(folder);
  const fs::path file = folder / "p.xml";
  const std::string details = test::source_path("details");
  std::ofstream(file) << project("<junction reference=\"J/1\" description=\"floor\" detail=\"" + details +
                                 "/intermediate-floor-external-insulation.xml\"><length metres=\"10\"/></junction>\n"
                                 "<junction reference=\"J02\" description=\"corner\" detail=\"" + details +
                                 "/external-wall-corner.xml\"><length metres=\"6\"/></junction>");
  const auto run = test::run_program("project -q --no-cache '" + file.string() + "' --hand-in '" + (folder / "set").string() + "'");
  REQUIRE(run.exit_code == 0);
  std::ifstream in(folder / "set" / "index.html");
  const std::string index((std::istreambuf_iterator<char>(in)), std::istreambuf_iterator<char>());
  for (const char* report : {"J_1.html", "J02.html"}) {
    CAPTURE(report);
    CHECK(index.find(std::string("href=\"") + report + "\"") != std::string::npos);
    std::ifstream r(folder / "set" / report);
    const std::string html((std::istreambuf_iterator<char>(r)), std::istreambuf_iterator<char>());
    CHECK(html.find("id=\"sheet\"") != std::string::npos);
  }
  CHECK(index.find("H<sub>TB</sub> = Σ ψ·l") != std::string::npos);
  CHECK(index.find("counter(pages)") != std::string::npos);
  fs::remove_all(folder);
}

TEST_CASE("in a project a junction's record is the project's, with the junction's reference and the detail's own drawing") {
  JunctionRecord detail;
  detail.drawing = "D-12";
  detail.assessor = "detail author";
  JunctionRecord project;
  project.project = "P";
  project.assessor = "A";
  project.drawing = "A-300 series";
  project.date = "2026-11-30";
  const JunctionRecord r = record_in_project(detail, project, "J07");
  CHECK(r.reference == "J07");
  CHECK(r.project == "P");
  CHECK(r.assessor == "A");
  CHECK(r.date == "2026-11-30");
  CHECK(r.drawing == "D-12");
  CHECK(record_in_project({}, project, "J07").drawing == "A-300 series");
}
