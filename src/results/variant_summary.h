// What a consultant reads off one variant of a sweep or comparison: plain data for the tables and
// pages (pipeline/variants.h makes it).
#pragma once

#include <map>
#include <optional>
#include <string>
#include <vector>

#include "results/junction_results.h"

namespace edgeflux {

/// The criteria checked on one kind of interior surface (opaque: mould; glazing and frames:
/// condensation), kept apart so a frame's fRsi is never set against the opaque requirement.
struct KindVerdict {
  SurfaceKind kind = SurfaceKind::opaque;
  double temperature_factor = 0;        ///< fRsi of the coldest surface of this kind
  double required_temperature_factor = 0;  ///< the highest of the criteria
  std::vector<CriterionCheck> criteria;
  bool met = false;                     ///< every criterion met
};

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
  std::vector<KindVerdict> verdicts;  ///< opaque first, then glazing and frames, where present
  std::optional<DimensionSystem> carried_forward;
  std::string climate;                ///< the climate of the criteria in words, empty without one
  std::string input_sha256;           ///< of the detail file as read
  int nodes = 0;
  double seconds = 0.0;
  /// The variant whose meshes this one was solved on (same geometry, other conductivities), empty
  /// when it was meshed and refined on its own.
  std::string meshes_from;
  std::vector<std::string> warnings;
  std::string error;                  ///< non-empty when this variant could not be calculated
};

}  // namespace edgeflux
