// The directly assembled conduction matrix against its definition: the sum over triangles of the
// element conductances (exact algebra), symmetric, with rows that sum to zero.
#include <doctest/doctest.h>

#include <Eigen/SparseCore>
#include <cmath>

#include "../test_support.h"
#include "mesh/mesh_cross_section.h"
#include "solver/conduction_matrix.h"

using namespace edgeflux;

TEST_CASE("conduction matrix: equals the triangle-by-triangle sum, symmetric, zero row sums (exact algebra)") {
  const CrossSection section = read_detail_file(test::source_path("tests/reference/iso10211_case2.xml"));
  const TriMesh mesh = mesh_cross_section(section, MeshOptions{});
  const std::vector<double> conductivity = triangle_conductivities(section, mesh);
  const Eigen::SparseMatrix<double> k = conduction_matrix(mesh, conductivity);

  std::vector<Eigen::Triplet<double>> entries;
  for (int t = 0; t < mesh.n_triangles(); ++t) {
    const auto& tri = mesh.triangles[t];
    const auto c = triangle_conductance(mesh.points[tri[0]], mesh.points[tri[1]], mesh.points[tri[2]], conductivity[t]);
    for (int i = 0; i < 3; ++i)
      for (int j = 0; j < 3; ++j) entries.emplace_back(tri[i], tri[j], c[i][j]);
  }
  Eigen::SparseMatrix<double> reference(mesh.n_points(), mesh.n_points());
  reference.setFromTriplets(entries.begin(), entries.end());

  REQUIRE(k.isCompressed());
  CHECK(k.nonZeros() == reference.nonZeros());
  const double scale = reference.coeffs().abs().maxCoeff();
  CHECK(Eigen::SparseMatrix<double>(k - reference).coeffs().abs().maxCoeff() <= 1e-14 * scale);
  const Eigen::SparseMatrix<double> transpose = k.transpose();
  CHECK(Eigen::SparseMatrix<double>(k - transpose).coeffs().abs().maxCoeff() <= 1e-14 * scale);
  const Eigen::VectorXd row_sums = k * Eigen::VectorXd::Ones(mesh.n_points());
  CHECK(row_sums.cwiseAbs().maxCoeff() <= 1e-12 * scale);
  // Within each column the rows are strictly increasing (Eigen's compressed format).
  for (int c = 0; c < k.outerSize(); ++c)
    for (auto i = k.outerIndexPtr()[c] + 1; i < k.outerIndexPtr()[c + 1]; ++i)
      REQUIRE(k.innerIndexPtr()[i - 1] < k.innerIndexPtr()[i]);
}
