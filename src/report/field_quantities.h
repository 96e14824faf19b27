// Walks along the boundary the reports need: the boundary loops and the interior surfaces in order.
#pragma once

#include <string>
#include <vector>

#include "geometry/cross_section.h"
#include "mesh/tri_mesh.h"

namespace edgeflux {

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
