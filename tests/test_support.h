// Helpers shared by the tests: paths to shipped files and a quick way to solve a detail file.
#pragma once

#include <string>

#include "input/read_detail_file.h"
#include "pipeline/calculate.h"

namespace edgeflux::test {

/// Absolute path of a file in the source tree, e.g. source_path("tests/reference/x.xml").
inline std::string source_path(const std::string& relative) { return std::string(EDGEFLUX_SOURCE_DIR) + "/" + relative; }

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
