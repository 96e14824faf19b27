// The junction record (<record>), the dimension system carried forward, and the library values a
// material brings with it (density, kind of value).
#include <doctest/doctest.h>

#include "../support/fixtures.h"
#include "../test_support.h"
#include "input/material_library.h"

using namespace edgeflux;

namespace {
std::string message_of(const std::string& text) {
  try {
    parse_detail_text(text, "r.xml");
  } catch (const InputError& e) {
    return e.what();
  }
  return "";
}
const std::string flanking = R"(
  <flanking-elements carry-forward="external">
    <element id="wall" cut-off="0,0 300,0" length-external="1000"/>
  </flanking-elements>)";
}  // namespace

TEST_CASE("<record> is read into the junction record, every field optional") {
  const CrossSection s = parse_detail_text(test::detail_xml(
      R"(<record reference="J03" project="P" client="C" site="S" drawing="D-1" revision="C" assessor="A" checker="K" date="2026-11-30"/>)" +
      test::two_layer_wall_body()), "r.xml");
  CHECK(s.record.reference == "J03");
  CHECK(s.record.project == "P");
  CHECK(s.record.client == "C");
  CHECK(s.record.site == "S");
  CHECK(s.record.drawing == "D-1");
  CHECK(s.record.revision == "C");
  CHECK(s.record.assessor == "A");
  CHECK(s.record.checker == "K");
  CHECK(s.record.date == "2026-11-30");
  CHECK(parse_detail_text(test::detail_xml(test::two_layer_wall_body()), "r.xml").record.empty());
}

TEST_CASE("a record that would not fit a title block, or is given twice, or holds content, is refused with the line") {
  const std::string body = test::two_layer_wall_body();
  CHECK(message_of(test::detail_xml("<record project=\"" + std::string(201, 'x') + "\"/>" + body)).find("at most 200") != std::string::npos);
  CHECK(message_of(test::detail_xml("<record/><record/>" + body)).find("r.xml:2: <record>: is given twice") != std::string::npos);
  CHECK(message_of(test::detail_xml("<record>J03</record>" + body)).find("takes only attributes") != std::string::npos);
  CHECK(message_of(test::detail_xml("<record ref=\"J03\"/>" + body)).find("ref") != std::string::npos);
}

TEST_CASE("carry-forward names the system the ψ goes into; it needs a length in it for every element") {
  const CrossSection s = parse_detail_text(test::detail_xml(test::two_layer_wall_body() + flanking), "r.xml");
  REQUIRE(s.carried_forward);
  CHECK(*s.carried_forward == DimensionSystem::external);
  std::string no_length = flanking;
  no_length.replace(no_length.find("external\">"), 8, "internal");
  const std::string m = message_of(test::detail_xml(test::two_layer_wall_body() + no_length));
  CHECK(m.find("has no internal length") != std::string::npos);
  std::string unknown = flanking;
  unknown.replace(unknown.find("\"external\">"), 10, "\"outside\"");
  CHECK(message_of(test::detail_xml(test::two_layer_wall_body() + unknown)).find("carry-forward dimension system \"outside\" is not known") !=
        std::string::npos);
}

TEST_CASE("a library material brings its density and kind of value; a λ of the detail's own has neither kind") {
  std::string body = test::two_layer_wall_body();
  body.replace(body.find("<material id=\"brick\" conductivity=\"0.8\" source=\"test value\"/>"), 62, "<material id=\"brick\" library=\"concrete-2000\"/>");
  body.replace(body.find("<material id=\"eps\" conductivity=\"0.035\" source=\"test value\"/>"), 61,
               "<material id=\"eps\" library=\"concrete-2000\" conductivity=\"0.035\"/>");
  const CrossSection s = parse_detail_text(test::detail_xml(body), "r.xml");
  CHECK(s.materials[0].density == 2000.0);  // ISO 10456:2007 Table 3, concrete medium density 2000 kg/m³
  CHECK(s.materials[0].basis == "normative");
  CHECK(s.materials[1].conductivity == 0.035);
  CHECK(s.materials[1].basis.empty());
}

TEST_CASE("library entries checked against their tables: ice at −10 °C and glass-fibre polyamide") {
  // ISO 10456:2007 Table 3 (from memory): ice at −10 °C 2.30 W/(m·K) at 920 kg/m³ (2.20 at 900 kg/m³ is 0 °C).
  const LibraryMaterial* ice = find_library_material("ice");
  REQUIRE(ice);
  CHECK(ice->conductivity == 2.30);
  CHECK(ice->density == 920.0);
  // ISO 10456:2007 Table 3 / ISO 10077-2 (from memory): polyamide 6.6 with 25 % glass fibre 0.30 W/(m·K), 1450 kg/m³.
  const LibraryMaterial* pa = find_library_material("polyamide-glass-fibre");
  REQUIRE(pa);
  CHECK(pa->conductivity == 0.30);
  CHECK(pa->density == 1450.0);
}
