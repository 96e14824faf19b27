// The HTML report: self-contained, carries the cautions, the key numbers and the input it came
// from. Built in process; the browser check (test_browser.cpp) looks at it rendered.
#include <doctest/doctest.h>

#include <fmt/format.h>

#include <regex>

#include "../test_support.h"
#include "core/sha256.h"
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

TEST_CASE("the report is self-contained: no scripts, nothing fetched") {
  for (const char* file : {"examples/intermediate-floor.xml", "examples/garage-partition.xml"}) {
    CAPTURE(file);
    const Built b = build(file);
    CHECK(b.html.rfind("<!DOCTYPE html>", 0) == 0);
    CHECK(b.html.find("<script") == std::string::npos);
    CHECK(b.html.find("@import") == std::string::npos);
    CHECK(b.html.find("url(http") == std::string::npos);
    CHECK(b.html.find("<link") == std::string::npos);
    // Every src/href is a fragment (#…); the only absolute URI is the SVG namespace name.
    const std::regex reference(R"re((?:src|href)\s*=\s*"([^"]*)")re");
    for (auto it = std::sregex_iterator(b.html.begin(), b.html.end(), reference); it != std::sregex_iterator(); ++it)
      CHECK_MESSAGE((*it)[1].str().rfind("#", 0) == 0, (*it)[1].str());
    CHECK(count(b.html, "http") == count(b.html, "xmlns=\"http://www.w3.org/2000/svg\""));
    CHECK(count(b.html, "<svg") == 5);
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
  CHECK(b.html.find("PASS") != std::string::npos);  // the demo passes DIN 4108-2 with margin (summary_text agrees)
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
