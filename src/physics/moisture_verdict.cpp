// Required fRsi from the ISO 13788 criterion and a national minimum, compared with the detail's fRsi.
#include "physics/moisture_verdict.h"

#include <algorithm>
#include <array>
#include <cmath>
#include <stdexcept>

#include <fmt/format.h>

#include "physics/linear_transmittance.h"
#include "physics/vapour.h"

namespace edgeflux {

namespace {

constexpr std::array<MinimumTemperatureFactorRule, 3> rules{{
    {"none", std::nullopt,
     "no national minimum: the ISO 13788 criterion for the stated climate alone decides",
     "ISO 13788"},
    {"din-4108-2", 0.70,
     "German minimum fRsi against mould on building components (design climate 20 °C / 50 % "
     "inside, -5 °C outside)",
     "DIN 4108-2"},
    {"bre-ip-1-06", 0.75,
     "UK critical temperature factor fCRsi for dwellings, residential buildings and schools",
     "BRE IP 1/06"},
}};

// Mould can germinate when the surface relative humidity stays above about 80 %, well before
// liquid water appears; on glazing and frames, which do not support mould, the limit is
// condensation itself.
constexpr double mould_surface_humidity = 0.8;

void check_finite(double value, const char* what) {
  if (!std::isfinite(value)) {
    throw std::invalid_argument(fmt::format("{} must be set to a finite value, got {}", what, value));
  }
}

std::string rule_ids() {
  std::string ids;
  for (const auto& rule : rules) {
    if (!ids.empty()) ids += ", ";
    ids += rule.id;
  }
  return ids;
}

double interior_vapour_pressure_of(const MoistureInput& input, double interior_saturation) {
  const bool has_rh = input.interior_relative_humidity.has_value();
  const bool has_p = input.interior_vapour_pressure.has_value();
  if (has_rh == has_p) {
    throw std::invalid_argument(
        "give exactly one of interior relative humidity and interior vapour pressure");
  }
  if (has_rh) {
    const double rh = *input.interior_relative_humidity;
    if (!std::isfinite(rh) || rh <= 0.0 || rh > 1.0) {
      throw std::invalid_argument(fmt::format(
          "interior relative humidity must be a fraction above 0 and at most 1, got {} "
          "(write 50 % as 0.5)",
          rh));
    }
    return rh * interior_saturation;
  }
  const double p = *input.interior_vapour_pressure;
  if (!std::isfinite(p) || p <= 0.0 || p > interior_saturation) {
    throw std::invalid_argument(fmt::format(
        "interior vapour pressure must be above 0 and at most {:.1f} Pa (saturation at {} °C), "
        "got {} Pa",
        interior_saturation, input.interior_temperature, p));
  }
  return p;
}

}  // namespace

std::span<const MinimumTemperatureFactorRule> minimum_temperature_factor_rules() { return rules; }

std::optional<MinimumTemperatureFactorRule> minimum_temperature_factor_rule(std::string_view id) {
  for (const auto& rule : rules) {
    if (rule.id == id) return rule;
  }
  return std::nullopt;
}

MoistureAssessment assess_surface_moisture(const MoistureInput& input) {
  const double theta_i = input.interior_temperature;
  const double theta_e = input.exterior_temperature;
  const double f_actual = input.temperature_factor;
  check_finite(theta_i, "interior temperature");
  check_finite(theta_e, "exterior temperature");
  check_finite(f_actual, "temperature factor fRsi");
  if (theta_i <= theta_e) {
    throw std::invalid_argument(fmt::format(
        "mould and condensation assessment needs the interior warmer than the exterior, got "
        "interior {} °C and exterior {} °C",
        theta_i, theta_e));
  }
  // With two environments the surface temperature lies between them, so fRsi is in [0, 1].
  if (f_actual < 0.0 || f_actual > 1.0) {
    throw std::invalid_argument(
        fmt::format("temperature factor fRsi must be between 0 and 1, got {}", f_actual));
  }
  const auto rule = minimum_temperature_factor_rule(input.rule_id);
  if (!rule) {
    throw std::invalid_argument(fmt::format("unknown minimum-fRsi rule '{}'; known rules: {}",
                                            input.rule_id, rule_ids()));
  }

  MoistureAssessment a{};
  a.interior_saturation_pressure = saturation_vapour_pressure(theta_i);
  a.interior_vapour_pressure = interior_vapour_pressure_of(input, a.interior_saturation_pressure);
  a.interior_relative_humidity = a.interior_vapour_pressure / a.interior_saturation_pressure;
  a.dew_point = dew_point(a.interior_vapour_pressure);
  // The surface RH is pi/psat(θsi): it reaches the limit where psat(θsi) = pi/limit.
  a.mould_surface_temperature =
      saturation_temperature(a.interior_vapour_pressure / mould_surface_humidity);
  a.mould_temperature_factor = temperature_factor(a.mould_surface_temperature, theta_i, theta_e);
  a.condensation_temperature_factor = temperature_factor(a.dew_point, theta_i, theta_e);

  const double iso_required =
      input.is_glazing_or_frame ? a.condensation_temperature_factor : a.mould_temperature_factor;
  a.actual_temperature_factor = f_actual;
  a.criteria.push_back({input.is_glazing_or_frame ? "ISO 13788, 100 % surface RH" : "ISO 13788, 80 % surface RH",
                        iso_required, f_actual >= iso_required, true});
  a.required_temperature_factor = iso_required;
  if (input.is_glazing_or_frame) {
    a.governing_basis = RequirementBasis::condensation_criterion;
    a.governing_requirement = "ISO 13788 surface condensation criterion, surface RH at most 100 %";
  } else {
    a.governing_basis = RequirementBasis::mould_criterion;
    a.governing_requirement = "ISO 13788 mould criterion, surface RH at most 80 %";
  }
  if (rule->minimum) {
    // A national minimum is its own row even when the ISO criterion is the stricter one.
    const bool national_governs = *rule->minimum > iso_required;
    a.criteria.push_back({fmt::format("{} minimum", rule->source), *rule->minimum, f_actual >= *rule->minimum, national_governs});
    if (national_governs) {
      a.criteria.front().governs = false;
      a.required_temperature_factor = *rule->minimum;
      a.governing_basis = RequirementBasis::national_rule;
      a.governing_requirement = fmt::format("{} minimum fRsi {:.2f}", rule->source, *rule->minimum);
    }
  }

  a.surface_temperature = theta_e + f_actual * (theta_i - theta_e);
  a.surface_relative_humidity =
      a.interior_vapour_pressure / saturation_vapour_pressure(a.surface_temperature);
  // Meeting the limit exactly is a pass: the criteria are "surface RH at most" the limit.
  a.passes = f_actual >= a.required_temperature_factor;
  a.margin = f_actual - a.required_temperature_factor;

  std::string statements;
  for (const CriterionCheck& c : a.criteria) statements += (statements.empty() ? "" : "; ") + criterion_statement(c, f_actual);
  const std::string climate = fmt::format(
      "at {:.1f} °C and {:.0f} % RH inside and {:.1f} °C outside the coldest surface reaches "
      "{:.1f} °C and {:.0f} % surface RH",
      theta_i, 100.0 * a.interior_relative_humidity, theta_e, a.surface_temperature,
      100.0 * a.surface_relative_humidity);
  if (a.passes) {
    a.verdict = fmt::format("{}; {}.", statements, climate);
  } else {
    const char* consequence =
        f_actual >= iso_required ? "so the ISO 13788 criterion is met but the national minimum is not"
        : input.is_glazing_or_frame ? "so surface condensation is expected"
                                    : "so mould growth is possible";
    a.verdict = fmt::format("{}; {}, {}.", statements, climate, consequence);
  }
  return a;
}

std::string criterion_statement(const CriterionCheck& check, double temperature_factor) {
  return fmt::format("criterion {}: fRsi {:.3f} {} fRsi,min {:.3f} ({})", check.met ? "met" : "NOT met", temperature_factor,
                     check.met ? "≥" : "<", check.required, check.criterion);
}

std::string criteria_outcome(const std::vector<CriterionCheck>& checks) {
  const auto failed = std::count_if(checks.begin(), checks.end(), [](const CriterionCheck& c) { return !c.met; });
  if (failed == 0) return checks.size() == 1 ? "criterion met" : "all criteria met";
  return failed == 1 ? "criterion NOT met" : fmt::format("{} criteria NOT met", failed);
}

std::vector<std::string> standard_cautions() {
  return {
      "Results are only as reliable as the geometry, thermal conductivities and boundary "
      "conditions entered; check each of them against the project documents.",
      "A steady-state two-dimensional model leaves out three-dimensional heat flow, moisture "
      "transport and air leakage, any of which can make the real junction colder, or lose more "
      "heat, than calculated.",
      "The mould and condensation verdict holds only for the interior and exterior climate stated "
      "with it; a more humid room or a colder design condition needs a new assessment.",
      "Whether a detail complies is decided by the building codes that apply where it is built and "
      "by a qualified professional, not by this calculation alone.",
  };
}

}  // namespace edgeflux
