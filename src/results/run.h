// One solved run: a set of surface resistances, its unit fields per environment and the design field.
#pragma once

#include <vector>

#include "results/field_results.h"
#include "solver/thermal_problem.h"

namespace edgeflux {

/// One set of surface resistances solved for every environment by superposition.
struct Run {
  ThermalProblem problem;
  /// Per environment e: the field with environment e at 1 °C and all others at 0 °C (#P each).
  std::vector<std::vector<double>> unit_temperature;
  LoadCase load;                     ///< design temperature per surface, °C
  std::vector<double> temperature;   ///< design field, #P, °C
  FieldResults field;
  SolveInfo info;
};

}  // namespace edgeflux
