// Sloped, turned and nearly-degenerate sections that once failed or gave wrong numbers, solved end to
// end and checked against exact solutions and physical bounds.
#include <doctest/doctest.h>

#include <algorithm>
#include <cmath>

#include <fmt/format.h>

#include "../support/transformed_section.h"
#include "../test_support.h"

using namespace edgeflux;

namespace {

CrossSection section_of(const std::string& materials, const std::string& regions, const std::string& surfaces,
                        const std::string& extra = "") {
  return parse_detail_text("<edgeflux-detail format=\"1\" units=\"mm\"><materials>" + materials + "</materials><regions>" +
                               regions + "</regions><environments><environment id=\"in\" temperature=\"20\" "
                               "side=\"interior\"/><environment id=\"out\" temperature=\"0\" side=\"exterior\"/>"
                               "</environments><boundaries>" + surfaces + "</boundaries>" + extra + "</edgeflux-detail>",
                           "sloped.xml");
}

const std::string lambda_one = "<material id=\"m\" conductivity=\"1\"/>";

/// Smallest interior angle of any triangle of the mesh, degrees.
double smallest_angle(const TriMesh& mesh) {
  double smallest = 180.0;
  for (const auto& t : mesh.triangles)
    for (int k = 0; k < 3; ++k) {
      const Point p = mesh.points[t[k]], u = mesh.points[t[(k + 1) % 3]] - p, v = mesh.points[t[(k + 2) % 3]] - p;
      smallest = std::min(smallest, std::atan2(std::abs(cross(u, v)), dot(u, v)) * 180.0 / 3.141592653589793);
    }
  return smallest;
}

double l2d(const Calculation& calc) { return *calc.heat_loss.field.coupling_2d; }

}  // namespace

TEST_CASE("the quadrilateral 0,0 100,0 100,100 0,90 converges between its one-dimensional bounds, on well-shaped meshes") {
  // λ 1, Rsi 0.13 on the 90 mm left face, Rse 0.04 on the 100 mm right face. Bounds from
  // one-dimensional strips (exact algebra): a 90 mm high slab passes 0.09/0.27 = 0.3333 W/(m·K), a
  // 100 mm one 0.1/0.27 = 0.3704; the section lies between them.
  const CrossSection quad = section_of(lambda_one, "<polygon material=\"m\" points=\"0,0 100,0 100,100 0,90\"/>",
                                       "<surface environment=\"in\" resistance=\"0.13\" path=\"0,0 0,90\"/>"
                                       "<surface environment=\"out\" resistance=\"0.04\" path=\"100,0 100,100\"/>");
  const Calculation calc = calculate(quad, {});
  CHECK(calc.convergence.target_met);
  CHECK(l2d(calc) > 0.09 / 0.27);
  CHECK(l2d(calc) < 0.1 / 0.27);
  // Refinement never leaves its edges: every triangle keeps at least half the mesher's 20.7°
  // (longest-edge bisection, Rivara's bound).
  CHECK(smallest_angle(calc.mesh) > 10.0);
  // Fixed meshes converge towards the adaptive value from either side within the bounds.
  for (double density : {1.0, 2.0, 4.0}) {
    CalculationOptions fixed;
    fixed.adaptive = false;
    fixed.density = density;
    const Calculation f = calculate(quad, fixed);
    CAPTURE(density);
    CHECK(std::abs(l2d(f) - l2d(calc)) < 1e-3 * l2d(calc));
    CHECK(smallest_angle(f.mesh) > 20.0);
  }
}

TEST_CASE("a two-layer parallelogram (sloped side faces) solves and converges like a rectangle") {
  const CrossSection parallelogram = section_of(
      "<material id=\"a\" conductivity=\"1\"/><material id=\"b\" conductivity=\"0.04\"/>",
      "<polygon material=\"a\" points=\"0,0 1000,0 1300,200 300,200\"/><polygon material=\"b\" points=\"300,200 1300,200 1450,300 450,300\"/>",
      "<surface environment=\"in\" resistance=\"0.13\" path=\"0,0 1000,0\"/>"
      "<surface environment=\"out\" resistance=\"0.04\" path=\"450,300 1450,300\"/>");
  const Calculation calc = calculate(parallelogram, {});
  CHECK(calc.convergence.target_met);
  CHECK(std::abs(calc.heat_loss.field.balance.relative) < 1e-9);
  // Bounds from the variational principles of steady conduction (exact): the rectangle's
  // one-dimensional field, tried in the parallelogram, has the same energy (each layer has the same
  // area, each surface the same length), so L2D ≤ 1/(0.13 + 0.2 + 2.5 + 0.04) = 0.3484 W/(m·K)
  // (Dirichlet); a uniform vertical flux through the 550 mm where the two surfaces lie above each
  // other is an admissible flux, so L2D ≥ 0.55 × 0.3484 (Thomson).
  CHECK(l2d(calc) < 1.0 / 2.87);
  CHECK(l2d(calc) > 0.55 / 2.87);
}

TEST_CASE("a 1000 × 300 mm rectangle with one corner raised by 0.5 mm differs from the rectangle by less than 0.1 %") {
  const std::string surfaces = "<surface environment=\"in\" resistance=\"0.13\" path=\"0,0 0,300\"/>"
                               "<surface environment=\"out\" resistance=\"0.04\" path=\"1000,0 1000,300.5\"/>";
  const std::string surfaces_flat = "<surface environment=\"in\" resistance=\"0.13\" path=\"0,0 0,300\"/>"
                                    "<surface environment=\"out\" resistance=\"0.04\" path=\"1000,0 1000,300\"/>";
  const Calculation raised =
      calculate(section_of(lambda_one, "<polygon material=\"m\" points=\"0,0 1000,0 1000,300.5 0,300\"/>", surfaces), {});
  const Calculation flat = calculate(section_of(lambda_one, "<rectangle material=\"m\" from=\"0,0\" to=\"1000,300\"/>", surfaces_flat), {});
  // The raised corner adds 250 mm² (0.08 %) of material and 0.5 mm (0.17 %) to the outer face.
  CHECK(l2d(raised) > l2d(flat));
  CHECK((l2d(raised) - l2d(flat)) / l2d(flat) < 1e-3);
}

TEST_CASE("a layered wall turned by 36.87° gives exactly b·U (exact: one-dimensional conduction, linear elements)") {
  // 1 m wide: 200 mm of λ 1 and 100 mm of λ 0.04; U = 1/(0.13 + 0.2 + 2.5 + 0.04) = 0.348432 W/(m²K)
  // (ISO 6946 formula). Linear elements represent the piecewise-linear exact field, so L2D = b·U to
  // rounding. With fixed temperatures (Rs = 0), L2D = 1/(0.2 + 2.5).
  const std::string materials = "<material id=\"a\" conductivity=\"1\"/><material id=\"b\" conductivity=\"0.04\"/>";
  const std::string regions = "<rectangle material=\"a\" from=\"0,0\" to=\"1000,200\"/><rectangle material=\"b\" from=\"0,200\" to=\"1000,300\"/>";
  for (double rs_in : {0.13, 0.0}) {
    const double rs_out = rs_in > 0 ? 0.04 : 0.0;
    const CrossSection wall = section_of(materials, regions,
                                         fmt::format("<surface environment=\"in\" resistance=\"{}\" path=\"0,0 1000,0\"/>"
                                                     "<surface environment=\"out\" resistance=\"{}\" path=\"0,300 1000,300\"/>",
                                                     rs_in, rs_out));
    const double exact = 1.0 / (rs_in + 0.2 + 2.5 + rs_out);
    CAPTURE(rs_in);
    CalculationOptions fixed;
    fixed.adaptive = false;
    const Calculation turned = calculate(test::transformed_section(wall, 0.8, 0.6, {}, 0), fixed);
    CHECK(l2d(turned) == doctest::Approx(exact).epsilon(1e-9));
    // Any angle, with 12-digit coordinates: the rounding to the 0.01 mm grid changes the 100 mm
    // insulation by at most 0.014 mm (1.4e-4 of its resistance).
    const Calculation cad = calculate(test::turned_section(wall, 17.0), fixed);
    CHECK(l2d(cad) == doctest::Approx(exact).epsilon(2e-4));
  }
}

TEST_CASE("a right triangle between two fixed temperatures: 10 °C along its line of symmetry (exact by symmetry)") {
  // Legs on the axes at 20 °C (x axis) and 0 °C (y axis), adiabatic hypotenuse. Reflection in the
  // hypotenuse and in the line y = x shows θ(x, x) = 10 °C for every x ≤ 500 mm.
  const CrossSection triangle = section_of(
      lambda_one, "<polygon material=\"m\" points=\"0,0 1000,0 0,1000\"/>",
      "<surface environment=\"in\" resistance=\"0\" path=\"0,0 1000,0\"/><surface environment=\"out\" resistance=\"0\" path=\"0,0 0,1000\"/>",
      "<probes><probe name=\"q\" at=\"250,250\"/><probe name=\"h\" at=\"500,500\"/></probes>");
  for (double degrees : {0.0, 30.0}) {
    const Calculation calc = calculate(test::turned_section(triangle, degrees), {});
    CAPTURE(degrees);
    CHECK(test::probe(calc, "q") == doctest::Approx(10.0).epsilon(1e-3));
    CHECK(test::probe(calc, "h") == doctest::Approx(10.0).epsilon(1e-3));
  }
}

TEST_CASE("sloped refinement converges like axis-parallel refinement: the external corner detail turned by 36.87° "
          "needs at most twice the nodes and one more level (common practice)") {
  CalculationOptions options;
  options.mesher = MeshSettings::Mesher::delaunay;
  const CrossSection corner = read_detail_file(test::source_path("details/external-wall-corner.xml"));
  const Calculation straight = calculate(corner, options);
  const Calculation turned = calculate(test::transformed_section(corner, 0.8, 0.6, {}, 0), options);
  CHECK(turned.convergence.target_met);
  CHECK(turned.mesh.n_points() <= 2 * straight.mesh.n_points());
  CHECK(turned.convergence.levels.size() <= straight.convergence.levels.size() + 1);
}

TEST_CASE("the pitched-roof eaves solves at every pitch from 25° to 45° (once 30°, 35° and 40° failed)") {
  for (double pitch : {25.0, 30.0, 35.0, 40.0, 45.0}) {
    CAPTURE(pitch);
    const Calculation calc =
        calculate(read_detail_file(test::source_path("details/eaves-pitched-roof.xml"), {{"pitch", pitch}}), {});
    CHECK(calc.convergence.target_met);
    CHECK(std::abs(calc.heat_loss.field.balance.relative) < 1e-9);  // ISO 10211 asks for 1e-4
    REQUIRE(calc.junction.temperature_factor);
    CHECK(*calc.junction.temperature_factor > 0.0);
    CHECK(*calc.junction.temperature_factor < 1.0);
    CHECK(calc.junction.warnings.empty());
  }
}
