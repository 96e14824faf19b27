// The whole calculation for one cross-section: mesh, solve, read off results.
#pragma once

#include <functional>
#include <string>

#include "geometry/cross_section.h"
#include "mesh/mesh_cross_section.h"
#include "results/field_results.h"
#include "solver/thermal_problem.h"

namespace edgeflux {

struct CalculationOptions {
  std::optional<double> density;                        ///< overrides the file's <mesh density>
  std::optional<MeshSettings::Mesher> mesher;           ///< overrides the file's <mesh mesher>
  SolveOptions solve;
  std::function<void(const std::string&)> progress;     ///< told of each stage, may be empty
};

struct Timings {
  double mesh_seconds = 0.0;
  double solve_seconds = 0.0;  ///< assembly, factorisation and solves
  double results_seconds = 0.0;
};

/// The heat-loss run: the surface resistances of the file.
struct Calculation {
  TriMesh mesh;
  ThermalProblem problem;
  LoadCase load;
  Solution solution;
  FieldResults field;
  Timings timings;
};

/// Runs the heat-loss calculation. Throws InputError for problems in the section; a numerical
/// failure is thrown as std::runtime_error with the solver's message.
Calculation calculate(const CrossSection& section, const CalculationOptions& options);

/// Conductivity per triangle from the material of each triangle.
std::vector<double> triangle_conductivities(const CrossSection& section, const TriMesh& mesh);

}  // namespace edgeflux
