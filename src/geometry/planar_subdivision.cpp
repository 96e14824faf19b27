// From the section's polygons to a planar subdivision on the 0.01 mm grid: snapping, snap
// rounding, painting, and the edges the mesher must keep.
#include "geometry/planar_subdivision.h"

#include <fmt/format.h>

#include <algorithm>
#include <cmath>
#include <limits>
#include <optional>
#include <stdexcept>
#include <unordered_map>
#include <unordered_set>

#include "geometry/boundary_paths.h"
#include "geometry/exact_geometry.h"
#include "geometry/painted_triangulation.h"
#include "geometry/polygon.h"
#include "geometry/section_topology.h"

namespace edgeflux {
namespace {

struct PointHash {
  std::size_t operator()(const std::pair<double, double>& p) const {
    return std::hash<double>()(p.first) * 31 + std::hash<double>()(p.second);
  }
};

/// Where an input point lands, in local grid steps before rounding.
struct Frame {
  GridPoint origin;
  Point local(Point m) const {
    return {m.x * grid_steps_per_metre - static_cast<double>(origin.x), m.y * grid_steps_per_metre - static_cast<double>(origin.y)};
  }
};

Frame frame_of(const CrossSection& section) {
  double x = std::numeric_limits<double>::infinity(), y = x;
  auto take = [&](Point p) { x = std::min(x, p.x), y = std::min(y, p.y); };
  for (const Region& r : section.regions)
    for (Point p : r.outline) take(p);  // islands lie inside
  for (const Surface& s : section.surfaces)
    for (Point p : s.path) take(p);
  for (const Probe& p : section.probes) take(p.at);
  for (const FlankingElement& f : section.flanking_elements) take(f.cut_off_start), take(f.cut_off_end);
  return {{static_cast<std::int64_t>(std::floor(x * grid_steps_per_metre)) - 1,
           static_cast<std::int64_t>(std::floor(y * grid_steps_per_metre)) - 1}};
}

/// The section's points in local grid steps before rounding: region corners (each position once)
/// with the outline edges between them, and the points that must become vertices of their own
/// (surface path points, cut-off ends, probes).
struct DrawnGeometry {
  std::vector<Point> corners;
  std::vector<std::array<int, 2>> edges;  ///< corner indices
  std::vector<int> edge_region;
  std::vector<Point> marks;               ///< path points, then cut-off ends, then probes
  std::vector<char> is_chord_point;       ///< per corner: put on an arc by the reader
};

DrawnGeometry drawn_geometry(const CrossSection& section, const Frame& frame) {
  DrawnGeometry g;
  std::unordered_map<std::pair<double, double>, int, PointHash> corner_of;
  std::unordered_set<std::pair<double, double>, PointHash> chord_points;
  for (Point p : section.chord_points) chord_points.insert({p.x, p.y});
  for (int r = 0; r < static_cast<int>(section.regions.size()); ++r) {
    // The outline and any islands: crossing either enters or leaves the region.
    std::vector<const std::vector<Point>*> loops{&section.regions[r].outline};
    for (const auto& island : section.regions[r].islands) loops.push_back(&island);
    for (const auto* loop : loops) {
      std::vector<int> ids;
      for (Point p : *loop) {
        const auto [it, added] = corner_of.try_emplace({p.x, p.y}, static_cast<int>(g.corners.size()));
        if (added) g.corners.push_back(frame.local(p)), g.is_chord_point.push_back(chord_points.count({p.x, p.y}) > 0);
        ids.push_back(it->second);
      }
      for (std::size_t k = 0; k < ids.size(); ++k) {
        g.edges.push_back({ids[k], ids[(k + 1) % ids.size()]});
        g.edge_region.push_back(r);
      }
    }
  }
  for (const Surface& s : section.surfaces)
    for (Point p : s.path) g.marks.push_back(frame.local(p));
  for (const FlankingElement& f : section.flanking_elements)
    g.marks.push_back(frame.local(f.cut_off_start)), g.marks.push_back(frame.local(f.cut_off_end));
  for (const Probe& p : section.probes) g.marks.push_back(frame.local(p.at));
  return g;
}

Box box_around(Point a, Point b, double margin) {
  return {std::min(a.x, b.x) - margin, std::min(a.y, b.y) - margin, std::max(a.x, b.x) + margin, std::max(a.y, b.y) + margin};
}

/// A point meant to lie on an edge is rarely on it to the last bit: coordinates typed to a few
/// decimals, or a drawing's rounding noise, leave it a hair inside or outside, which would make a
/// sliver or a notch. Every corner within one grid step (0.01 mm) of an edge it does not end on,
/// and not within a step of that edge's ends, moves onto the edge; every mark (path point, cut-off
/// end, probe) moves onto the nearest corner within a step, or else onto the nearest edge within a
/// step. Returns a warning when a drawn corner or a mark moved by more than rounding noise.
std::optional<std::string> snap_points_onto_edges(const CrossSection& section, const PlanarSubdivision& frame,
                                                  DrawnGeometry& g) {
  constexpr double step = 1.0, noise = 0.01;  // grid steps: 0.01 mm and 0.1 µm
  std::vector<Box> edge_boxes, corner_boxes, mark_boxes;
  for (const auto& e : g.edges) edge_boxes.push_back(box_around(g.corners[e[0]], g.corners[e[1]], step));
  for (Point p : g.corners) corner_boxes.push_back(box_around(p, p, 0.0));
  for (Point p : g.marks) mark_boxes.push_back(box_around(p, p, step));

  int moved = 0;
  double largest = 0.0;
  Point largest_at{};
  auto record = [&](Point from, Point to) {
    const double d = distance(from, to);
    if (d <= noise) return;
    ++moved;
    if (d > largest) largest = d, largest_at = from;
  };
  // Corners: decided on the drawn positions, then moved.
  std::vector<double> best(g.corners.size(), std::numeric_limits<double>::infinity());
  std::vector<Point> target(g.corners.size());
  for (const auto& [e, c] : overlapping_boxes(edge_boxes, corner_boxes)) {
    const auto& edge = g.edges[e];
    if (edge[0] == c || edge[1] == c) continue;
    const Point p = g.corners[c], a = g.corners[edge[0]], b = g.corners[edge[1]];
    const Point foot = nearest_on_segment(p, a, b);
    const double d = distance(p, foot);
    if (d == 0.0 || d > step || distance(p, a) <= step || distance(p, b) <= step || d >= best[c]) continue;
    best[c] = d, target[c] = foot;
  }
  for (std::size_t c = 0; c < g.corners.size(); ++c)
    if (std::isfinite(best[c])) {
      // Chord points of an arc tangent to a line lie hundredths of a millimetre from it by
      // construction: moved without a word.
      if (!g.is_chord_point[c]) record(g.corners[c], target[c]);
      g.corners[c] = target[c];
    }
  // Marks: onto a corner, else onto an edge (the moved corners and edges).
  std::vector<double> to_corner(g.marks.size(), std::numeric_limits<double>::infinity()),
      to_edge(g.marks.size(), std::numeric_limits<double>::infinity());
  std::vector<Point> corner_target(g.marks.size()), edge_target(g.marks.size());
  for (const auto& [m, c] : overlapping_boxes(mark_boxes, corner_boxes)) {
    const double d = distance(g.marks[m], g.corners[c]);
    if (d <= step && d < to_corner[m]) to_corner[m] = d, corner_target[m] = g.corners[c];
  }
  for (const auto& [m, e] : overlapping_boxes(mark_boxes, edge_boxes)) {
    const Point foot = nearest_on_segment(g.marks[m], g.corners[g.edges[e][0]], g.corners[g.edges[e][1]]);
    const double d = distance(g.marks[m], foot);
    if (d <= step && d < to_edge[m]) to_edge[m] = d, edge_target[m] = foot;
  }
  for (std::size_t m = 0; m < g.marks.size(); ++m) {
    if (!std::isfinite(to_corner[m]) && !std::isfinite(to_edge[m])) continue;
    const Point to = std::isfinite(to_corner[m]) ? corner_target[m] : edge_target[m];
    record(g.marks[m], to);
    g.marks[m] = to;
  }
  if (moved == 0) return std::nullopt;
  return fmt::format("{} point{} within 0.01 mm of an edge or corner {} moved onto it (the largest move {:.4f} mm, "
                     "from {}); check that {} meant to lie on it",
                     moved, moved == 1 ? "" : "s", moved == 1 ? "was" : "were", largest / 100.0,
                     section.format_point(frame.metres(largest_at)), moved == 1 ? "it was" : "they were");
}

GridPoint rounded(Point p) { return grid_point(p); }

/// The pieces the outlines are cut into by snap rounding, each once, with the regions whose
/// outline runs along it an odd number of times (crossing the piece enters or leaves them).
struct Pieces {
  std::vector<GridPoint> points;
  std::vector<std::array<int, 2>> segments;
  std::vector<std::vector<int>> toggles;
};

Pieces snapped_pieces(const DrawnGeometry& g) {
  // An edge shared by two regions is rounded once (snap rounding is the costly step).
  std::vector<std::array<Point, 2>> segments;
  std::vector<int> segment_of_edge(g.edges.size());
  {
    std::unordered_map<long long, int> seen;
    for (std::size_t e = 0; e < g.edges.size(); ++e) {
      const int a = std::min(g.edges[e][0], g.edges[e][1]), b = std::max(g.edges[e][0], g.edges[e][1]);
      const auto [it, added] = seen.try_emplace((static_cast<long long>(a) << 32) | static_cast<unsigned>(b),
                                                static_cast<int>(segments.size()));
      if (added) segments.push_back({g.corners[a], g.corners[b]});
      segment_of_edge[e] = it->second;
    }
  }
  const std::vector<std::vector<GridPoint>> rounded_segments = snap_rounded(segments, g.marks);
  Pieces pieces;
  std::unordered_map<GridPoint, int, GridPointHash> point_of;
  std::unordered_map<long long, int> piece_of;
  auto point_index = [&](GridPoint p) {
    const auto [it, added] = point_of.try_emplace(p, static_cast<int>(pieces.points.size()));
    if (added) pieces.points.push_back(p);
    return it->second;
  };
  for (std::size_t e = 0; e < g.edges.size(); ++e) {
    const auto& line = rounded_segments[segment_of_edge[e]];
    for (std::size_t k = 0; k + 1 < line.size(); ++k) {
      const int a = point_index(line[k]), b = point_index(line[k + 1]);
      const long long key = (static_cast<long long>(std::min(a, b)) << 32) | static_cast<unsigned>(std::max(a, b));
      const auto [it, added] = piece_of.try_emplace(key, static_cast<int>(pieces.segments.size()));
      if (added) pieces.segments.push_back({std::min(a, b), std::max(a, b)}), pieces.toggles.emplace_back();
      pieces.toggles[it->second].push_back(g.edge_region[e]);
    }
  }
  for (auto& t : pieces.toggles) {
    std::sort(t.begin(), t.end());
    std::vector<int> odd;
    for (std::size_t i = 0; i < t.size();) {
      std::size_t j = i;
      while (j < t.size() && t[j] == t[i]) ++j;
      if ((j - i) % 2 == 1) odd.push_back(t[i]);
      i = j;
    }
    t = std::move(odd);
  }
  return pieces;
}

/// Groups triangles into faces and paints each: starting from outside the hull (in no region),
/// crossing a piece enters or leaves the regions it toggles, so every face learns the set of
/// regions enclosing it; the last of them in file order paints it.
PaintedTriangulation painted_triangulation(Pieces pieces, const std::vector<Point>& queries, std::size_t n_regions,
                                           std::vector<char>& owns_area, std::vector<char>& is_member) {
  PaintedTriangulation p;
  p.triangulation = segment_triangulation(pieces.points, pieces.segments, queries);
  p.points = std::move(pieces.points);
  p.segments = std::move(pieces.segments);
  const auto& tri = p.triangulation;
  const int n = static_cast<int>(tri.triangles.size());
  p.face.assign(n, -1);
  std::vector<int> stack;
  int n_faces = 0;
  for (int t = 0; t < n; ++t) {
    if (p.face[t] >= 0) continue;
    p.face[t] = n_faces;
    p.unbounded.push_back(0);
    stack.assign(1, t);
    while (!stack.empty()) {
      const int u = stack.back();
      stack.pop_back();
      for (int k = 0; k < 3; ++k) {
        if (tri.segment[u][k] >= 0) continue;
        const int w = tri.neighbour[u][k];
        if (w < 0) p.unbounded[n_faces] = 1;
        else if (p.face[w] < 0) p.face[w] = n_faces, stack.push_back(w);
      }
    }
    ++n_faces;
  }
  // Face adjacency across pieces; the outside of the hull is face n_faces.
  const int outside = n_faces;
  std::vector<std::vector<std::pair<int, int>>> across(n_faces + 1);  // (face, piece)
  for (int t = 0; t < n; ++t)
    for (int k = 0; k < 3; ++k) {
      const int s = tri.segment[t][k];
      if (s < 0) continue;
      const int w = tri.neighbour[t][k];
      const int other = w < 0 ? outside : p.face[w];
      across[p.face[t]].push_back({other, s});
      if (w < 0) across[outside].push_back({p.face[t], s});
    }
  std::vector<std::vector<int>> member(n_faces + 1);
  std::vector<char> seen(n_faces + 1, 0);
  std::vector<int> queue{outside};
  seen[outside] = 1;
  for (int f = 0; f < n_faces; ++f)
    if (p.unbounded[f]) seen[f] = 1, queue.push_back(f);
  for (std::size_t head = 0; head < queue.size(); ++head) {
    const int f = queue[head];
    for (const auto& [g, s] : across[f]) {
      std::vector<int> next;
      std::set_symmetric_difference(member[f].begin(), member[f].end(), pieces.toggles[s].begin(),
                                    pieces.toggles[s].end(), std::back_inserter(next));
      if (seen[g]) {
        if (next != member[g]) throw std::logic_error("the painting of the section's faces is inconsistent");
        continue;
      }
      seen[g] = 1;
      member[g] = std::move(next);
      queue.push_back(g);
    }
  }
  p.owner.assign(n_faces, -1);
  owns_area.assign(n_regions, 0);
  is_member.assign(n_regions, 0);
  for (int f = 0; f < n_faces; ++f) {
    if (member[f].empty()) continue;
    p.owner[f] = member[f].back();
    owns_area[p.owner[f]] = 1;
    for (int r : member[f]) is_member[r] = 1;
  }
  return p;
}

double twice_area(Point a, Point b, Point c) { return cross(b - a, c - a); }

}  // namespace

PlanarSubdivision planar_subdivision(const CrossSection& section, bool for_solving) {
  PlanarSubdivision sub;
  const Frame frame = frame_of(section);
  sub.origin = frame.origin;
  DrawnGeometry drawn = drawn_geometry(section, frame);
  if (auto warning = snap_points_onto_edges(section, sub, drawn)) sub.warnings.push_back(*warning);
  std::vector<GridPoint> marks;
  for (Point m : drawn.marks) marks.push_back(rounded(m));

  std::vector<Point> probe_queries;
  const std::size_t first_probe = marks.size() - section.probes.size();
  for (std::size_t k = first_probe; k < marks.size(); ++k) probe_queries.push_back(as_point(marks[k]));
  std::vector<char> owns_area, is_member;
  const PaintedTriangulation painted =
      painted_triangulation(snapped_pieces(drawn), probe_queries, section.regions.size(), owns_area, is_member);

  check_enclosed_gaps(section, sub, painted);
  check_region_visibility(section, sub, owns_area, is_member);
  check_point_contacts(section, sub, painted);

  // Edges: the pieces with different regions on their two sides.
  const auto& tri = painted.triangulation;
  std::vector<int> vertex_of(painted.points.size(), -1);
  std::vector<std::array<int, 2>> edge_triangles;
  std::vector<int> edge_of_piece(painted.segments.size(), -1);
  for (int t = 0; t < static_cast<int>(tri.triangles.size()); ++t)
    for (int k = 0; k < 3; ++k) {
      const int s = tri.segment[t][k];
      if (s < 0 || edge_of_piece[s] >= 0) continue;
      const int a = tri.triangles[t][k], b = tri.triangles[t][(k + 1) % 3];
      const int here = painted.owner[painted.face[t]], there = painted.owner_across(t, k);
      if (here == there) continue;
      for (int v : {a, b})
        if (vertex_of[v] < 0) vertex_of[v] = static_cast<int>(sub.vertices.size()), sub.vertices.push_back(painted.points[v]);
      edge_of_piece[s] = static_cast<int>(sub.edges.size());
      sub.edges.push_back({vertex_of[a], vertex_of[b], here, there});
      edge_triangles.push_back({t, tri.neighbour[t][k]});
    }

  // One seed per painted face: the centroid of its largest triangle, well inside it.
  std::vector<int> largest(painted.n_faces(), -1);
  std::vector<double> largest_area(painted.n_faces(), 0.0);
  for (int t = 0; t < static_cast<int>(tri.triangles.size()); ++t) {
    const int f = painted.face[t];
    if (painted.owner[f] < 0) continue;
    const auto& v = tri.triangles[t];
    const double area = twice_area(as_point(painted.points[v[0]]), as_point(painted.points[v[1]]), as_point(painted.points[v[2]]));
    if (area > largest_area[f]) largest_area[f] = area, largest[f] = t;
  }
  for (int f = 0; f < painted.n_faces(); ++f) {
    if (largest[f] < 0) continue;
    const auto& v = tri.triangles[largest[f]];
    const Point c = (1.0 / 3.0) * (as_point(painted.points[v[0]]) + as_point(painted.points[v[1]]) + as_point(painted.points[v[2]]));
    sub.seeds.push_back({c, painted.owner[f], largest_area[f]});
  }

  if (!for_solving) return sub;
  SnappedMarks snapped;
  std::size_t next = 0;
  for (const Surface& s : section.surfaces) {
    snapped.paths.emplace_back(marks.begin() + next, marks.begin() + next + s.path.size());
    next += s.path.size();
  }
  for (std::size_t f = 0; f < section.flanking_elements.size(); ++f, next += 2)
    snapped.cut_offs.push_back({marks[next], marks[next + 1]});
  lay_boundary_paths(section, snapped, sub);
  // Probes: on the grid, inside the section or on its outline.
  std::vector<char> painted_vertex(painted.points.size(), 0);
  for (int t = 0; t < static_cast<int>(tri.triangles.size()); ++t)
    if (painted.owner[painted.face[t]] >= 0)
      for (int v : tri.triangles[t]) painted_vertex[v] = 1;
  std::unordered_map<GridPoint, int, GridPointHash> point_of;
  for (int v = 0; v < static_cast<int>(painted.points.size()); ++v) point_of.emplace(painted.points[v], v);
  for (std::size_t k = 0; k < section.probes.size(); ++k) {
    const Probe& probe = section.probes[k];
    const GridPoint at = marks[first_probe + k];
    const int t = tri.located[k];
    const auto vertex = point_of.find(at);
    const bool inside = (t >= 0 && painted.owner[painted.face[t]] >= 0) ||
                        (vertex != point_of.end() && painted_vertex[vertex->second]);
    if (!inside)
      throw_input_error(probe.where, fmt::format("probe '{}'", probe.name),
                        fmt::format("{} lies outside the section", section.format_point(probe.at)),
                        "give a point inside one of the regions or on their outline");
    sub.probes.push_back(at);
  }
  check_separate_parts(section, sub, painted, edge_triangles);
  warn_narrow_slots(section, sub);
  return sub;
}

}  // namespace edgeflux
