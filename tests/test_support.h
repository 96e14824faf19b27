// Helpers shared by the tests: paths to shipped files and a quick way to solve a detail file.
#pragma once

#include <algorithm>
#include <filesystem>
#include <fstream>
#include <iterator>
#include <string>
#include <vector>

#include "input/read_detail_file.h"
#include "pipeline/calculate.h"

namespace edgeflux::test {

/// Absolute path of a file in the source tree, e.g. source_path("tests/reference/x.xml").
inline std::string source_path(const std::string& relative) { return std::string(EDGEFLUX_SOURCE_DIR) + "/" + relative; }

/// The detail files of a shipped folder ("examples", "details", …), sorted: its .xml files whose
/// root is <edgeflux-detail> (a project file lives beside them in examples/).
inline std::vector<std::string> detail_files_in(const std::string& folder) {
  std::vector<std::string> files;
  const std::filesystem::path dir = source_path(folder);
  if (!std::filesystem::exists(dir)) return files;
  for (const auto& entry : std::filesystem::directory_iterator(dir)) {
    if (entry.path().extension() != ".xml") continue;
    std::ifstream in(entry.path());
    const std::string text((std::istreambuf_iterator<char>(in)), std::istreambuf_iterator<char>());
    if (text.find("<edgeflux-detail") != std::string::npos) files.push_back(entry.path().string());
  }
  std::sort(files.begin(), files.end());
  return files;
}

/// Reads and solves a detail file with default options (or the given ones).
inline Calculation solve_file(const std::string& relative, CalculationOptions options = {}) {
  return calculate(read_detail_file(source_path(relative)), options);
}

inline double probe(const Calculation& calc, const std::string& name) {
  for (const auto& p : calc.heat_loss.field.probes)
    if (p.name == name) return p.temperature;
  throw std::runtime_error("no probe " + name);
}

/// A minimal valid detail around the given <regions>/<boundaries> body, in millimetres.
inline std::string detail_xml(const std::string& body) {
  return "<edgeflux-detail format=\"1\" units=\"mm\">\n" + body + "\n</edgeflux-detail>\n";
}

}  // namespace edgeflux::test
