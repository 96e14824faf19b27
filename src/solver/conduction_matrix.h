// Vertex-centred finite-volume conduction matrix on the median dual of a triangle mesh.
#pragma once

#include <Eigen/SparseCore>
#include <array>

#include "solver/thermal_problem.h"

namespace edgeflux {

/// Conductance couplings of one triangle: K(i, j) = λ (e_i · e_j) / (4 A) with e_i the edge
/// opposite node i. This is the heat flow across the triangle's parts of the median-dual cell
/// faces, so each triangle contributes with its own λ and material jumps on edges are exact.
std::array<std::array<double, 3>, 3> triangle_conductance(Point p0, Point p1, Point p2, double conductivity);

/// Conduction part of the balance, #P × #P, symmetric, rows sum to zero: (K T)_i is the net heat
/// flow out of node i's control volume into the rest of the section, W/m.
Eigen::SparseMatrix<double> conduction_matrix(const TriMesh& mesh, const std::vector<double>& triangle_conductivity);

}  // namespace edgeflux
