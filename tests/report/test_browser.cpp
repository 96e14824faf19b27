// The demo report opened in headless Chromium: loads offline without errors, shows the key numbers
// of the JSON results, renders every drawing; its explorable field read and zoomed with real
// pointer events; screenshots and prints saved under build/test-artifacts/.
#include <doctest/doctest.h>

#include <filesystem>

#include "../test_support.h"
#include "report_test_support.h"

namespace fs = std::filesystem;
using namespace edgeflux::test;

TEST_CASE("the demo report in a real browser") {
  const fs::path folder = scratch_folder("browser");
  const fs::path html = folder / "intermediate-floor.html", json = folder / "intermediate-floor.json";
  const ProgramRun run = run_edgeflux("solve -q " + shell_quoted(source_path("examples/intermediate-floor.xml")) + " --report " + shell_quoted(html) +
                                      " --json " + shell_quoted(json));
  INFO(run.output);
  REQUIRE(run.exit_code == 0);
  const fs::path artifacts = fs::path(EDGEFLUX_BINARY).parent_path() / "test-artifacts";
  const ProgramRun check = run_command(std::string(debian_python) + " " + shell_quoted(source_path("tests/report/browser_check.py")) + " " +
                                       shell_quoted(html) + " " + shell_quoted(json) + " " + shell_quoted(artifacts));
  INFO(check.output);
  // Exit 2 means the browser could not start: that fails too, with chromium's reason in the output.
  CHECK(check.exit_code == 0);
  fs::remove_all(folder);
}

TEST_CASE("the explorable temperature field in a real browser") {
  // explorable_check.py points at θsi,min and the junction's own minimum of the JSON results and at
  // a point inside a mesh triangle of the VTU file; the read-out must show the solver's own linear
  // field there (exact) to the digits displayed; zoom, pan, switches and the printed copy as well.
  const fs::path folder = scratch_folder("explorable");
  const fs::path html = folder / "intermediate-floor.html", json = folder / "intermediate-floor.json", vtu = folder / "intermediate-floor.vtu";
  const ProgramRun run = run_edgeflux("solve -q " + shell_quoted(source_path("examples/intermediate-floor.xml")) + " --report " + shell_quoted(html) +
                                      " --json " + shell_quoted(json) + " --vtu " + shell_quoted(vtu));
  INFO(run.output);
  REQUIRE(run.exit_code == 0);
  const fs::path artifacts = fs::path(EDGEFLUX_BINARY).parent_path() / "test-artifacts";
  const ProgramRun check = run_command(std::string(debian_python) + " " + shell_quoted(source_path("tests/report/explorable_check.py")) + " " +
                                       shell_quoted(html) + " " + shell_quoted(json) + " " + shell_quoted(vtu) + " " + shell_quoted(artifacts));
  INFO(check.output);
  MESSAGE(check.output);
  CHECK(check.exit_code == 0);
  fs::remove_all(folder);
}
