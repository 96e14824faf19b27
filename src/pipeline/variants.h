// Many calculations at once: a parameter sweep or a set of details, run in parallel on all cores.
#pragma once

#include <functional>
#include <optional>
#include <string>
#include <vector>

#include "input/read_detail_file.h"
#include "pipeline/calculate.h"
#include "results/variant_summary.h"

namespace edgeflux {

/// One parameter varied over `steps` evenly spaced values from `from` to `to` (both included).
struct ParameterRange {
  std::string name;
  double from = 0.0, to = 0.0;
  int steps = 2;
  std::vector<double> values() const;
};

VariantSummary summarise(const std::string& label, const std::string& file, const CrossSection& section,
                         const Calculation& calc);

/// Every combination of the ranges (the first varies slowest), each solved from `file` with those
/// overrides. `jobs` worker threads (0: all cores); results are in combination order and identical
/// for any number of jobs. An input error in one variant is recorded in that variant.
std::vector<VariantSummary> run_sweep(const std::string& file, const std::vector<ParameterRange>& ranges,
                                      const CalculationOptions& options, int jobs,
                                      const std::function<void(int done, int total)>& progress = {});

/// One calculation of a batch: a detail file with parameter values, and its label.
struct VariantJob {
  std::string label;
  std::string file;
  ParameterOverrides overrides;
};

/// Called in the worker thread with a job's index, section and calculation, before they are
/// discarded (to build a report from them); it must only touch storage of its own index.
using CalculationHook = std::function<void(std::size_t index, const CrossSection&, const Calculation&)>;

/// Any batch of calculations in parallel, results in job order (identical for any `jobs`).
std::vector<VariantSummary> run_variants(const std::vector<VariantJob>& batch, const CalculationOptions& options, int jobs,
                                         const std::function<void(int done, int total)>& progress = {},
                                         const CalculationHook& with_calculation = {});

/// Several detail files side by side, in parallel.
std::vector<VariantSummary> run_comparison(const std::vector<std::string>& files, const CalculationOptions& options, int jobs,
                                           const std::function<void(int done, int total)>& progress = {});

}  // namespace edgeflux
