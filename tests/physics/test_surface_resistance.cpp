// Tests of the named surface-resistance presets against the standards they cite.
#include <doctest/doctest.h>

#include <set>
#include <string>

#include "physics/surface_resistance.h"

using namespace edgeflux;

namespace {

double preset_value(const char* id) {
  const auto value = surface_resistance_preset(id);
  REQUIRE_MESSAGE(value.has_value(), "missing preset ", id);
  return *value;
}

}  // namespace

TEST_CASE("heat-loss surface resistances match ISO 6946:2017 Table 7") {
  CHECK(preset_value("rsi-upward") == 0.10);      // ISO 6946:2017 Table 7, heat flow upwards
  CHECK(preset_value("rsi-horizontal") == 0.13);  // ISO 6946:2017 Table 7, horizontal
  CHECK(preset_value("rsi-downward") == 0.17);    // ISO 6946:2017 Table 7, downwards
  CHECK(preset_value("rse") == 0.04);             // ISO 6946:2017 Table 7, external
}

TEST_CASE("surface-temperature run resistances match ISO 13788 and ISO 10077-2") {
  CHECK(preset_value("rsi-temperature") == 0.25);   // ISO 13788 clause 4, opaque surfaces
  CHECK(preset_value("rsi-glazing") == 0.13);       // ISO 13788 clause 4 / ISO 10077-2, glazing
  CHECK(preset_value("rsi-frame-corner") == 0.20);  // ISO 10077-2, frame corners and steps
  CHECK(temperature_run_surface_resistance_opaque == 0.25);   // ISO 13788 clause 4
  CHECK(temperature_run_surface_resistance_glazing == 0.13);  // ISO 13788 clause 4
}

TEST_CASE("every preset has a unique id, a positive value, a description and a source") {
  const auto presets = surface_resistance_presets();
  CHECK(presets.size() == 7);
  std::set<std::string> ids;
  for (const auto& preset : presets) {
    CAPTURE(preset.id);
    CHECK(ids.insert(std::string(preset.id)).second);
    CHECK(preset.value > 0.0);
    CHECK_FALSE(preset.description.empty());
    CHECK_FALSE(preset.source.empty());
    REQUIRE(surface_resistance_preset(preset.id).has_value());
    CHECK(*surface_resistance_preset(preset.id) == preset.value);
  }
}

TEST_CASE("an unknown or differently spelled preset name gives nothing") {
  CHECK_FALSE(surface_resistance_preset("rsi").has_value());
  CHECK_FALSE(surface_resistance_preset("RSE").has_value());
  CHECK_FALSE(surface_resistance_preset("").has_value());
}

TEST_CASE("surface-temperature run resistance of each surface: ISO 13788 defaults inside, heat-loss values elsewhere") {
  CrossSection section;
  section.environments = {{"room", 20.0, Side::interior, {}}, {"outside", -5.0, Side::exterior, {}}, {"garage", 5.0, Side::other, {}}};
  auto surface = [](std::size_t environment, double resistance, SurfaceKind kind = SurfaceKind::opaque) {
    Surface s;
    s.environment = environment, s.resistance = resistance, s.kind = kind;
    return s;
  };
  CHECK(temperature_run_resistance(section, surface(0, 0.13)) == 0.25);                      // ISO 13788 clause 4: opaque
  CHECK(temperature_run_resistance(section, surface(0, 0.13, SurfaceKind::glazing)) == 0.13);  // ISO 13788 clause 4: glazing
  CHECK(temperature_run_resistance(section, surface(1, 0.04)) == 0.04);  // exterior keeps Rse (common practice)
  CHECK(temperature_run_resistance(section, surface(2, 0.13)) == 0.13);  // other environments keep theirs
  CHECK(temperature_run_resistance(section, surface(0, 0.0)) == 0.0);    // a fixed temperature stays fixed
  Surface given = surface(0, 0.13);
  given.temperature_run_resistance_given = 0.2;
  CHECK(temperature_run_resistance(section, given) == 0.2);  // the file's value wins
}
