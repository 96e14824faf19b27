// Mould and surface-condensation verdict for the coldest internal surface of a junction (ISO 13788).
#pragma once

#include <limits>
#include <optional>
#include <span>
#include <string>
#include <string_view>
#include <vector>

namespace edgeflux {

/// A national minimum temperature factor that may be required on top of the ISO 13788 criterion.
struct MinimumTemperatureFactorRule {
  std::string_view id;                   ///< stable name used on the command line, e.g. "din-4108-2"
  std::optional<double> minimum;         ///< minimum fRsi (dimensionless); none for "none"
  std::string_view description;          ///< one line: what the rule asks and where it applies
  std::string_view source;               ///< document the value comes from
};

/// All rule presets in a fixed order: "none", "din-4108-2", "bre-ip-1-06".
/// The span refers to static storage and stays valid for the life of the program.
std::span<const MinimumTemperatureFactorRule> minimum_temperature_factor_rules();

/// The rule preset named `id` (exact, case-sensitive match), or nothing when there is none.
std::optional<MinimumTemperatureFactorRule> minimum_temperature_factor_rule(std::string_view id);

/// Climate and result of a surface-temperature run (Rsi = 0.25 opaque, 0.13 glazing) to assess.
/// Give exactly one of interior_relative_humidity and interior_vapour_pressure. The numbers start
/// as NaN so that a field left unset is reported rather than silently defaulted.
struct MoistureInput {
  static constexpr double unset = std::numeric_limits<double>::quiet_NaN();
  double interior_temperature = unset;                ///< θi, °C; finite, > θe
  std::optional<double> interior_relative_humidity;   ///< φi, fraction, 0 < φi ≤ 1
  std::optional<double> interior_vapour_pressure;     ///< pi, Pa; 0 < pi ≤ psat(θi)
  double exterior_temperature = unset;                ///< θe, °C; finite
  double temperature_factor = unset;                  ///< fRsi of the detail from the run, 0–1
  bool is_glazing_or_frame = false;  ///< true: condensation criterion (surface RH ≤ 100 %) governs;
                                     ///< false: mould criterion (surface RH ≤ 80 %)
  std::string rule_id = "none";      ///< id of a MinimumTemperatureFactorRule
};

/// Which requirement set the required fRsi.
enum class RequirementBasis {
  mould_criterion,         ///< ISO 13788, surface RH ≤ 80 %
  condensation_criterion,  ///< ISO 13788, surface RH ≤ 100 % (glazing, frames)
  national_rule,           ///< the minimum of the chosen rule preset
};

/// One requirement checked on its own: the ISO 13788 criterion, or a national minimum.
struct CriterionCheck {
  std::string criterion;  ///< what asks for it, e.g. "ISO 13788, 80 % surface RH" or "DIN 4108-2 minimum"
  double required = 0;    ///< fRsi,min it sets
  bool met = false;       ///< fRsi ≥ fRsi,min (meeting it exactly counts as met)
  bool governs = false;   ///< the highest of the requirements checked
};

/// The words every output uses for one checked criterion, e.g.
/// "criterion met: fRsi 0.945 ≥ fRsi,min 0.705 (ISO 13788, 80 % surface RH)".
std::string criterion_statement(const CriterionCheck& check, double temperature_factor);

/// The words for a set of checks as a whole: "all criteria met" / "criterion NOT met" /
/// "2 criteria NOT met".
std::string criteria_outcome(const std::vector<CriterionCheck>& checks);

/// Outcome of assess_surface_moisture. Pressures in Pa, temperatures in °C, factors dimensionless.
struct MoistureAssessment {
  double interior_vapour_pressure;             ///< pi, Pa
  double interior_saturation_pressure;         ///< psat(θi), Pa
  double interior_relative_humidity;           ///< φi = pi/psat(θi), fraction
  double dew_point;                            ///< θ with psat(θ) = pi, °C
  double mould_surface_temperature;            ///< θsi,min for mould: psat(θsi,min) = pi/0.8, °C
  double mould_temperature_factor;             ///< fRsi,min for mould
  double condensation_temperature_factor;      ///< fRsi,min for condensation (θsi,min = dew point)
  double required_temperature_factor;          ///< max(governing ISO 13788 value, rule minimum)
  RequirementBasis governing_basis;            ///< which of them set the requirement
  std::string governing_requirement;           ///< the same, as text for reports
  std::vector<CriterionCheck> criteria;        ///< ISO 13788, then the national minimum if one is chosen
  double actual_temperature_factor;            ///< fRsi of the detail, as given
  double surface_temperature;                  ///< θsi = θe + fRsi·(θi − θe) in this climate, °C
  double surface_relative_humidity;            ///< pi/psat(θsi) at that surface, fraction
  bool passes;                                 ///< every criterion met (fRsi ≥ required fRsi)
  double margin;                               ///< fRsi − required fRsi; ≥ 0 when it passes
  std::string verdict;                         ///< one sentence for the report
};

/// Compares the detail's fRsi with the fRsi the ISO 13788 criterion requires in the stated
/// climate, raised to the chosen national minimum where that is higher.
/// Throws std::invalid_argument for: neither or both humidity inputs, φi outside (0, 1],
/// pi ≤ 0 or above psat(θi), θi ≤ θe, non-finite values, fRsi outside [0, 1], an unknown rule id.
MoistureAssessment assess_surface_moisture(const MoistureInput& input);

/// The four cautions every result carries, one sentence each: input quality, limits of a
/// steady-state 2D model, the climate the verdict holds for, and who decides compliance.
std::vector<std::string> standard_cautions();

}  // namespace edgeflux
