// The entities of a DXF drawing as read, before blocks are expanded: plain data between the DXF
// library's callbacks (read_drawing.cpp) and the assembly of outlines and chains
// (assemble_drawing.cpp).
#pragma once

#include <map>
#include <string>
#include <vector>

#include "core/error.h"
#include "core/point.h"
#include "input/read_drawing.h"

namespace edgeflux {

inline constexpr double pi = 3.14159265358979323846;

/// A vertex of a polyline as drawn: position and the bulge of the edge to the next vertex
/// (tan of a quarter of the arc's included angle, positive counter-clockwise).
struct Vertex {
  Point at;
  double bulge = 0.0;
};

/// One entity as read, in the coordinates of its block (or of the model).
struct RawEntity {
  enum class Kind { polyline, line, arc, circle, ellipse, hatch_loop, insert, spline } kind;
  std::string type;      ///< DXF type for messages
  std::string layer;
  std::string handle;
  bool mirrored = false; ///< extrusion along −z: x is mirrored
  std::vector<Vertex> vertices;  ///< polyline, hatch loop
  bool closed = false;
  Point a{}, b{};        ///< line ends; arc/circle/ellipse centre in a, ellipse major axis end in b
  double radius = 0.0, start = 0.0, end = 0.0, ratio = 1.0;  ///< arcs: degrees; ellipses: parameters
  std::vector<std::vector<Point>> loop_edges;  ///< hatch loop as faceted edges (edge path)
  std::vector<char> curved_edges;              ///< per loop edge: an arc or an ellipse
  bool outer = false;    ///< hatch loop: the external boundary
  // insert
  std::string block;
  Point scale{1, 1};
  double angle = 0.0;    ///< degrees
  int columns = 1, rows = 1;
  Point spacing{};
  int hatch = -1;        ///< hatch loops: index of the hatch they belong to
};

/// Everything read from the file, per block ("" = model space).
struct RawDrawing {
  std::map<std::string, std::vector<RawEntity>> blocks;
  std::map<std::string, Point> block_base;
  std::map<std::string, int> ignored;     ///< entity type → count
  std::vector<std::string> layers_declared;
  int insunits = -1;
};

/// The points of a polyline with bulges, arcs as chords (their points also go to `chords`); closed
/// polylines do not repeat the start.
std::vector<Point> polyline_points(const std::vector<Vertex>& vertices, bool closed, double tolerance,
                                   std::vector<Point>& chords);

/// Points on an elliptical arc from parameter t0 to t1 (turning counter-clockwise when `ccw`),
/// chords within `tolerance` × the radius of curvature at the flattest point.
std::vector<Point> ellipse_points(Point centre, Point major, double ratio, double t0, double t1, bool ccw, double tolerance);

/// Expands the model space of `raw` (blocks inserted with their transforms), joins lines and arcs
/// into chains and closed outlines, sorts hatch loops into outlines and islands, drops duplicates
/// and zero-length pieces with notes, converts to metres (drawing.metres_per_unit) and fills the
/// layer summaries of `drawing`.
void assemble_drawing(CadDrawing& drawing, const RawDrawing& raw, double arc_tolerance, const SourceLocation& where);

}  // namespace edgeflux
