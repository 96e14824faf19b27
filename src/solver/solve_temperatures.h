// Steady conduction: node temperatures for every load case, from one factorisation.
#pragma once

#include "solver/thermal_problem.h"

namespace edgeflux {

/// Solves (K + R) T = r for each load case: K the conduction matrix, R the surface-resistance
/// (Robin) terms, fixed-temperature nodes eliminated. One factorisation serves all load cases,
/// since they differ only in the right-hand side. Numerical failure is reported in info, not thrown.
Solution solve_temperatures(const TriMesh& mesh, const ThermalProblem& problem, const std::vector<LoadCase>& load_cases,
                            const SolveOptions& options = {});

/// For each node, the fixed-temperature surfaces it lies on (empty for most nodes).
std::vector<std::vector<int>> fixed_surfaces_per_node(const TriMesh& mesh, const ThermalProblem& problem);

}  // namespace edgeflux
