// Many calculations at once: a parameter sweep or a set of details, run in parallel on all cores.
#pragma once

#include <functional>
#include <optional>
#include <string>
#include <vector>

#include "input/read_detail_file.h"
#include "pipeline/calculate.h"

namespace edgeflux {

/// One parameter varied over `steps` evenly spaced values from `from` to `to` (both included).
struct ParameterRange {
  std::string name;
  double from = 0.0, to = 0.0;
  int steps = 2;
  std::vector<double> values() const;
};

/// What a consultant reads off one variant.
struct VariantSummary {
  std::string label;                  ///< file name or "name=value, ..."
  std::string file;
  ParameterOverrides parameters;      ///< the varied values (sweeps)
  std::string title;
  std::optional<double> coupling_2d;  ///< L2D, W/(m·K)
  std::optional<double> coupling_2d_error;
  std::vector<PsiValue> psi;
  std::vector<double> psi_error;
  std::optional<double> min_surface_temperature;  ///< °C
  std::optional<double> temperature_factor;       ///< fRsi
  std::optional<double> required_temperature_factor;
  std::optional<bool> passes;
  std::string governing_requirement;
  int nodes = 0;
  double seconds = 0.0;
  std::vector<std::string> warnings;
  std::string error;                  ///< non-empty when this variant could not be calculated
};

VariantSummary summarise(const std::string& label, const std::string& file, const CrossSection& section,
                         const Calculation& calc);

/// Every combination of the ranges (the first varies slowest), each solved from `file` with those
/// overrides. `jobs` worker threads (0: all cores); results are in combination order and identical
/// for any number of jobs. An input error in one variant is recorded in that variant.
std::vector<VariantSummary> run_sweep(const std::string& file, const std::vector<ParameterRange>& ranges,
                                      const CalculationOptions& options, int jobs,
                                      const std::function<void(int done, int total)>& progress = {});

/// Several detail files side by side, in parallel.
std::vector<VariantSummary> run_comparison(const std::vector<std::string>& files, const CalculationOptions& options, int jobs,
                                           const std::function<void(int done, int total)>& progress = {});

}  // namespace edgeflux
