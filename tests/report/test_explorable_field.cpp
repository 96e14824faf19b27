// The explorable temperature field's data and markup: what the page interpolates is the solver's
// own field, the raster for large meshes samples it, and every reference in the picture resolves.
// The page itself is driven in a browser by explorable_check.py (test_browser.cpp).
#include <doctest/doctest.h>

#include <nlohmann/json.hpp>

#include <cmath>
#include <regex>
#include <set>

#include "../test_support.h"
#include "report/explorable_field.h"
#include "results/field_results.h"

using namespace edgeflux;

namespace {

struct Demo {
  CrossSection section = read_detail_file(test::source_path("examples/intermediate-floor.xml"));
  Calculation calc = calculate(section, {});
};

nlohmann::json data_of(const std::string& html) {
  const std::string open = "<script type=\"application/json\" id=\"xf-data\">";
  const std::size_t a = html.find(open), b = html.find("</script>", a);
  REQUIRE(a != std::string::npos);
  return nlohmann::json::parse(html.substr(a + open.size(), b - a - open.size()));
}

/// Half a unit of a rounded last digit, with room for the rounding of doubles at a tie.
double half_unit(double unit) { return 0.5 * unit * (1 + 1e-9); }

}  // namespace

TEST_CASE("the explorable field carries the solver's mesh and fields to the digits the page needs") {
  const Demo d;
  const std::vector<Drawing> drawings = report_drawings(d.section, d.calc);
  const std::string html = explorable_field_section(d.section, d.calc, drawings);
  const nlohmann::json j = data_of(html);
  const TriMesh& mesh = d.calc.mesh;
  REQUIRE(j["x_um"].size() == mesh.points.size());
  REQUIRE(j["theta"].size() == mesh.points.size());
  REQUIRE(j["triangles"].size() == 3 * mesh.triangles.size());
  REQUIRE(j["q"].size() == mesh.triangles.size());
  for (std::size_t i = 0; i < mesh.points.size(); ++i) {
    // exact: the solver's nodes and surface-temperature run, as embedded (points to 1 µm, θ to 1e-5 K):
    // half a unit of the last digit, which a point halfway between two µm reaches up to the doubles' rounding
    CHECK(std::abs(j["x_um"][i].get<double>() * 1e-6 - mesh.points[i].x) <= half_unit(1e-6));
    CHECK(std::abs(j["y_um"][i].get<double>() * 1e-6 - mesh.points[i].y) <= half_unit(1e-6));
    CHECK(std::abs(j["theta"][i].get<double>() - d.calc.surface_temperature.temperature[i]) <= half_unit(1e-5));
  }
  for (std::size_t t = 0; t < mesh.triangles.size(); ++t) {
    for (int k = 0; k < 3; ++k) CHECK(j["triangles"][3 * t + k].get<int>() == mesh.triangles[t][k]);
    // exact: |q| of the heat-loss run on that triangle, to 1e-3 W/m²
    CHECK(std::abs(j["q"][t].get<double>() - norm(d.calc.heat_loss.field.heat_flux[t])) <= half_unit(1e-3));
    CHECK(j["material"][t].get<int>() == mesh.triangle_material[t]);
  }
  CHECK(j["theta_decimals"] == 2);  // number_format.h: θsi to 2 decimals
  // Figures 1–2 on the sheet, 3–5 the mesh, heat-flux and surface-temperature drawings of Appendix B
  // (hand count from html_tables.cpp).
  CHECK(html.find("<b>Figure 6. Explorable temperature field.</b>") != std::string::npos);
  CHECK(html.find("(as Figure 4)") != std::string::npos);
  CHECK(html.find("final mesh itself") != std::string::npos);
}

TEST_CASE("every reference of the explorable picture resolves in the report, and it needs the temperature drawing") {
  const Demo d;
  const std::vector<Drawing> drawings = report_drawings(d.section, d.calc);
  const std::string html = explorable_field_section(d.section, d.calc, drawings);
  std::string document = html;
  for (const Drawing& drawing : drawings) document += drawing.svg;
  const std::regex reference(R"re(href="#([^"]+)")re");
  int references = 0;
  for (auto it = std::sregex_iterator(html.begin(), html.end(), reference); it != std::sregex_iterator(); ++it, ++references)
    CHECK_MESSAGE(document.find("id=\"" + (*it)[1].str() + "\"") != std::string::npos, (*it)[1].str());
  // The screen picture and the printed copy each use the bands, outline and isotherms (6), and the
  // screen picture the flux classes (1): counted from explorable_field.cpp.
  CHECK(references == 7);
  std::vector<Drawing> without_temperature;
  for (const Drawing& drawing : drawings)
    if (drawing.id != "temperature") without_temperature.push_back(drawing);
  CHECK(explorable_field_section(d.section, d.calc, without_temperature).empty());
}

TEST_CASE("a material name cannot end the data block early") {
  Demo d;
  d.section.materials[0].id = "</script><b>";
  const std::string html = explorable_field_section(d.section, d.calc, report_drawings(d.section, d.calc));
  CHECK(html.find("</script><b>") == std::string::npos);
  CHECK(data_of(html)["materials"][0] == "</script><b>");  // the JSON reads back to the name
}

TEST_CASE("above the triangle limit the picture carries a raster sample of the solver's field") {
  const Demo d;
  const int limit = 1000;
  REQUIRE(d.calc.mesh.n_triangles() > limit);
  const ExplorableMesh raster = explorable_mesh(d.calc, limit);
  CHECK(raster.raster_step > 0);
  CHECK(static_cast<int>(raster.triangles.size()) <= limit);
  // First the solver's own triangles along the boundary, one per triangle with a boundary edge.
  std::set<int> boundary;
  for (const BoundaryEdge& e : d.calc.mesh.boundary_edges) boundary.insert(e.triangle);
  CHECK(raster.boundary_triangles == static_cast<int>(boundary.size()));
  // Then the raster: the section covers 0.34 × 2.68 + 1.16 × 0.28 = 1.236 m² of its 1.5 × 2.68 m box,
  // 31 % (hand calculation from the file), so about 31 % of the cells left, less those the outline cuts.
  const double cells = (limit - raster.boundary_triangles) / 2.0;
  CHECK(static_cast<double>(raster.triangles.size() - raster.boundary_triangles) > 2 * cells * 0.2);
  const std::vector<std::optional<double>> solver = temperatures_at(d.calc.mesh, d.calc.surface_temperature.temperature, raster.points);
  for (std::size_t i = 0; i < raster.points.size(); ++i) {
    REQUIRE(solver[i]);
    // exact: the solver's linear field at the point (a mesh node, or a raster point); 1e-12 K for the
    // rounding of the barycentric sum when the point is found in a neighbouring triangle
    CHECK(std::abs(raster.temperature[i] - *solver[i]) <= 1e-12);
  }
  std::set<int> used;
  for (const auto& t : raster.triangles) {
    const Point a = raster.points[t[0]], b = raster.points[t[1]], c = raster.points[t[2]];
    CHECK(cross(b - a, c - a) > 0);  // counter-clockwise, as the mesh's
    used.insert(t.begin(), t.end());
  }
  CHECK(used.size() == raster.points.size());  // no point without a triangle
  const std::string html = explorable_field_section(d.section, d.calc, report_drawings(d.section, d.calc), limit);
  CHECK(html.find("regular raster sample every") != std::string::npos);
  CHECK(data_of(html)["triangles"].size() == 3 * raster.triangles.size());
}
