// Circles and arcs: their chords, how a detail file writes them, and pipes checked against exact
// and handbook shape factors.
#include <doctest/doctest.h>

#include <cmath>
#include <string>

#include "../test_support.h"
#include "geometry/arc_points.h"

using namespace edgeflux;

namespace {

constexpr double pi = 3.14159265358979323846;

/// λ 1 between two fixed temperatures (20 and 0 °C): L2D is the conduction shape factor per metre.
std::string pipe_detail(const std::string& points, const std::string& inner, const std::string& outer) {
  return "<edgeflux-detail format=\"1\" units=\"mm\"><materials><material id=\"m\" conductivity=\"1\"/></materials>"
         "<regions><polygon material=\"m\" points=\"" + points + "\"/></regions><environments>"
         "<environment id=\"in\" temperature=\"20\" side=\"interior\"/><environment id=\"out\" temperature=\"0\" "
         "side=\"exterior\"/></environments><boundaries><fixed-temperature environment=\"in\" path=\"" + inner +
         "\"/><fixed-temperature environment=\"out\" path=\"" + outer + "\"/></boundaries></edgeflux-detail>";
}

double shape_factor(const std::string& xml, const AccuracyTarget& target = {}) {
  CalculationOptions options;
  options.target = target;
  const Calculation calc = calculate(parse_detail_text(xml, "pipe.xml", {}, arc_tolerance_for(target)), options);
  REQUIRE(calc.convergence.target_met);
  return *calc.heat_loss.field.coupling_2d;
}

std::string reader_error(const std::string& regions) {
  try {
    parse_detail_text(test::detail_xml("<materials><material id=\"m\" conductivity=\"1\"/></materials><regions>" + regions +
                                       "</regions><environments><environment id=\"a\" temperature=\"20\"/><environment "
                                       "id=\"b\" temperature=\"0\"/></environments><boundaries><surface environment=\"a\" "
                                       "resistance=\"0\" path=\"0,0 100,0\"/><surface environment=\"b\" resistance=\"0\" "
                                       "path=\"0,100 100,100\"/></boundaries>"),
                      "arc.xml");
  } catch (const InputError& e) {
    return e.what();
  }
  return "";
}

}  // namespace

TEST_CASE("arc chords stand off the arc by at most the tolerance × radius, and end where the arc ends (exact geometry)") {
  const Point centre{1.0, 2.0};
  const double r = 0.05;
  for (double tolerance : {1e-2, 1e-3, 1e-4}) {
    CAPTURE(tolerance);
    const auto points = arc_points({1.05, 2.0}, {1.0, 2.05}, centre, true, tolerance);  // a quarter turn
    // Chord over φ: sagitta r(1 − cos φ/2); n chords over π/2.
    const double n = static_cast<double>(points.size() + 1);
    CHECK(r * (1.0 - std::cos(pi / 4.0 / n)) <= tolerance * r * (1.0 + 1e-12));
    for (Point p : points) CHECK(distance(p, centre) == doctest::Approx(r).epsilon(1e-12));
    CHECK(points.front().y > 2.0);  // counter-clockwise from (1.05, 2): y grows first
  }
  // A full turn from a point to itself; clockwise goes the other way round.
  const auto circle = arc_points({1.05, 2.0}, {1.05, 2.0}, centre, true, 1e-3);
  CHECK(circle.size() + 1 == static_cast<std::size_t>(std::ceil(2.0 * pi / (2.0 * std::acos(1.0 - 1e-3)) - 1e-9)));
  CHECK(arc_points({1.05, 2.0}, {1.0, 2.05}, centre, false, 1e-3).front().y < 2.0);
}

TEST_CASE("a quarter of a pipe's insulation between two circles: L2D = (π/2)/ln(D2/D1) (exact, concentric cylinders), "
          "converging with the accuracy target") {
  const std::string xml = pipe_detail("50,0 100,0 ccw(0,0) 0,100 0,50 cw(0,0)", "50,0 ccw(0,0) 0,50", "100,0 ccw(0,0) 0,100");
  const double exact = (pi / 2.0) / std::log(2.0);
  for (double target : {1e-2, 1e-3, 1e-4}) {
    CAPTURE(target);
    AccuracyTarget t;
    t.coupling_relative = target;
    CHECK(std::abs(shape_factor(xml, t) - exact) <= target * exact);
  }
}

TEST_CASE("half of a pipe off the centre of a larger one: L2D = π / arcosh((D1² + D2² − 4z²)/(2 D1 D2)) (exact, "
          "eccentric cylinders; Incropera & DeWitt, Fundamentals of Heat and Mass Transfer, Table 4.1, from memory)") {
  // D1 = 60 mm centred at (30, 0), D2 = 200 mm centred at the origin, z = 30 mm; the x axis is a
  // symmetry line (adiabatic).
  const std::string xml = pipe_detail("60,0 100,0 ccw(0,0) -100,0 0,0 cw(30,0)", "0,0 cw(30,0) 60,0", "100,0 ccw(0,0) -100,0");
  const double exact = pi / std::acosh((60.0 * 60.0 + 200.0 * 200.0 - 4.0 * 30.0 * 30.0) / (2.0 * 60.0 * 200.0));
  CHECK(std::abs(shape_factor(xml) - exact) <= 1e-3 * exact);
}

TEST_CASE("a quarter of a round pipe centred in a square block: S = 2π / ln(1.08 w/D) (Incropera & DeWitt, Fundamentals "
          "of Heat and Mass Transfer, Table 4.1, from memory; the handbook's fit is good to about 1 %)") {
  // D = 100 mm, w = 400 mm.
  const std::string xml = pipe_detail("50,0 200,0 200,200 0,200 0,50 cw(0,0)", "50,0 ccw(0,0) 0,50", "200,0 200,200 0,200");
  const double handbook = 2.0 * pi / std::log(1.08 * 4.0) / 4.0;
  CHECK(std::abs(shape_factor(xml) - handbook) <= 1e-2 * handbook);
}

TEST_CASE("a round steel column painted into a wall, written as <circle>, solves; its faceted outline is on the circle") {
  const CrossSection section = parse_detail_text(
      test::detail_xml("<materials><material id=\"wall\" conductivity=\"0.8\"/><material id=\"steel\" conductivity=\"50\"/>"
                       "</materials><regions><rectangle material=\"wall\" from=\"0,0\" to=\"300,1000\"/>"
                       "<circle name=\"column\" material=\"steel\" centre=\"150,500\" radius=\"60\"/></regions>"
                       "<environments><environment id=\"in\" temperature=\"20\" side=\"interior\"/><environment id=\"out\" "
                       "temperature=\"-5\" side=\"exterior\"/></environments><boundaries><surface environment=\"in\" "
                       "resistance=\"0.13\" path=\"300,0 300,1000\"/><surface environment=\"out\" resistance=\"0.04\" "
                       "path=\"0,0 0,1000\"/></boundaries>"),
      "column.xml");
  const Region& column = section.regions[1];
  CHECK(column.outline.size() >= 200);  // 1e-4 of the radius: about 222 chords
  for (Point p : column.outline) CHECK(distance(p, {0.15, 0.5}) == doctest::Approx(0.06).epsilon(1e-9));
  const Calculation calc = calculate(section, {});
  CHECK(calc.convergence.target_met);
  CHECK(std::abs(calc.heat_loss.field.balance.relative) < 1e-9);
}

TEST_CASE("arcs written wrong are refused with the points and the fix") {
  CHECK(reader_error("<polygon material=\"m\" points=\"0,0 100,0 ccw(0,0) 0,120\"/>").find("does not fit a circle: its ends are "
                                                                                           "100 and 120 mm from the centre") !=
        std::string::npos);
  CHECK(reader_error("<polygon material=\"m\" points=\"0,0 100,0 arc(0,0) 0,100\"/>").find("\"arc(\" is not an arc") !=
        std::string::npos);
  CHECK(reader_error("<polygon material=\"m\" points=\"ccw(0,0) 0,0 100,0 0,100\"/>").find("needs one centre x,y and a point "
                                                                                          "before it") != std::string::npos);
  CHECK(reader_error("<circle material=\"m\" centre=\"50,50\" radius=\"0\"/>").find("below the 0.01 mm resolution") !=
        std::string::npos);
}
