// Running the real edgeflux program from a test, and a scratch folder for its files.
#pragma once

#include <cstdio>
#include <filesystem>
#include <fstream>
#include <sstream>
#include <string>
#include <sys/wait.h>
#include <unistd.h>

namespace edgeflux::test {

struct ProgramRun {
  int exit_code = -1;
  std::string output;  ///< standard output and standard error together
};

/// Runs a shell command line; its standard output and error together.
inline ProgramRun run_shell(const std::string& command_line) {
  const std::string command = "{ " + command_line + "; } 2>&1";
  FILE* pipe = popen(command.c_str(), "r");
  std::string output;
  char buffer[4096];
  while (std::size_t n = fread(buffer, 1, sizeof buffer, pipe)) output.append(buffer, n);
  const int status = pclose(pipe);
  return {WIFEXITED(status) ? WEXITSTATUS(status) : -1, output};
}

/// Runs `edgeflux ARGUMENTS` through the shell (arguments quoted by the caller).
inline ProgramRun run_program(const std::string& arguments) {
  return run_shell(std::string(EDGEFLUX_BINARY) + " " + arguments);
}

/// A folder of this test process under the system's temporary folder, created if needed.
inline std::filesystem::path scratch_folder(const std::string& purpose) {
  const std::filesystem::path folder =
      std::filesystem::temp_directory_path() / ("edgeflux-" + purpose + "-" + std::to_string(::getpid()));
  std::filesystem::create_directories(folder);
  return folder;
}

/// The whole content of a file, as bytes; empty when it cannot be read.
inline std::string file_contents(const std::filesystem::path& path) {
  std::ifstream in(path, std::ios::binary);
  std::ostringstream text;
  text << in.rdbuf();
  return text.str();
}

}  // namespace edgeflux::test
