// Assembly of the finite-volume conduction matrix.
#include "solver/conduction_matrix.h"

#include <vector>

namespace edgeflux {

std::array<std::array<double, 3>, 3> triangle_conductance(Point p0, Point p1, Point p2, double conductivity) {
  const Point e[3] = {p2 - p1, p0 - p2, p1 - p0};
  const double twice_area = cross(p1 - p0, p2 - p0);
  std::array<std::array<double, 3>, 3> k{};
  if (!(twice_area > 0.0)) return k;  // a needle whose area rounds to zero conducts nothing
  for (int i = 0; i < 3; ++i)
    for (int j = 0; j < 3; ++j) k[i][j] = conductivity * dot(e[i], e[j]) / (2.0 * twice_area);
  return k;
}

Eigen::SparseMatrix<double> conduction_matrix(const TriMesh& mesh, const std::vector<double>& triangle_conductivity) {
  std::vector<Eigen::Triplet<double>> entries;
  entries.reserve(9 * mesh.triangles.size());
  for (int t = 0; t < mesh.n_triangles(); ++t) {
    const auto& tri = mesh.triangles[t];
    const auto k = triangle_conductance(mesh.points[tri[0]], mesh.points[tri[1]], mesh.points[tri[2]],
                                        triangle_conductivity[t]);
    for (int i = 0; i < 3; ++i)
      for (int j = 0; j < 3; ++j) entries.emplace_back(tri[i], tri[j], k[i][j]);
  }
  Eigen::SparseMatrix<double> matrix(mesh.n_points(), mesh.n_points());
  matrix.setFromTriplets(entries.begin(), entries.end());
  return matrix;
}

}  // namespace edgeflux
