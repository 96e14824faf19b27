// Finding the triangle of a mesh that contains a point: triangles binned into a uniform grid over
// the mesh, about one cell per triangle. Used for probe temperatures and by the drawings.
#pragma once

#include <array>
#include <cstddef>
#include <optional>
#include <vector>

#include "mesh/tri_mesh.h"

namespace edgeflux {

/// Triangles binned into a uniform grid over the mesh's bounding box, about one cell per triangle,
/// so a point is located among the few triangles whose box covers its cell instead of all of them.
/// Each triangle's box is widened by the rounding allowance of the barycentric test below, so a
/// point on an edge still finds both triangles.
class TriangleLocator {
 public:
  struct Location {
    int triangle = -1;
    std::array<double, 3> barycentric{};  ///< of p with respect to the triangle's three nodes
  };

  explicit TriangleLocator(const TriMesh& mesh);


  /// The triangle containing p and p's barycentric coordinates in it; for a point on an edge
  /// either neighbour. Nothing when p lies outside every triangle (beyond rounding).
  std::optional<Location> locate(Point p) const;

  /// Index of the triangle containing p, or −1 outside the mesh.
  int triangle_at(Point p) const {
    const auto at = locate(p);
    return at ? at->triangle : -1;
  }

  /// The piecewise-linear value of a nodal field at p, or nothing outside the mesh.
  std::optional<double> value_at(const std::vector<double>& nodal, Point p) const;

 private:
  /// A point this far outside a triangle, in barycentric terms, still counts as on it (rounding).
  static constexpr double barycentric_allowance = 1e-9;

  const TriMesh& mesh_;
  Point lo_{}, hi_{};
  int nx_ = 1, ny_ = 1;
  double cell_w_ = 1.0, cell_h_ = 1.0;
  std::vector<std::size_t> start_;  // triangles of cell c: triangles_[start_[c] .. start_[c+1])
  std::vector<int> triangles_;

  double slack_x() const { return 2 * barycentric_allowance * (hi_.x - lo_.x); }
  double slack_y() const { return 2 * barycentric_allowance * (hi_.y - lo_.y); }
  std::size_t cell(int i, int j) const { return static_cast<std::size_t>(j) * nx_ + i; }

  /// Cells covered by the widened box of triangle t: {i0, i1, j0, j1}, inclusive.
  std::array<int, 4> cell_span(int t) const;

};


}  // namespace edgeflux
