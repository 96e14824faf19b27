// What a consultant reads off one variant of a sweep or comparison: plain data for the tables and
// pages (pipeline/variants.h makes it).
#pragma once

#include <map>
#include <optional>
#include <string>
#include <vector>

#include "results/junction_results.h"

namespace edgeflux {

/// What a consultant reads off one variant.
struct VariantSummary {
  std::string label;                  ///< file name or "name=value, ..."
  std::string file;
  std::map<std::string, double> parameters;  ///< the varied values (sweeps): name → value
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

}  // namespace edgeflux
