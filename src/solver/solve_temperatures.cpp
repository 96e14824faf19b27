// Assembly of the surface terms, elimination of fixed temperatures and the sparse solve.
#include "solver/solve_temperatures.h"

#include <Eigen/CholmodSupport>
#include <Eigen/IterativeLinearSolvers>
#include <Eigen/SparseCholesky>
#include <algorithm>
#include <chrono>

#include "solver/conduction_matrix.h"

namespace edgeflux {
namespace {

double seconds_since(std::chrono::steady_clock::time_point start) {
  return std::chrono::duration<double>(std::chrono::steady_clock::now() - start).count();
}

template <class Factorization>
bool factor_and_solve(Factorization& solver, const Eigen::SparseMatrix<double>& a,
                      const Eigen::MatrixXd& b, Eigen::MatrixXd& x, SolveInfo& info) {
  auto start = std::chrono::steady_clock::now();
  solver.compute(a);
  info.factorize_seconds = seconds_since(start);
  if (solver.info() != Eigen::Success) {
    info.message = "the conduction matrix could not be factorised (is some part of the section "
                   "connected to no surface?)";
    return false;
  }
  start = std::chrono::steady_clock::now();
  x = solver.solve(b);
  info.solve_seconds = seconds_since(start);
  if (solver.info() != Eigen::Success) {
    info.message = "the linear solve failed";
    return false;
  }
  return true;
}

}  // namespace

std::vector<std::vector<int>> fixed_surfaces_per_node(const TriMesh& mesh, const ThermalProblem& problem) {
  std::vector<std::vector<int>> fixed(mesh.n_points());
  for (const BoundaryEdge& edge : mesh.boundary_edges) {
    if (edge.surface < 0 || problem.surface_resistance[edge.surface] != 0.0) continue;
    for (int node : {edge.a, edge.b}) {
      auto& list = fixed[node];
      if (std::find(list.begin(), list.end(), edge.surface) == list.end()) list.push_back(edge.surface);
    }
  }
  return fixed;
}

Solution solve_temperatures(const TriMesh& mesh, const ThermalProblem& problem,
                            const std::vector<LoadCase>& load_cases, const SolveOptions& options) {
  const int n = mesh.n_points();
  const int n_cases = static_cast<int>(load_cases.size());
  Solution solution;
  SolveInfo& info = solution.info;
  auto start = std::chrono::steady_clock::now();

  Eigen::SparseMatrix<double> k = conduction_matrix(mesh, problem.triangle_conductivity);

  // Surface resistances: each node's share of a boundary edge (half its length) exchanges heat
  // with the environment through the surface coefficient 1/Rs.
  Eigen::VectorXd robin_diagonal = Eigen::VectorXd::Zero(n);
  Eigen::MatrixXd rhs_full = Eigen::MatrixXd::Zero(n, n_cases);
  for (const BoundaryEdge& edge : mesh.boundary_edges) {
    if (edge.surface < 0) continue;
    const double rs = problem.surface_resistance[edge.surface];
    if (rs == 0.0) continue;
    const double share = 0.5 * distance(mesh.points[edge.a], mesh.points[edge.b]) / rs;
    for (int node : {edge.a, edge.b}) {
      robin_diagonal[node] += share;
      for (int c = 0; c < n_cases; ++c) rhs_full(node, c) += share * load_cases[c][edge.surface];
    }
  }
  for (int i = 0; i < n; ++i) k.coeffRef(i, i) += robin_diagonal[i];

  // Fixed temperatures: a node on several fixed surfaces (a corner where two meet) takes their mean.
  const auto fixed = fixed_surfaces_per_node(mesh, problem);
  std::vector<int> unknown(n, -1);
  int n_unknowns = 0;
  for (int i = 0; i < n; ++i)
    if (fixed[i].empty()) unknown[i] = n_unknowns++;
  Eigen::MatrixXd known = Eigen::MatrixXd::Zero(n, n_cases);
  for (int i = 0; i < n; ++i) {
    if (fixed[i].empty()) continue;
    for (int c = 0; c < n_cases; ++c) {
      double sum = 0.0;
      for (int s : fixed[i]) sum += load_cases[c][s];
      known(i, c) = sum / static_cast<double>(fixed[i].size());
    }
  }

  std::vector<Eigen::Triplet<double>> entries;
  entries.reserve(k.nonZeros());
  Eigen::MatrixXd rhs(n_unknowns, n_cases);
  for (int i = 0; i < n; ++i)
    if (unknown[i] >= 0) rhs.row(unknown[i]) = rhs_full.row(i);
  for (int col = 0; col < k.outerSize(); ++col) {
    for (Eigen::SparseMatrix<double>::InnerIterator it(k, col); it; ++it) {
      const int row = static_cast<int>(it.row());
      if (unknown[row] < 0) continue;
      if (unknown[col] >= 0)
        entries.emplace_back(unknown[row], unknown[col], it.value());
      else
        rhs.row(unknown[row]) -= it.value() * known.row(col);
    }
  }
  Eigen::SparseMatrix<double> a(n_unknowns, n_unknowns);
  a.setFromTriplets(entries.begin(), entries.end());
  info.n_unknowns = n_unknowns;
  info.assemble_seconds = seconds_since(start);

  Eigen::MatrixXd x;
  bool ok = true;
  if (n_unknowns > 0) {
    switch (options.solver) {
      case LinearSolver::supernodal_cholesky: {
        info.solver = "supernodal Cholesky (CHOLMOD)";
        Eigen::CholmodSupernodalLLT<Eigen::SparseMatrix<double>> solver;
        ok = factor_and_solve(solver, a, rhs, x, info);
        break;
      }
      case LinearSolver::simplicial_ldlt: {
        info.solver = "simplicial LDLT (Eigen)";
        Eigen::SimplicialLDLT<Eigen::SparseMatrix<double>> solver;
        ok = factor_and_solve(solver, a, rhs, x, info);
        break;
      }
      case LinearSolver::conjugate_gradient: {
        info.solver = "conjugate gradient, incomplete Cholesky (Eigen)";
        Eigen::ConjugateGradient<Eigen::SparseMatrix<double>, Eigen::Lower | Eigen::Upper,
                                 Eigen::IncompleteCholesky<double>> solver;
        solver.setTolerance(1e-13);
        ok = factor_and_solve(solver, a, rhs, x, info);
        break;
      }
    }
  }
  info.ok = ok;
  if (!ok) return solution;

  solution.temperature.assign(n_cases, std::vector<double>(n));
  for (int c = 0; c < n_cases; ++c)
    for (int i = 0; i < n; ++i)
      solution.temperature[c][i] = unknown[i] >= 0 ? x(unknown[i], c) : known(i, c);
  return solution;
}

}  // namespace edgeflux
