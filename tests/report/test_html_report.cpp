// The HTML report: self-contained, carries the cautions, the key numbers and the input it came
// from. Built in process; the browser check (test_browser.cpp) looks at it rendered.
#include <doctest/doctest.h>

#include <fmt/format.h>

#include <regex>

#include "../test_support.h"
#include "core/sha256.h"
#include "report/html_parts.h"
#include "report/html_report.h"
#include "report/svg_support.h"
#include "report_test_support.h"

using namespace edgeflux;
using namespace edgeflux::test;

namespace {

struct Built {
  CrossSection section;
  Calculation calc;
  std::string input;
  std::string html;
};

Built build(const std::string& relative) {
  Built b{read_detail_file(source_path(relative)), {}, read_text(source_path(relative)), {}};
  b.calc = calculate(b.section, {});
  b.html = html_report(b.section, b.calc, report_drawings(b.section, b.calc), {b.input, "2000-01-01 00:00 UTC"});
  return b;
}

std::size_t count(const std::string& text, const std::string& what) {
  std::size_t n = 0;
  for (std::size_t at = text.find(what); at != std::string::npos; at = text.find(what, at + what.size())) ++n;
  return n;
}

}  // namespace

TEST_CASE("the report is self-contained: inline scripts only, nothing fetched") {
  for (const char* file : {"examples/intermediate-floor.xml", "examples/garage-partition.xml"}) {
    CAPTURE(file);
    const Built b = build(file);
    CHECK(b.html.rfind("<!DOCTYPE html>", 0) == 0);
    // The explorable field's data block and its program, both inline, and nothing else.
    CHECK(count(b.html, "<script") == 2);
    CHECK(count(b.html, "</script>") == 2);
    CHECK(count(b.html, "<script type=\"application/json\" id=\"xf-data\">") == 1);
    CHECK(count(b.html, "<script>") == 1);
    CHECK(b.html.find("@import") == std::string::npos);
    CHECK(b.html.find("url(http") == std::string::npos);
    CHECK(b.html.find("<link") == std::string::npos);
    // Every src/href is a fragment (#…); the only absolute URI is the SVG namespace name.
    const std::regex reference(R"re((?:src|href)\s*=\s*"([^"]*)")re");
    for (auto it = std::sregex_iterator(b.html.begin(), b.html.end(), reference); it != std::sregex_iterator(); ++it)
      CHECK_MESSAGE((*it)[1].str().rfind("#", 0) == 0, (*it)[1].str());
    CHECK(count(b.html, "http") == count(b.html, "xmlns=\"http://www.w3.org/2000/svg\""));
    CHECK(count(b.html, "<svg") == 7);  // five drawings, the explorable picture and its printed copy
    CHECK(b.html.find("@media print") != std::string::npos);
  }
}

TEST_CASE("the report carries the cautions, the key numbers and its input") {
  const Built b = build("examples/intermediate-floor.xml");
  for (const std::string& caution : b.calc.junction.cautions) CHECK(b.html.find(svg::escape(caution)) != std::string::npos);
  REQUIRE(b.calc.heat_loss.field.coupling_2d);
  CHECK(b.html.find(fmt::format("{:.4f}", *b.calc.heat_loss.field.coupling_2d)) != std::string::npos);
  REQUIRE(b.calc.junction.psi.size() == 3);
  for (const PsiValue& p : b.calc.junction.psi) CHECK(b.html.find(fmt::format("{:.3f}", p.psi)) != std::string::npos);
  CHECK(b.html.find(fmt::format("{:.3f}", *b.calc.junction.temperature_factor)) != std::string::npos);
  // Each rule is its own row, in the words every output uses: the ISO 13788 criterion and the DIN 4108-2 minimum.
  REQUIRE(b.calc.junction.moisture.size() == 1);
  for (const CriterionCheck& c : b.calc.junction.moisture[0].assessment.criteria)
    CHECK(b.html.find(svg::escape(criterion_statement(c, b.calc.junction.moisture[0].assessment.actual_temperature_factor))) != std::string::npos);
  CHECK(b.calc.junction.moisture[0].assessment.criteria.size() == 2);
  CHECK(b.html.find("PASS") == std::string::npos);  // a badge would read as compliance, which the cautions disclaim
  // Provenance: the SHA-256 of the exact bytes, and the bytes themselves, escaped.
  CHECK(b.html.find(sha256_hex(b.input)) != std::string::npos);
  CHECK(b.html.find(svg::escape(b.input)) != std::string::npos);
  CHECK(b.html.find("<details>") != std::string::npos);
  CHECK(b.html.find("Validation status:</b> not run for this report") != std::string::npos);
  CHECK(b.html.find("2000-01-01 00:00 UTC") != std::string::npos);
}

TEST_CASE("a report made with a validation run shows its conformity result (ISO 10211 Annex C, Cases 1 and 2)") {
  const Built b = build("examples/intermediate-floor.xml");
  const std::string html = html_report(b.section, b.calc, {}, {b.input, "now", iso10211_conformity()});
  CHECK(html.find("38 of 38 reference values within the standard's tolerance") != std::string::npos);
  CHECK(html.find("high-precision method") != std::string::npos);
  CHECK(html.find("Φ through the section") != std::string::npos);
}

TEST_CASE("with three environments the report gives the coupling matrix and g factors") {
  const Built b = build("examples/garage-partition.xml");
  CHECK(b.html.find("Coupling matrix") != std::string::npos);
  for (const auto& row : b.calc.junction.coupling)
    for (double v : row) CHECK(b.html.find(fmt::format("{:.5f}", v)) != std::string::npos);
  for (double g : b.calc.junction.weighting_factors) CHECK(b.html.find(fmt::format("{:.4f}", g)) != std::string::npos);
  for (const std::string& w : b.calc.junction.warnings) CHECK(b.html.find(svg::escape(w)) != std::string::npos);
  CHECK(b.html.find("assumed, the detail file gives none") != std::string::npos);  // this example gives no climate
}

TEST_CASE("text from the detail file is escaped everywhere") {
  Built b = build("examples/intermediate-floor.xml");
  b.section.title = "<b>bold</b> & \"quoted\"";
  b.section.surfaces[0].name = "<face>";
  const std::string html = html_report(b.section, b.calc, report_drawings(b.section, b.calc), {"<x/>", "now"});
  CHECK(html.find("<b>bold</b>") == std::string::npos);
  CHECK(html.find("&lt;b&gt;bold&lt;/b&gt; &amp; &quot;quoted&quot;") != std::string::npos);
  CHECK(html.find("<face>") == std::string::npos);
  CHECK(html.find("&lt;x/&gt;") != std::string::npos);
}

TEST_CASE("the junction sheet: record on every page, the ψ carried forward marked, the junction's own minimum, appendices that can be left out") {
  const Built b = build("examples/intermediate-floor.xml");
  // The record of the demo file, in the title block and in the running header of printed pages.
  for (const char* field : {"Lindenhof row houses, block B", "A-310 section B-B", "R. Okafor", "M. Lindqvist", "2026-11-30"})
    CHECK(b.html.find(field) != std::string::npos);
  CHECK(b.html.find("@top-left { content: \"Junction J04 · rev. B · 2026-11-30\"; }") != std::string::npos);
  CHECK(b.html.find("counter(page) \" of \" counter(pages)") != std::string::npos);
  // External dimensions carried forward: that row is marked, the others are for reference.
  REQUIRE(b.section.carried_forward == DimensionSystem::external);
  CHECK(count(b.html, "<b>carried forward</b>") == 1);
  CHECK(b.html.find("for reference: internal") != std::string::npos);
  // θsi,min lies on the plain upper wall at its cut-off; the sheet says so and gives the junction's own minimum.
  CHECK(b.html.find("the undisturbed element governs") != std::string::npos);
  REQUIRE(b.calc.junction.junction_minimum);
  CHECK(b.html.find(fmt::format("{:.2f} °C", b.calc.junction.junction_minimum->temperature)) != std::string::npos);
  // Appendices follow the sheet; without them the sheet alone, saying what was left out.
  for (const char* id : {"id=\"appendix-results\"", "id=\"appendix-mesh\"", "id=\"method\""}) CHECK(b.html.find(id) != std::string::npos);
  const std::string sheet = html_report(b.section, b.calc, report_drawings(b.section, b.calc), {b.input, "2000-01-01 00:00 UTC"}, false);
  for (const char* id : {"id=\"appendix-results\"", "id=\"appendix-mesh\"", "id=\"method\""}) CHECK(sheet.find(id) == std::string::npos);
  CHECK(sheet.find("were left out of this print") != std::string::npos);
  CHECK(count(sheet, "<svg") == 2);  // the detail and its temperature field
}

TEST_CASE("three environments: the sheet gives ψ per pair of environments") {
  const Built b = build("examples/garage-partition.xml");
  REQUIRE(b.calc.junction.pair_psi.size() == 3);
  for (const PairPsi& pair : b.calc.junction.pair_psi)
    for (const PsiValue& p : pair.psi)
      CHECK(b.html.find(fmt::format("ψ {}–{}, {} dimensions", b.section.environments[pair.first].id, b.section.environments[pair.second].id,
                                    dimension_system_name(p.system))) != std::string::npos);
}

TEST_CASE("record text cannot break out of the running header's CSS string or the style element") {
  CHECK(html::css_string("J\"1\\ </style><script>") == "\"J\\\"1\\\\ \\3C /style>\\3C script>\"");
  CHECK(html::css_string("w\xff.xml") == "\"w\u00ff.xml\"");  // a file name that is not UTF-8 is read as Latin-1
  Built b = build("examples/intermediate-floor.xml");
  b.section.record.reference = "</style><b>x";
  const std::string html = html_report(b.section, b.calc, {}, {b.input, "now"});
  CHECK(html.find("</style><b>x") == std::string::npos);
  CHECK(html.find("&lt;/style&gt;&lt;b&gt;x") != std::string::npos);
}
