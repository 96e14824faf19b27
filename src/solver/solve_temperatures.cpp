// Assembly of the surface terms, elimination of fixed temperatures and the sparse solve.
#include "solver/solve_temperatures.h"

#include <fmt/format.h>

#include <Eigen/CholmodSupport>
#include <Eigen/IterativeLinearSolvers>
#include <Eigen/SparseCholesky>
#include <algorithm>
#include <array>
#include <chrono>
#include <stdexcept>

#include "solver/conduction_matrix.h"
#include "solver/factorisation_runtime.h"

namespace edgeflux {
namespace {

double seconds_since(std::chrono::steady_clock::time_point start) {
  return std::chrono::duration<double>(std::chrono::steady_clock::now() - start).count();
}

using SparseMatrix = Eigen::SparseMatrix<double>;

}  // namespace

struct SteadyConduction::State {
  const TriMesh* mesh;
  SolveOptions options;
  SparseMatrix conduction;             // K, #P × #P
  std::vector<int> diagonal_position;  // index of K(i, i) in conduction.valuePtr()
  // For new conductivities on this mesh: each triangle's conductance at λ = 1 and where its nine
  // entries go in conduction.valuePtr() (made on the first set_conductivity).
  std::vector<std::array<double, 9>> unit_conductance;
  std::vector<std::array<int, 9>> entry_position;
  // Symbolic analysis of the reduced matrix, kept while the fixed nodes stay the same.
  std::vector<std::vector<int>> analysed_fixed;
  bool analysed = false;
  Eigen::CholmodSupernodalLLT<SparseMatrix> cholmod;
  Eigen::SimplicialLDLT<SparseMatrix> ldlt;
  // The factorisation held by the solver above: for which resistances, and which nodes are unknowns.
  bool factorised = false;
  std::vector<double> factorised_resistance;
  std::vector<int> unknown;
  SparseMatrix iterative_matrix;  // the reduced matrix, kept only for the conjugate-gradient solver
};

SteadyConduction::SteadyConduction(const TriMesh& mesh, const std::vector<double>& triangle_conductivity,
                                   SolveOptions options)
    : state_(std::make_unique<State>()) {
  state_->mesh = &mesh;
  state_->options = options;
  // CHOLMOD reports its errors in its status, which is read below; it must not print them on
  // standard output among the results.
  state_->cholmod.cholmod().print = 0;
  state_->conduction = conduction_matrix(mesh, triangle_conductivity);
  const SparseMatrix& k = state_->conduction;
  state_->diagonal_position.assign(mesh.n_points(), -1);
  for (int col = 0; col < k.outerSize(); ++col)
    for (auto index = k.outerIndexPtr()[col]; index < k.outerIndexPtr()[col + 1]; ++index)
      if (k.innerIndexPtr()[index] == col) state_->diagonal_position[col] = static_cast<int>(index);
}

SteadyConduction::~SteadyConduction() = default;

void SteadyConduction::set_conductivity(const std::vector<double>& triangle_conductivity) {
  // The pattern is the mesh's (node and neighbours), whatever the conductivities: only the values
  // change, and each triangle's conductance is linear in its λ.
  State& st = *state_;
  const TriMesh& mesh = *st.mesh;
  SparseMatrix& k = st.conduction;
  if (st.entry_position.empty()) {
    st.unit_conductance.resize(mesh.n_triangles());
    st.entry_position.resize(mesh.n_triangles());
    for (int t = 0; t < mesh.n_triangles(); ++t) {
      const auto& tri = mesh.triangles[t];
      const auto unit = triangle_conductance(mesh.points[tri[0]], mesh.points[tri[1]], mesh.points[tri[2]], 1.0);
      for (int j = 0; j < 3; ++j)
        for (int i = 0; i < 3; ++i) {
          const int* first = k.innerIndexPtr() + k.outerIndexPtr()[tri[j]];
          const int* last = k.innerIndexPtr() + k.outerIndexPtr()[tri[j] + 1];
          const int* at = std::lower_bound(first, last, tri[i]);
          if (at == last || *at != tri[i]) throw std::logic_error("conduction matrix pattern changed on one mesh");
          st.unit_conductance[t][3 * j + i] = unit[i][j];
          st.entry_position[t][3 * j + i] = static_cast<int>(at - k.innerIndexPtr());
        }
    }
  }
  st.factorised = false;
  std::fill(k.valuePtr(), k.valuePtr() + k.nonZeros(), 0.0);
  for (int t = 0; t < mesh.n_triangles(); ++t)
    for (int e = 0; e < 9; ++e) k.valuePtr()[st.entry_position[t][e]] += triangle_conductivity[t] * st.unit_conductance[t][e];
}

std::vector<std::vector<int>> fixed_surfaces_per_node(const TriMesh& mesh, const std::vector<double>& surface_resistance) {
  std::vector<std::vector<int>> fixed(mesh.n_points());
  for (const BoundaryEdge& edge : mesh.boundary_edges) {
    if (edge.surface < 0 || surface_resistance[edge.surface] != 0.0) continue;
    for (int node : {edge.a, edge.b}) {
      auto& list = fixed[node];
      if (std::find(list.begin(), list.end(), edge.surface) == list.end()) list.push_back(edge.surface);
    }
  }
  return fixed;
}

Solution SteadyConduction::solve(const std::vector<double>& surface_resistance, const std::vector<LoadCase>& load_cases) {
  State& st = *state_;
  const TriMesh& mesh = *st.mesh;
  const int n = mesh.n_points();
  const int n_cases = static_cast<int>(load_cases.size());
  Solution solution;
  SolveInfo& info = solution.info;
  auto start = std::chrono::steady_clock::now();

  // Solve for the temperature above a reference level (the middle of each case's surface
  // temperatures): conduction only sees differences (K·1 = 0), and the rounding of the
  // factorisation then scales with the temperature spread, not with the level. At −30/−31 °C with
  // conductivities 10^6 apart, solving for absolute temperatures left an energy imbalance of
  // 3.4e-6, relative temperatures 1.2e-6 (found by fuzz_solver; the ISO 10211 criterion is 1e-4).
  std::vector<LoadCase> shifted = load_cases;
  std::vector<double> reference(n_cases, 0.0);
  for (int c = 0; c < n_cases; ++c) {
    if (shifted[c].empty()) continue;
    const auto [lo, hi] = std::minmax_element(shifted[c].begin(), shifted[c].end());
    reference[c] = 0.5 * (*lo + *hi);
    for (double& t : shifted[c]) t -= reference[c];
  }

  // Surface resistances: each node's share of a boundary edge (half its length) exchanges heat
  // with the environment through the surface coefficient 1/Rs.
  Eigen::VectorXd robin_diagonal = Eigen::VectorXd::Zero(n);
  Eigen::MatrixXd rhs_full = Eigen::MatrixXd::Zero(n, n_cases);
  for (const BoundaryEdge& edge : mesh.boundary_edges) {
    if (edge.surface < 0) continue;
    const double rs = surface_resistance[edge.surface];
    if (rs == 0.0) continue;
    const double share = 0.5 * distance(mesh.points[edge.a], mesh.points[edge.b]) / rs;
    for (int node : {edge.a, edge.b}) {
      robin_diagonal[node] += share;
      for (int c = 0; c < n_cases; ++c) rhs_full(node, c) += share * shifted[c][edge.surface];
    }
  }

  // Fixed temperatures: a node on several fixed surfaces (a corner where two meet) takes their mean.
  const auto fixed = fixed_surfaces_per_node(mesh, surface_resistance);
  std::vector<int> unknown(n, -1);
  int n_unknowns = 0;
  for (int i = 0; i < n; ++i)
    if (fixed[i].empty()) unknown[i] = n_unknowns++;
  Eigen::MatrixXd known = Eigen::MatrixXd::Zero(n, n_cases);
  for (int i = 0; i < n; ++i) {
    if (fixed[i].empty()) continue;
    for (int c = 0; c < n_cases; ++c) {
      double sum = 0.0;
      for (int s : fixed[i]) sum += shifted[c][s];
      known(i, c) = sum / static_cast<double>(fixed[i].size());
    }
  }

  SparseMatrix a;
  Eigen::MatrixXd rhs(n_unknowns, n_cases);
  if (n_unknowns == n) {
    // No fixed nodes (the usual case): the system is K + R itself.
    a = st.conduction;
    for (int i = 0; i < n; ++i) a.valuePtr()[st.diagonal_position[i]] += robin_diagonal[i];
    rhs = rhs_full;
  } else {
    std::vector<Eigen::Triplet<double>> entries;
    entries.reserve(st.conduction.nonZeros());
    for (int i = 0; i < n; ++i)
      if (unknown[i] >= 0) rhs.row(unknown[i]) = rhs_full.row(i);
    for (int col = 0; col < st.conduction.outerSize(); ++col) {
      for (SparseMatrix::InnerIterator it(st.conduction, col); it; ++it) {
        const int row = static_cast<int>(it.row());
        if (unknown[row] < 0) continue;
        const double value = it.value() + (row == col ? robin_diagonal[row] : 0.0);
        if (unknown[col] >= 0)
          entries.emplace_back(unknown[row], unknown[col], value);
        else
          rhs.row(unknown[row]) -= value * known.row(col);
      }
    }
    a.resize(n_unknowns, n_unknowns);
    a.setFromTriplets(entries.begin(), entries.end());
  }
  info.n_unknowns = n_unknowns;
  info.assemble_seconds = seconds_since(start);

  Eigen::MatrixXd x;
  bool ok = true;
  if (n_unknowns > 0) {
    start = std::chrono::steady_clock::now();
    // The pattern of the reduced matrix depends only on which nodes are fixed: reuse the
    // symbolic analysis (ordering and elimination tree) across runs when those are unchanged.
    const bool reuse = st.analysed && st.analysed_fixed == fixed;
    auto finish = [&](auto& solver) {
      if (!reuse) solver.analyzePattern(a);
      solver.factorize(a);
      info.factorize_seconds = seconds_since(start);
      if (solver.info() != Eigen::Success) {
        info.message = "the conduction matrix could not be factorised: it is not positive definite";
        return false;
      }
      start = std::chrono::steady_clock::now();
      x = solver.solve(rhs);
      info.solve_seconds = seconds_since(start);
      return solver.info() == Eigen::Success;
    };
    switch (st.options.solver) {
      case LinearSolver::supernodal_cholesky:
        info.solver = "supernodal Cholesky (CHOLMOD)";
        prepare_factorisation_runtime(n_unknowns);
        ok = finish(st.cholmod);
        if (!ok && st.cholmod.cholmod().status == CHOLMOD_OUT_OF_MEMORY) {
          info.out_of_memory = true;
          info.message = fmt::format("the memory ran out while factorising the conduction matrix ({} unknowns)", n_unknowns);
        }
        break;
      case LinearSolver::simplicial_ldlt:
        info.solver = "simplicial LDLT (Eigen)";
        ok = finish(st.ldlt);
        break;
      case LinearSolver::conjugate_gradient: {
        info.solver = "conjugate gradient, incomplete Cholesky (Eigen)";
        Eigen::ConjugateGradient<SparseMatrix, Eigen::Lower | Eigen::Upper, Eigen::IncompleteCholesky<double>> cg;
        cg.setTolerance(1e-13);
        cg.compute(a);
        info.factorize_seconds = seconds_since(start);
        start = std::chrono::steady_clock::now();
        x = cg.solve(rhs);
        info.solve_seconds = seconds_since(start);
        ok = cg.info() == Eigen::Success;
        break;
      }
    }
    st.analysed = ok && st.options.solver != LinearSolver::conjugate_gradient;
    st.analysed_fixed = fixed;
    st.factorised = ok;
    st.factorised_resistance = surface_resistance;
    st.unknown = unknown;
    if (ok && st.options.solver == LinearSolver::conjugate_gradient) st.iterative_matrix = a;
    if (!ok && info.message.empty()) info.message = "the linear solve did not converge";
  }
  info.ok = ok;
  if (!ok) return solution;

  solution.temperature.assign(n_cases, std::vector<double>(n));
  for (int c = 0; c < n_cases; ++c)
    for (int i = 0; i < n; ++i) solution.temperature[c][i] = reference[c] + (unknown[i] >= 0 ? x(unknown[i], c) : known(i, c));
  return solution;
}

std::vector<std::vector<double>> SteadyConduction::solve_sources(const std::vector<double>& surface_resistance,
                                                                 const std::vector<std::vector<double>>& nodal_sources) {
  State& st = *state_;
  const int n = st.mesh->n_points();
  if (!st.factorised || st.factorised_resistance != surface_resistance) {
    const Solution first = solve(surface_resistance, {LoadCase(surface_resistance.size(), 0.0)});
    if (!first.info.ok) throw std::runtime_error("numerical failure: " + first.info.message);
  }
  std::vector<std::vector<double>> response(nodal_sources.size(), std::vector<double>(n, 0.0));
  const int n_unknowns = static_cast<int>(std::count_if(st.unknown.begin(), st.unknown.end(), [](int u) { return u >= 0; }));
  if (n_unknowns == 0 || nodal_sources.empty()) return response;
  Eigen::MatrixXd rhs = Eigen::MatrixXd::Zero(n_unknowns, static_cast<Eigen::Index>(nodal_sources.size()));
  for (std::size_t c = 0; c < nodal_sources.size(); ++c)
    for (int i = 0; i < n; ++i)
      if (st.unknown[i] >= 0) rhs(st.unknown[i], static_cast<Eigen::Index>(c)) = nodal_sources[c][i];
  Eigen::MatrixXd x;
  bool ok = true;
  switch (st.options.solver) {
    case LinearSolver::supernodal_cholesky:
      x = st.cholmod.solve(rhs);
      ok = st.cholmod.info() == Eigen::Success;
      break;
    case LinearSolver::simplicial_ldlt:
      x = st.ldlt.solve(rhs);
      ok = st.ldlt.info() == Eigen::Success;
      break;
    case LinearSolver::conjugate_gradient: {
      Eigen::ConjugateGradient<SparseMatrix, Eigen::Lower | Eigen::Upper, Eigen::IncompleteCholesky<double>> cg;
      cg.setTolerance(1e-13);
      cg.compute(st.iterative_matrix);
      x = cg.solve(rhs);
      ok = cg.info() == Eigen::Success;
      break;
    }
  }
  if (!ok) throw std::runtime_error("numerical failure: the adjoint solve did not succeed");
  for (std::size_t c = 0; c < nodal_sources.size(); ++c)
    for (int i = 0; i < n; ++i)
      if (st.unknown[i] >= 0) response[c][i] = x(st.unknown[i], static_cast<Eigen::Index>(c));
  return response;
}

Solution solve_temperatures(const TriMesh& mesh, const ThermalProblem& problem, const std::vector<LoadCase>& load_cases,
                            const SolveOptions& options) {
  SteadyConduction conduction(mesh, problem.triangle_conductivity, options);
  return conduction.solve(problem.surface_resistance, load_cases);
}

}  // namespace edgeflux
