// Watch mode: the page follows every save of the detail, and shows an input error instead of a
// stale picture.
#include <doctest/doctest.h>

#include <chrono>
#include <filesystem>
#include <fstream>
#include <sstream>
#include <thread>

#include "../support/run_program.h"
#include "../test_support.h"
#include "app/watch.h"

namespace fs = std::filesystem;
using namespace edgeflux;
using namespace edgeflux::test;

namespace {

/// Waits up to a minute for the page to satisfy `ready`; false when it never does.
bool wait_for(const fs::path& page, const std::function<bool(const std::string&)>& ready) {
  for (int i = 0; i < 600; ++i) {
    if (fs::exists(page) && ready(file_contents(page))) return true;
    std::this_thread::sleep_for(std::chrono::milliseconds(100));
  }
  return false;
}

}  // namespace

TEST_CASE("edgeflux watch: solved on start, the error page after a broken save, solved again after the fix") {
  const fs::path folder = scratch_folder("watch");
  const fs::path detail = folder / "floor.xml", page = folder / "floor.html";
  const std::string good = file_contents(source_path("examples/intermediate-floor.xml"));
  std::ofstream(detail, std::ios::binary) << good;
  ProgramRun run;
  std::thread watcher([&] { run = run_program("watch '" + detail.string() + "' --report '" + page.string() + "' --runs 3"); });

  // The demo's L2D as the terminal prints it (0.6146 W/(m·K), the value the golden results hold).
  const bool first = wait_for(page, [](const std::string& html) { return html.find("live-banner") != std::string::npos; });
  CHECK(first);
  const std::string solved = file_contents(page);
  CHECK(solved.find("http-equiv=\"refresh\"") != std::string::npos);
  CHECK(solved.find("0.6146") != std::string::npos);

  std::string broken = good;
  broken.replace(broken.find("<materials>"), 11, "<materials><bogus/>");
  std::ofstream(detail, std::ios::binary) << broken;
  const bool error_shown = wait_for(page, [](const std::string& html) { return html.find("watch-error") != std::string::npos; });
  CHECK(error_shown);
  const std::string error = file_contents(page);
  CHECK(error.find("bogus") != std::string::npos);
  CHECK(error.find("0.6146") == std::string::npos);  // no stale result beside the error
  CHECK(error.find("http-equiv=\"refresh\"") != std::string::npos);

  std::ofstream(detail, std::ios::binary) << good;
  const bool solved_again = wait_for(page, [](const std::string& html) { return html.find("live-banner") != std::string::npos; });
  CHECK(solved_again);
  watcher.join();
  INFO(run.output);
  CHECK(run.exit_code == 0);
  CHECK(run.output.find("cannot be solved") != std::string::npos);
  fs::remove_all(folder);
}

TEST_CASE("the live banner and the reload are added to a report, and hidden in print") {
  const std::string page = live_report("<!DOCTYPE html><html><head><title>x</title></head><body class=\"r\"><h1>T</h1></body></html>",
                                       "a&b.xml", "12:00:00");
  CHECK(page.find("<head><meta http-equiv=\"refresh\" content=\"2\">") != std::string::npos);
  CHECK(page.find("<body class=\"r\"><div class=\"live-banner\"") != std::string::npos);
  CHECK(page.find("a&amp;b.xml") != std::string::npos);
  CHECK(page.find("@media print{.live-banner{display:none}}") != std::string::npos);
}

TEST_CASE("edgeflux watch refuses a detail file that is not there, with exit code 2 and no page") {
  const fs::path folder = scratch_folder("watch-missing");
  const ProgramRun run = run_program("watch '" + (folder / "missing.xml").string() + "' --report '" + (folder / "page.html").string() + "'");
  CHECK(run.exit_code == 2);
  CHECK(run.output.find("does not exist") != std::string::npos);
  CHECK_FALSE(fs::exists(folder / "page.html"));
  fs::remove_all(folder);
}
