// Evidence that the mesh is fine enough: the reported quantities on successive meshes, their
// estimated remaining error, and the ISO 10211 doubling check.
#pragma once

#include <optional>
#include <string>
#include <vector>

namespace edgeflux {

/// The accuracy asked of every reported quantity.
struct AccuracyTarget {
  double coupling_relative = 1e-3;    ///< |error of L2D| / L2D (or of each heat flow / max |Φ|)
  double psi_absolute = 5e-4;         ///< W/(m·K)
  double temperature_absolute = 0.01; ///< K, for θsi,min
};

/// A value with its estimated discretisation error (the difference to the mesh-converged value).
struct ErrorEstimate {
  double value = 0.0;
  double error = 0.0;       ///< ≥ 0, same unit as value
  double observed_rate = 0.0;  ///< a in Q − Q∞ ∝ N^−a fitted to the last three levels (0: not available)
};

struct ConvergenceLevel {
  int nodes = 0;
  double seconds = 0.0;                 ///< mesh + both runs + results for this level
  std::vector<double> heat_flows;       ///< per environment, W/m (heat-loss run)
  std::optional<double> coupling_2d;    ///< L2D, W/(m·K)
  std::vector<double> psi;              ///< per reported system, W/(m·K)
  std::optional<double> min_surface_temperature;  ///< θsi,min, °C
  std::vector<double> probes;           ///< probe temperatures, °C (heat-loss run)
  double sum_abs_heat_flow = 0.0;       ///< Σ |Φ|, W/m, for the ISO 10211 doubling check
};

/// ISO 10211: the sum of the absolute heat flows with n and 2n subdivisions (≈ 4× the nodes)
/// differs by less than 1 %.
struct DoublingCheck {
  int coarse_nodes = 0, fine_nodes = 0;
  double coarse_sum = 0.0, fine_sum = 0.0;
  double relative_change = 0.0;
  bool passed = false;
};

struct Convergence {
  bool adaptive = false;
  AccuracyTarget target;
  std::vector<ConvergenceLevel> levels;
  std::optional<ErrorEstimate> coupling_2d;
  std::vector<ErrorEstimate> psi;                 ///< same order as JunctionResults::psi
  std::optional<ErrorEstimate> min_surface_temperature;
  std::vector<ErrorEstimate> heat_flows;          ///< per environment
  std::vector<ErrorEstimate> probes;              ///< per probe
  /// Two fixed temperatures meet at a boundary point: the exact heat flux is infinite there and the
  /// heat flows grow without bound as the mesh is refined, so only temperatures are targeted.
  bool singular_heat_flow = false;
  std::optional<DoublingCheck> doubling;
  bool target_met = false;
  std::string stop_reason;
};

/// Richardson-type estimate from the last levels: with Q(N) = Q∞ + C N^−a (N nodes),
/// Q_last − Q∞ = (Q_last − Q_prev) · N_last^−a / (N_prev^−a − N_last^−a); the change used is the
/// larger of the last one and the one before (scaled by (N_prev/N_last)^a). The rate a is the one
/// fitted to the last three levels, held between 0.5 (error ∝ h, the slowest seen on the reference
/// cases) and 0.6, below the 2/3 of a heat flow near a re-entrant right-angle corner: fitted rates
/// overshoot before the asymptotic range and would understate the error (docs/method.md shows the
/// levels). Without a fit (two levels, changes of opposite sign) a = 0.5.
/// `nodes` and `values` have the same length ≥ 2.
ErrorEstimate richardson_estimate(const std::vector<int>& nodes, const std::vector<double>& values);

/// Fills the estimates and the doubling check from the recorded levels.
void estimate_errors(Convergence& convergence);

/// True when every estimate meets the target.
bool meets_target(const Convergence& convergence);

}  // namespace edgeflux
