// Constrained Delaunay triangulation of all region edges, refined to a graded size field and a
// minimum-angle bound. The only translation unit that includes CGAL.
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
#include <fmt/format.h>
#include <tuple>
#include <unordered_map>
#include <cmath>

#include "geometry/cross_section.h"
#include "geometry/polygon.h"
#include "geometry/segment_arrangement.h"
#include "mesh/mesh_cross_section.h"
#include "mesh/raw_triangulation.h"

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

/// Size field: each feature seed asks for its own size, growing linearly away from it, capped at
/// max_size. A seed only matters within (max_size − size)/grading of itself, so seeds are kept in
/// buckets of that width and a query looks at the 3 × 3 buckets around it.
class SizeField {
 public:
  SizeField(std::vector<SizeSeed> seeds, double max_size, double grading, double x0, double y0)
      : max_size_(max_size), grading_(grading), x0_(x0), y0_(y0), width_(max_size / grading) {
    for (const SizeSeed& s : seeds) {
      if (s.size >= max_size) continue;
      buckets_[key(cell(s.at.x, x0_), cell(s.at.y, y0_))].push_back(s);
    }
  }
  double operator()(double x, double y) const {
    double h = max_size_;
    const long long cx = cell(x, x0_), cy = cell(y, y0_);
    for (long long i = cx - 1; i <= cx + 1; ++i)
      for (long long j = cy - 1; j <= cy + 1; ++j) {
        const auto it = buckets_.find(key(i, j));
        if (it == buckets_.end()) continue;
        for (const SizeSeed& s : it->second) h = std::min(h, s.size + grading_ * std::hypot(x - s.at.x, y - s.at.y));
      }
    return h;
  }

 private:
  long long cell(double v, double origin) const { return static_cast<long long>(std::floor((v - origin) / width_)); }
  static long long key(long long i, long long j) { return (i << 32) ^ (j & 0xffffffffLL); }
  double max_size_, grading_, x0_, y0_, width_;
  std::unordered_map<long long, std::vector<SizeSeed>> buckets_;
};

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
/// the triangulation never has to construct an intersection point), and the surface end points.
void insert_section(const CrossSection& section, const std::vector<Segment>& arrangement, Cdt& cdt) {
  for (const Segment& s : arrangement) cdt.insert_constraint(CgalPoint(s.a.x, s.a.y), CgalPoint(s.b.x, s.b.y));
  // Surface end points become vertices so each boundary edge belongs to one surface only; probes
  // become vertices so their temperature is a nodal value, free of interpolation error.
  for (const Surface& surface : section.surfaces)
    for (Point p : surface.path) cdt.insert(CgalPoint(p.x, p.y));
  for (const Probe& probe : section.probes) cdt.insert(CgalPoint(probe.at.x, probe.at.y));
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

/// Points inside covered areas, to tell the mesher which faces to refine (cheap on the
/// constraints-only triangulation, which has few faces).
std::vector<CgalPoint> domain_seeds(const CrossSection& section, const Cdt& cdt) {
  std::vector<CgalPoint> seeds;
  for (auto f = cdt.finite_faces_begin(); f != cdt.finite_faces_end(); ++f) {
    const CgalPoint c = CGAL::centroid(f->vertex(0)->point(), f->vertex(1)->point(), f->vertex(2)->point());
    if (painting_region(section, {CGAL::to_double(c.x()), CGAL::to_double(c.y())}) >= 0) seeds.push_back(c);
  }
  return seeds;
}

RawTriangulation painted_triangulation(const CrossSection& section, Cdt& cdt);

/// The smallest angle between two region edges that meet at a vertex, and where (degrees, point).
std::pair<double, Point> smallest_input_angle(const std::vector<Segment>& arrangement) {
  std::vector<std::pair<Point, Point>> ends;  // (vertex, direction)
  for (const Segment& s : arrangement) ends.push_back({s.a, s.b - s.a}), ends.push_back({s.b, s.a - s.b});
  std::sort(ends.begin(), ends.end(), [](const auto& p, const auto& q) { return std::tie(p.first.x, p.first.y) < std::tie(q.first.x, q.first.y); });
  double best = 180.0;
  Point where{};
  for (std::size_t i = 0; i < ends.size(); ++i)
    for (std::size_t j = i + 1; j < ends.size() && ends[j].first.x == ends[i].first.x && ends[j].first.y == ends[i].first.y; ++j) {
      const Point u = ends[i].second, v = ends[j].second;
      const double angle = std::atan2(std::abs(cross(u, v)), dot(u, v)) * 180.0 / 3.141592653589793;
      if (angle < best) best = angle, where = ends[i].first;
    }
  return {best, where};
}

/// Runs Delaunay refinement step by step so a pathological input (very small angles between region
/// edges, which can make refinement cascade without end) stops at `max_vertices` with a clear
/// message instead of running out of memory.
template <class Criteria>
void refine_guarded(const CrossSection& section, Cdt& cdt, const std::vector<CgalPoint>& seeds, const Criteria& criteria,
                    const std::vector<Segment>& arrangement, std::size_t max_vertices) {
  CGAL::Delaunay_mesher_2<Cdt, Criteria> mesher(cdt, criteria);
  mesher.set_seeds(seeds.begin(), seeds.end(), true);
  mesher.init();
  while (mesher.step_by_step_refine_mesh()) {
    if (cdt.number_of_vertices() <= max_vertices) continue;
    const auto [angle, at] = smallest_input_angle(arrangement);
    throw_input_error({section.file, 0}, "mesh",
                      fmt::format("the mesher stopped at {} nodes without reaching its quality bound; the smallest angle "
                                  "between region edges is {:.2f}° at {}", cdt.number_of_vertices(), angle, section.format_point(at)),
                      "avoid sliver-shaped regions and near-tangent edges (snap nearly coincident points together), or "
                      "lower the density");
  }
}

}  // namespace

RawTriangulation delaunay_through_points(const CrossSection& section, const std::vector<Point>& points,
                                         std::size_t max_vertices) {
  Cdt cdt;
  const std::vector<Segment> arrangement = arranged_segments(section);
  insert_section(section, arrangement, cdt);
  const std::vector<CgalPoint> seeds = domain_seeds(section, cdt);
  // Points on (or within rounding of) a constraint are left out: a point a hair off a constrained
  // edge would leave a sliver the refinement cannot remove. The angle-bound refinement splits
  // those edges again where interior points crowd them.
  const double tolerance = 1e-9 * section_extent(section);
  std::vector<CgalPoint> inside;
  inside.reserve(points.size());
  for (Point p : points) {
    bool near_constraint = false;
    for (const Segment& s : arrangement)
      if (distance_to_segment(p, s.a, s.b) <= tolerance) { near_constraint = true; break; }
    if (!near_constraint) inside.emplace_back(p.x, p.y);
  }
  cdt.insert(inside.begin(), inside.end());
  refine_guarded(section, cdt, seeds, CGAL::Delaunay_mesh_criteria_2<Cdt>(0.125), arrangement, max_vertices);
  return painted_triangulation(section, cdt);
}

RawTriangulation delaunay_triangulation(const CrossSection& section, const MeshOptions& options) {
  Cdt cdt;
  const std::vector<Segment> arrangement = arranged_segments(section);
  insert_section(section, arrangement, cdt);
  double x_min = 1e300, y_min = 1e300;
  for (const Region& region : section.regions)
    for (Point p : region.outline) x_min = std::min(x_min, p.x), y_min = std::min(y_min, p.y);
  const SizeField field(feature_sizes(section, options.density),
                        section_extent(section) / (50.0 * options.density),
                        0.3 / std::sqrt(options.density), x_min, y_min);
  // Mesh only faces painted by some region.
  const std::vector<CgalPoint> seeds = domain_seeds(section, cdt);
  // Shape bound 0.125 is a minimum angle of about 20.7°, which the refinement always reaches.
  GradedCriteria criteria(0.125, &field);
  refine_guarded(section, cdt, seeds, criteria, arrangement, options.max_nodes);

  return painted_triangulation(section, cdt);
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
