// Quantities the reports draw that the results stage does not keep: the heat-flux density per
// triangle and the temperature along the interior surfaces, read from the mesh and a solved field.
#pragma once

#include <string>
#include <vector>

#include "geometry/cross_section.h"
#include "mesh/tri_mesh.h"

namespace edgeflux {

/// Heat-flux density q = −λ ∇T per triangle, W/m², from the linear (P1) interpolation of the node
/// temperatures, which is constant on each triangle.
/// conductivity: #T, W/(m·K); temperature: #P, °C. Returns #T vectors (x, y).
std::vector<Point> heat_flux_density(const TriMesh& mesh, const std::vector<double>& conductivity,
                                      const std::vector<double>& temperature);

/// The closed boundary loops of a mesh, each as boundary-edge indices in walking order (the section
/// on the left), the outer loop and the loop of every hole alike.
std::vector<std::vector<int>> boundary_loops(const TriMesh& mesh);

/// One mesh node on an interior surface, in the order of a walk along the surfaces.
struct SurfaceSample {
  double distance = 0;  ///< m along the walk, continuing across breaks
  int chain = 0;        ///< index of the connected stretch of interior surface (0, 1, …)
  int node = 0;         ///< mesh node index
  int surface = 0;      ///< index into CrossSection::surfaces
  Point at;             ///< m
};

/// The nodes of every surface that faces an interior environment (Side::interior), walked with the
/// section on the left. Each connected stretch is one chain; chains are ordered by the file order of
/// the first surface they contain. A node where two interior surfaces meet appears once, with the
/// surface of the edge leading into it (the first surface for a chain's first node). Empty when the
/// section has no interior environment.
std::vector<SurfaceSample> interior_surface_walk(const CrossSection& section, const TriMesh& mesh);

}  // namespace edgeflux
