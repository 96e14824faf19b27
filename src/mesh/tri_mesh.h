// The triangulated cross-section handed from the mesher to the solver: plain arrays only.
#pragma once

#include <array>
#include <cstdint>
#include <string>
#include <vector>

#include "core/point.h"

namespace edgeflux {

/// An edge on the outer boundary, oriented so the section lies on its left.
struct BoundaryEdge {
  int a = 0, b = 0;   ///< node indices
  int surface = -1;   ///< index into CrossSection::surfaces, or -1 for adiabatic
  int triangle = -1;  ///< the triangle this edge belongs to
  int cut_off = -1;   ///< index into CrossSection::flanking_elements whose cut-off runs here, or -1
};

struct TriMesh {
  std::vector<Point> points;                   ///< #P nodes, m
  std::vector<std::array<int, 3>> triangles;   ///< #T, counter-clockwise node indices
  std::vector<int> triangle_region;            ///< #T, index of the region that paints it
  std::vector<int> triangle_material;          ///< #T, index into CrossSection::materials
  std::vector<BoundaryEdge> boundary_edges;    ///< every edge with a triangle on one side only
  std::vector<int> probe_nodes;                ///< per CrossSection::probes entry, its node, or -1 (locate it)
  std::string mesher;                          ///< "grid" or "delaunay", for reports

  int n_points() const { return static_cast<int>(points.size()); }
  int n_triangles() const { return static_cast<int>(triangles.size()); }
};

}  // namespace edgeflux
