// Contours of a nodal field on a triangle mesh: isotherm lines by marching triangles, and the
// clipping of a polygon with values at its corners to the part above or below a level (the
// filled bands of a temperature drawing). Pure functions of the field; coordinates as given.
#pragma once

#include <utility>
#include <vector>

#include "core/point.h"
#include "mesh/tri_mesh.h"

namespace edgeflux {

/// A point and the field's value there.
using FieldVertex = std::pair<Point, double>;

/// The part of a convex polygon (values linear along its edges) where the value is >= `level`
/// (keep_above) or <= `level`; new corners where an edge crosses the level. Empty if none.
std::vector<FieldVertex> clip_to_level(const std::vector<FieldVertex>& polygon, double level, bool keep_above);

/// The lines where the piecewise-linear field T (one value per mesh point) equals `level`, chained
/// across shared triangle edges into polylines, in mesh coordinates.
struct IsothermLines {
  double level = 0.0;
  std::vector<std::vector<Point>> lines;
};
IsothermLines isotherm_lines(const TriMesh& mesh, const std::vector<double>& T, double level);

}  // namespace edgeflux
