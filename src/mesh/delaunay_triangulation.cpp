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
#include <cmath>

#include "geometry/cross_section.h"
#include "mesh/mesh_cross_section.h"
#include "mesh/raw_triangulation.h"

namespace edgeflux {
namespace {

using Kernel = CGAL::Exact_predicates_inexact_constructions_kernel;
// Vertex info: output node index; face info: painting region (-2 = not yet painted).
using VertexBase = CGAL::Triangulation_vertex_base_with_info_2<int, Kernel, CGAL::Delaunay_mesh_vertex_base_2<Kernel>>;
using FaceBase = CGAL::Triangulation_face_base_with_info_2<int, Kernel, CGAL::Delaunay_mesh_face_base_2<Kernel>>;
using Tds = CGAL::Triangulation_data_structure_2<VertexBase, FaceBase>;
// Exact_predicates_tag lets region edges cross: the crossing points become vertices.
using Cdt = CGAL::Constrained_Delaunay_triangulation_2<Kernel, Tds, CGAL::Exact_predicates_tag>;
using CgalPoint = Cdt::Point;

/// Size field: each feature seed asks for its own size, growing linearly away from it.
struct SizeField {
  std::vector<SizeSeed> seeds;
  double max_size = 0.0;
  double grading = 0.3;
  double operator()(double x, double y) const {
    double h = max_size;
    for (const SizeSeed& s : seeds) h = std::min(h, s.size + grading * std::hypot(x - s.at.x, y - s.at.y));
    return h;
  }
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
      const double a = CGAL::squared_distance(pb, pc), b = CGAL::squared_distance(pc, pa),
                   c = CGAL::squared_distance(pa, pb);
      double sorted[3] = {a, b, c};
      std::sort(sorted, sorted + 3);
      const double h = (*field_)((pa.x() + pb.x() + pc.x()) / 3.0, (pa.y() + pb.y() + pc.y()) / 3.0);
      q.second = sorted[2] / (h * h);
      if (q.size() > 1) {
        q.first = 1;
        return CGAL::Mesh_2::IMPERATIVELY_BAD;
      }
      const double area = 2 * CGAL::area(pa, pb, pc);
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

}  // namespace

RawTriangulation delaunay_triangulation(const CrossSection& section, const MeshOptions& options) {
  Cdt cdt;
  double x_min = 1e300, x_max = -1e300, y_min = 1e300, y_max = -1e300;
  auto to_cgal = [&](Point p) {
    x_min = std::min(x_min, p.x), x_max = std::max(x_max, p.x);
    y_min = std::min(y_min, p.y), y_max = std::max(y_max, p.y);
    return CgalPoint(p.x, p.y);
  };
  for (const Region& region : section.regions) {
    const std::size_t n = region.outline.size();
    for (std::size_t i = 0; i < n; ++i)
      cdt.insert_constraint(to_cgal(region.outline[i]), to_cgal(region.outline[(i + 1) % n]));
  }
  // Surface end points become vertices so each boundary edge belongs to one surface only.
  for (const Surface& surface : section.surfaces)
    for (Point p : surface.path) cdt.insert(to_cgal(p));

  SizeField field;
  field.seeds = feature_sizes(section, options.density);
  field.max_size = std::max(x_max - x_min, y_max - y_min) / (50.0 * options.density);
  field.grading = 0.3 / std::sqrt(options.density);

  // Mesh only faces painted by some region: seeds at the centroids of covered faces.
  std::vector<CgalPoint> seeds;
  for (auto f = cdt.finite_faces_begin(); f != cdt.finite_faces_end(); ++f) {
    const CgalPoint c = CGAL::centroid(f->vertex(0)->point(), f->vertex(1)->point(), f->vertex(2)->point());
    if (painting_region(section, {c.x(), c.y()}) >= 0) seeds.push_back(c);
  }
  // Shape bound 0.125 is a minimum angle of about 20.7°, which the refinement always reaches.
  GradedCriteria criteria(0.125, &field);
  CGAL::refine_Delaunay_mesh_2(cdt, seeds.begin(), seeds.end(), criteria, true);

  RawTriangulation raw;
  raw.points.reserve(cdt.number_of_vertices());
  for (auto v = cdt.finite_vertices_begin(); v != cdt.finite_vertices_end(); ++v) {
    v->info() = static_cast<int>(raw.points.size());
    raw.points.push_back({v->point().x(), v->point().y()});
  }
  // Faces between the same constraints share a region: paint one face per constrained component.
  for (auto f = cdt.finite_faces_begin(); f != cdt.finite_faces_end(); ++f) f->info() = -2;
  std::vector<Cdt::Face_handle> todo;
  for (auto f = cdt.finite_faces_begin(); f != cdt.finite_faces_end(); ++f) {
    if (f->info() != -2) continue;
    const CgalPoint c = CGAL::centroid(f->vertex(0)->point(), f->vertex(1)->point(), f->vertex(2)->point());
    const int region = painting_region(section, {c.x(), c.y()});
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

}  // namespace edgeflux
