// Walking surface paths and cut-offs along the outline (see the header).
#include "geometry/boundary_paths.h"

#include <fmt/format.h>

#include <algorithm>
#include <cmath>
#include <limits>
#include <unordered_map>

#include "geometry/polygon.h"

namespace edgeflux {
namespace {

// A path's corners lie within this many grid steps (0.02 mm) of its straight segments: rounding to
// the grid moves a point by at most 0.7 of a step, so two rounded points and the corner between
// them stay within 1.5 steps of a line the drawing had them on.
constexpr double path_tolerance = 2.0;


bool is_boundary(const SubdivisionEdge& e) { return (e.left < 0) != (e.right < 0); }

class Outline {
 public:
  Outline(const CrossSection& section, PlanarSubdivision& sub) : section_(section), sub_(sub) {
    for (int v = 0; v < static_cast<int>(sub.vertices.size()); ++v) vertex_of_.emplace(sub.vertices[v], v);
    at_vertex_.resize(sub.vertices.size());
    for (int e = 0; e < static_cast<int>(sub.edges.size()); ++e)
      if (is_boundary(sub.edges[e])) at_vertex_[sub.edges[e].a].push_back(e), at_vertex_[sub.edges[e].b].push_back(e);
  }

  /// The boundary vertex at p; throws naming the object and how far p is from the outline.
  int vertex_at(GridPoint p, const SourceLocation& where, const std::string& object, const char* what) const {
    const auto it = vertex_of_.find(p);
    if (it != vertex_of_.end() && !at_vertex_[it->second].empty()) return it->second;
    double nearest = std::numeric_limits<double>::infinity();
    Point nearest_at{};
    for (const SubdivisionEdge& e : sub_.edges) {
      if (!is_boundary(e)) continue;
      const Point a = as_point(sub_.vertices[e.a]), b = as_point(sub_.vertices[e.b]);
      const Point foot = nearest_on_segment(as_point(p), a, b);
      const double d = distance(as_point(p), foot);
      if (d < nearest) nearest = d, nearest_at = foot;
    }
    throw_input_error(where, object,
                      fmt::format("its {} {} does not lie on the outline of the section (the nearest outline edge is "
                                  "{:.3f} mm away, at {})", what, metres_text(p), nearest / 100.0,
                                  section_.format_point(sub_.metres(nearest_at))),
                      "give points on the outline of the regions (within 0.01 mm), in order along the boundary");
  }

  /// The chain of boundary edges from vertex p to vertex q along the straight segment between them.
  std::vector<int> chain(int p, int q, const SourceLocation& where, const std::string& object) const {
    const Point a = as_point(sub_.vertices[p]), b = as_point(sub_.vertices[q]);
    const Point d = b - a;
    const double len2 = dot(d, d);
    auto along = [&](int v) { return dot(as_point(sub_.vertices[v]) - a, d) / len2; };
    std::vector<int> edges;
    int u = p;
    while (u != q) {
      int best = -1;
      double best_deviation = std::numeric_limits<double>::infinity();
      int nearest_miss = -1;
      double miss_deviation = std::numeric_limits<double>::infinity();
      for (int e : at_vertex_[u]) {
        const int w = sub_.edges[e].a == u ? sub_.edges[e].b : sub_.edges[e].a;
        if (!(along(w) > along(u)) || along(w) > 1.0 + 1e-9) continue;
        const double deviation = distance_to_segment(as_point(sub_.vertices[w]), a, b);
        if (deviation <= path_tolerance && deviation < best_deviation) best_deviation = deviation, best = e;
        if (deviation < miss_deviation) miss_deviation = deviation, nearest_miss = w;
      }
      if (best < 0 || edges.size() > sub_.edges.size()) {
        const std::string problem =
            nearest_miss < 0
                ? fmt::format("the outline does not run on from {} towards {}", point_text(u), point_text(q))
                : fmt::format("the outline leaves the straight line from {} to {} at {}: its next corner {} is {:.3f} mm "
                              "off the line", point_text(p), point_text(q), point_text(u), point_text(nearest_miss),
                              miss_deviation / 100.0);
        throw_input_error(where, object,
                          fmt::format("the path segment from {} to {} does not lie on the outer boundary of the "
                                      "section: {}", point_text(p), point_text(q), problem),
                          "give path points on the outline of the regions, in order along the boundary, with a point "
                          "at every corner where the outline turns");
      }
      edges.push_back(best);
      u = sub_.edges[best].a == u ? sub_.edges[best].b : sub_.edges[best].a;
    }
    return edges;
  }

  bool touches_surface(int v) const {
    for (int e : at_vertex_[v])
      if (sub_.edges[e].surface >= 0) return true;
    return false;
  }

  std::string point_text(int v) const { return section_.format_point(sub_.metres(sub_.vertices[v])); }
  std::string metres_text(GridPoint p) const { return section_.format_point(sub_.metres(p)); }

 private:
  const CrossSection& section_;
  PlanarSubdivision& sub_;
  std::unordered_map<GridPoint, int, GridPointHash> vertex_of_;
  std::vector<std::vector<int>> at_vertex_;
};

}  // namespace

void lay_boundary_paths(const CrossSection& section, const SnappedMarks& marks, PlanarSubdivision& sub) {
  const Outline outline(section, sub);
  for (int s = 0; s < static_cast<int>(section.surfaces.size()); ++s) {
    const Surface& surface = section.surfaces[s];
    const std::string object = fmt::format("surface '{}'", surface.name);
    const auto& path = marks.paths[s];
    for (std::size_t k = 0; k + 1 < path.size(); ++k) {
      if (path[k] == path[k + 1])
        throw_input_error(surface.where, object,
                          fmt::format("path points {} and {} coincide at {} (closer than the 0.01 mm resolution)", k + 1,
                                      k + 2, outline.metres_text(path[k])),
                          "remove the repeated point, or give the two points their own positions");
      const int p = outline.vertex_at(path[k], surface.where, object, "path point");
      const int q = outline.vertex_at(path[k + 1], surface.where, object, "path point");
      for (int e : outline.chain(p, q, surface.where, object)) {
        SubdivisionEdge& edge = sub.edges[e];
        if (edge.surface >= 0) {
          const Surface& other = section.surfaces[edge.surface];
          throw_input_error(surface.where, object,
                            edge.surface == s
                                ? fmt::format("its path runs twice along {} to {}", outline.point_text(edge.a),
                                              outline.point_text(edge.b))
                                : fmt::format("overlaps surface '{}' (line {}) along {} to {}", other.name,
                                              other.where.line, outline.point_text(edge.a), outline.point_text(edge.b)),
                            "give each part of the boundary to one surface only");
        }
        edge.surface = s;
      }
    }
  }
  for (int f = 0; f < static_cast<int>(section.flanking_elements.size()); ++f) {
    const FlankingElement& element = section.flanking_elements[f];
    const std::string object = fmt::format("flanking element '{}'", element.id);
    const auto& ends = marks.cut_offs[f];
    if (ends[0] == ends[1])
      throw_input_error(element.where, object,
                        fmt::format("the two ends of its cut-off coincide at {}", outline.metres_text(ends[0])),
                        "give the two ends of the straight adiabatic edge where the element is cut off");
    const int p = outline.vertex_at(ends[0], element.where, object, "cut-off end");
    const int q = outline.vertex_at(ends[1], element.where, object, "cut-off end");
    for (int e : outline.chain(p, q, element.where, object)) {
      SubdivisionEdge& edge = sub.edges[e];
      if (edge.surface >= 0)
        throw_input_error(element.where, object,
                          fmt::format("the cut-off edge from {} to {} is not adiabatic: surface '{}' lies along it",
                                      section.format_point(element.cut_off_start), section.format_point(element.cut_off_end),
                                      section.surfaces[edge.surface].name),
                          "a cut-off plane is an adiabatic edge; remove the surface there or move the cut-off");
      if (edge.cut_off >= 0 && edge.cut_off != f) {
        // Two elements may name the same cut-off (one carries the other's U); overlapping ones clash.
        const FlankingElement& other = section.flanking_elements[edge.cut_off];
        if (marks.cut_offs[edge.cut_off] != ends)
          throw_input_error(element.where, object,
                            fmt::format("its cut-off overlaps the cut-off of flanking element '{}' (line {}) along {} to {}",
                                        other.id, other.where.line, outline.point_text(edge.a), outline.point_text(edge.b)),
                            "give each element its own cut-off edge");
        continue;
      }
      edge.cut_off = f;
    }
    for (int end : {p, q})
      if (!outline.touches_surface(end))
        throw_input_error(element.where, object,
                          fmt::format("the cut-off edge must run from one surface to another, but its {} end at {} "
                                      "touches no surface", end == p ? "first" : "second", outline.point_text(end)),
                          "put the cut-off across the whole element, from its outside face to its inside face");
  }
}

}  // namespace edgeflux
