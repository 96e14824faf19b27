// What the solver needs besides the mesh: a conductivity per triangle, a surface resistance per
// surface, and one or more load cases (a temperature per surface).
#pragma once

#include <string>
#include <vector>

#include "mesh/tri_mesh.h"

namespace edgeflux {

struct ThermalProblem {
  std::vector<double> triangle_conductivity;  ///< #T, λ in W/(m·K)
  std::vector<double> surface_resistance;     ///< per surface, m²K/W; 0 = fixed temperature
};

/// Environment temperature seen by each surface, °C (one entry per surface).
using LoadCase = std::vector<double>;

enum class LinearSolver { supernodal_cholesky, simplicial_ldlt, conjugate_gradient };

struct SolveOptions {
  LinearSolver solver = LinearSolver::supernodal_cholesky;
};

struct SolveInfo {
  bool ok = false;
  std::string message;          ///< why it failed, when !ok
  bool out_of_memory = false;   ///< the failure was memory running out, not the matrix
  std::string solver;           ///< name of the linear solver used
  int n_unknowns = 0;
  double assemble_seconds = 0.0;
  double factorize_seconds = 0.0;
  double solve_seconds = 0.0;
};

struct Solution {
  std::vector<std::vector<double>> temperature;  ///< per load case, #P node temperatures, °C
  SolveInfo info;
};

}  // namespace edgeflux
