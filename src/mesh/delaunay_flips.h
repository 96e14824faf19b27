// Edge flips that make a triangle mesh Delaunay again within each region.
#pragma once

#include "mesh/tri_mesh.h"

namespace edgeflux {

/// Flips every edge between two triangles of the same region whose opposite angles sum to more
/// than 180° (Lawson's algorithm), until none is left. Such an edge has a negative conductance in
/// the linear-element (median-dual) conduction matrix, which breaks the discrete maximum
/// principle; after the flips only region edges can carry one. Nodes, regions, the boundary and
/// its surface tags are unchanged; each boundary edge keeps naming the triangle that has it.
/// Returns the number of flips.
int flip_to_delaunay(TriMesh& mesh);

}  // namespace edgeflux
