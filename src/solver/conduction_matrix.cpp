// Assembly of the finite-volume conduction matrix.
#include "solver/conduction_matrix.h"

#include <algorithm>
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
  // Assembled straight into compressed columns: the pattern is the node itself plus its mesh
  // neighbours, so each column is short (about 7 entries) and is found by a linear search. Against
  // a triplet list (9 entries per triangle, sorted and summed) this touches a third of the memory.
  const int n = mesh.n_points();
  std::vector<int> degree(n + 1, 0);  // upper bound: 2 per triangle corner, plus the diagonal
  for (const auto& tri : mesh.triangles)
    for (int v : tri) degree[v] += 2;
  std::vector<int> start(n + 1, 0);
  for (int i = 0; i < n; ++i) start[i + 1] = start[i] + degree[i] + 1;
  std::vector<int> rows(start[n]);
  std::vector<int> used(n, 0);
  auto slot = [&](int col, int row) {
    int* first = rows.data() + start[col];
    for (int k = 0; k < used[col]; ++k)
      if (first[k] == row) return start[col] + k;
    first[used[col]] = row;
    return start[col] + used[col]++;
  };
  for (int i = 0; i < n; ++i) slot(i, i);
  std::vector<double> values(start[n], 0.0);
  for (int t = 0; t < mesh.n_triangles(); ++t) {
    const auto& tri = mesh.triangles[t];
    const auto k = triangle_conductance(mesh.points[tri[0]], mesh.points[tri[1]], mesh.points[tri[2]],
                                        triangle_conductivity[t]);
    for (int j = 0; j < 3; ++j)
      for (int i = 0; i < 3; ++i) values[slot(tri[j], tri[i])] += k[i][j];
  }
  // Compress: sorted rows per column, as Eigen's compressed format wants.
  Eigen::SparseMatrix<double> matrix(n, n);
  std::size_t nonzeros = 0;
  for (int c = 0; c < n; ++c) nonzeros += used[c];
  matrix.resizeNonZeros(static_cast<Eigen::Index>(nonzeros));
  int* outer = matrix.outerIndexPtr();
  int* inner = matrix.innerIndexPtr();
  double* value = matrix.valuePtr();
  std::vector<int> order;
  int at = 0;
  for (int c = 0; c < n; ++c) {
    outer[c] = at;
    order.resize(used[c]);
    for (int k = 0; k < used[c]; ++k) order[k] = k;
    std::sort(order.begin(), order.end(), [&](int a, int b) { return rows[start[c] + a] < rows[start[c] + b]; });
    for (int k : order) inner[at] = rows[start[c] + k], value[at] = values[start[c] + k], ++at;
  }
  outer[n] = at;
  return matrix;
}

}  // namespace edgeflux
