// Constrained Delaunay triangulation of the subdivision's edges, refined to a graded size field and
// a minimum-angle bound. The only translation unit of mesh/ that includes CGAL.
//
// The mesher works in the subdivision's local grid steps, where every vertex has small integer
// coordinates. A point the refinement puts on a constrained edge is nearly always the midpoint of
// two points on it, which in doubles is exact and so lies on the edge to the last bit. Near small
// angles between edges the split points sit at power-of-two distances from the corner (concentric
// shells, which keep the refinement finite); those are within a unit of the last place of the edge.
// Faces are painted by flooding from a seed inside each face of the subdivision, never by testing
// a point against the outlines, so a hair-thin triangle outside an edge can never join the mesh.

// CGAL's own consistency checks stay on in Release builds: a broken invariant becomes a clear
// message instead of a crash (measured cost: none visible in the mesh times of the shipped details).
#define CGAL_DEBUG
#include <CGAL/Constrained_Delaunay_triangulation_2.h>
#include <CGAL/Delaunay_mesh_criteria_2.h>
#include <CGAL/Delaunay_mesh_face_base_2.h>
#include <CGAL/Delaunay_mesh_size_criteria_2.h>
#include <CGAL/Delaunay_mesh_vertex_base_2.h>
#include <CGAL/Delaunay_mesher_2.h>
#include <CGAL/Exact_predicates_inexact_constructions_kernel.h>
#include <CGAL/Spatial_sort_traits_adapter_2.h>
#include <CGAL/property_map.h>
#include <CGAL/spatial_sort.h>
#include <CGAL/Triangulation_face_base_with_info_2.h>
#include <CGAL/Triangulation_vertex_base_with_info_2.h>

#include <fmt/format.h>

#include <algorithm>
#include <cmath>
#include <mutex>
#include <stdexcept>
#include <tuple>

#include "geometry/planar_subdivision.h"
#include "geometry/polygon.h"
#include "mesh/mesh_cross_section.h"
#include "mesh/delaunay_triangulation.h"
#include "mesh/mesher_guards.h"
#include "mesh/size_field.h"

namespace edgeflux {
namespace {

/// Exact predicates, inexact constructions: exact constructions make the coordinates of refinement
/// points grow without bound (measured: a two-rectangle section did not finish).
using MeshKernel = CGAL::Exact_predicates_inexact_constructions_kernel;

// Vertex info: output node index; face info: painting region (-2 = not yet painted).
using VertexBase = CGAL::Triangulation_vertex_base_with_info_2<int, MeshKernel, CGAL::Delaunay_mesh_vertex_base_2<MeshKernel>>;
using FaceBase = CGAL::Triangulation_face_base_with_info_2<int, MeshKernel, CGAL::Delaunay_mesh_face_base_2<MeshKernel>>;
using Tds = CGAL::Triangulation_data_structure_2<VertexBase, FaceBase>;
// The subdivision's edges never cross: an intersection would be a broken promise, and CGAL says so.
using Cdt = CGAL::Constrained_Delaunay_triangulation_2<MeshKernel, Tds, CGAL::No_constraint_intersection_requiring_constructions_tag>;
using CgalPoint = Cdt::Point;

constexpr double degree = 3.141592653589793 / 180.0;

CgalPoint cgal_point(Point p) { return CgalPoint(p.x, p.y); }
CgalPoint cgal_point(GridPoint p) { return CgalPoint(static_cast<double>(p.x), static_cast<double>(p.y)); }
Point plain(const CgalPoint& p) { return {p.x(), p.y()}; }

/// Minimum-angle bound plus a size bound that varies in space (the longest edge of a face must
/// not exceed the size field at its centroid).
class GradedCriteria : public virtual CGAL::Delaunay_mesh_criteria_2<Cdt> {
 public:
  using Base = CGAL::Delaunay_mesh_criteria_2<Cdt>;
  using Quality = CGAL::Delaunay_mesh_size_criteria_2<Cdt>::Quality;

  GradedCriteria(double aspect_bound, const SizeField* field) : Base(aspect_bound), field_(field) {}

  class Is_bad : public Base::Is_bad {
   public:
    Is_bad(double aspect_bound, const SizeField* field, const MeshKernel& traits)
        : Base::Is_bad(aspect_bound, traits), field_(field) {}

    CGAL::Mesh_2::Face_badness operator()(const Quality q) const {
      if (q.size() > 1) return CGAL::Mesh_2::IMPERATIVELY_BAD;
      return q.sine() < this->B ? CGAL::Mesh_2::BAD : CGAL::Mesh_2::NOT_BAD;
    }

    CGAL::Mesh_2::Face_badness operator()(const Cdt::Face_handle& fh, Quality& q) const {
      const Point a = plain(fh->vertex(0)->point()), b = plain(fh->vertex(1)->point()), c = plain(fh->vertex(2)->point());
      double sorted[3] = {dot(b - c, b - c), dot(c - a, c - a), dot(a - b, a - b)};
      std::sort(sorted, sorted + 3);
      const Point centre = (1.0 / 3.0) * (a + b + c);
      const double h = (*field_)(centre.x, centre.y);
      q.second = sorted[2] / (h * h);
      if (q.size() > 1) {
        q.first = 1;
        return CGAL::Mesh_2::IMPERATIVELY_BAD;
      }
      const double area = cross(b - a, c - a);
      q.first = (area * area) / (sorted[2] * sorted[1]);
      return q.sine() < this->B ? CGAL::Mesh_2::BAD : CGAL::Mesh_2::NOT_BAD;
    }

   private:
    const SizeField* field_;
  };

  Is_bad is_bad_object() const { return Is_bad(this->bound(), field_, this->traits); }

 private:
  const SizeField* field_;
};

/// Paints every face from the seeds: faces between the same constraints share a region. Faces no
/// seed reaches stay -1 (outside the section).
void paint_from_seeds(const PlanarSubdivision& sub, Cdt& cdt) {
  for (auto f = cdt.all_faces_begin(); f != cdt.all_faces_end(); ++f) f->info() = -1;
  std::vector<Cdt::Face_handle> todo;
  Cdt::Face_handle hint;
  // Seeds in space-filling-curve order: each is located by a short walk from the one before.
  std::vector<std::pair<CgalPoint, int>> ordered;
  for (std::size_t k = 0; k < sub.seeds.size(); ++k) ordered.emplace_back(cgal_point(sub.seeds[k].at), static_cast<int>(k));
  CGAL::spatial_sort(ordered.begin(), ordered.end(),
                     CGAL::Spatial_sort_traits_adapter_2<MeshKernel, CGAL::First_of_pair_property_map<std::pair<CgalPoint, int>>>());
  for (const auto& [point, k] : ordered) {
    const FaceSeed& seed = sub.seeds[k];
    const Cdt::Face_handle start = cdt.locate(point, hint);
    hint = start;
    if (cdt.is_infinite(start)) throw std::logic_error("a face seed of the section lies outside its triangulation");
    if (start->info() == seed.region) continue;
    if (start->info() >= 0) throw std::logic_error("two regions paint one face of the section");
    start->info() = seed.region;
    todo.assign(1, start);
    while (!todo.empty()) {
      const Cdt::Face_handle g = todo.back();
      todo.pop_back();
      for (int k = 0; k < 3; ++k) {
        const Cdt::Face_handle h = g->neighbor(k);
        if (cdt.is_infinite(h) || g->is_constrained(k) || h->info() == seed.region) continue;
        h->info() = seed.region;
        todo.push_back(h);
      }
    }
  }
}

/// Triangles of the constraints-only triangulation that some region paints: the domain for the
/// node estimate (cheap: that triangulation has few faces).
std::vector<DomainTriangle> painted_domain(const Cdt& cdt) {
  std::vector<DomainTriangle> domain;
  for (auto f = cdt.finite_faces_begin(); f != cdt.finite_faces_end(); ++f) {
    if (f->info() < 0) continue;
    const Point p[3] = {plain(f->vertex(0)->point()), plain(f->vertex(1)->point()), plain(f->vertex(2)->point())};
    double longest = 0.0, longest_constrained = 0.0;
    for (int k = 0; k < 3; ++k) {  // side k faces vertex k
      const double length = distance(p[(k + 1) % 3], p[(k + 2) % 3]);
      longest = std::max(longest, length);
      if (f->is_constrained(k)) longest_constrained = std::max(longest_constrained, length);
    }
    domain.push_back({p[0], p[1], p[2], longest_constrained >= 0.75 * longest});
  }
  return domain;
}

/// Local target element size at every vertex of the subdivision, from the distance to the nearest
/// feature it does not touch (the neighbouring vertices and the constrained edges facing it in the
/// constraints-only triangulation, in which a feature hidden behind another is never the
/// nearest). Thin layers and short edges get small elements; re-entrant corners (above 200°), where
/// the heat flux is singular (θ − θc ∝ r^(2/3) at 270°), start several times finer.
std::vector<SizeSeed> feature_sizes(const Cdt& cdt, double density) {
  const double elements_across = 3.0 * density;
  const double reflex_factor = 10.0;
  // Near a corner of angle α the field goes as r^(π/α): at 200° the exponent is 0.9, and a
  // finely drawn curve, whose corners are all within a few degrees of 180°, has no singularity.
  const double reflex_angle = 200.0 * degree;
  std::vector<SizeSeed> seeds;
  for (auto v = cdt.finite_vertices_begin(); v != cdt.finite_vertices_end(); ++v) {
    const Point p = plain(v->point());
    double nearest = std::numeric_limits<double>::infinity();
    bool reflex = false;
    // Faces around v, counter-clockwise; runs of one region add up to that region's angle at v.
    std::vector<std::pair<int, double>> fan;  // (region, angle)
    auto f = cdt.incident_faces(v), done = f;
    do {
      if (cdt.is_infinite(f)) {
        fan.push_back({-1, 0.0});
        continue;
      }
      const int i = f->index(v);
      const Point q = plain(f->vertex(Cdt::ccw(i))->point()), r = plain(f->vertex(Cdt::cw(i))->point());
      nearest = std::min({nearest, distance(p, q), distance(p, r)});
      if (f->is_constrained(i)) nearest = std::min(nearest, distance_to_segment(p, q, r));
      fan.push_back({f->info(), std::atan2(std::abs(cross(q - p, r - p)), dot(q - p, r - p))});
    } while (++f != done);
    const std::size_t n = fan.size();
    std::size_t start = 0;
    while (start < n && fan[start].first == fan[(start + n - 1) % n].first) ++start;
    if (start < n) {
      double run = 0.0;
      for (std::size_t k = 0; k < n; ++k) {
        const auto& [region, angle] = fan[(start + k) % n];
        if (k > 0 && region != fan[(start + k - 1) % n].first) run = 0.0;
        run += angle;
        if (region >= 0 && run > reflex_angle) reflex = true;
      }
    }
    if (std::isfinite(nearest)) seeds.push_back({p, nearest / (elements_across * (reflex ? reflex_factor : 1.0))});
  }
  std::sort(seeds.begin(), seeds.end(), [](const SizeSeed& a, const SizeSeed& b) {
    return std::tie(a.at.x, a.at.y, a.size) < std::tie(b.at.x, b.at.y, b.size);
  });
  return seeds;
}

/// Runs Delaunay refinement step by step so a pathological input stops at its budget with a clear
/// message instead of running for minutes or out of memory.
/// The domain is the painted faces (face info ≥ 0), marked here rather than found by CGAL from
/// seed points: CGAL locates each seed from scratch, which on a long section (a wall of thousands
/// of bricks) walks across the whole triangulation for every one.
template <class Criteria>
void refine_guarded(const CrossSection& section, const PlanarSubdivision& sub, Cdt& cdt, const Criteria& criteria,
                    const SharpAngles& sharp, const RefinementBudget& limits) {
  for (auto f = cdt.all_faces_begin(); f != cdt.all_faces_end(); ++f) f->set_in_domain(!cdt.is_infinite(f) && f->info() >= 0);
  CGAL::Delaunay_mesher_2<Cdt, Criteria> mesher(cdt, criteria);
  mesher.init(true);
  while (mesher.step_by_step_refine_mesh()) {
    if (cdt.number_of_vertices() <= limits.budget) continue;
    if (limits.budget >= limits.max_vertices)
      throw_mesh_limit(section,
                       fmt::format("the mesh reached the limit of {} nodes before its elements were well shaped (about "
                                   "{:.3g} nodes the element sizes ask for); {}", limits.max_vertices, limits.expected,
                                   smallest_angle_text(section, sub, sharp)),
                       "lower the density or the accuracy target, or cut the model at the cut-off planes ISO 10211 asks for");
    throw_mesh_limit(section,
                     fmt::format("the mesher stopped at {} nodes, {:.0f} times the {:.3g} nodes the element sizes ask "
                                 "for: refinement cascades, usually where region edges meet at sharp angles; {}",
                                 cdt.number_of_vertices(), cdt.number_of_vertices() / std::max(limits.expected, 1.0),
                                 limits.expected, smallest_angle_text(section, sub, sharp)),
                     "end tapering regions in a short blunt edge across their tip, or give very thin slivers a "
                     "thickness of their own");
  }
}

/// Follows the constrained edges of the refined triangulation from a to b: the chain of vertices
/// the refinement put on the subdivision edge a–b. Midpoints lie on the edge exactly, the split
/// points near small angles within a unit of the last place; at each vertex the next one is the
/// constrained neighbour nearer to b that lies closest to the line (another edge through the vertex
/// is at least 0.05° off it, and every mesh edge is longer than a nanometre, so its far end is
/// orders of magnitude further off).
std::vector<Cdt::Vertex_handle> constrained_chain(const Cdt& cdt, Cdt::Vertex_handle a, Cdt::Vertex_handle b) {
  const Point pa = plain(a->point()), pb = plain(b->point());
  const double length = distance(pa, pb);
  constexpr double on_line = 1e-6;  // grid steps: 10⁻¹¹ m
  std::vector<Cdt::Vertex_handle> chain{a};
  Cdt::Vertex_handle u = a;
  while (u != b) {
    Cdt::Vertex_handle next;
    double best = on_line;
    auto e = cdt.incident_edges(u), done = e;
    do {
      if (!cdt.is_constrained(*e) || cdt.is_infinite(*e)) continue;
      const Cdt::Face_handle f = e->first;
      const int i = e->second;
      const Cdt::Vertex_handle w = f->vertex(Cdt::ccw(i)) == u ? f->vertex(Cdt::cw(i)) : f->vertex(Cdt::ccw(i));
      if (!CGAL::has_smaller_distance_to_point(b->point(), w->point(), u->point())) continue;
      const double deviation = std::abs(cross(pb - pa, plain(w->point()) - pa)) / length;
      if (deviation <= best) best = deviation, next = w;
    } while (++e != done);
    if (next == Cdt::Vertex_handle() || chain.size() > cdt.number_of_vertices())
      throw std::logic_error(fmt::format("the mesh lost the edge from ({}, {}) to ({}, {}) of the section", pa.x, pa.y,
                                         pb.x, pb.y));
    chain.push_back(next);
    u = next;
  }
  return chain;
}

RawTriangulation painted_triangulation(const PlanarSubdivision& sub, Cdt& cdt,
                                       const std::vector<Cdt::Vertex_handle>& vertex) {
  paint_from_seeds(sub, cdt);
  RawTriangulation raw;
  raw.points.reserve(cdt.number_of_vertices());
  for (auto v = cdt.finite_vertices_begin(); v != cdt.finite_vertices_end(); ++v) {
    v->info() = static_cast<int>(raw.points.size());
    raw.points.push_back(sub.metres(plain(v->point())));
  }
  raw.triangles.reserve(cdt.number_of_faces());
  for (auto f = cdt.finite_faces_begin(); f != cdt.finite_faces_end(); ++f) {
    raw.triangles.push_back({f->vertex(0)->info(), f->vertex(1)->info(), f->vertex(2)->info()});
    raw.triangle_region.push_back(f->info());
  }
  for (const SubdivisionEdge& e : sub.edges) {
    if (e.surface < 0 && e.cut_off < 0) continue;
    const auto chain = constrained_chain(cdt, vertex[e.a], vertex[e.b]);
    for (std::size_t k = 0; k + 1 < chain.size(); ++k)
      raw.tagged.push_back({chain[k]->info(), chain[k + 1]->info(), e.surface, e.cut_off});
  }
  return raw;
}

RawTriangulation graded_triangulation(const CrossSection& section, const PlanarSubdivision& sub, const MeshOptions& options) {
  Cdt cdt;
  // All vertices at once (CGAL sorts them along a space-filling curve); the info is the vertex's
  // index until the output numbering replaces it.
  std::vector<std::pair<CgalPoint, int>> with_index;
  for (std::size_t v = 0; v < sub.vertices.size(); ++v) with_index.emplace_back(cgal_point(sub.vertices[v]), static_cast<int>(v));
  cdt.insert(with_index.begin(), with_index.end());
  std::vector<Cdt::Vertex_handle> vertex(sub.vertices.size());
  for (auto v = cdt.finite_vertices_begin(); v != cdt.finite_vertices_end(); ++v) vertex[v->info()] = v;
  for (const SubdivisionEdge& e : sub.edges) cdt.insert_constraint(vertex[e.a], vertex[e.b]);
  paint_from_seeds(sub, cdt);
  const std::vector<DomainTriangle> domain = painted_domain(cdt);
  const std::vector<SizeSeed> size_seeds = feature_sizes(cdt, options.density);
  // Probes become vertices so their temperature is a nodal value, free of interpolation error.
  std::vector<Cdt::Vertex_handle> probes;
  for (GridPoint p : sub.probes) probes.push_back(cdt.insert(cgal_point(p)));
  if (!probes.empty()) paint_from_seeds(sub, cdt);  // the faces the probes split

  double x_min = 1e300, y_min = 1e300, x_max = -1e300, y_max = -1e300;
  for (GridPoint p : sub.vertices) {
    x_min = std::min(x_min, static_cast<double>(p.x)), x_max = std::max(x_max, static_cast<double>(p.x));
    y_min = std::min(y_min, static_cast<double>(p.y)), y_max = std::max(y_max, static_cast<double>(p.y));
  }
  const double extent = std::max(x_max - x_min, y_max - y_min);
  const SizeField field(size_seeds, extent / (50.0 * options.density), 0.3 / std::sqrt(options.density));
  const SharpAngles sharp = sharp_angles(sub);
  reject_unmeshable_angle(section, sub, sharp);
  // Sharp corners first: they are counted at once, the size field needs a quadrature.
  const double limit = static_cast<double>(options.max_nodes);
  const double given_points = static_cast<double>(sub.vertices.size() + sub.probes.size());
  const double size_nodes =
      sharp.wedge_nodes > limit ? 0.0 : given_points + estimated_node_count(domain, field, limit - sharp.wedge_nodes);
  check_node_estimate(section, sub, size_nodes, sharp, extent, size_seeds, options.max_nodes);
  // Shape bound 0.125 is a minimum angle of about 20.7°, which the refinement always reaches.
  GradedCriteria criteria(0.125, &field);
  refine_guarded(section, sub, cdt, criteria, sharp, make_budget(size_nodes + sharp.wedge_nodes, options.max_nodes));
  RawTriangulation raw = painted_triangulation(sub, cdt, vertex);
  for (const Cdt::Vertex_handle& v : probes) raw.probe_nodes.push_back(v->info());
  return raw;
}

/// CGAL reports a failed check on stderr before it throws (when built with clang); the message
/// the user gets is ours, on one line, so CGAL's own stays silent.
void silent_cgal_failure(const char*, const char*, const char*, int, const char*) {}

}  // namespace

RawTriangulation delaunay_triangulation(const CrossSection& section, const PlanarSubdivision& sub, const MeshOptions& options) {
  static std::once_flag silenced;
  std::call_once(silenced, [] { CGAL::set_error_handler(silent_cgal_failure); });
  try {
    return graded_triangulation(section, sub, options);
  } catch (const CGAL::Failure_exception& e) {
    // Seen only on fuzzed sections with several near-flat corners close together, where split
    // points near small angles (within a unit of the last place of their edge) meet.
    const SharpAngles sharp = sharp_angles(sub);
    throw_mesh_limit(section,
                     fmt::format("the triangulation lost its consistency during refinement (CGAL: {}), which happens "
                                 "where region edges meet at very flat angles close to other corners; {}",
                                 e.expression(), smallest_angle_text(section, sub, sharp)),
                     "let nearly parallel region edges meet at a shared corner point or move them apart, and avoid "
                     "very sharp corners next to each other");
  }
}

}  // namespace edgeflux
