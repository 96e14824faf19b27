// The edges of a triangle mesh, numbered once, with the triangles on either side: what the
// refinement and the error indicator need, in linear time and without hashing.
#pragma once

#include <array>
#include <vector>

#include "mesh/tri_mesh.h"

namespace edgeflux {

struct EdgeTable {
  std::vector<std::array<int, 3>> of_triangle;  ///< edge id of side k = (tri[k], tri[k+1])
  std::vector<std::array<int, 2>> triangles;    ///< per edge: the one or two triangles on it (-1: none)
  std::vector<std::array<int, 2>> ends;         ///< per edge: its end nodes, lower index first
};

EdgeTable edge_table(const TriMesh& mesh);

}  // namespace edgeflux
