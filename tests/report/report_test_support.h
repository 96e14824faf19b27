// Running the real program and helper scripts from the report tests.
#pragma once

#include <sys/wait.h>
#include <unistd.h>

#include <cstdio>
#include <filesystem>
#include <fstream>
#include <sstream>
#include <string>

namespace edgeflux::test {

struct ProgramRun {
  int exit_code;
  std::string output;  ///< standard output and standard error together
};

/// Runs a shell command, collecting its output; the exit code is −1 when it did not exit normally.
inline ProgramRun run_command(const std::string& command) {
  FILE* pipe = popen((command + " 2>&1").c_str(), "r");
  if (!pipe) return {-1, "popen failed"};
  std::string output;
  char buffer[4096];
  while (std::size_t n = fread(buffer, 1, sizeof buffer, pipe)) output.append(buffer, n);
  const int status = pclose(pipe);
  return {WIFEXITED(status) ? WEXITSTATUS(status) : -1, output};
}

/// Runs edgeflux with the given arguments.
inline ProgramRun run_edgeflux(const std::string& arguments) { return run_command(std::string(EDGEFLUX_BINARY) + " " + arguments); }

/// A fresh scratch folder for one test case.
inline std::filesystem::path scratch_folder(const std::string& name) {
  const auto folder = std::filesystem::temp_directory_path() / ("edgeflux-report-" + name + "-" + std::to_string(::getpid()));
  std::filesystem::remove_all(folder);
  std::filesystem::create_directories(folder);
  return folder;
}

inline std::string read_text(const std::filesystem::path& path) {
  std::ifstream in(path, std::ios::binary);
  std::ostringstream s;
  s << in.rdbuf();
  return s.str();
}

/// The Debian interpreter, which has python3-meshio; a python3 earlier on PATH may not.
inline const char* debian_python = "/usr/bin/python3";

/// Quotes a path for the shell.
inline std::string shell_quoted(const std::filesystem::path& p) { return "'" + p.string() + "'"; }

}  // namespace edgeflux::test
