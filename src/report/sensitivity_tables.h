// The sensitivities as the terminal and the report show them: one row per input, ranked by its
// effect on ψ, with elasticities, the first-order uncertainty range and the verdict's robustness.
#pragma once

#include <optional>
#include <string>
#include <vector>

#include "geometry/cross_section.h"
#include "results/calculation.h"

namespace edgeflux {

/// One input's row, every number already in the unit the tables show.
struct SensitivityRow {
  std::string input;                      ///< "λ concrete" or "Rs inside wall"
  std::string value;                      ///< "2.300 W/(m·K)" or "0.130 m²K/W"
  std::optional<double> psi_per_10_percent;        ///< Δψ for the input 10 % higher, W/(m·K)
  std::optional<double> coupling_elasticity;       ///< % change of L2D per % change of the input
  std::optional<double> psi_elasticity;            ///< the same for ψ (nothing when |ψ| < 0.001)
  std::optional<double> min_temperature_per_10_percent;  ///< Δθsi,min for the input 10 % higher, K
  std::optional<double> temperature_factor_elasticity;   ///< % change of fRsi per % change of the input
};

/// The ψ the tables speak of: the carried-forward system's, else the first reported; nothing without ψ.
std::optional<std::size_t> headline_psi(const CrossSection& section, const Calculation& calc);

/// Rows ranked by |Δψ| (then by |Δθsi,min|), largest first.
std::vector<SensitivityRow> sensitivity_rows(const CrossSection& section, const Calculation& calc);

/// The sentences under the table: what ε means, the uncertainty range of ψ and fRsi, and whether the
/// criterion is still met with every λ off the unfavourable way. Empty without sensitivities.
std::vector<std::string> sensitivity_notes(const CrossSection& section, const Calculation& calc);

/// Which input moves ψ most and which moves θsi,min most, in one sentence (empty without them).
std::string sensitivity_headline(const CrossSection& section, const Calculation& calc);

/// The terminal block (empty without sensitivities).
std::string sensitivity_text(const CrossSection& section, const Calculation& calc);

/// The report's table with its notes (empty without sensitivities).
std::string sensitivity_html(const CrossSection& section, const Calculation& calc);

}  // namespace edgeflux
