// Reader of DXF drawings: the closed outlines and open line chains on each layer, in metres. The
// only place that includes dxflib.
#pragma once

#include <map>
#include <optional>
#include <string>
#include <vector>

#include "core/point.h"

namespace edgeflux {

/// A closed outline (a region's shape) or an open chain of lines (a surface path) from a drawing.
struct DrawnShape {
  std::string layer;
  std::string entities;                    ///< entity type(s) and handle(s), e.g. "LWPOLYLINE 2F"
  std::vector<Point> points;               ///< m; arcs as chords; closed shapes do not repeat the first point
  std::vector<std::vector<Point>> islands; ///< m; inner loops of a hatch (holes, or islands within holes)
  int order = 0;                           ///< position in the drawing's entity order (blocks expanded)
};

/// What a layer holds, for the layer list of `edgeflux import`.
struct DrawingLayer {
  std::string name;
  int entities = 0;                        ///< entities read or ignored on the layer
  int outlines = 0, chains = 0;            ///< closed outlines and open chains found
  Point lower{}, upper{};                  ///< m, extent of what was read
};

struct CadDrawing {
  std::string file;
  std::string unit;                        ///< "mm", "cm", "m", "in", "ft"
  double metres_per_unit = 0.001;
  bool unit_stated = false;                ///< $INSUNITS gave a unit
  std::vector<DrawnShape> outlines;        ///< closed, in entity order
  std::vector<DrawnShape> chains;          ///< open, in entity order
  std::vector<DrawingLayer> layers;        ///< sorted by name
  std::map<std::string, int> ignored;      ///< entity type → count (text, dimensions, points, …)
  std::vector<std::string> splines;        ///< "layer: SPLINE handle" of splines, which are not read
  std::vector<std::string> notes;          ///< duplicates and zero-length pieces dropped (with where)
  std::vector<Point> chord_points;         ///< m, points put on arcs, circles and ellipses (not drawn)
};

struct DrawingOptions {
  std::optional<std::string> unit;         ///< overrides $INSUNITS: "mm", "cm", "m", "in", "ft"
  double arc_tolerance = 1e-4;             ///< chord tolerance of arcs, relative to the radius
};

/// Reads a DXF file (R12 to current, ASCII): LWPOLYLINE and POLYLINE (bulges are arcs), CIRCLE,
/// ARC, LINE, ELLIPSE, HATCH boundary paths (edge and polyline paths; inner loops kept as islands)
/// and INSERT of blocks (scale, rotation, arrays, nested; entities on layer 0 take the insert's
/// layer). Lines and arcs whose ends meet within 0.01 mm are joined into chains, and a chain that
/// closes becomes an outline. The unit comes from $INSUNITS unless `options.unit` is given;
/// without either, millimetres (`unit_stated` false). Throws InputError naming the file (and the
/// layer, entity handle and coordinates where there are any) for a file that cannot be read, an
/// unknown unit, or a block inserted into itself.
CadDrawing read_drawing(const std::string& path, const DrawingOptions& options);

}  // namespace edgeflux
