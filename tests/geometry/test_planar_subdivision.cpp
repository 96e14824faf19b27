// The geometry stage on small hand-drawn sections: painting, snapping onto edges, and what it
// refuses or warns about (with the coordinates it names).
#include <doctest/doctest.h>

#include <algorithm>
#include <string>

#include "geometry/planar_subdivision.h"
#include "input/read_detail_file.h"

using namespace edgeflux;

namespace {

/// A detail in millimetres with materials "a" (λ 1) and "b" (λ 0.04), environments "in" (20 °C)
/// and "out" (0 °C), and the given regions and surfaces.
CrossSection section_of(const std::string& regions, const std::string& surfaces) {
  return parse_detail_text(
      "<edgeflux-detail format=\"1\" units=\"mm\"><materials><material id=\"a\" conductivity=\"1\"/>"
      "<material id=\"b\" conductivity=\"0.04\"/></materials><regions>" + regions +
          "</regions><environments><environment id=\"in\" temperature=\"20\" side=\"interior\"/>"
          "<environment id=\"out\" temperature=\"0\" side=\"exterior\"/></environments><boundaries>" + surfaces +
          "</boundaries></edgeflux-detail>",
      "drawn.xml");
}

const std::string wall_surfaces =
    "<surface environment=\"in\" resistance=\"0.13\" path=\"0,0 0,1000\"/>"
    "<surface environment=\"out\" resistance=\"0.04\" path=\"300,0 300,1000\"/>";

std::string error_of(const CrossSection& section) {
  try {
    planar_subdivision(section);
  } catch (const InputError& e) {
    return e.what();
  }
  return "";
}

bool has_warning(const PlanarSubdivision& sub, const std::string& fragment) {
  return std::any_of(sub.warnings.begin(), sub.warnings.end(), [&](const std::string& w) { return w.find(fragment) != std::string::npos; });
}

int edges_with_surface(const PlanarSubdivision& sub, int surface) {
  return static_cast<int>(std::count_if(sub.edges.begin(), sub.edges.end(), [&](const SubdivisionEdge& e) { return e.surface == surface; }));
}

}  // namespace

TEST_CASE("painting: the later region owns the overlap, and only edges between different regions are kept") {
  // A 300 × 1000 wall of "a" with a block of "b" painted into its middle; the block's edges inside
  // the wall separate a from b, its part of the wall's outline is outline.
  const auto sub = planar_subdivision(section_of(
      "<rectangle material=\"a\" from=\"0,0\" to=\"300,1000\"/><rectangle material=\"b\" from=\"100,400\" to=\"300,600\"/>",
      wall_surfaces));
  int interfaces = 0, outline = 0;
  for (const SubdivisionEdge& e : sub.edges) {
    CHECK(e.left != e.right);
    if (e.left >= 0 && e.right >= 0) ++interfaces;
    else ++outline;
  }
  CHECK(interfaces == 3);  // the block's three edges inside the wall
  CHECK(outline == 6);     // bottom, top, inner face, and the outer face in three pieces
  REQUIRE(sub.seeds.size() == 2);
  CHECK(sub.warnings.empty());
  // A region painted over entirely is reported.
  const auto hidden = planar_subdivision(section_of(
      "<rectangle name=\"lost\" material=\"b\" from=\"100,400\" to=\"200,600\"/><rectangle material=\"a\" from=\"0,0\" to=\"300,1000\"/>",
      wall_surfaces));
  CHECK(has_warning(hidden, "region 'lost' (line 1) is painted over entirely by later regions"));
}

TEST_CASE("a corner on another region's sloped edge, written to 12 digits, becomes a T-junction (no gap, no sliver)") {
  // Layer "b" sits on the sloped top of layer "a" (rise 1 in 3); its corners are written as a
  // drawing exports them, a few 1e-10 mm off the edge.
  const auto sub = planar_subdivision(section_of(
      "<polygon material=\"a\" points=\"0,0 300,0 300,1100 0,1000\"/>"
      "<polygon material=\"b\" points=\"0,1000 100,1033.33333333 200,1066.66666667 200,1200 0,1200\"/>",
      "<surface environment=\"in\" resistance=\"0.13\" path=\"0,0 0,1200\"/>"
      "<surface environment=\"out\" resistance=\"0.04\" path=\"300,0 300,1100\"/>"));
  CHECK(sub.warnings.empty());  // moves of 1e-10 mm are rounding noise, not worth a word
  const auto vertex = std::find(sub.vertices.begin(), sub.vertices.end(), GridPoint{20000 - sub.origin.x, 106667 - sub.origin.y});
  CHECK(vertex != sub.vertices.end());  // (200, 1066.67) mm is a vertex of the subdivision
}

TEST_CASE("points within 0.01 mm of an edge move onto it, with a warning above rounding noise") {
  // The block's corner (150, 1000.005) lies 0.005 mm above the wall's top edge.
  const std::string regions =
      "<rectangle material=\"a\" from=\"0,0\" to=\"300,1000\"/>"
      "<polygon material=\"b\" points=\"150,1000.005 300,1000 300,1200 150,1200\"/>";
  const auto sub = planar_subdivision(section_of(regions, wall_surfaces));
  CHECK(has_warning(sub, "1 point within 0.01 mm of an edge or corner was moved onto it"));
  CHECK(has_warning(sub, "0.0050 mm, from (150, 1000.005) mm"));
  // 1e-7 mm off: moved without a word.
  const auto quiet = planar_subdivision(section_of(
      "<rectangle material=\"a\" from=\"0,0\" to=\"300,1000\"/>"
      "<polygon material=\"b\" points=\"150,1000.0000001 300,1000 300,1200 150,1200\"/>",
      wall_surfaces));
  CHECK(quiet.warnings.empty());
}

TEST_CASE("refused with coordinates: an enclosed uncovered area, parts touching at a point, a part touching nothing") {
  CHECK(error_of(section_of("<rectangle material=\"a\" from=\"0,0\" to=\"300,400\"/>"
                            "<rectangle material=\"a\" from=\"0,600\" to=\"300,1000\"/>"
                            "<rectangle material=\"a\" from=\"0,400\" to=\"100,600\"/>"
                            "<rectangle material=\"a\" from=\"200,400\" to=\"300,600\"/>",
                            wall_surfaces))
            .find("covered by no region, between (100, 400) mm and (200, 600) mm") != std::string::npos);
  // Two squares that share only the corner (300, 500).
  const std::string contact = error_of(section_of(
      "<rectangle name=\"left\" material=\"a\" from=\"0,0\" to=\"300,500\"/>"
      "<rectangle name=\"right\" material=\"a\" from=\"300,500\" to=\"600,1000\"/>",
      "<surface environment=\"in\" resistance=\"0.13\" path=\"0,0 0,500\"/>"
      "<surface environment=\"out\" resistance=\"0.04\" path=\"600,500 600,1000\"/>"));
  CHECK(contact.find("regions 'left' and 'right' touch only at the point (300, 500) mm") != std::string::npos);
  CHECK(contact.find("Fix:") != std::string::npos);
  // A block beside the wall that touches neither the wall nor a surface.
  const std::string island = error_of(section_of(
      "<rectangle material=\"a\" from=\"0,0\" to=\"300,1000\"/><rectangle name=\"loose\" material=\"b\" from=\"400,0\" to=\"500,100\"/>",
      wall_surfaces));
  CHECK(island.find("region 'loose'") != std::string::npos);
  CHECK(island.find("touches neither the rest of the section nor any surface") != std::string::npos);
}

TEST_CASE("warned: separate parts that each touch a surface, a narrow slot open to the outside") {
  // A wall cut in two by a 40 mm joint left out: each half joins both environments.
  const auto parts = planar_subdivision(section_of(
      "<rectangle material=\"a\" from=\"0,0\" to=\"300,480\"/><rectangle material=\"a\" from=\"0,520\" to=\"300,1000\"/>",
      "<surface environment=\"in\" resistance=\"0.13\" path=\"0,0 0,480\"/><surface environment=\"in\" resistance=\"0.13\" "
      "path=\"0,520 0,1000\"/><surface environment=\"out\" resistance=\"0.04\" path=\"300,0 300,480\"/>"
      "<surface environment=\"out\" resistance=\"0.04\" path=\"300,520 300,1000\"/>"));
  CHECK(has_warning(parts, "the section falls into 2 separate parts"));
  // Two leaves side by side, each facing one environment only: no heat flows at all.
  CHECK(error_of(section_of("<rectangle material=\"a\" from=\"0,0\" to=\"140,1000\"/>"
                            "<rectangle material=\"b\" from=\"160,0\" to=\"300,1000\"/>",
                            wall_surfaces))
            .find("none of them joins surfaces facing environments at different temperatures") != std::string::npos);
  // A 1 mm slot 200 mm deep cut into the wall from its top.
  const auto slot = planar_subdivision(section_of(
      "<polygon material=\"a\" points=\"0,0 300,0 300,1000 150.5,1000 150.5,800 149.5,800 149.5,1000 0,1000\"/>",
      wall_surfaces));
  CHECK(has_warning(slot, "a slot 1.00 mm wide"));
  CHECK(has_warning(slot, "is open to the outside"));
  // A 5 mm slot is a deliberate shape.
  const auto wide = planar_subdivision(section_of(
      "<polygon material=\"a\" points=\"0,0 300,0 300,1000 152.5,1000 152.5,800 147.5,800 147.5,1000 0,1000\"/>",
      wall_surfaces));
  CHECK(wide.warnings.empty());
}

TEST_CASE("a region thinner than the 0.01 mm resolution is refused, naming it") {
  const std::string message = error_of(section_of(
      "<rectangle material=\"a\" from=\"0,0\" to=\"300,1000\"/>"
      "<polygon name=\"foil\" material=\"b\" points=\"100,100 200,100 210,100.004 110,100.004\"/>",
      wall_surfaces));
  CHECK(message.find("region 'foil'") != std::string::npos);
  CHECK(message.find("thinner than the 0.01 mm resolution") != std::string::npos);
}

TEST_CASE("surface paths follow the outline: along sloped edges, past corners they do not name, split where a path "
          "point lies inside an edge") {
  // A wall whose sloped outer face has a corner at (320, 500) that the path does not name.
  const auto sloped = planar_subdivision(section_of(
      "<polygon material=\"a\" points=\"0,0 300,0 320,500 340,1000 0,1000\"/>",
      "<surface environment=\"in\" resistance=\"0.13\" path=\"0,0 0,1000\"/>"
      "<surface environment=\"out\" resistance=\"0.04\" path=\"300,0 340,1000\"/>"));
  CHECK(edges_with_surface(sloped, 1) == 2);
  // Two surfaces that meet at (300, 600), a point inside the outer face: the face is split there.
  const auto split = planar_subdivision(section_of(
      "<rectangle material=\"a\" from=\"0,0\" to=\"300,1000\"/>",
      "<surface environment=\"in\" resistance=\"0.13\" path=\"0,0 0,1000\"/>"
      "<surface name=\"lower\" environment=\"out\" resistance=\"0.04\" path=\"300,0 300,600\"/>"
      "<surface name=\"upper\" environment=\"out\" resistance=\"0.04\" path=\"300,600 300,1000\"/>"));
  CHECK(edges_with_surface(split, 1) == 1);
  CHECK(edges_with_surface(split, 2) == 1);
  // A path that cuts across a corner of the outline is refused at the corner where it leaves.
  const std::string across = error_of(section_of(
      "<polygon material=\"a\" points=\"0,0 300,0 300,500 350,1000 0,1000\"/>",
      "<surface environment=\"in\" resistance=\"0.13\" path=\"0,0 0,1000\"/>"
      "<surface name=\"outer\" environment=\"out\" resistance=\"0.04\" path=\"300,0 350,1000\"/>"));
  CHECK(across.find("surface 'outer'") != std::string::npos);
  CHECK(across.find("does not lie on the outer boundary") != std::string::npos);
  // A path point 0.004 mm off the outline is on it.
  const auto near = planar_subdivision(section_of(
      "<rectangle material=\"a\" from=\"0,0\" to=\"300,1000\"/>",
      "<surface environment=\"in\" resistance=\"0.13\" path=\"0,0 0,1000\"/>"
      "<surface environment=\"out\" resistance=\"0.04\" path=\"300.004,0 300,1000\"/>"));
  CHECK(edges_with_surface(near, 1) == 1);
}
