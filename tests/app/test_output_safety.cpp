// Outputs are never lost: an output that is an input, two outputs with one name, read-only files
// and devices are refused before anything is written; symlinks are followed; an interrupted run
// leaves no temporary behind; a standard output that cannot be written is an error. Runs the
// real program.
#include <doctest/doctest.h>

#include <sys/stat.h>
#include <unistd.h>

#include <filesystem>
#include <fstream>
#include <sstream>

#include "../support/fixtures.h"
#include "../support/run_program.h"

namespace fs = std::filesystem;
using edgeflux::test::run_program;

namespace {

bool has_temporaries(const fs::path& folder) {
  for (const auto& entry : fs::directory_iterator(folder))
    if (entry.path().filename().string().find(".partial") != std::string::npos) return true;
  return false;
}

struct Folder {
  fs::path path = edgeflux::test::scratch_folder("outputs");
  fs::path detail = path / "wall.xml";
  Folder() {
    fs::remove_all(path);
    fs::create_directories(path);
    std::ofstream(detail) << edgeflux::test::detail_xml(edgeflux::test::two_layer_wall_body());
  }
  ~Folder() { fs::remove_all(path); }
  std::string q(const fs::path& p) const { return "'" + p.string() + "'"; }
};

}  // namespace

TEST_CASE("an output named like the input, directly, through ./ or a symlink, is refused and the input kept") {
  Folder f;
  const std::string before = edgeflux::test::file_contents(f.detail);
  fs::create_symlink(f.detail, f.path / "link.json");
  for (const fs::path& out : {f.detail, f.path / "." / "wall.xml", f.path / "link.json"}) {
    CAPTURE(out.string());
    const auto run = run_program("solve -q " + f.q(f.detail) + " --json " + f.q(out));
    CHECK(run.exit_code == 2);
    CHECK(run.output.find("is the input file") != std::string::npos);
    CHECK(edgeflux::test::file_contents(f.detail) == before);
  }
  const auto surface_csv = run_program("solve -q " + f.q(f.detail) + " --surface-csv " + f.q(f.detail));
  CHECK(surface_csv.exit_code == 2);
  CHECK(edgeflux::test::file_contents(f.detail) == before);
}

TEST_CASE("two outputs with one name are refused, and nothing is written") {
  Folder f;
  const auto run = run_program("solve -q " + f.q(f.detail) + " --json " + f.q(f.path / "same.out") + " --report " +
                               f.q(f.path / "same.out"));
  CHECK(run.exit_code == 2);
  CHECK(run.output.find("named twice among the outputs") != std::string::npos);
  CHECK(!fs::exists(f.path / "same.out"));
}

TEST_CASE("a read-only file and a device are refused; a symlink's target is written and the link kept") {
  Folder f;
  const fs::path protected_file = f.path / "protected.json";
  std::ofstream(protected_file) << "keep";
  fs::permissions(protected_file, fs::perms::owner_read | fs::perms::group_read | fs::perms::others_read);
  auto run = run_program("solve -q " + f.q(f.detail) + " --json " + f.q(protected_file));
  CHECK(run.exit_code == 2);
  CHECK(run.output.find("read-only") != std::string::npos);
  CHECK(edgeflux::test::file_contents(protected_file) == "keep");

  run = run_program("solve -q " + f.q(f.detail) + " --json /dev/null");
  CHECK(run.exit_code == 2);
  CHECK(run.output.find("not a regular file") != std::string::npos);

  fs::create_symlink("results.json", f.path / "latest.json");  // dangling: the target does not exist yet
  run = run_program("solve -q " + f.q(f.detail) + " --json " + f.q(f.path / "latest.json"));
  CHECK(run.exit_code == 0);
  CHECK(fs::is_symlink(fs::symlink_status(f.path / "latest.json")));
  CHECK(edgeflux::test::file_contents(f.path / "results.json").find("\"coupling_coefficient_2d_w_per_mk\"") != std::string::npos);
  CHECK(!has_temporaries(f.path));
}

TEST_CASE("interrupted at any moment, a run leaves no temporary file and no half-written output") {
  Folder f;
  const fs::path vtu = f.path / "field.vtu";
  // A VTK file of some megabytes takes a while to format and write; SIGTERM after growing delays
  // hits the solve, the formatting or the writing.
  for (const char* delay : {"0.05", "0.2", "0.4", "0.6", "0.8", "1.0"}) {
    CAPTURE(delay);
    fs::remove(vtu);
    edgeflux::test::run_shell(std::string("timeout -s TERM ") + delay + " " + std::string(EDGEFLUX_BINARY) + " solve -q " +
                              f.q(edgeflux::test::source_path("examples/intermediate-floor.xml")) +
                              " --fixed-mesh --density 8 --vtu " + f.q(vtu) + " >/dev/null");
    CHECK(!has_temporaries(f.path));
    // Either no file, or a whole one.
    if (fs::exists(vtu)) CHECK(edgeflux::test::file_contents(vtu).find("</VTKFile>") != std::string::npos);
  }
}

TEST_CASE("results that cannot be written to standard output end with exit 2 (a full disk)") {
  Folder f;
  const auto run = run_program("solve -q " + f.q(f.detail) + " > /dev/full");
  CHECK(run.exit_code == 2);
  CHECK(run.output.find("standard output") != std::string::npos);
  // With output files: the summary is checked first, so the old files stay as they were.
  const fs::path json = f.path / "r.json";
  std::ofstream(json) << "old";
  const auto with_json = run_program("solve -q " + f.q(f.detail) + " --json " + f.q(json) + " > /dev/full");
  CHECK(with_json.exit_code == 2);
  CHECK(edgeflux::test::file_contents(json) == "old");
  // Help that cannot be printed is a failure too.
  CHECK(run_program("--help > /dev/full").exit_code == 2);
}

TEST_CASE("a bad output path is refused before the solve, not after it") {
  Folder f;
  const auto run = run_program("solve " + f.q(f.detail) + " --json " + f.q(f.path / "missing" / "r.json"));
  CHECK(run.exit_code == 2);
  CHECK(run.output.find("does not exist") != std::string::npos);
  CHECK(run.output.find("level 1") == std::string::npos);  // no refinement level was started
}

TEST_CASE("an output that is where the summary goes, or in a 'folder' that is a file, is refused with what it is") {
  Folder f;
  const fs::path summary = f.path / "summary.txt";
  const auto into_stdout = run_program("solve -q " + f.q(f.detail) + " --surface-csv /dev/stdout > " + f.q(summary));
  CHECK(into_stdout.exit_code == 2);
  CHECK(into_stdout.output.find("is where the printed summary goes") != std::string::npos);
  std::ofstream(f.path / "afile") << "x";
  const auto under_file = run_program("solve -q " + f.q(f.detail) + " --vtu " + f.q(f.path / "afile" / "r.vtu"));
  CHECK(under_file.exit_code == 2);
  CHECK(under_file.output.find("is a file, not a folder") != std::string::npos);
}

TEST_CASE("temporaries of a run killed outright (kill -9) are removed by the next run writing that file; a live writer's are kept") {
  Folder f;
  // Process ids above the kernel's pid_max (4194304 at most) never belong to a process.
  const fs::path stale = f.path / ".r.json.partial-4194399-abcdef", live = f.path / (".r.json.partial-" + std::to_string(::getpid()) + "-ghijkl");
  std::ofstream(stale) << "half";
  std::ofstream(live) << "being written";
  const auto run = run_program("solve -q " + f.q(f.detail) + " --json " + f.q(f.path / "r.json"));
  CHECK(run.exit_code == 0);
  CHECK_FALSE(fs::exists(stale));
  CHECK(fs::exists(live));
}

TEST_CASE("a hang-up (SIGHUP) while writing leaves no temporary either") {
  Folder f;
  const fs::path vtu = f.path / "field.vtu";
  for (const char* delay : {"0.3", "0.6", "0.9"}) {
    CAPTURE(delay);
    edgeflux::test::run_shell(std::string("timeout -s HUP ") + delay + " " + std::string(EDGEFLUX_BINARY) + " solve -q " +
                              f.q(edgeflux::test::source_path("examples/intermediate-floor.xml")) +
                              " --fixed-mesh --density 8 --vtu " + f.q(vtu) + " >/dev/null");
    CHECK(!has_temporaries(f.path));
    if (fs::exists(vtu)) CHECK(edgeflux::test::file_contents(vtu).find("</VTKFile>") != std::string::npos);
  }
}

TEST_CASE("under a memory limit, a refinement that runs out of memory keeps the levels already solved") {
  // 700 MB of address space: the demo refined towards 1e-6 outgrows it after a few levels (about
  // 400 000 nodes). Whatever the machine, the run must end normally with an honest result.
  const std::string command = "ulimit -v 700000; timeout 300 " + std::string(EDGEFLUX_BINARY) + " solve -q '" +
                              edgeflux::test::source_path("examples/intermediate-floor.xml") +
                              "' --target 1e-6 --psi-target 1e-7 --temperature-target 1e-6";
  const auto run = edgeflux::test::run_shell(command);
  CAPTURE(run.output.substr(0, 2000));
  CHECK(run.exit_code == 0);
  CHECK(run.output.find("CHOLMOD error") == std::string::npos);  // no library chatter among the results
  CHECK(run.output.find("thermal coupling coefficient L2D = 0.6146") != std::string::npos);
  if (run.output.find("the memory ran out") != std::string::npos)
    CHECK(run.output.find("did not reach the accuracy target") != std::string::npos);
}

TEST_CASE("under a memory limit too small to solve at all, the run fails at once with the limit named, never hangs") {
  // 400 MB of address space: the BLAS library's buffer allocation would retry for ever.
  const auto run = edgeflux::test::run_shell("ulimit -v 409600; timeout 60 " + std::string(EDGEFLUX_BINARY) + " solve -q '" +
                                             edgeflux::test::source_path("examples/intermediate-floor.xml") + "'");
  CHECK(run.exit_code == 3);
  CHECK(run.output.find("may use only 400 MB of address space") != std::string::npos);
}
