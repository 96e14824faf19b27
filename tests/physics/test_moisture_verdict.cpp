// Tests of the mould / condensation verdict and of the national minimum-fRsi rule presets.
#include <doctest/doctest.h>

#include <cmath>
#include <set>
#include <stdexcept>
#include <string>

#include "physics/moisture_verdict.h"
#include "physics/vapour.h"

using namespace edgeflux;

namespace {

// Design climate 20 °C / 50 % inside, −5 °C outside (the DIN 4108-2 design climate).
MoistureInput standard_climate(double f_rsi, const char* rule = "none", bool glazing = false) {
  MoistureInput input;
  input.interior_temperature = 20.0;
  input.interior_relative_humidity = 0.5;
  input.exterior_temperature = -5.0;
  input.temperature_factor = f_rsi;
  input.is_glazing_or_frame = glazing;
  input.rule_id = rule;
  return input;
}

}  // namespace

TEST_CASE("rule presets carry the national minimum fRsi values") {
  const auto none = minimum_temperature_factor_rule("none");
  const auto din = minimum_temperature_factor_rule("din-4108-2");
  const auto bre = minimum_temperature_factor_rule("bre-ip-1-06");
  REQUIRE(none.has_value());
  REQUIRE(din.has_value());
  REQUIRE(bre.has_value());
  CHECK_FALSE(none->minimum.has_value());  // ISO 13788 criterion only
  REQUIRE(din->minimum.has_value());
  REQUIRE(bre->minimum.has_value());
  CHECK(*din->minimum == 0.70);  // DIN 4108-2: fRsi ≥ 0.70
  CHECK(*bre->minimum == 0.75);  // BRE IP 1/06: fCRsi = 0.75 for dwellings, schools
  CHECK(din->source == "DIN 4108-2");
  CHECK(bre->source == "BRE IP 1/06");
  CHECK_FALSE(minimum_temperature_factor_rule("DIN").has_value());

  std::set<std::string> ids;
  for (const auto& rule : minimum_temperature_factor_rules()) {
    CAPTURE(rule.id);
    CHECK(ids.insert(std::string(rule.id)).second);
    CHECK_FALSE(rule.description.empty());
    CHECK_FALSE(rule.source.empty());
  }
  CHECK(ids.size() == 3);
}

TEST_CASE("ISO 13788 check values at 20 °C / 50 % inside and −5 °C outside") {
  const MoistureAssessment a = assess_surface_moisture(standard_climate(0.80));
  // Check values computed from the ISO 13788 formulas: psat(20 °C) = 2337.0 Pa,
  // θsi,min = 12.62 °C (rounded to 0.01), fRsi,min = 0.705, dew point 9.27 °C.
  CHECK(std::abs(a.interior_saturation_pressure - 2337.0) <= 0.1);
  CHECK(std::abs(a.interior_vapour_pressure - 0.5 * 2337.0) <= 0.05);
  CHECK(std::abs(a.interior_relative_humidity - 0.5) <= 1e-12);
  CHECK(std::abs(a.mould_surface_temperature - 12.62) <= 0.005);
  CHECK(std::abs(a.mould_temperature_factor - 0.705) <= 0.001);
  CHECK(std::abs(a.dew_point - 9.27) <= 0.01);
  // Condensation limit from the same dew point: (9.27 + 5)/25 = 0.571 (ISO 13788 formulas).
  CHECK(std::abs(a.condensation_temperature_factor - 0.571) <= 0.001);
  // θsi = θe + fRsi·(θi − θe) = −5 + 0.80·25 = 15.0 °C (fRsi definition, ISO 10211).
  CHECK(std::abs(a.surface_temperature - 15.0) <= 1e-12);
  CHECK(std::abs(a.surface_relative_humidity -
                 a.interior_vapour_pressure / saturation_vapour_pressure(15.0)) <= 1e-12);
}

TEST_CASE("verdict on both sides of the ISO 13788 mould limit") {
  SUBCASE("just above the limit passes with a positive margin") {
    const MoistureAssessment a = assess_surface_moisture(standard_climate(0.706));
    CHECK(a.passes);
    CHECK(a.margin > 0.0);
    CHECK(a.governing_basis == RequirementBasis::mould_criterion);
    CHECK(std::abs(a.margin - (0.706 - a.mould_temperature_factor)) <= 1e-12);
    CHECK(a.verdict.rfind("criterion met: fRsi 0.706 ≥ fRsi,min 0.705 (ISO 13788, 80 % surface RH)", 0) == 0);
    REQUIRE(a.criteria.size() == 1);
    CHECK(a.criteria[0].met);
    CHECK(criteria_outcome(a.criteria) == "criterion met");
  }
  SUBCASE("just below the limit fails with a negative margin") {
    const MoistureAssessment a = assess_surface_moisture(standard_climate(0.704));
    CHECK_FALSE(a.passes);
    CHECK(a.margin < 0.0);
    CHECK(a.surface_relative_humidity > 0.8);  // mould criterion, ISO 13788
    CHECK(a.verdict.rfind("criterion NOT met: fRsi 0.704 < fRsi,min 0.705 (ISO 13788, 80 % surface RH)", 0) == 0);
    CHECK(a.verdict.find("mould") != std::string::npos);
    CHECK(criteria_outcome(a.criteria) == "criterion NOT met");
  }
  SUBCASE("exactly on the limit passes: the criterion is surface RH at most 80 %") {
    const double limit = assess_surface_moisture(standard_climate(0.8)).mould_temperature_factor;
    const MoistureAssessment a = assess_surface_moisture(standard_climate(limit));
    CHECK(a.passes);
    CHECK(a.margin == 0.0);
  }
}

TEST_CASE("the national minimum governs only where it is higher than the ISO 13788 value") {
  SUBCASE("DIN 4108-2 0.70 is below the ISO value 0.705 in its own design climate") {
    const MoistureAssessment a = assess_surface_moisture(standard_climate(0.702, "din-4108-2"));
    CHECK(a.governing_basis == RequirementBasis::mould_criterion);
    CHECK(a.required_temperature_factor == a.mould_temperature_factor);
    CHECK_FALSE(a.passes);
    // Both rules are checked rows: the national one is met, the ISO one governs and is not.
    REQUIRE(a.criteria.size() == 2);
    CHECK(a.criteria[0].governs);
    CHECK_FALSE(a.criteria[0].met);
    CHECK_FALSE(a.criteria[1].governs);
    CHECK(a.criteria[1].met);
    CHECK(a.criteria[1].required == 0.70);  // DIN 4108-2
    CHECK(criterion_statement(a.criteria[1], a.actual_temperature_factor) == "criterion met: fRsi 0.702 ≥ fRsi,min 0.700 (DIN 4108-2 minimum)");
    CHECK(criteria_outcome(a.criteria) == "criterion NOT met");
  }
  SUBCASE("BRE IP 1/06 0.75 governs and fails a detail the ISO criterion alone would pass") {
    const MoistureAssessment a = assess_surface_moisture(standard_climate(0.74, "bre-ip-1-06"));
    CHECK(a.governing_basis == RequirementBasis::national_rule);
    CHECK(a.required_temperature_factor == 0.75);  // BRE IP 1/06
    CHECK_FALSE(a.passes);
    CHECK(std::abs(a.margin - (-0.01)) <= 1e-12);
    CHECK(a.governing_requirement.find("BRE IP 1/06") != std::string::npos);
    CHECK(a.verdict.find("national minimum") != std::string::npos);
    REQUIRE(a.criteria.size() == 2);
    CHECK(a.criteria[0].met);
    CHECK_FALSE(a.criteria[1].met);
    CHECK(a.criteria[1].governs);
    CHECK(a.verdict.find("criterion NOT met: fRsi 0.740 < fRsi,min 0.750 (BRE IP 1/06 minimum)") != std::string::npos);
  }
  SUBCASE("BRE IP 1/06 passes above 0.75") {
    const MoistureAssessment a = assess_surface_moisture(standard_climate(0.76, "bre-ip-1-06"));
    CHECK(a.passes);
    CHECK(std::abs(a.margin - 0.01) <= 1e-12);
    CHECK(criteria_outcome(a.criteria) == "all criteria met");
  }
  SUBCASE("DIN 4108-2 governs in a drier climate where the ISO value falls below 0.70") {
    MoistureInput input = standard_climate(0.69, "din-4108-2");
    input.interior_relative_humidity = 0.40;
    const MoistureAssessment a = assess_surface_moisture(input);
    CHECK(a.mould_temperature_factor < 0.70);
    CHECK(a.governing_basis == RequirementBasis::national_rule);
    CHECK(a.required_temperature_factor == 0.70);  // DIN 4108-2
    CHECK_FALSE(a.passes);
  }
}

TEST_CASE("glazing and frames are judged by the condensation criterion") {
  // ISO 13788: surface RH at most 100 % on glazing and frames; limit (9.27 + 5)/25 = 0.571 here.
  const MoistureAssessment pass = assess_surface_moisture(standard_climate(0.60, "none", true));
  CHECK(pass.governing_basis == RequirementBasis::condensation_criterion);
  CHECK(pass.required_temperature_factor == pass.condensation_temperature_factor);
  CHECK(pass.passes);  // 0.60 is below the mould limit but above the condensation limit
  CHECK(pass.margin > 0.0);
  const MoistureAssessment fail = assess_surface_moisture(standard_climate(0.55, "none", true));
  CHECK_FALSE(fail.passes);
  CHECK(fail.margin < 0.0);
  CHECK(fail.surface_temperature < fail.dew_point);
  CHECK(fail.verdict.find("condensation") != std::string::npos);
}

TEST_CASE("interior vapour pressure may be given instead of relative humidity") {
  MoistureInput by_pressure = standard_climate(0.75);
  by_pressure.interior_relative_humidity.reset();
  // pi from a humidity class: class 3 at θe = −5 °C with pe = 300 Pa gives 1191 Pa
  // (ISO 13788 humidity classes, from memory; pe an arbitrary input below saturation).
  by_pressure.interior_vapour_pressure = interior_vapour_pressure_from_class(3, -5.0, 300.0);
  const MoistureAssessment a = assess_surface_moisture(by_pressure);
  CHECK(std::abs(a.interior_vapour_pressure - 1191.0) <= 1e-9);
  CHECK(std::abs(a.interior_relative_humidity - 1191.0 / saturation_vapour_pressure(20.0)) <=
        1e-12);
  CHECK(std::abs(a.dew_point - dew_point(1191.0)) <= 1e-12);

  // The same climate given both ways gives the same limits.
  MoistureInput same = standard_climate(0.75);
  same.interior_relative_humidity.reset();
  same.interior_vapour_pressure = 0.5 * saturation_vapour_pressure(20.0);
  const MoistureAssessment b = assess_surface_moisture(same);
  const MoistureAssessment c = assess_surface_moisture(standard_climate(0.75));
  CHECK(std::abs(b.mould_temperature_factor - c.mould_temperature_factor) <= 1e-12);
}

TEST_CASE("saturated room air fails every detail") {
  // At 100 % indoor RH the mould limit lies above θi, so no fRsi ≤ 1 can meet it.
  MoistureInput input = standard_climate(1.0);
  input.interior_relative_humidity = 1.0;
  const MoistureAssessment a = assess_surface_moisture(input);
  CHECK(a.mould_temperature_factor > 1.0);
  CHECK_FALSE(a.passes);
}

TEST_CASE("assessment rejects out-of-domain input") {
  SUBCASE("relative humidity outside 0–1") {
    MoistureInput input = standard_climate(0.8);
    input.interior_relative_humidity = 1.2;
    CHECK_THROWS_AS(assess_surface_moisture(input), std::invalid_argument);
    input.interior_relative_humidity = 50.0;
    CHECK_THROWS_AS(assess_surface_moisture(input), std::invalid_argument);
    input.interior_relative_humidity = 0.0;
    CHECK_THROWS_AS(assess_surface_moisture(input), std::invalid_argument);
    input.interior_relative_humidity = -0.1;
    CHECK_THROWS_AS(assess_surface_moisture(input), std::invalid_argument);
  }
  SUBCASE("neither or both humidity inputs") {
    MoistureInput input = standard_climate(0.8);
    input.interior_relative_humidity.reset();
    CHECK_THROWS_WITH_AS(assess_surface_moisture(input), doctest::Contains("exactly one"),
                         std::invalid_argument);
    input.interior_relative_humidity = 0.5;
    input.interior_vapour_pressure = 1100.0;
    CHECK_THROWS_AS(assess_surface_moisture(input), std::invalid_argument);
  }
  SUBCASE("interior vapour pressure above saturation or not positive") {
    MoistureInput input = standard_climate(0.8);
    input.interior_relative_humidity.reset();
    input.interior_vapour_pressure = 2500.0;  // above psat(20 °C) = 2337.0 Pa (ISO 13788 formula)
    CHECK_THROWS_AS(assess_surface_moisture(input), std::invalid_argument);
    input.interior_vapour_pressure = 0.0;
    CHECK_THROWS_AS(assess_surface_moisture(input), std::invalid_argument);
  }
  SUBCASE("equal or reversed interior and exterior temperatures") {
    MoistureInput input = standard_climate(0.8);
    input.exterior_temperature = 20.0;
    CHECK_THROWS_AS(assess_surface_moisture(input), std::invalid_argument);
    input.exterior_temperature = 25.0;
    CHECK_THROWS_AS(assess_surface_moisture(input), std::invalid_argument);
  }
  SUBCASE("fRsi outside 0–1 or unset") {
    CHECK_THROWS_AS(assess_surface_moisture(standard_climate(1.2)), std::invalid_argument);
    CHECK_THROWS_AS(assess_surface_moisture(standard_climate(-0.1)), std::invalid_argument);
    MoistureInput input = standard_climate(0.8);
    input.temperature_factor = MoistureInput::unset;
    CHECK_THROWS_AS(assess_surface_moisture(input), std::invalid_argument);
  }
  SUBCASE("unset climate") {
    MoistureInput input;
    input.interior_relative_humidity = 0.5;
    input.temperature_factor = 0.8;
    CHECK_THROWS_AS(assess_surface_moisture(input), std::invalid_argument);
  }
  SUBCASE("unknown rule") {
    CHECK_THROWS_WITH_AS(assess_surface_moisture(standard_climate(0.8, "din-4108")),
                         doctest::Contains("din-4108-2"), std::invalid_argument);
  }
}

TEST_CASE("the four standard cautions are present") {
  const auto cautions = standard_cautions();
  REQUIRE(cautions.size() == 4);
  CHECK(cautions[0].find("geometry") != std::string::npos);
  CHECK(cautions[0].find("conductivities") != std::string::npos);
  CHECK(cautions[0].find("boundary conditions") != std::string::npos);
  CHECK(cautions[1].find("three-dimensional") != std::string::npos);
  CHECK(cautions[1].find("moisture") != std::string::npos);
  CHECK(cautions[1].find("air leakage") != std::string::npos);
  CHECK(cautions[2].find("climate") != std::string::npos);
  CHECK(cautions[3].find("building codes") != std::string::npos);
  CHECK(cautions[3].find("qualified professional") != std::string::npos);
}
