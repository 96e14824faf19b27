// DXF drawings as the source of a section's geometry: what the reader takes from each kind of
// entity, that a drawn section solves exactly as the same section typed in, and the messages for
// what real drawings get wrong. The drawings are made by scripts/make-drawings (ezdxf, an
// independent DXF writer).
#include <doctest/doctest.h>

#include <algorithm>
#include <cmath>
#include <string>

#include "../test_support.h"
#include "core/error.h"
#include "input/read_drawing.h"

using namespace edgeflux;

namespace {

std::string drawing_path(const std::string& name) { return test::source_path("tests/data/drawings/" + name); }

CadDrawing read(const std::string& name, std::optional<std::string> unit = std::nullopt) {
  DrawingOptions options;
  options.unit = unit;
  return read_drawing(drawing_path(name), options);
}

const DrawingLayer& layer(const CadDrawing& d, const std::string& name) {
  for (const DrawingLayer& l : d.layers)
    if (l.name == name) return l;
  FAIL("no layer " << name);
  throw std::logic_error("unreachable");
}

std::vector<const DrawnShape*> outlines_on(const CadDrawing& d, const std::string& name) {
  std::vector<const DrawnShape*> found;
  for (const DrawnShape& s : d.outlines)
    if (s.layer == name) found.push_back(&s);
  return found;
}

/// Lower-left and upper-right corner of a shape, m.
std::pair<Point, Point> extent(const std::vector<Point>& points) {
  Point lo{1e300, 1e300}, hi{-1e300, -1e300};
  for (Point p : points) lo = {std::min(lo.x, p.x), std::min(lo.y, p.y)}, hi = {std::max(hi.x, p.x), std::max(hi.y, p.y)};
  return {lo, hi};
}

double area(const std::vector<Point>& points) {
  double a = 0.0;
  for (std::size_t i = 0; i < points.size(); ++i) {
    const Point p = points[i], q = points[(i + 1) % points.size()];
    a += p.x * q.y - q.x * p.y;
  }
  return 0.5 * a;
}

/// A detail beside the test drawings whose regions come from `drawing` with the given layers.
std::string detail_with(const std::string& drawing_element, const std::string& surfaces) {
  return test::detail_xml("<materials><material id=\"m\" conductivity=\"1\"/></materials><regions>" + drawing_element +
                          "</regions><environments><environment id=\"in\" temperature=\"20\" side=\"interior\"/>"
                          "<environment id=\"out\" temperature=\"0\" side=\"exterior\"/></environments><boundaries>" +
                          surfaces + "</boundaries>");
}

const std::string wall_faces = "<surface environment=\"in\" resistance=\"0.13\" drawing-layer=\"FACE-IN\"/>"
                               "<surface environment=\"out\" resistance=\"0.04\" drawing-layer=\"FACE-OUT\"/>";

CrossSection parse_beside_drawings(const std::string& xml) {
  return parse_detail_text(xml, drawing_path("test.xml"));
}

std::string reader_error(const std::string& xml) {
  try {
    parse_beside_drawings(xml);
  } catch (const InputError& e) {
    return e.what();
  }
  return "";
}

bool has_warning(const CrossSection& section, const std::string& fragment) {
  return std::any_of(section.warnings.begin(), section.warnings.end(),
                     [&](const std::string& w) { return w.find(fragment) != std::string::npos; });
}

}  // namespace

TEST_CASE("drawing kit: blocks in arrays and nested, scaled and turned inserts, hatches with islands, bulges, "
          "chained lines and arcs, circles; annotations counted, not read (exact geometry of the drawing)") {
  const CadDrawing d = read("kit.dxf");
  CHECK(d.unit == "mm");
  CHECK(d.unit_stated);
  CHECK(d.metres_per_unit == 0.001);
  CHECK(d.splines.empty());

  // Four rows of a course of two 100 × 250 mm bricks (nested block, array insert): eight bricks
  // tiling 0 ≤ x ≤ 200, 0 ≤ y ≤ 1000 mm on the insert's layer (the block's entities are on layer 0).
  const auto bricks = outlines_on(d, "MASONRY");
  REQUIRE(bricks.size() == 8);
  double brick_area = 0.0;
  for (const DrawnShape* b : bricks) {
    CHECK(std::abs(area(b->points)) == doctest::Approx(0.1 * 0.25).epsilon(1e-12));
    brick_area += std::abs(area(b->points));
    const auto [lo, hi] = extent(b->points);
    CHECK(lo.x >= -1e-12);
    CHECK(hi.x <= 0.2 + 1e-12);
    CHECK(lo.y >= -1e-12);
    CHECK(hi.y <= 1.0 + 1e-12);
  }
  CHECK(brick_area == doctest::Approx(0.2).epsilon(1e-12));

  // Steel: the plate block (25 × 5 mm) at scale 2 turned 90° lands on 140…150 × 600…650 mm; the
  // duct closed from four lines and a fillet arc of radius 10 mm; the anchor circle r = 20 mm.
  const auto steel = outlines_on(d, "STEEL");
  REQUIRE(steel.size() == 3);
  int plates = 0, ducts = 0, circles = 0;
  for (const DrawnShape* s : steel) {
    const auto [lo, hi] = extent(s->points);
    const double a = std::abs(area(s->points));
    if (std::abs(lo.x - 0.14) < 1e-9 && std::abs(hi.x - 0.15) < 1e-9 && std::abs(lo.y - 0.6) < 1e-9 &&
        std::abs(hi.y - 0.65) < 1e-9) {
      ++plates;
      CHECK(a == doctest::Approx(0.01 * 0.05).epsilon(1e-9));
    } else if (std::abs(lo.x - 0.28) < 1e-9 && std::abs(hi.y - 0.52) < 1e-9) {
      ++ducts;
      // 40 × 40 mm less the corner a 10 mm fillet cuts off: 10² (1 − π/4); chords a little less.
      const double exact = 0.04 * 0.04 - 0.01 * 0.01 * (1.0 - M_PI / 4.0);
      CHECK(a < exact);
      CHECK(a == doctest::Approx(exact).epsilon(1e-4));
      CHECK(s->entities.find("ARC") != std::string::npos);
      CHECK(s->entities.find("LINE") != std::string::npos);
    } else {
      ++circles;
      CHECK(hi.x - lo.x == doctest::Approx(0.04).epsilon(1e-4));
      CHECK(a == doctest::Approx(M_PI * 0.02 * 0.02).epsilon(1e-3));  // chords: within the arc tolerance
      for (Point p : s->points) CHECK(std::hypot(p.x - 0.1, p.y - 0.9) == doctest::Approx(0.02).epsilon(1e-12));
    }
  }
  CHECK(plates == 1);
  CHECK(ducts == 1);
  CHECK(circles == 1);

  // The insulation hatch: 200 × 1000 mm outline with one 40 × 40 mm island.
  const auto insulation = outlines_on(d, "INSULATION");
  REQUIRE(insulation.size() == 1);
  CHECK(std::abs(area(insulation[0]->points)) == doctest::Approx(0.2).epsilon(1e-12));
  REQUIRE(insulation[0]->islands.size() == 1);
  CHECK(std::abs(area(insulation[0]->islands[0])) == doctest::Approx(0.04 * 0.04).epsilon(1e-12));

  // The polyline with bulge −tan(22.5°): a clockwise quarter arc from (310, 520) to (320, 510) about
  // the fillet's centre (310, 510); its points between the ends lie on that circle.
  const auto air = outlines_on(d, "AIR");
  REQUIRE(air.size() == 1);
  int on_arc = 0;
  for (Point p : air[0]->points) {
    const double r = std::hypot(p.x - 0.31, p.y - 0.51);
    if (std::abs(r - 0.01) < 1e-12) ++on_arc;
  }
  CHECK(on_arc >= 3);  // the two ends and at least one chord point
  CHECK(std::abs(area(air[0]->points)) == doctest::Approx(0.01 * 0.01 * (1.0 - M_PI / 4.0)).epsilon(1e-3));

  // The two faces are open lines; text and the dimension are counted as ignored.
  CHECK(layer(d, "FACE-IN").chains == 1);
  CHECK(layer(d, "FACE-OUT").chains == 1);
  CHECK(d.ignored.count("TEXT") == 1);
  CHECK(d.ignored.count("DIMENSION") == 1);
  CHECK(d.outlines.size() == 13);
  CHECK(!d.chord_points.empty());
}

TEST_CASE("the drawing kit solves: painted in entity order, the island left to the duct, energy balance closed") {
  const CrossSection section = read_detail_file(drawing_path("kit.xml"));
  CHECK(section.regions.size() == 13);
  CHECK(section.surfaces.size() == 2);
  CHECK(section.warnings.empty());
  const Calculation calc = calculate(section, {});
  CHECK(calc.convergence.target_met);
  CHECK(std::abs(calc.heat_loss.field.balance.relative) < 1e-4);  // ISO 10211 energy-balance criterion
  // Steel (λ 50) in both layers adds conductance to the plain two-layer wall, which the 21 mm² air
  // pocket (0.025 instead of 0.035) cannot take back: L2D above the wall's 1-D value (ISO 6946 §6.7,
  // layers in series, 1 m high; masonry λ 0.99 from the material library), by a few per cent at most.
  const double plain_wall = 1.0 / (0.13 + 0.2 / 0.99 + 0.2 / 0.035 + 0.04);
  const double l2d = *calc.heat_loss.field.coupling_2d;
  CHECK(l2d > plain_wall);
  CHECK(l2d < 1.05 * plain_wall);
}

TEST_CASE("ISO 10211 Case 2 read from a DXF drawing in metres gives the results of the detail typed in") {
  const Calculation typed = test::solve_file("tests/reference/iso10211_case2.xml");
  const Calculation drawn = test::solve_file("tests/data/drawings/case2-from-drawing.xml");
  // The same section to the last bit of the input up to the unit conversion: equal to rounding.
  REQUIRE(drawn.heat_loss.field.probes.size() == typed.heat_loss.field.probes.size());
  for (std::size_t k = 0; k < typed.heat_loss.field.probes.size(); ++k) {
    CAPTURE(typed.heat_loss.field.probes[k].name);
    CHECK(drawn.heat_loss.field.probes[k].temperature ==
          doctest::Approx(typed.heat_loss.field.probes[k].temperature).epsilon(1e-9));
    // ISO 10211:2017 Annex C, Case 2: temperatures within 0.1 K of the table (checked for the typed
    // file by test_iso10211_case2.cpp; the drawn file equals it).
  }
  const double flow = drawn.heat_loss.field.environments[0].heat_flow;
  CHECK(flow == doctest::Approx(typed.heat_loss.field.environments[0].heat_flow).epsilon(1e-9));
  CHECK(std::abs(flow - 9.5) <= 0.1);  // ISO 10211:2017 Annex C, Case 2: 9.5 W/m within 0.1 W/m
}

TEST_CASE("a detail from a drawing turned by 30° and rounded to 0.001 mm agrees with the demo typed in") {
  const Calculation typed = test::solve_file("examples/intermediate-floor.xml");
  const Calculation drawn = test::solve_file("tests/data/drawings/turned-floor.xml");
  const AccuracyTarget& target = typed.convergence.target;
  // Two estimates of one value agree within their error bars, each at least the accuracy target
  // (common practice); the drawing's 0.001 mm rounding moves no result by more.
  auto agree = [](ErrorEstimate a, ErrorEstimate b, double floor) {
    return std::abs(a.value - b.value) <= std::max(a.error, floor) + std::max(b.error, floor);
  };
  REQUIRE(drawn.convergence.coupling_2d);
  CHECK(agree(*typed.convergence.coupling_2d, *drawn.convergence.coupling_2d,
              target.coupling_relative * typed.convergence.coupling_2d->value));
  REQUIRE(drawn.convergence.psi.size() == typed.convergence.psi.size());
  for (std::size_t k = 0; k < typed.convergence.psi.size(); ++k)
    CHECK(agree(typed.convergence.psi[k], drawn.convergence.psi[k], target.psi_absolute));
  REQUIRE(drawn.convergence.min_surface_temperature);
  CHECK(agree(*typed.convergence.min_surface_temperature, *drawn.convergence.min_surface_temperature,
              target.temperature_absolute));
  REQUIRE(drawn.convergence.probes.size() == typed.convergence.probes.size());
  for (std::size_t k = 0; k < typed.convergence.probes.size(); ++k)
    CHECK(agree(typed.convergence.probes[k], drawn.convergence.probes[k], target.temperature_absolute));
  REQUIRE(drawn.junction.temperature_factor);
  CHECK(std::abs(*drawn.junction.temperature_factor - *typed.junction.temperature_factor) < 1e-3);
}

TEST_CASE("drawing units: $INSUNITS read, a unit given in the detail file overrides it (exact conversions)") {
  const CadDrawing metres = read("case2.dxf");
  CHECK(metres.unit == "m");
  CHECK(metres.unit_stated);
  const CadDrawing inches = read("case2.dxf", std::string("in"));
  CHECK(inches.metres_per_unit == 0.0254);  // 1 in = 25.4 mm exactly (international inch, 1959)
  REQUIRE(inches.outlines.size() == metres.outlines.size());
  for (std::size_t i = 0; i < metres.outlines.size(); ++i)
    for (std::size_t k = 0; k < metres.outlines[i].points.size(); ++k) {
      CHECK(inches.outlines[i].points[k].x == doctest::Approx(0.0254 * metres.outlines[i].points[k].x).epsilon(1e-12));
      CHECK(inches.outlines[i].points[k].y == doctest::Approx(0.0254 * metres.outlines[i].points[k].y).epsilon(1e-12));
    }
  const CadDrawing feet = read("case2.dxf", std::string("ft"));
  CHECK(feet.metres_per_unit == doctest::Approx(0.3048).epsilon(1e-15));  // 1 ft = 0.3048 m exactly
  CHECK(read("case2.dxf", std::string("cm")).metres_per_unit == doctest::Approx(0.01).epsilon(1e-15));
  CHECK(read("case2.dxf", std::string("mm")).metres_per_unit == doctest::Approx(0.001).epsilon(1e-15));

  // No $INSUNITS: millimetres with a warning that names the fix; the drawing is in metres, so
  // units="m" is needed, and without it the 1 m high wall is read as 1 mm, which a warning calls
  // implausible for a junction.
  const CadDrawing unstated = read("fault-no-unit.dxf");
  CHECK(!unstated.unit_stated);
  CHECK(unstated.unit == "mm");
  const std::string layers = "<layer name=\"WALL\" material=\"m\"/>";
  const CrossSection right = parse_beside_drawings(
      detail_with("<drawing file=\"fault-no-unit.dxf\" units=\"m\">" + layers + "</drawing>", wall_faces));
  CHECK(!has_warning(right, "states no unit"));
  const Calculation calc = calculate(right, {});
  // One-dimensional wall, 1 m high: L2D = 1 / (0.13 + 0.3/1 + 0.04) (ISO 6946 §6.7, exact).
  CHECK(*calc.heat_loss.field.coupling_2d == doctest::Approx(1.0 / 0.47).epsilon(1e-6));
  const CrossSection wrong =
      parse_beside_drawings(detail_with("<drawing file=\"fault-no-unit.dxf\">" + layers + "</drawing>", wall_faces));
  CHECK(has_warning(wrong, "states no unit ($INSUNITS); it was read in millimetres: give units="));
  CHECK(has_warning(wrong, "only 1 mm across: were the coordinates meant in metres"));
  CHECK_THROWS_AS(read("case2.dxf", std::string("furlong")), InputError);
}

TEST_CASE("messages for what drawings get wrong: open outlines with their gap, duplicates and zero-length lines "
          "dropped with a note, splines and missing layers refused, unmapped outlines named") {
  SUBCASE("an outline that does not close names its ends and the gap") {
    const std::string error = reader_error(detail_with(
        "<drawing file=\"fault-open-outline.dxf\"><layer name=\"WALL\" material=\"m\"/></drawing>", wall_faces));
    CHECK(error.find("test.xml") != std::string::npos);
    CHECK(error.find("layer \"WALL\"") != std::string::npos);
    CHECK(error.find("do not close into an outline") != std::string::npos);
    CHECK(error.find("0.500 mm apart") != std::string::npos);
    CHECK(error.find("(0, 0.5) mm") != std::string::npos);
  }
  SUBCASE("duplicates and a zero-length line are dropped with a note; the wall solves") {
    const CadDrawing d = read("fault-duplicates.dxf");
    CHECK(outlines_on(d, "WALL").size() == 1);
    const auto noted = [&](const std::string& fragment) {
      return std::any_of(d.notes.begin(), d.notes.end(), [&](const std::string& n) { return n.find(fragment) != std::string::npos; });
    };
    CHECK(noted("repeats"));
    CHECK(noted("zero-length line"));
    REQUIRE(d.splines.size() == 1);
    CHECK(d.splines[0].rfind("CURVE:", 0) == 0);
    const CrossSection section = parse_beside_drawings(
        detail_with("<drawing file=\"fault-duplicates.dxf\"><layer name=\"WALL\" material=\"m\"/></drawing>", wall_faces));
    CHECK(section.regions.size() == 1);
    CHECK(has_warning(section, "repeats"));
    const Calculation calc = calculate(section, {});
    CHECK(*calc.heat_loss.field.coupling_2d == doctest::Approx(1.0 / 0.47).epsilon(1e-6));  // ISO 6946 §6.7, exact
  }
  SUBCASE("a spline on a mapped layer is refused, with how to convert it") {
    const std::string error = reader_error(detail_with("<drawing file=\"fault-duplicates.dxf\"><layer name=\"WALL\" "
                                                       "material=\"m\"/><layer name=\"CURVE\" material=\"m\"/></drawing>",
                                                       wall_faces));
    CHECK(error.find("spline") != std::string::npos);
    CHECK(error.find("polyline") != std::string::npos);
  }
  SUBCASE("a layer the drawing lacks is refused, listing the layers with outlines") {
    const std::string error = reader_error(
        detail_with("<drawing file=\"kit.dxf\"><layer name=\"BRICKS\" material=\"m\"/></drawing>", wall_faces));
    CHECK(error.find("has no layer \"BRICKS\"") != std::string::npos);
    CHECK(error.find("MASONRY") != std::string::npos);
    CHECK(error.find("FACE-IN") == std::string::npos);  // open lines only: no regions there
  }
  SUBCASE("layers with outlines that are not mapped are named in a warning") {
    const CrossSection section = parse_beside_drawings(detail_with(
        "<drawing file=\"kit.dxf\"><layer name=\"MASONRY\" material=\"m\"/><layer name=\"INSULATION\" "
        "material=\"m\"/></drawing>",
        wall_faces));
    CHECK(has_warning(section, "\"STEEL\" (3 outlines)"));
    CHECK(has_warning(section, "\"AIR\" (1 outline)"));
  }
  SUBCASE("a surface layer with no open lines, and a drawing that is not there") {
    std::string error = reader_error(detail_with(
        "<drawing file=\"kit.dxf\"><layer name=\"MASONRY\" material=\"m\"/></drawing>",
        "<surface environment=\"in\" resistance=\"0.13\" drawing-layer=\"FACE-SIDE\"/>"));
    CHECK(error.find("no open lines on layer \"FACE-SIDE\"") != std::string::npos);
    error = reader_error(detail_with("<drawing file=\"missing.dxf\"><layer name=\"W\" material=\"m\"/></drawing>", wall_faces));
    CHECK(error.find("missing.dxf") != std::string::npos);
  }
}

TEST_CASE("paint-order decides which layer covers another where outlines overlap, else entity order") {
  // Case 2's insulation is drawn first and the aluminium over it; painting the insulation last
  // covers the aluminium, and the heat flow falls (aluminium λ 230 becomes insulation λ 0.12):
  // lowering λ anywhere lowers L2D (Thomson's principle, exact).
  const std::string case2_layers = "<layer name=\"INSULATION\" material=\"ins\"%/><layer name=\"ALUMINIUM\" "
                                   "material=\"alu\"/><layer name=\"WOOD\" material=\"ins\"/><layer name=\"CONCRETE\" "
                                   "material=\"con\"/>";
  auto detail = [&](const std::string& paint) {
    std::string layers = case2_layers;
    layers.replace(layers.find('%'), 1, paint);
    return test::detail_xml(
        "<materials><material id=\"ins\" conductivity=\"0.12\"/><material id=\"alu\" conductivity=\"230\"/>"
        "<material id=\"con\" conductivity=\"1.15\"/></materials><regions><drawing file=\"case2.dxf\">" +
        layers + "</drawing></regions><environments><environment id=\"warm\" temperature=\"20\" side=\"interior\"/>"
                 "<environment id=\"cold\" temperature=\"0\" side=\"exterior\"/></environments><boundaries>"
                 "<surface environment=\"warm\" resistance=\"0.1\" drawing-layer=\"FACE-WARM\"/><surface "
                 "environment=\"cold\" resistance=\"0.1\" drawing-layer=\"FACE-COLD\"/></boundaries>");
  };
  const CrossSection entity_order = parse_beside_drawings(detail(""));
  const CrossSection insulation_last = parse_beside_drawings(detail(" paint-order=\"1\""));
  REQUIRE(entity_order.regions.size() == 6);
  REQUIRE(insulation_last.regions.size() == 6);
  CHECK(entity_order.regions.front().name.rfind("INSULATION", 0) == 0);
  CHECK(insulation_last.regions.back().name.rfind("INSULATION", 0) == 0);
  const double with_aluminium = *calculate(entity_order, {}).heat_loss.field.coupling_2d;
  const double covered = *calculate(insulation_last, {}).heat_loss.field.coupling_2d;
  CHECK(covered < with_aluminium);
  MESSAGE("Case 2 layers in entity order: L2D ", with_aluminium, " W/(m·K); insulation painted last: ", covered);
}

TEST_CASE("ellipses are read as chords on the ellipse, whole or as an arc closed by a line (exact geometry)") {
  const CadDrawing d = read("ellipse.dxf");
  const auto whole = outlines_on(d, "ELLIPSE");
  REQUIRE(whole.size() == 1);
  // Every chord point on x'²/a² + y'²/b² = 1 in the ellipse's own axes (a = 100, b = 40 mm, turned 30°).
  const double c = std::cos(M_PI / 6), s = std::sin(M_PI / 6);
  for (Point p : whole[0]->points) {
    const double dx = p.x - 0.5, dy = p.y - 0.3;
    const double u = c * dx + s * dy, v = -s * dx + c * dy;
    CHECK(u * u / (0.1 * 0.1) + v * v / (0.04 * 0.04) == doctest::Approx(1.0).epsilon(1e-9));
  }
  CHECK(std::abs(area(whole[0]->points)) == doctest::Approx(M_PI * 0.1 * 0.04).epsilon(1e-3));  // π a b, chorded
  // The half ellipse and its diameter close into one outline of area π a b / 2.
  const auto half = outlines_on(d, "HALF");
  REQUIRE(half.size() == 1);
  CHECK(std::abs(area(half[0]->points)) == doctest::Approx(M_PI * 0.08 * 0.03 / 2).epsilon(1e-3));
  CHECK(half[0]->entities.find("ELLIPSE") != std::string::npos);
  CHECK(half[0]->entities.find("LINE") != std::string::npos);
}
