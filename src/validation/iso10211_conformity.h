// The ISO 10211 validation check: Cases 1 and 2 solved by this program and compared with the
// standard's reference values and tolerances.
#pragma once

#include <cmath>
#include <functional>
#include <string>
#include <vector>

namespace edgeflux {

struct ConformityRow {
  std::string reference_case;  ///< "Case 1" or "Case 2"
  std::string quantity;        ///< e.g. "θ at r1c2" or "Φ"
  std::string unit;            ///< "°C" or "W/m"
  double reference = 0.0;      ///< the standard's value
  double computed = 0.0;
  double tolerance = 0.0;      ///< the standard's permitted difference
  bool passed() const { return std::abs(computed - reference) <= tolerance; }
};

struct ConformityReport {
  std::vector<ConformityRow> rows;
  int case1_nodes = 0, case2_nodes = 0;
  double seconds = 0.0;
  bool passed() const;
  /// The standard's class for a method that passes both cases, or why it does not qualify.
  std::string classification() const;
};

/// Exact temperature of the full square column of ISO 10211 Case 1 (side L, the edge y = L at
/// 20 °C, the others at 0 °C), by the separation-of-variables series.
double iso10211_case1_series(double x, double y, double side);

/// The standard's table for Case 1: 7 rows (a/4 … 7a/4 below the heated edge) × 4 columns
/// (x = a/4 … a), °C.
const double (&iso10211_case1_table())[7][4];

/// Solves both cases from the built-in files at default settings and compares.
ConformityReport iso10211_conformity(const std::function<void(const std::string&)>& progress = {});

/// The conformity table as text.
std::string conformity_text(const ConformityReport& report);

}  // namespace edgeflux
