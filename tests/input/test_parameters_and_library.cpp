// Parameters, {expressions} and the material library in detail files.
#include <doctest/doctest.h>

#include <cmath>

#include "../test_support.h"
#include "input/material_library.h"

using namespace edgeflux;

namespace {
std::string message_of(const std::string& text, const ParameterOverrides& overrides = {}) {
  try {
    parse_detail_text(text, "p.xml", overrides);
  } catch (const InputError& e) {
    return e.what();
  }
  return "";
}
const std::string body = R"(
  <parameters>
    <parameter name="d" value="200"/>
    <parameter name="h" value="2 * d + 600"/>
  </parameters>
  <materials><material id="c" library="concrete-2400"/></materials>
  <regions><rectangle material="c" from="0,0" to="{d},{h}"/></regions>
  <environments><environment id="in" temperature="20"/><environment id="out" temperature="0"/></environments>
  <boundaries>
    <surface environment="in" resistance="rsi-horizontal" path="0,{h} 0,0"/>
    <surface environment="out" resistance="{0.02 * 2}" path="{d},0 {d},{h}"/>
  </boundaries>)";
}  // namespace

TEST_CASE("every library material has a positive λ and a source; typical values say so") {
  REQUIRE(material_library().size() >= 40);
  for (const LibraryMaterial& m : material_library()) {
    CAPTURE(m.id);
    CHECK(m.conductivity > 0.0);
    CHECK(!m.source.empty());
    CHECK((m.basis == "normative" || m.basis == "typical"));
    if (m.basis == "typical") CHECK(m.source.find("typical") != std::string::npos);
  }
  // Spot checks against ISO 10456:2007 Table 3 (from memory).
  CHECK(find_library_material("concrete-2400")->conductivity == 2.0);
  CHECK(find_library_material("reinforced-concrete-2pct")->conductivity == 2.5);
  CHECK(find_library_material("stainless-steel")->conductivity == 17);
}

TEST_CASE("parameters and expressions set geometry and values; --set overrides them") {
  const CrossSection section = parse_detail_text(test::detail_xml(body), "p.xml");
  CHECK(section.regions[0].outline[2].x == doctest::Approx(0.2));
  CHECK(section.regions[0].outline[2].y == doctest::Approx(1.0));  // 2·200 + 600 mm
  CHECK(section.surfaces[1].resistance == doctest::Approx(0.04));
  CHECK(section.materials[0].conductivity == 2.0);  // from the library entry
  CHECK(section.materials[0].source.find("ISO 10456") != std::string::npos);
  const CrossSection thicker = parse_detail_text(test::detail_xml(body), "p.xml", {{"d", 300}});
  CHECK(thicker.regions[0].outline[2].x == doctest::Approx(0.3));
  CHECK(thicker.regions[0].outline[2].y == doctest::Approx(1.2));  // h follows d
  CHECK(thicker.parameters[0].overridden);
}

TEST_CASE("bad parameter names and expressions give clear messages with file and line") {
  const std::string xml = test::detail_xml(body);
  auto with = [&](const std::string& from, const std::string& to) {
    std::string t = xml;
    t.replace(t.find(from), from.size(), to);
    return t;
  };
  std::string m = message_of(with("to=\"{d},{h}\"", "to=\"{d},{hh}\""));
  CAPTURE(m);
  CHECK(m.find("p.xml:8:") != std::string::npos);
  CHECK(m.find("hh") != std::string::npos);
  CHECK(m.find("d, h") != std::string::npos);  // lists the known parameters
  m = message_of(with("to=\"{d},{h}\"", "to=\"{d},{h*(2}\""));
  CHECK(m.find("cannot evaluate") != std::string::npos);
  m = message_of(with("to=\"{d},{h}\"", "to=\"{d},{h\""));
  CHECK(m.find("without a closing") != std::string::npos);
  m = message_of(with("name=\"d\"", "name=\"2d\""));
  CHECK(m.find("not a valid parameter name") != std::string::npos);
  m = message_of(xml, {{"thickness", 3}});
  CHECK(m.find("parameter 'thickness'") != std::string::npos);
  CHECK(m.find("not defined in the file") != std::string::npos);
  m = message_of(with("library=\"concrete-2400\"", "library=\"concrete-9999\""));
  CHECK(m.find("not in the material library") != std::string::npos);
  CHECK(m.find("concrete-2400") != std::string::npos);  // suggests near entries
}
