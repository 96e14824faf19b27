// Topological checks of the painted subdivision (see the header).
#include "geometry/section_topology.h"

#include <fmt/format.h>
#include <fmt/ranges.h>

#include <algorithm>
#include <cmath>
#include <limits>
#include <numeric>

namespace edgeflux {
namespace {

std::string region_name(const CrossSection& section, int r) { return fmt::format("'{}'", section.regions[r].name); }

/// Union–find over integers.
class Groups {
 public:
  explicit Groups(int n) : parent_(n) { std::iota(parent_.begin(), parent_.end(), 0); }
  int find(int x) {
    while (parent_[x] != x) x = parent_[x] = parent_[parent_[x]];
    return x;
  }
  void join(int a, int b) { parent_[find(a)] = find(b); }

 private:
  std::vector<int> parent_;
};

}  // namespace

void check_enclosed_gaps(const CrossSection& section, const PlanarSubdivision& sub, const PaintedTriangulation& painted) {
  const auto& tri = painted.triangulation;
  const int n = static_cast<int>(tri.triangles.size());
  // Unpainted triangles reachable from beyond the hull through unpainted ones are outside the
  // section; any other unpainted triangle lies in a hole no region covers.
  std::vector<char> outside(n, 0);
  std::vector<int> stack;
  auto unpainted = [&](int t) { return painted.owner[painted.face[t]] < 0; };
  for (int t = 0; t < n; ++t)
    if (unpainted(t) && painted.unbounded[painted.face[t]]) outside[t] = 1, stack.push_back(t);
  for (int t = 0; t < n; ++t)
    for (int k = 0; k < 3; ++k)
      if (tri.neighbour[t][k] < 0 && unpainted(t) && !outside[t]) outside[t] = 1, stack.push_back(t);
  auto spread = [&](std::vector<char>& mark, Point* lo, Point* hi) {
    while (!stack.empty()) {
      const int t = stack.back();
      stack.pop_back();
      for (int v : tri.triangles[t])
        if (lo) {
          const Point p = as_point(painted.points[v]);
          lo->x = std::min(lo->x, p.x), lo->y = std::min(lo->y, p.y), hi->x = std::max(hi->x, p.x), hi->y = std::max(hi->y, p.y);
        }
      for (int u : tri.neighbour[t])
        if (u >= 0 && unpainted(u) && !mark[u]) mark[u] = 1, stack.push_back(u);
    }
  };
  spread(outside, nullptr, nullptr);
  for (int t = 0; t < n; ++t) {
    if (!unpainted(t) || outside[t]) continue;
    Point lo{std::numeric_limits<double>::infinity(), std::numeric_limits<double>::infinity()};
    Point hi{-lo.x, -lo.y};
    outside[t] = 1;
    stack.assign(1, t);
    spread(outside, &lo, &hi);
    throw_input_error({section.file, 0}, "section",
                      fmt::format("an area enclosed by the model is covered by no region, between {} and {}",
                                  section.format_point(sub.metres(lo)), section.format_point(sub.metres(hi))),
                      "add a region (for example an air layer or the missing material) that covers this area, or "
                      "extend a neighbouring region over it");
  }
}

void check_point_contacts(const CrossSection& section, const PlanarSubdivision& sub, const PaintedTriangulation& painted) {
  const auto& tri = painted.triangulation;
  const int n = static_cast<int>(tri.triangles.size());
  std::vector<int> some_triangle(painted.points.size(), -1);
  for (int t = 0; t < n; ++t)
    for (int v : tri.triangles[t]) some_triangle[v] = t;
  auto index_in = [&](int t, int v) {
    for (int k = 0; k < 3; ++k)
      if (tri.triangles[t][k] == v) return k;
    return -1;
  };
  std::vector<int> fan;
  for (int v = 0; v < static_cast<int>(painted.points.size()); ++v) {
    if (some_triangle[v] < 0) continue;
    // Turn clockwise to the hull (or all the way round), then collect the fan counter-clockwise:
    // the triangle after t around v lies across the side that ends at v.
    int start = some_triangle[v];
    for (int guard = 0; guard < n; ++guard) {
      const int k = index_in(start, v);
      const int before = tri.neighbour[start][k];  // across the side that starts at v
      if (before < 0 || before == some_triangle[v]) break;
      start = before;
    }
    fan.clear();
    int t = start;
    bool on_hull = false;
    do {
      fan.push_back(painted.owner[painted.face[t]]);
      const int k = index_in(t, v);
      t = tri.neighbour[t][(k + 2) % 3];
      if (t < 0) on_hull = true;
    } while (t >= 0 && t != start && fan.size() <= static_cast<std::size_t>(n));
    if (on_hull) fan.push_back(-1);
    // Painted runs around the point, read cyclically.
    int runs = 0, first_run_region = -1, second_run_region = -1;  // named in file order below
    for (std::size_t i = 0; i < fan.size(); ++i) {
      const int previous = fan[(i + fan.size() - 1) % fan.size()];
      if (fan[i] >= 0 && previous < 0) {
        ++runs;
        (runs == 1 ? first_run_region : second_run_region) = fan[i];
      }
    }
    if (runs < 2) continue;
    if (first_run_region > second_run_region) std::swap(first_run_region, second_run_region);
    throw_input_error({section.file, 0}, "section",
                      fmt::format("regions {} and {} touch only at the point {}, with no material around it on two "
                                  "sides: the heat passing through a contact of zero width depends on the mesh, not on "
                                  "the construction", region_name(section, first_run_region),
                                  region_name(section, second_run_region), section.format_point(sub.metres(painted.points[v]))),
                      "join the parts along an edge where they are in contact, or leave a gap between them (more than "
                      "0.01 mm) where they are not");
  }
}

void check_region_visibility(const CrossSection& section, PlanarSubdivision& sub, const std::vector<char>& owns_area,
                             const std::vector<char>& is_member) {
  std::vector<std::string> hidden;
  for (std::size_t r = 0; r < section.regions.size(); ++r) {
    const Region& region = section.regions[r];
    if (!is_member[r])
      throw_input_error(region.where, fmt::format("region '{}'", region.name),
                        "is thinner than the 0.01 mm resolution of the model everywhere and vanishes when its corners "
                        "are rounded to it",
                        "give the region a thickness of more than 0.01 mm, or model a very thin layer as a surface "
                        "resistance or leave it out");
    if (!owns_area[r]) hidden.push_back(fmt::format("'{}' (line {})", region.name, region.where.line));
  }
  if (!hidden.empty())
    sub.warnings.push_back(fmt::format("region{} {} {} painted over entirely by later regions and {} no effect; check the "
                                       "order of the regions", hidden.size() == 1 ? "" : "s", fmt::join(hidden, ", "),
                                       hidden.size() == 1 ? "is" : "are", hidden.size() == 1 ? "has" : "have"));
}

void check_separate_parts(const CrossSection& section, PlanarSubdivision& sub, const PaintedTriangulation& painted,
                          const std::vector<std::array<int, 2>>& edge_triangles) {
  // Parts: painted faces joined across edges with material on both sides.
  Groups parts(painted.n_faces());
  const auto& tri = painted.triangulation;
  for (int t = 0; t < static_cast<int>(tri.triangles.size()); ++t)
    for (int k = 0; k < 3; ++k) {
      const int u = tri.neighbour[t][k];
      if (u >= 0 && painted.owner[painted.face[t]] >= 0 && painted.owner[painted.face[u]] >= 0)
        parts.join(painted.face[t], painted.face[u]);
    }
  std::vector<char> has_surface(painted.n_faces(), 0), is_part(painted.n_faces(), 0);
  std::vector<Point> corner(painted.n_faces());
  // Per part, the coldest and warmest environment its surfaces face: heat flows through a part
  // only when they differ.
  std::vector<double> coldest(painted.n_faces(), 1e300), warmest(painted.n_faces(), -1e300);
  for (std::size_t e = 0; e < sub.edges.size(); ++e)
    for (int side = 0; side < 2; ++side) {
      const int t = edge_triangles[e][side];
      if (t < 0 || painted.owner[painted.face[t]] < 0) continue;
      const int part = parts.find(painted.face[t]);
      if (const int s = sub.edges[e].surface; s >= 0) {
        has_surface[part] = 1;
        const double theta = section.environments[section.surfaces[s].environment].temperature;
        coldest[part] = std::min(coldest[part], theta), warmest[part] = std::max(warmest[part], theta);
      }
      if (!is_part[part]) is_part[part] = 1, corner[part] = as_point(sub.vertices[sub.edges[e].a]);
    }
  int n_parts = 0;
  for (int f = 0; f < painted.n_faces(); ++f) {
    if (!is_part[f]) continue;
    ++n_parts;
    if (has_surface[f]) continue;
    int region = -1;
    for (int g = 0; g < painted.n_faces() && region < 0; ++g)
      if (painted.owner[g] >= 0 && parts.find(g) == f) region = painted.owner[g];
    throw_input_error(section.regions[region].where, fmt::format("region '{}'", section.regions[region].name),
                      fmt::format("belongs to a part of the section (with a corner at {}) that touches neither the "
                                  "rest of the section nor any surface, so its temperature is undefined",
                                  section.format_point(sub.metres(corner[f]))),
                      "join the part to the rest of the section along an edge, give it a surface, or remove it");
  }
  bool heat_flows = false;
  for (int f = 0; f < painted.n_faces(); ++f) heat_flows = heat_flows || (is_part[f] && warmest[f] > coldest[f]);
  if (!heat_flows)
    throw_input_error({section.file, 0}, "section",
                      fmt::format("the section falls into {} separate parts and none of them joins surfaces facing "
                                  "environments at different temperatures, so no heat flows through it", n_parts),
                      "close the gap between the regions that should touch (regions within 0.01 mm of each other are "
                      "joined)");
  if (n_parts > 1)
    sub.warnings.push_back(fmt::format("the section falls into {} separate parts that touch nowhere; each is solved on its "
                                       "own and the heat flows add up. Check for an unintended gap between regions",
                                       n_parts));
}

void warn_narrow_slots(const CrossSection& section, PlanarSubdivision& sub) {
  constexpr double narrow = 300.0;  // grid steps: 3 mm
  std::vector<int> boundary;
  std::vector<Box> boxes;
  for (int e = 0; e < static_cast<int>(sub.edges.size()); ++e) {
    const SubdivisionEdge& edge = sub.edges[e];
    if ((edge.left < 0) == (edge.right < 0)) continue;
    const Point a = as_point(sub.vertices[edge.a]), b = as_point(sub.vertices[edge.b]);
    boundary.push_back(e);
    boxes.push_back({std::min(a.x, b.x) - narrow, std::min(a.y, b.y) - narrow, std::max(a.x, b.x) + narrow,
                     std::max(a.y, b.y) + narrow});
  }
  // The outward normal points to the side without material.
  auto outward = [&](const SubdivisionEdge& e) {
    const Point d = as_point(sub.vertices[e.b]) - as_point(sub.vertices[e.a]);
    const Point left{-d.y, d.x};
    return (1.0 / norm(d)) * (e.left < 0 ? left : -1.0 * left);
  };
  double best = narrow;
  Point best_a{}, best_b{};
  for (const auto& [i, j] : overlapping_boxes(boxes)) {
    const SubdivisionEdge &e = sub.edges[boundary[i]], &f = sub.edges[boundary[j]];
    if (e.a == f.a || e.a == f.b || e.b == f.a || e.b == f.b) continue;
    if (e.surface >= 0 || f.surface >= 0) continue;  // a slot with surfaces is modelled as such
    const Point ne = outward(e), nf = outward(f);
    if (dot(ne, nf) > -0.9) continue;  // not facing each other
    const Point ea = as_point(sub.vertices[e.a]), eb = as_point(sub.vertices[e.b]);
    const Point fa = as_point(sub.vertices[f.a]), fb = as_point(sub.vertices[f.b]);
    // The gap along e's normal, over the stretch where the two edges face each other.
    const Point along = (1.0 / distance(ea, eb)) * (eb - ea);
    const double e0 = 0.0, e1 = distance(ea, eb);
    const double f0 = std::min(dot(fa - ea, along), dot(fb - ea, along)), f1 = std::max(dot(fa - ea, along), dot(fb - ea, along));
    const double overlap = std::min(e1, f1) - std::max(e0, f0);
    const double gap = std::min(dot(fa - ea, ne), dot(fb - ea, ne));
    if (gap <= 0.0 || gap >= best || overlap <= gap) continue;
    if (std::min(dot(ea - fa, nf), dot(eb - fa, nf)) <= 0.0) continue;
    best = gap;
    const double mid = 0.5 * (std::max(e0, f0) + std::min(e1, f1));
    best_a = ea + mid * along;
    best_b = best_a + gap * ne;
  }
  if (best >= narrow) return;
  sub.warnings.push_back(fmt::format(
      "a slot {:.2f} mm wide between {} and {} is open to the outside: its faces carry no surface, so it acts as a "
      "perfect insulator cutting into the section. If it is a drawing slip, close it; if it is a real air gap, fill it "
      "with a region of the air layer's equivalent conductivity", best / 100.0, section.format_point(sub.metres(best_a)),
      section.format_point(sub.metres(best_b))));
}

}  // namespace edgeflux
