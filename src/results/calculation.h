// Everything one calculation of a cross-section produced: the mesh, the heat-loss and
// surface-temperature runs, the junction's numbers and the convergence record. Plain data that
// the reports read (pipeline/calculate.h makes it).
#pragma once

#include "mesh/tri_mesh.h"
#include "results/convergence.h"
#include "results/junction_results.h"
#include "results/run.h"
#include "results/sensitivity.h"

namespace edgeflux {

struct Timings {
  double mesh_seconds = 0.0;
  double solve_seconds = 0.0;  ///< assembly, factorisation and solves of both runs
  double results_seconds = 0.0;
};

struct Calculation {
  TriMesh mesh;
  Run heat_loss;            ///< the surface resistances of the file (ISO 6946)
  Run surface_temperature;  ///< interior Rsi replaced (ISO 13788): 0.25 opaque, 0.13 glazing
  JunctionResults junction;
  Convergence convergence;
  std::optional<Sensitivities> sensitivities;  ///< when asked for (CalculationOptions::sensitivities), of the final level  ///< levels and error estimates (one level when not adaptive)
  Timings timings;          ///< of the final level
  double total_seconds = 0.0;
};

}  // namespace edgeflux
