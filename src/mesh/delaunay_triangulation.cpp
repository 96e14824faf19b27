// Constrained Delaunay triangulation of all region edges, refined to a graded size field and a
// minimum-angle bound. The only translation unit that includes CGAL.

// CGAL's own consistency checks stay on in Release builds: with inexact constructions, region edges
// that cross at flat angles next to a sharp corner can leave a constrained edge whose computed
// midpoint lies in neither of its triangles; unchecked, refinement then follows a null face and the
// program crashes (found by fuzz_solver). Checked, CGAL throws, and the caller gets a clear message.
// Measured cost: none visible in the mesh times of the shipped details (docs/method.md).
#define CGAL_DEBUG
#include <CGAL/Constrained_Delaunay_triangulation_2.h>
#include <CGAL/Delaunay_mesh_criteria_2.h>
#include <CGAL/Delaunay_mesh_face_base_2.h>
#include <CGAL/Delaunay_mesh_size_criteria_2.h>
#include <CGAL/Delaunay_mesh_vertex_base_2.h>
#include <CGAL/Delaunay_mesher_2.h>
#include <CGAL/Exact_predicates_inexact_constructions_kernel.h>
#include <CGAL/Triangulation_face_base_with_info_2.h>
#include <CGAL/Triangulation_vertex_base_with_info_2.h>

#include <algorithm>
#include <cstdlib>
#include <mutex>
#include <fmt/format.h>
#include <tuple>
#include <unordered_map>
#include <cmath>

#include "geometry/cross_section.h"
#include "geometry/polygon.h"
#include "geometry/segment_arrangement.h"
#include "mesh/mesh_cross_section.h"
#include "mesh/raw_triangulation.h"
#include "mesh/size_field.h"

namespace edgeflux {
namespace {

// Exact predicates, inexact constructions: exact constructions make the coordinates of refinement
// points grow without bound (measured: a two-rectangle section did not finish). Constraint pieces
// therefore must be exactly straight in doubles, which segment_arrangement ensures for axis-parallel
// edges (crossings take the exact coordinates of the edges).
using Kernel = CGAL::Exact_predicates_inexact_constructions_kernel;
// Vertex info: output node index; face info: painting region (-2 = not yet painted).
using VertexBase = CGAL::Triangulation_vertex_base_with_info_2<int, Kernel, CGAL::Delaunay_mesh_vertex_base_2<Kernel>>;
using FaceBase = CGAL::Triangulation_face_base_with_info_2<int, Kernel, CGAL::Delaunay_mesh_face_base_2<Kernel>>;
using Tds = CGAL::Triangulation_data_structure_2<VertexBase, FaceBase>;
// Exact_predicates_tag lets region edges cross: the crossing points become vertices.
using Cdt = CGAL::Constrained_Delaunay_triangulation_2<Kernel, Tds, CGAL::Exact_predicates_tag>;
using edgeflux::Segment;
using CgalPoint = Cdt::Point;

/// Minimum-angle bound plus a size bound that varies in space (the longest edge of a face must
/// not exceed the size field at its centroid).
class GradedCriteria : public virtual CGAL::Delaunay_mesh_criteria_2<Cdt> {
 public:
  using Base = CGAL::Delaunay_mesh_criteria_2<Cdt>;
  using Quality = CGAL::Delaunay_mesh_size_criteria_2<Cdt>::Quality;

  GradedCriteria(double aspect_bound, const SizeField* field) : Base(aspect_bound), field_(field) {}

  class Is_bad : public Base::Is_bad {
   public:
    Is_bad(double aspect_bound, const SizeField* field, const Kernel& traits)
        : Base::Is_bad(aspect_bound, traits), field_(field) {}

    CGAL::Mesh_2::Face_badness operator()(const Quality q) const {
      if (q.size() > 1) return CGAL::Mesh_2::IMPERATIVELY_BAD;
      return q.sine() < this->B ? CGAL::Mesh_2::BAD : CGAL::Mesh_2::NOT_BAD;
    }

    CGAL::Mesh_2::Face_badness operator()(const Cdt::Face_handle& fh, Quality& q) const {
      const CgalPoint& pa = fh->vertex(0)->point();
      const CgalPoint& pb = fh->vertex(1)->point();
      const CgalPoint& pc = fh->vertex(2)->point();
      // Sizes and shapes need no exactness: judge them in doubles.
      const double ax = CGAL::to_double(pa.x()), ay = CGAL::to_double(pa.y()), bx = CGAL::to_double(pb.x()),
                   by = CGAL::to_double(pb.y()), cx = CGAL::to_double(pc.x()), cy = CGAL::to_double(pc.y());
      const double a = (bx - cx) * (bx - cx) + (by - cy) * (by - cy), b = (cx - ax) * (cx - ax) + (cy - ay) * (cy - ay),
                   c = (ax - bx) * (ax - bx) + (ay - by) * (ay - by);
      double sorted[3] = {a, b, c};
      std::sort(sorted, sorted + 3);
      const double h = (*field_)((ax + bx + cx) / 3.0, (ay + by + cy) / 3.0);
      q.second = sorted[2] / (h * h);
      if (q.size() > 1) {
        q.first = 1;
        return CGAL::Mesh_2::IMPERATIVELY_BAD;
      }
      const double area = (bx - ax) * (cy - ay) - (by - ay) * (cx - ax);
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

/// Inserts the region edges, split where they cross or overlap (so no two constraints cross and
/// the triangulation never has to construct an intersection point).
void insert_constraints(const std::vector<Segment>& arrangement, Cdt& cdt) {
  for (const Segment& s : arrangement) cdt.insert_constraint(CgalPoint(s.a.x, s.a.y), CgalPoint(s.b.x, s.b.y));
}

/// Surface end points become vertices so each boundary edge belongs to one surface only; probes
/// become vertices so their temperature is a nodal value, free of interpolation error. Returns how
/// many points were given.
std::size_t insert_surface_and_probe_points(const CrossSection& section, Cdt& cdt) {
  std::size_t count = 0;
  for (const Surface& surface : section.surfaces)
    for (Point p : surface.path) cdt.insert(CgalPoint(p.x, p.y)), ++count;
  for (const Probe& probe : section.probes) cdt.insert(CgalPoint(probe.at.x, probe.at.y)), ++count;
  return count;
}

double section_extent(const CrossSection& section) {
  double x_min = 1e300, x_max = -1e300, y_min = 1e300, y_max = -1e300;
  for (const Region& region : section.regions)
    for (Point p : region.outline) {
      x_min = std::min(x_min, p.x), x_max = std::max(x_max, p.x);
      y_min = std::min(y_min, p.y), y_max = std::max(y_max, p.y);
    }
  return std::max(x_max - x_min, y_max - y_min);
}

std::vector<Segment> arranged_segments(const CrossSection& section) {
  return segment_arrangement(region_segments(section), 1e-9 * section_extent(section));
}

/// The faces of the constraints-only triangulation that some region paints: points inside them tell
/// the mesher which faces to refine, and the faces themselves are the domain for the node estimate
/// (cheap: that triangulation has few faces).
struct Domain {
  std::vector<CgalPoint> seeds;
  std::vector<std::array<Point, 3>> triangles;
};

Domain painted_domain(const CrossSection& section, const Cdt& cdt) {
  Domain domain;
  auto to_point = [](const CgalPoint& p) { return Point{CGAL::to_double(p.x()), CGAL::to_double(p.y())}; };
  for (auto f = cdt.finite_faces_begin(); f != cdt.finite_faces_end(); ++f) {
    const CgalPoint c = CGAL::centroid(f->vertex(0)->point(), f->vertex(1)->point(), f->vertex(2)->point());
    if (painting_region(section, to_point(c)) < 0) continue;
    domain.seeds.push_back(c);
    domain.triangles.push_back({to_point(f->vertex(0)->point()), to_point(f->vertex(1)->point()), to_point(f->vertex(2)->point())});
  }
  return domain;
}

RawTriangulation painted_triangulation(const CrossSection& section, Cdt& cdt);

/// The angles at which region edges meet (at their ends, and where they cross).
struct SharpAngles {
  double smallest = 180.0;  ///< degrees
  Point where{};
  /// Extra nodes that sharp angles cost: inside a wedge of angle α the well-shaped elements at
  /// distance r from the tip are about r·α large, so the wedge takes about ln(L/r₀)/α of them.
  /// Measured on a 5 m taper: 12/α (α in radians) for α of 0.06–0.3°.
  double wedge_nodes = 0.0;
};

SharpAngles sharp_angles(const std::vector<Segment>& arrangement) {
  std::vector<std::pair<Point, Point>> ends;  // (vertex, direction)
  for (const Segment& s : arrangement) ends.push_back({s.a, s.b - s.a}), ends.push_back({s.b, s.a - s.b});
  std::sort(ends.begin(), ends.end(), [](const auto& p, const auto& q) { return std::tie(p.first.x, p.first.y) < std::tie(q.first.x, q.first.y); });
  SharpAngles sharp;
  constexpr double degree = 3.141592653589793 / 180.0;
  for (std::size_t i = 0; i < ends.size(); ++i)
    for (std::size_t j = i + 1; j < ends.size() && ends[j].first.x == ends[i].first.x && ends[j].first.y == ends[i].first.y; ++j) {
      const Point u = ends[i].second, v = ends[j].second;
      // Collinear ends are one edge drawn twice (two regions sharing it) or overlapping edges,
      // which the arrangement merges: not a corner.
      if (cross(u, v) == 0.0) continue;
      const double angle = std::atan2(std::abs(cross(u, v)), dot(u, v));
      if (angle < 20.0 * degree) sharp.wedge_nodes += 12.0 / std::max(angle, 1e-12);
      if (angle / degree < sharp.smallest) sharp.smallest = angle / degree, sharp.where = ends[i].first;
    }
  return sharp;
}

[[noreturn]] void throw_mesh_limit(const CrossSection& section, const std::string& problem, const std::string& fix) {
  throw MeshLimitError(format_input_error({section.file, 0}, "mesh", problem, fix), problem);
}

// Tips sharper than this take tens of thousands of nodes each (12/α) and, being nearly always
// drawing errors (a point a hair off a line), are refused before meshing. A taper of 1 in 1 000,
// far flatter than any screed or insulation fall, is 0.057°.
constexpr double sharpest_meshable_angle = 0.05;  // degrees

void reject_unmeshable_angle(const CrossSection& section, const SharpAngles& sharp) {
  if (sharp.smallest >= sharpest_meshable_angle) return;
  throw_mesh_limit(section,
                   fmt::format("region edges meet at {:.4f}° at {}, sharper than the {}° the mesher can fill with "
                               "well-shaped elements", sharp.smallest, section.format_point(sharp.where),
                               sharpest_meshable_angle),
                   "a tip that sharp is usually a drawing error: snap nearly coincident points together, or end the "
                   "tapering region in a short blunt edge across its tip");
}

/// How far refinement may go: the node limit, and a budget of a few times what the element sizes
/// ask for. Delaunay refinement always terminates, but it can cascade (many sharp corners, or
/// corners that the estimate misjudges); the budget ends that after seconds instead of minutes.
struct RefinementBudget {
  std::size_t max_vertices;   ///< the documented node limit
  std::size_t budget;         ///< ≤ max_vertices
  double expected;            ///< what the sizes (or the given points) ask for
  const char* expected_what;  ///< "nodes the element sizes ask for" / "nodes of the refined mesh"
};

// Measured on every shipped detail and reference case: the graded mesh has 0.61–1.07 × the
// estimated nodes, and angle repair after adaptive refinement changes the count by under 5 %. Four
// times the estimate, and at least 60 000 nodes (about 2 s of refinement), leaves room for any
// honest section while ending a cascade early.
constexpr double budget_factor = 4.0;
constexpr double budget_floor = 60'000.0;

RefinementBudget make_budget(double expected, std::size_t max_vertices, const char* what) {
  const double budget = std::min(static_cast<double>(max_vertices), std::max(budget_floor, budget_factor * expected));
  return {max_vertices, static_cast<std::size_t>(budget), expected, what};
}

/// Runs Delaunay refinement step by step so a pathological input stops at its budget with a clear
/// message instead of running for minutes or out of memory.
template <class Criteria>
void refine_guarded(const CrossSection& section, Cdt& cdt, const std::vector<CgalPoint>& seeds, const Criteria& criteria,
                    const SharpAngles& sharp, const RefinementBudget& limits) {
  CGAL::Delaunay_mesher_2<Cdt, Criteria> mesher(cdt, criteria);
  mesher.set_seeds(seeds.begin(), seeds.end(), true);
  mesher.init();
  while (mesher.step_by_step_refine_mesh()) {
    if (cdt.number_of_vertices() <= limits.budget) continue;
    const std::string angle = fmt::format("the smallest angle between region edges is {:.2f}° at {}", sharp.smallest,
                                          section.format_point(sharp.where));
    if (limits.budget >= limits.max_vertices)
      throw_mesh_limit(section,
                       fmt::format("the mesh reached the limit of {} nodes before its elements were well shaped (about "
                                   "{:.3g} {}); {}", limits.max_vertices, limits.expected, limits.expected_what, angle),
                       "lower the density or the accuracy target, or cut the model at the cut-off planes ISO 10211 asks for");
    throw_mesh_limit(section,
                     fmt::format("the mesher stopped at {} nodes, {:.0f} times the {:.3g} {}: refinement cascades, "
                                 "usually where region edges meet at sharp angles; {}", cdt.number_of_vertices(),
                                 cdt.number_of_vertices() / std::max(limits.expected, 1.0), limits.expected,
                                 limits.expected_what, angle),
                     "snap nearly coincident points together, end tapering regions in a short blunt edge across their "
                     "tip, or give very thin slivers a thickness of their own");
  }
}

[[noreturn]] void refuse_sharp_corners(const CrossSection& section, const SharpAngles& sharp, std::size_t max_vertices) {
  throw_mesh_limit(section,
                   fmt::format("the sharp corners between region edges (the smallest {:.2f}° at {}) need about {:.3g} "
                               "nodes to be filled with well-shaped elements, more than the limit of {}",
                               sharp.smallest, section.format_point(sharp.where), sharp.wedge_nodes, max_vertices),
                   "draw corners sharper than about 20° only where the construction has them; a zigzag or a "
                   "serrated edge is better modelled as a layer of equivalent conductivity");
}

/// Fails at once when the sharp corners alone ask for more nodes than the limit.
void check_sharp_corner_nodes(const CrossSection& section, const SharpAngles& sharp, std::size_t max_vertices) {
  if (sharp.wedge_nodes > static_cast<double>(max_vertices)) refuse_sharp_corners(section, sharp, max_vertices);
}

/// Fails at once when the element sizes and sharp corners together ask for more nodes than the limit.
void check_node_estimate(const CrossSection& section, double size_nodes, const SharpAngles& sharp, const SizeField& field,
                         double extent, const std::vector<SizeSeed>& seeds, std::size_t max_vertices) {
  if (size_nodes + sharp.wedge_nodes <= static_cast<double>(max_vertices)) return;
  if (sharp.wedge_nodes > size_nodes) refuse_sharp_corners(section, sharp, max_vertices);
  const auto finest = std::min_element(seeds.begin(), seeds.end(), [](const SizeSeed& a, const SizeSeed& b) { return a.size < b.size; });
  const double smallest = finest == seeds.end() ? field.max_size() : std::min(finest->size, field.max_size());
  throw_mesh_limit(section,
                   fmt::format("the section is {:.4g} m across and its smallest features ask for elements of {:.3g} mm, "
                               "so its mesh needs more than the limit of {} nodes", extent, 1e3 * smallest, max_vertices),
                   "check the unit of the coordinates (a section kilometres across is usually metres written where "
                   "millimetres were meant), cut the model at the cut-off planes ISO 10211 asks for, or lower the density");
}

RawTriangulation graded_triangulation(const CrossSection& section, const MeshOptions& options) {
  // The corners of the outlines as drawn are a part of the corners the mesher will see (crossings
  // add more): in linear time they already refuse a tip too sharp or too many sharp corners, before
  // the arrangement, the size field and the painting, which grow faster with the number of edges.
  {
    const SharpAngles drawn = sharp_angles(region_segments(section));
    reject_unmeshable_angle(section, drawn);
    check_sharp_corner_nodes(section, drawn, options.max_nodes);
  }
  Cdt cdt;
  const std::vector<Segment> arrangement = arranged_segments(section);
  insert_constraints(arrangement, cdt);
  // The domain comes from the region edges alone: probes and surface ends are points, not features
  // whose thickness the elements must resolve.
  const Domain domain = painted_domain(section, cdt);
  const std::size_t given_points = insert_surface_and_probe_points(section, cdt);
  double x_min = 1e300, y_min = 1e300;
  for (const Region& region : section.regions)
    for (Point p : region.outline) x_min = std::min(x_min, p.x), y_min = std::min(y_min, p.y);
  const double extent = section_extent(section);
  const std::vector<SizeSeed> size_seeds = feature_sizes(section, options.density);
  const SizeField field(size_seeds, extent / (50.0 * options.density), 0.3 / std::sqrt(options.density), {x_min, y_min});
  const SharpAngles sharp = sharp_angles(arrangement);
  reject_unmeshable_angle(section, sharp);
  // Sharp corners first: they are counted at once, the size field needs a quadrature.
  const double limit = static_cast<double>(options.max_nodes);
  const double size_nodes =
      sharp.wedge_nodes > limit
          ? 0.0
          : static_cast<double>(given_points) + estimated_node_count(domain.triangles, field, limit - sharp.wedge_nodes);
  check_node_estimate(section, size_nodes, sharp, field, extent, size_seeds, options.max_nodes);
  const double estimate = size_nodes + sharp.wedge_nodes;
  // Shape bound 0.125 is a minimum angle of about 20.7°, which the refinement always reaches.
  GradedCriteria criteria(0.125, &field);
  refine_guarded(section, cdt, domain.seeds, criteria, sharp, make_budget(estimate, options.max_nodes, "nodes the element sizes ask for"));
  return painted_triangulation(section, cdt);
}

/// Runs a meshing step, turning a failed CGAL consistency check into a MeshLimitError that says
/// where the geometry is most delicate.
/// CGAL reports a failed check on stderr before it throws (when built with clang); the message
/// the user gets is ours, on one line, so CGAL's own stays silent.
void silent_cgal_failure(const char*, const char*, const char*, int, const char*) {}

template <class Step>
RawTriangulation checked(const CrossSection& section, Step step) {
  static std::once_flag silenced;
  std::call_once(silenced, [] { CGAL::set_error_handler(silent_cgal_failure); });
  try {
    return step();
  } catch (const CGAL::Failure_exception& e) {
    const SharpAngles sharp = sharp_angles(arranged_segments(section));
    throw_mesh_limit(section,
                     fmt::format("the triangulation lost its consistency during refinement (CGAL: {}), which happens "
                                 "where region edges cross at flat angles close to other corners; the smallest angle "
                                 "between region edges is {:.2f}° at {}", e.expression(), sharp.smallest,
                                 section.format_point(sharp.where)),
                     "move crossing region edges apart or let them meet at a shared corner point, and avoid sharp "
                     "corners next to the crossings");
  }
}

}  // namespace

RawTriangulation delaunay_triangulation(const CrossSection& section, const MeshOptions& options) {
  return checked(section, [&] { return graded_triangulation(section, options); });
}

namespace {

RawTriangulation painted_triangulation(const CrossSection& section, Cdt& cdt) {
  RawTriangulation raw;
  raw.points.reserve(cdt.number_of_vertices());
  for (auto v = cdt.finite_vertices_begin(); v != cdt.finite_vertices_end(); ++v) {
    v->info() = static_cast<int>(raw.points.size());
    raw.points.push_back({CGAL::to_double(v->point().x()), CGAL::to_double(v->point().y())});
  }
  // Faces between the same constraints share a region: paint one face per constrained component.
  for (auto f = cdt.finite_faces_begin(); f != cdt.finite_faces_end(); ++f) f->info() = -2;
  std::vector<Cdt::Face_handle> todo;
  for (auto f = cdt.finite_faces_begin(); f != cdt.finite_faces_end(); ++f) {
    if (f->info() != -2) continue;
    const CgalPoint c = CGAL::centroid(f->vertex(0)->point(), f->vertex(1)->point(), f->vertex(2)->point());
    const int region = painting_region(section, {CGAL::to_double(c.x()), CGAL::to_double(c.y())});
    f->info() = region;
    todo.push_back(f);
    while (!todo.empty()) {
      const Cdt::Face_handle g = todo.back();
      todo.pop_back();
      for (int k = 0; k < 3; ++k) {
        const Cdt::Face_handle h = g->neighbor(k);
        if (cdt.is_infinite(h) || g->is_constrained(k) || h->info() != -2) continue;
        h->info() = region;
        todo.push_back(h);
      }
    }
  }
  raw.triangles.reserve(cdt.number_of_faces());
  for (auto f = cdt.finite_faces_begin(); f != cdt.finite_faces_end(); ++f) {
    raw.triangles.push_back({f->vertex(0)->info(), f->vertex(1)->info(), f->vertex(2)->info()});
    raw.triangle_region.push_back(f->info());
  }
  return raw;
}

}  // namespace
}  // namespace edgeflux
