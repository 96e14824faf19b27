// Snap rounding, box overlaps and the constrained triangulation of the section's segments (CGAL).
#include "geometry/exact_geometry.h"

#include <CGAL/Box_intersection_d/Box_with_info_d.h>
#include <CGAL/Constrained_Delaunay_triangulation_2.h>
#include <CGAL/Exact_predicates_exact_constructions_kernel.h>
#include <CGAL/Exact_predicates_inexact_constructions_kernel.h>
#include <CGAL/Snap_rounding_2.h>
#include <CGAL/Snap_rounding_traits_2.h>
#include <CGAL/Triangulation_vertex_base_with_info_2.h>
#include <CGAL/box_intersection_d.h>

#include <algorithm>
#include <cmath>
#include <list>
#include <stdexcept>
#include <unordered_map>

#include "geometry/polygon.h"

namespace edgeflux {
namespace {

// ---- box overlaps -------------------------------------------------------------------------------

using CgalBox = CGAL::Box_intersection_d::Box_with_info_d<double, 2, int>;

std::vector<CgalBox> cgal_boxes(const std::vector<Box>& boxes) {
  std::vector<CgalBox> out;
  out.reserve(boxes.size());
  for (std::size_t i = 0; i < boxes.size(); ++i) {
    double lo[2] = {boxes[i].x_min, boxes[i].y_min}, hi[2] = {boxes[i].x_max, boxes[i].y_max};
    out.emplace_back(lo, hi, static_cast<int>(i));
  }
  return out;
}

// ---- snap rounding ------------------------------------------------------------------------------

/// Sign of the turn a → b → c. Exact for grid coordinates below about 6·10⁷ steps (600 m), where
/// every product is an integer below 2⁵³; beyond, only the generous margins below rely on it.
int turn(Point a, Point b, Point c) {
  const double v = cross(b - a, c - a);
  return (v > 0) - (v < 0);
}

double segment_distance(Point a, Point b, Point c, Point d) {
  const int o1 = turn(a, b, c), o2 = turn(a, b, d), o3 = turn(c, d, a), o4 = turn(c, d, b);
  if (o1 * o2 < 0 && o3 * o4 < 0) return 0.0;  // proper crossing
  return std::min({distance_to_segment(c, a, b), distance_to_segment(d, a, b), distance_to_segment(a, c, d),
                   distance_to_segment(b, c, d)});
}

using SrKernel = CGAL::Exact_predicates_exact_constructions_kernel;
using SrTraits = CGAL::Snap_rounding_traits_2<SrKernel>;

/// CGAL's snap rounding centres pixels at half-integers; the shift by half a step puts our grid
/// points at the centres (a point in the pixel of grid point g lands in CGAL's pixel of g).
SrKernel::Point_2 shifted(Point p, double dx = 0.0) { return SrKernel::Point_2(p.x + 0.5 + dx, p.y + 0.5); }

std::vector<std::vector<GridPoint>> cgal_snap_rounding(const std::vector<std::array<Point, 2>>& segments,
                                                       const std::vector<Point>& hot_points) {
  std::vector<SrKernel::Segment_2> input;
  input.reserve(segments.size() + hot_points.size());
  for (const auto& s : segments) input.emplace_back(shifted(s[0]), shifted(s[1]));
  // A hot point enters as a segment too short to leave its pixel: it makes the pixel hot and
  // rounds to the pixel's centre. (A segment of length zero is not allowed.)
  for (Point p : hot_points) {
    const double room = (static_cast<double>(grid_point(p).x) + 0.5) - p.x;  // to the pixel's right side, > 0
    input.emplace_back(shifted(p), shifted(p, 0.5 * room));
  }
  std::list<std::list<SrKernel::Point_2>> output;
  CGAL::snap_rounding_2<SrTraits>(input.begin(), input.end(), output, 1.0, true, true, 1);
  std::vector<std::vector<GridPoint>> polylines;
  polylines.reserve(segments.size());
  for (const auto& polyline : output) {
    if (polylines.size() == segments.size()) break;
    std::vector<GridPoint> points;
    for (const auto& q : polyline) {
      const GridPoint g{std::llround(CGAL::to_double(q.x())), std::llround(CGAL::to_double(q.y()))};
      if (points.empty() || points.back() != g) points.push_back(g);
    }
    polylines.push_back(std::move(points));
  }
  return polylines;
}

}  // namespace

std::vector<std::pair<int, int>> overlapping_boxes(const std::vector<Box>& a, const std::vector<Box>& b) {
  std::vector<CgalBox> ca = cgal_boxes(a), cb = cgal_boxes(b);
  std::vector<std::pair<int, int>> pairs;
  CGAL::box_intersection_d(ca.begin(), ca.end(), cb.begin(), cb.end(),
                           [&](const CgalBox& x, const CgalBox& y) { pairs.emplace_back(x.info(), y.info()); });
  std::sort(pairs.begin(), pairs.end());
  return pairs;
}

std::vector<std::pair<int, int>> overlapping_boxes(const std::vector<Box>& boxes) {
  std::vector<CgalBox> c = cgal_boxes(boxes);
  std::vector<std::pair<int, int>> pairs;
  CGAL::box_self_intersection_d(c.begin(), c.end(), [&](const CgalBox& x, const CgalBox& y) {
    pairs.emplace_back(std::min(x.info(), y.info()), std::max(x.info(), y.info()));
  });
  std::sort(pairs.begin(), pairs.end());
  return pairs;
}

std::vector<std::vector<GridPoint>> snap_rounded(const std::vector<std::array<Point, 2>>& segments,
                                                 const std::vector<Point>& hot_points) {
  // Snap rounding in exact arithmetic costs about 0.1 ms per segment. Most segments of a section
  // touch nothing but their neighbours at shared end points and pass no hot pixel: they round to
  // the centres of their end points' pixels. Only segments that come within one step of another
  // segment, or of a point they do not end at, are "involved" and go through the exact algorithm,
  // together with every point within two steps of them (a hot pixel is half a step wide and
  // rerouting moves a segment by at most √2/2 of a step, so no other point can come into play).
  const std::size_t n = segments.size();
  std::vector<Point> points;  // distinct end points and hot points
  {
    std::unordered_map<GridPoint, std::vector<int>, GridPointHash> seen;  // by pixel, then exact
    auto add = [&](Point p) {
      auto& bucket = seen[grid_point(p)];
      for (int k : bucket)
        if (points[k].x == p.x && points[k].y == p.y) return;
      bucket.push_back(static_cast<int>(points.size()));
      points.push_back(p);
    };
    for (const auto& s : segments) add(s[0]), add(s[1]);
    for (Point p : hot_points) add(p);
  }
  constexpr double reach = 2.0;
  std::vector<Box> segment_boxes(n), point_boxes(points.size());
  for (std::size_t i = 0; i < n; ++i) {
    const Point a = segments[i][0], b = segments[i][1];
    segment_boxes[i] = {std::min(a.x, b.x) - reach, std::min(a.y, b.y) - reach, std::max(a.x, b.x) + reach,
                        std::max(a.y, b.y) + reach};
  }
  for (std::size_t i = 0; i < points.size(); ++i) point_boxes[i] = {points[i].x, points[i].y, points[i].x, points[i].y};
  auto same = [](Point p, Point q) { return p.x == q.x && p.y == q.y; };
  std::vector<char> involved(n, 0);
  for (std::size_t i = 0; i < n; ++i)
    if (grid_point(segments[i][0]) == grid_point(segments[i][1])) involved[i] = 2;  // within one pixel
  for (const auto& [i, j] : overlapping_boxes(segment_boxes)) {
    const auto &s = segments[i], &t = segments[j];
    if (involved[i] == 2 || involved[j] == 2) continue;
    if (same(s[0], t[0]) || same(s[0], t[1]) || same(s[1], t[0]) || same(s[1], t[1])) continue;  // see the point test
    if (segment_distance(s[0], s[1], t[0], t[1]) <= 1.0) involved[i] = involved[j] = 1;
  }
  const auto near_points = overlapping_boxes(segment_boxes, point_boxes);
  for (const auto& [i, k] : near_points) {
    const auto& s = segments[i];
    if (involved[i] == 2 || same(points[k], s[0]) || same(points[k], s[1])) continue;
    if (distance_to_segment(points[k], s[0], s[1]) <= 1.0) involved[i] = 1;
  }
  std::vector<std::array<Point, 2>> hard;
  std::vector<std::size_t> hard_index;
  for (std::size_t i = 0; i < n; ++i)
    if (involved[i] == 1) hard.push_back(segments[i]), hard_index.push_back(i);
  std::vector<char> is_hot(points.size(), 0);
  for (const auto& [i, k] : near_points)
    if (involved[i] == 1 && distance_to_segment(points[k], segments[i][0], segments[i][1]) <= reach) is_hot[k] = 1;
  std::vector<Point> hot;
  for (std::size_t k = 0; k < points.size(); ++k)
    if (is_hot[k]) hot.push_back(points[k]);

  std::vector<std::vector<GridPoint>> result(n);
  for (std::size_t i = 0; i < n; ++i) {
    if (involved[i] == 2) result[i] = {grid_point(segments[i][0])};
    else if (involved[i] == 0) result[i] = {grid_point(segments[i][0]), grid_point(segments[i][1])};
  }
  if (!hard.empty()) {
    std::vector<std::vector<GridPoint>> rounded = cgal_snap_rounding(hard, hot);
    for (std::size_t h = 0; h < hard.size(); ++h) result[hard_index[h]] = std::move(rounded[h]);
  }
  return result;
}

// ---- constrained triangulation ------------------------------------------------------------------

namespace {

using Kernel = CGAL::Exact_predicates_inexact_constructions_kernel;
using VertexBase = CGAL::Triangulation_vertex_base_with_info_2<int, Kernel>;
using FaceBase = CGAL::Constrained_triangulation_face_base_2<Kernel>;
using Tds = CGAL::Triangulation_data_structure_2<VertexBase, FaceBase>;
// Segments never cross (snap rounding sees to it), so no intersection point is ever constructed;
// the tag makes CGAL throw instead if that promise is broken.
using Cdt = CGAL::Constrained_Delaunay_triangulation_2<Kernel, Tds, CGAL::No_constraint_intersection_requiring_constructions_tag>;

long long edge_key(int a, int b) { return (static_cast<long long>(std::min(a, b)) << 32) | static_cast<unsigned>(std::max(a, b)); }

}  // namespace

SegmentTriangulation segment_triangulation(const std::vector<GridPoint>& points,
                                           const std::vector<std::array<int, 2>>& segments,
                                           const std::vector<Point>& queries) {
  Cdt cdt;
  std::vector<std::pair<Kernel::Point_2, int>> with_info;
  with_info.reserve(points.size());
  for (std::size_t i = 0; i < points.size(); ++i)
    with_info.emplace_back(Kernel::Point_2(static_cast<double>(points[i].x), static_cast<double>(points[i].y)),
                           static_cast<int>(i));
  cdt.insert(with_info.begin(), with_info.end());
  std::vector<Cdt::Vertex_handle> handle(points.size());
  for (auto v = cdt.finite_vertices_begin(); v != cdt.finite_vertices_end(); ++v) handle[v->info()] = v;
  std::unordered_map<long long, int> segment_of;
  segment_of.reserve(2 * segments.size());
  try {
    for (std::size_t s = 0; s < segments.size(); ++s) {
      cdt.insert_constraint(handle[segments[s][0]], handle[segments[s][1]]);
      segment_of.emplace(edge_key(segments[s][0], segments[s][1]), static_cast<int>(s));
    }
  } catch (const CGAL::Failure_exception& e) {
    throw std::logic_error(std::string("segments of the section cross after snap rounding: ") + e.what());
  }

  SegmentTriangulation out;
  std::unordered_map<Cdt::Face_handle, int> index;
  index.reserve(cdt.number_of_faces());
  for (auto f = cdt.finite_faces_begin(); f != cdt.finite_faces_end(); ++f) {
    index.emplace(f, static_cast<int>(out.triangles.size()));
    out.triangles.push_back({f->vertex(0)->info(), f->vertex(1)->info(), f->vertex(2)->info()});
  }
  out.neighbour.resize(out.triangles.size());
  out.segment.resize(out.triangles.size());
  for (auto f = cdt.finite_faces_begin(); f != cdt.finite_faces_end(); ++f) {
    const int t = index.at(f);
    for (int k = 0; k < 3; ++k) {
      // Side k runs from vertex k to vertex k+1, opposite vertex k+2 (CGAL numbers edges by the
      // vertex they face).
      const int opposite = (k + 2) % 3;
      const Cdt::Face_handle g = f->neighbor(opposite);
      out.neighbour[t][k] = cdt.is_infinite(g) ? -1 : index.at(g);
      out.segment[t][k] = -1;
      if (f->is_constrained(opposite)) {
        const auto it = segment_of.find(edge_key(out.triangles[t][k], out.triangles[t][(k + 1) % 3]));
        if (it == segment_of.end())
          throw std::logic_error("a segment of the section passes through a point of another after snap rounding");
        out.segment[t][k] = it->second;
      }
    }
  }
  out.located.reserve(queries.size());
  Cdt::Face_handle hint;
  for (Point q : queries) {
    const Cdt::Face_handle f = cdt.locate(Kernel::Point_2(q.x, q.y), hint);
    hint = f;
    out.located.push_back(cdt.is_infinite(f) ? -1 : index.at(f));
  }
  return out;
}

}  // namespace edgeflux
