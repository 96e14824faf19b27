// DXF drawings read with dxflib into plain outlines and chains (see the header).
#include "input/read_drawing.h"

#include <dxflib/dl_creationadapter.h>
#include <dxflib/dl_dxf.h>
#include <fmt/format.h>

#include <algorithm>
#include <cmath>
#include <cstdlib>
#include <filesystem>
#include <fstream>
#include <functional>
#include <set>
#include <unordered_map>

#include "core/error.h"
#include "geometry/arc_points.h"
#include "geometry/polygon.h"

namespace edgeflux {
namespace {

constexpr double pi = 3.14159265358979323846;

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

/// The affine map of a block insert: p ↦ offset + M·p.
struct Transform {
  double m00 = 1, m01 = 0, m10 = 0, m11 = 1;
  Point offset{};
  Point operator()(Point p) const { return {offset.x + m00 * p.x + m01 * p.y, offset.y + m10 * p.x + m11 * p.y}; }
  Transform then(const Transform& outer) const {  // outer ∘ this
    Transform t;
    t.m00 = outer.m00 * m00 + outer.m01 * m10, t.m01 = outer.m00 * m01 + outer.m01 * m11;
    t.m10 = outer.m10 * m00 + outer.m11 * m10, t.m11 = outer.m10 * m01 + outer.m11 * m11;
    t.offset = outer(offset);
    return t;
  }
};

std::string hex_handle(int handle) { return handle > 0 ? fmt::format("{:X}", handle) : std::string("?"); }

class Collector : public DL_CreationAdapter {
 public:
  std::map<std::string, std::vector<RawEntity>> blocks;  ///< "" = model space
  std::map<std::string, Point> block_base;
  std::map<std::string, int> ignored;
  std::vector<std::string> layers_declared;
  int insunits = -1;

  void addLayer(const DL_LayerData& d) override { layers_declared.push_back(d.name); }
  void addBlock(const DL_BlockData& d) override {
    current_ = d.name;
    block_base[d.name] = {d.bpx, d.bpy};
  }
  void endBlock() override { current_.clear(); }

  void addLine(const DL_LineData& d) override {
    RawEntity e = start(RawEntity::Kind::line, "LINE");
    e.a = {d.x1, d.y1}, e.b = {d.x2, d.y2};
    push(std::move(e));
  }
  void addArc(const DL_ArcData& d) override {
    RawEntity e = start(RawEntity::Kind::arc, "ARC");
    e.a = {d.cx, d.cy}, e.radius = d.radius, e.start = d.angle1, e.end = d.angle2;
    push(std::move(e));
  }
  void addCircle(const DL_CircleData& d) override {
    RawEntity e = start(RawEntity::Kind::circle, "CIRCLE");
    e.a = {d.cx, d.cy}, e.radius = d.radius;
    push(std::move(e));
  }
  void addEllipse(const DL_EllipseData& d) override {
    RawEntity e = start(RawEntity::Kind::ellipse, "ELLIPSE");
    e.a = {d.cx, d.cy}, e.b = {d.mx, d.my}, e.ratio = d.ratio, e.start = d.angle1, e.end = d.angle2;
    push(std::move(e));
  }
  void addPolyline(const DL_PolylineData& d) override {
    polyline_ = start(RawEntity::Kind::polyline, "POLYLINE");
    polyline_.closed = (d.flags & 1) != 0;
    in_polyline_ = true;
  }
  void addVertex(const DL_VertexData& d) override {
    if (in_polyline_) polyline_.vertices.push_back({{d.x, d.y}, d.bulge});
  }
  void addSpline(const DL_SplineData&) override { push(start(RawEntity::Kind::spline, "SPLINE")); }
  void addInsert(const DL_InsertData& d) override {
    RawEntity e = start(RawEntity::Kind::insert, "INSERT");
    e.block = d.name, e.a = {d.ipx, d.ipy}, e.scale = {d.sx, d.sy}, e.angle = d.angle;
    e.columns = std::max(1, d.cols), e.rows = std::max(1, d.rows), e.spacing = {d.colSp, d.rowSp};
    push(std::move(e));
  }
  void addHatch(const DL_HatchData&) override {
    hatch_ = start(RawEntity::Kind::hatch_loop, "HATCH");
    hatch_index_ = next_hatch_++;
    in_hatch_ = true;
    // Polyline-type boundary paths, which the library does not decode, from the group codes of
    // this entity (code 92 starts a path; bit 2 marks a polyline path with 72 has-bulge, 73 closed,
    // 93 vertex count, then 10/20[/42] per vertex).
    for (std::size_t i = 0; i < hatch_pairs_.size(); ++i) {
      if (hatch_pairs_[i].first != 92) continue;
      const int flag = std::atoi(hatch_pairs_[i].second.c_str());
      if (!(flag & 2)) continue;
      RawEntity loop = hatch_;
      loop.hatch = hatch_index_;
      loop.outer = (flag & 1) != 0;
      loop.closed = true;
      bool has_bulge = false;
      int count = 0;
      std::size_t j = i + 1;
      for (; j < hatch_pairs_.size() && hatch_pairs_[j].first != 10; ++j) {
        if (hatch_pairs_[j].first == 72) has_bulge = std::atoi(hatch_pairs_[j].second.c_str()) != 0;
        if (hatch_pairs_[j].first == 93) count = std::atoi(hatch_pairs_[j].second.c_str());
      }
      for (int v = 0; v < count && j + 1 < hatch_pairs_.size(); ++v) {
        Vertex vertex{{std::atof(hatch_pairs_[j].second.c_str()), std::atof(hatch_pairs_[j + 1].second.c_str())}, 0.0};
        j += 2;
        if (has_bulge && j < hatch_pairs_.size() && hatch_pairs_[j].first == 42)
          vertex.bulge = std::atof(hatch_pairs_[j].second.c_str()), ++j;
        loop.vertices.push_back(vertex);
      }
      push(std::move(loop));
    }
  }
  void addHatchLoop(const DL_HatchLoopData&) override { flush_edge_loop(); }
  void addHatchEdge(const DL_HatchEdgeData& d) override {
    if (!in_hatch_) return;
    if (d.type < 1 || d.type > 4) {  // the library's stand-in for a polyline path: decoded above
      bad_loop_ = true;
      return;
    }
    std::vector<Point> edge;
    if (d.type == 1) {
      edge = {{d.x1, d.y1}, {d.x2, d.y2}};
    } else if (d.type == 2) {
      // Angles in radians here; a clockwise arc edge is stored mirrored (angles negated).
      const double a1 = d.ccw ? d.angle1 : -d.angle1, a2 = d.ccw ? d.angle2 : -d.angle2;
      const Point c{d.cx, d.cy};
      const Point from = c + d.radius * Point{std::cos(a1), std::sin(a1)}, to = c + d.radius * Point{std::cos(a2), std::sin(a2)};
      edge.push_back(from);
      for (Point p : arc_points(from, to, c, d.ccw, tolerance)) edge.push_back(p);
      edge.push_back(to);
    } else if (d.type == 3) {
      edge = ellipse_points({d.cx, d.cy}, {d.mx, d.my}, d.ratio, d.ccw ? d.angle1 : -d.angle1,
                            d.ccw ? d.angle2 : -d.angle2, d.ccw, tolerance);
    } else {
      spline_edge_ = true;
      return;
    }
    edge_loop_.push_back(std::move(edge));
    edge_curved_.push_back(d.type != 1);
  }
  void endEntity() override {
    if (in_polyline_) push(std::move(polyline_)), in_polyline_ = false;
    if (in_hatch_) {
      flush_edge_loop();
      if (spline_edge_) {
        RawEntity e = hatch_;
        e.kind = RawEntity::Kind::spline, e.type = "HATCH with a spline edge";
        push(std::move(e));
      }
      in_hatch_ = false, spline_edge_ = false;
    }
  }
  void endSequence() override { endEntity(); }

  /// Annotation is counted where the user drew it: in model space and named blocks, not in the
  /// anonymous blocks (*D…, *X…) a CAD program writes to show a dimension or a hatch.
  void ignore(const char* type) {
    if (current_.empty() || current_[0] != '*') ++ignored[type];
  }

  void addText(const DL_TextData&) override { ignore("TEXT"); }
  void addMText(const DL_MTextData&) override { ignore("MTEXT"); }
  void addPoint(const DL_PointData&) override { ignore("POINT"); }
  void addSolid(const DL_SolidData&) override { ignore("SOLID"); }
  void addTrace(const DL_TraceData&) override { ignore("TRACE"); }
  void add3dFace(const DL_3dFaceData&) override { ignore("3DFACE"); }
  void addXLine(const DL_XLineData&) override { ignore("XLINE"); }
  void addRay(const DL_RayData&) override { ignore("RAY"); }
  void addLeader(const DL_LeaderData&) override { ignore("LEADER"); }
  void addImage(const DL_ImageData&) override { ignore("IMAGE"); }
  void addAttribute(const DL_AttributeData&) override { ignore("ATTRIB"); }
  void addDimAlign(const DL_DimensionData&, const DL_DimAlignedData&) override { ignore("DIMENSION"); }
  void addDimLinear(const DL_DimensionData&, const DL_DimLinearData&) override { ignore("DIMENSION"); }
  void addDimRadial(const DL_DimensionData&, const DL_DimRadialData&) override { ignore("DIMENSION"); }
  void addDimDiametric(const DL_DimensionData&, const DL_DimDiametricData&) override { ignore("DIMENSION"); }
  void addDimAngular(const DL_DimensionData&, const DL_DimAngular2LData&) override { ignore("DIMENSION"); }
  void addDimAngular3P(const DL_DimensionData&, const DL_DimAngular3PData&) override { ignore("DIMENSION"); }
  void addDimOrdinate(const DL_DimensionData&, const DL_DimOrdinateData&) override { ignore("DIMENSION"); }

  void processCodeValuePair(unsigned int code, const std::string& value) override {
    if (code == 0) {
      collecting_hatch_ = value == "HATCH";
      if (collecting_hatch_) hatch_pairs_.clear();
    } else if (collecting_hatch_) {
      hatch_pairs_.push_back({static_cast<int>(code), value});
    }
  }
  void setVariableInt(const std::string& key, int value, int) override {
    if (key == "$INSUNITS") insunits = value;
  }

  double tolerance = 1e-4;

  static std::vector<Point> ellipse_points(Point centre, Point major, double ratio, double t0, double t1, bool ccw,
                                           double tolerance) {
    const Point minor{-major.y * ratio, major.x * ratio};
    double sweep = t1 - t0;
    if (ccw) {
      while (sweep <= 0.0) sweep += 2.0 * pi;
    } else {
      while (sweep >= 0.0) sweep -= 2.0 * pi;
    }
    // Chords against the curvature at the flattest point: radius a²/b for semi-axes a ≥ b.
    const double a = norm(major), b = a * std::abs(ratio);
    const double r = std::max(a, b) * std::max(a, b) / std::max(std::min(a, b), 1e-300);
    const double step = std::min(pi / 8.0, 2.0 * std::acos(std::max(0.0, 1.0 - tolerance * std::min(a, b) / r)));
    const int pieces = std::max(2, static_cast<int>(std::ceil(std::abs(sweep) / std::max(step, 1e-4))));
    std::vector<Point> points;
    for (int k = 0; k <= pieces; ++k) {
      const double t = t0 + sweep * k / pieces;
      points.push_back(centre + std::cos(t) * major + std::sin(t) * minor);
    }
    return points;
  }

 private:
  RawEntity start(RawEntity::Kind kind, const char* type) {
    RawEntity e{};
    e.kind = kind;
    e.type = type;
    e.layer = getAttributes().getLayer();
    e.handle = hex_handle(getAttributes().getHandle());
    e.mirrored = getExtrusion() != nullptr && getExtrusion()->getDirection()[2] < 0.0;
    return e;
  }
  void push(RawEntity e) { blocks[current_].push_back(std::move(e)); }
  void flush_edge_loop() {
    if (!in_hatch_) return;
    if (!edge_loop_.empty() && !bad_loop_) {
      RawEntity loop = hatch_;
      loop.hatch = hatch_index_;
      loop.loop_edges = std::move(edge_loop_);
      loop.curved_edges = std::move(edge_curved_);
      loop.closed = true;
      push(std::move(loop));
    }
    edge_loop_.clear();
    edge_curved_.clear();
    bad_loop_ = false;
  }

  std::string current_;
  RawEntity polyline_{}, hatch_{};
  bool in_polyline_ = false, in_hatch_ = false, bad_loop_ = false, spline_edge_ = false, collecting_hatch_ = false;
  int hatch_index_ = -1, next_hatch_ = 0;
  std::vector<std::vector<Point>> edge_loop_;
  std::vector<char> edge_curved_;
  std::vector<std::pair<int, std::string>> hatch_pairs_;
};

struct UnitInfo {
  const char* name;
  double metres;
};

UnitInfo unit_named(const std::string& name) {
  if (name == "mm") return {"mm", 0.001};
  if (name == "cm") return {"cm", 0.01};
  if (name == "m") return {"m", 1.0};
  if (name == "in") return {"in", 0.0254};
  if (name == "ft") return {"ft", 0.3048};
  return {"", 0.0};
}

/// $INSUNITS codes of the DXF reference: 1 inches, 2 feet, 4 millimetres, 5 centimetres, 6 metres.
UnitInfo unit_of_insunits(int code) {
  switch (code) {
    case 1: return {"in", 0.0254};
    case 2: return {"ft", 0.3048};
    case 4: return {"mm", 0.001};
    case 5: return {"cm", 0.01};
    case 6: return {"m", 1.0};
    default: return {"", 0.0};
  }
}

/// The points of a polyline with bulges, arcs as chords (their points also go to `chords`); closed
/// polylines do not repeat the start.
std::vector<Point> polyline_points(const std::vector<Vertex>& vertices, bool closed, double tolerance,
                                   std::vector<Point>& chords) {
  std::vector<Point> points;
  const std::size_t n = vertices.size();
  for (std::size_t i = 0; i < n; ++i) {
    points.push_back(vertices[i].at);
    if (i + 1 == n && !closed) break;
    const Point from = vertices[i].at, to = vertices[(i + 1) % n].at;
    const double bulge = vertices[i].bulge;
    if (bulge == 0.0 || distance(from, to) == 0.0) continue;
    // The centre lies off the chord's midpoint by (c/2)(1 − b²)/(2b), to the left for b > 0.
    const Point chord = to - from, left{-chord.y, chord.x};
    const Point centre = 0.5 * (from + to) + ((1.0 - bulge * bulge) / (4.0 * bulge)) * left;
    for (Point p : arc_points(from, to, centre, bulge > 0.0, tolerance)) points.push_back(p), chords.push_back(p);
  }
  return points;
}

/// What the DXF library cannot be trusted with: a file that is not ASCII DXF, one too large to be a
/// section, and counts (of vertices, loops, edges, knots) larger than the file could hold, which
/// the library would allocate before reading them.
void preflight(const std::string& path, const SourceLocation& where) {
  constexpr std::uintmax_t max_bytes = 256u << 20;
  std::error_code ec;
  const std::uintmax_t bytes = std::filesystem::file_size(path, ec);
  if (ec) throw_input_error(where, "drawing", "cannot be read (" + ec.message() + ")", "check the file name and its permissions");
  if (bytes > max_bytes)
    throw_input_error(where, "drawing", fmt::format("is {} MB, more than the {} MB a section drawing needs", bytes >> 20, max_bytes >> 20),
                      "save only the section (its layers in model space) to a new DXF file");
  std::ifstream in(path, std::ios::binary);
  std::string code_line, value, entity;
  int line = 0;
  bool first = true;
  const std::uintmax_t max_count = std::max<std::uintmax_t>(1000, bytes / 8);  // a vertex takes ≥ 8 bytes
  while (std::getline(in, code_line) && std::getline(in, value)) {
    line += 2;
    auto trim = [](std::string& t) {
      while (!t.empty() && (t.back() == '\r' || t.back() == ' ' || t.back() == '\t')) t.pop_back();
      t.erase(0, t.find_first_not_of(" \t"));
    };
    trim(code_line), trim(value);
    char* end = nullptr;
    const long code = std::strtol(code_line.c_str(), &end, 10);
    if (end == code_line.c_str() || *end != '\0') {
      if (first && code_line.rfind("AutoCAD Binary DXF", 0) == 0)
        throw_input_error(where, "drawing", "is a binary DXF file", "save the drawing as ASCII DXF from the CAD program");
      throw_input_error({path, line - 1}, "drawing", "is not a DXF file: this line should hold a group code (a whole number)",
                        "save the drawing as ASCII DXF (any version from R12 on) from the CAD program");
    }
    if (first && code != 999 && !(code == 0 && value == "SECTION"))
      throw_input_error({path, line - 1}, "drawing", "is not a DXF file: it does not begin with a SECTION",
                        "save the drawing as ASCII DXF (any version from R12 on) from the CAD program");
    if (code != 999) first = false;
    if (code == 0) entity = value.substr(0, 16);
    const bool count = (entity == "LWPOLYLINE" && code == 90) || (entity == "HATCH" && (code == 91 || code == 93 || code == 98)) ||
                       (entity == "SPLINE" && code >= 72 && code <= 74);
    if (count) {
      const double count = std::strtod(value.c_str(), nullptr);
      if (count > static_cast<double>(max_count))
        throw_input_error({path, line}, "drawing", fmt::format("declares a count of {} (group code {}) in a file of {} bytes: "
                                                               "the file is damaged", value.substr(0, 20), code, bytes),
                          "export the drawing again from the CAD program");
    }
  }
  if (first)
    throw_input_error(where, "drawing", "is empty", "export the drawing again from the CAD program as ASCII DXF");
}

}  // namespace

CadDrawing read_drawing(const std::string& path, const DrawingOptions& options) {
  CadDrawing drawing;
  drawing.file = path;
  const SourceLocation where{path, 0};
  {
    std::ifstream probe(path, std::ios::binary);
    if (!probe)
      throw_input_error(where, "drawing", "cannot be opened (missing or unreadable)",
                        "check the file name in <drawing file=\"…\">; it is read relative to the detail file");
  }
  preflight(path, where);
  Collector collector;
  collector.tolerance = options.arc_tolerance;
  DL_Dxf dxf;
  if (!dxf.in(path, &collector))
    throw_input_error(where, "drawing", "is not a DXF file the reader understands",
                      "save the drawing as ASCII DXF (any version from R12 on) from the CAD program");
  if (collector.blocks.find("") == collector.blocks.end() && collector.blocks.empty())
    throw_input_error(where, "drawing", "contains no entities", "check that the section is drawn in model space");

  // Unit.
  UnitInfo unit{"mm", 0.001};
  if (options.unit) {
    unit = unit_named(*options.unit);
    if (unit.metres == 0.0)
      throw_input_error(where, "drawing", fmt::format("unit \"{}\" is not known", *options.unit),
                        "use units=\"mm\", \"cm\", \"m\", \"in\" or \"ft\"");
    drawing.unit_stated = true;
  } else if (const UnitInfo stated = unit_of_insunits(collector.insunits); stated.metres > 0.0) {
    unit = stated;
    drawing.unit_stated = true;
  }
  drawing.unit = unit.name;
  drawing.metres_per_unit = unit.metres;
  drawing.ignored = collector.ignored;

  // Expand model space, blocks inserted with their transforms; pieces to chain afterwards.
  struct Piece {
    std::string layer, entity;
    std::vector<Point> points;
    int order;
  };
  std::vector<Piece> pieces;
  std::map<std::pair<int, int>, std::vector<DrawnShape>> hatch_loops;  // per (insert, hatch), its loops
  int instances = 0;
  std::map<std::string, DrawingLayer> layers;
  int order = 0;
  const double tolerance = options.arc_tolerance;
  int zero_length = 0;
  std::string zero_length_first;
  constexpr long max_placed_entities = 2'000'000;
  long placed = 0;

  std::function<void(const std::string&, const Transform&, const std::string&, int)> expand =
      [&](const std::string& block, const Transform& transform, const std::string& insert_layer, int depth) {
        if (depth > 64)
          throw_input_error(where, fmt::format("block '{}'", block), "is inserted into itself (directly or through other blocks)",
                            "remove the recursive INSERT from the block definition");
        const auto found = collector.blocks.find(block);
        if (found == collector.blocks.end()) return;
        const int instance = instances++;
        const Point base = collector.block_base.count(block) ? collector.block_base[block] : Point{};
        for (const RawEntity& e : found->second) {
          // Arrays of nested blocks multiply: a few lines can stand for billions of entities.
          if (++placed > max_placed_entities)
            throw_input_error(where, fmt::format("block '{}'", block),
                              fmt::format("expands to more than {} entities through inserts and arrays", max_placed_entities),
                              "explode the arrays the section does not need, or draw the section without them");
          const std::string layer = (e.layer == "0" && !insert_layer.empty()) ? insert_layer : e.layer;
          auto place = [&](Point p) {
            if (e.mirrored) p.x = -p.x;
            return transform(p - base);
          };
          auto place_all = [&](std::vector<Point> points) {
            for (Point& p : points) p = place(p);
            return points;
          };
          std::vector<Point> chords;  // this entity's arc points, in block coordinates
          struct Flush {
            std::vector<Point>& chords;
            std::function<Point(Point)> place;
            std::vector<Point>& out;
            ~Flush() { for (Point p : chords) out.push_back(place(p)); }
          } flush{chords, place, drawing.chord_points};
          const std::string entity = fmt::format("{} {}", e.type, e.handle);
          ++layers[layer].entities;
          switch (e.kind) {
            case RawEntity::Kind::insert: {
              const double a = e.angle * pi / 180.0, c = std::cos(a), s = std::sin(a);
              for (int col = 0; col < e.columns; ++col)
                for (int row = 0; row < e.rows; ++row) {
                  Transform local;
                  local.m00 = c * e.scale.x, local.m01 = -s * e.scale.y, local.m10 = s * e.scale.x, local.m11 = c * e.scale.y;
                  const Point shift{col * e.spacing.x, row * e.spacing.y};
                  local.offset = e.a + Point{c * shift.x - s * shift.y, s * shift.x + c * shift.y};
                  Transform t = local;
                  // The insert's own position is in the coordinates of the block that holds it.
                  if (e.mirrored) t.m00 = -t.m00, t.m01 = -t.m01, t.offset.x = -t.offset.x;
                  t.offset = t.offset - base;
                  expand(e.block, t.then(transform), layer, depth + 1);
                }
              break;
            }
            case RawEntity::Kind::spline:
              drawing.splines.push_back(fmt::format("{}: {}", layer, entity));
              break;
            case RawEntity::Kind::line:
              if (distance(e.a, e.b) == 0.0) {
                if (zero_length++ == 0) zero_length_first = fmt::format("{} on layer '{}'", entity, layer);
                break;
              }
              pieces.push_back({layer, entity, {place(e.a), place(e.b)}, order++});
              break;
            case RawEntity::Kind::arc: {
              const Point from = e.a + e.radius * Point{std::cos(e.start * pi / 180), std::sin(e.start * pi / 180)};
              const Point to = e.a + e.radius * Point{std::cos(e.end * pi / 180), std::sin(e.end * pi / 180)};
              std::vector<Point> points{from};
              for (Point p : arc_points(from, to, e.a, true, tolerance)) points.push_back(p), chords.push_back(p);
              points.push_back(to);
              pieces.push_back({layer, entity, place_all(points), order++});
              break;
            }
            case RawEntity::Kind::circle: {
              const Point start = e.a + Point{e.radius, 0.0};
              std::vector<Point> points{start};
              for (Point p : arc_points(start, start, e.a, true, tolerance)) points.push_back(p), chords.push_back(p);
              drawing.outlines.push_back({layer, entity, place_all(points), {}, order++});
              break;
            }
            case RawEntity::Kind::ellipse: {
              const bool full = std::abs(std::abs(e.end - e.start) - 2.0 * pi) < 1e-9 || e.end == e.start;
              std::vector<Point> points = Collector::ellipse_points(e.a, e.b, e.ratio, e.start, full ? e.start + 2.0 * pi : e.end, true, tolerance);
              chords.insert(chords.end(), points.begin() + 1, points.end() - 1);
              if (full) {
                points.pop_back();
                drawing.outlines.push_back({layer, entity, place_all(points), {}, order++});
              } else {
                pieces.push_back({layer, entity, place_all(points), order++});
              }
              break;
            }
            case RawEntity::Kind::polyline: {
              std::vector<Point> points = place_all(polyline_points(e.vertices, e.closed, tolerance, chords));
              points.erase(std::unique(points.begin(), points.end(), [](Point p, Point q) { return distance(p, q) == 0.0; }), points.end());
              if (e.closed && points.size() > 1 && distance(points.front(), points.back()) == 0.0) points.pop_back();
              if (points.size() < 2) {
                if (zero_length++ == 0) zero_length_first = fmt::format("{} on layer '{}'", entity, layer);
                break;
              }
              if (e.closed) drawing.outlines.push_back({layer, entity, points, {}, order++});
              else pieces.push_back({layer, entity, points, order++});
              break;
            }
            case RawEntity::Kind::hatch_loop: {
              std::vector<Point> points;
              if (!e.loop_edges.empty()) {
                for (std::size_t k = 0; k < e.loop_edges.size(); ++k) {
                  const auto& edge = e.loop_edges[k];
                  if (e.curved_edges[k] && edge.size() > 2) chords.insert(chords.end(), edge.begin() + 1, edge.end() - 1);
                  for (Point p : edge)
                    if (points.empty() || distance(points.back(), p) > 1e-9 * std::max(1.0, norm(p))) points.push_back(p);
                }
                if (points.size() > 1 && distance(points.front(), points.back()) <= 1e-9 * std::max(1.0, norm(points.front())))
                  points.pop_back();
              } else {
                points = polyline_points(e.vertices, true, tolerance, chords);
              }
              if (points.size() >= 3)
                hatch_loops[{instance, e.hatch}].push_back({layer, entity, place_all(points), {}, order++});
              break;
            }
          }
        }
      };
  expand("", Transform{}, "", 0);
  if (zero_length > 0)
    drawing.notes.push_back(fmt::format("{} zero-length line{} or polyline{} left out (first: {})", zero_length,
                                        zero_length == 1 ? "" : "s", zero_length == 1 ? "" : "s", zero_length_first));

  // Hatches: the loop enclosing the largest area is the outline; the others are islands in it.
  for (auto& [hatch, loops] : hatch_loops) {
    auto area = [](const DrawnShape& s) { return std::abs(signed_area(s.points)); };
    const auto outer = std::max_element(loops.begin(), loops.end(), [&](const auto& a, const auto& b) { return area(a) < area(b); });
    DrawnShape shape = *outer;
    for (auto it = loops.begin(); it != loops.end(); ++it)
      if (it != outer) shape.islands.push_back(it->points);
    drawing.outlines.push_back(std::move(shape));
  }

  // Chains: pieces whose ends meet within 0.01 mm, per layer.
  const double join = 1e-5;  // m
  std::map<std::string, std::vector<int>> by_layer;
  for (int i = 0; i < static_cast<int>(pieces.size()); ++i) by_layer[pieces[i].layer].push_back(i);
  for (const auto& [layer, members] : by_layer) {
    // Cluster end points.
    std::vector<Point> nodes;
    std::unordered_map<long long, std::vector<int>> cells;
    auto cell_key = [](long long i, long long j) { return i * 73856093LL ^ j * 19349663LL; };
    auto node_at = [&](Point p) {
      const long long ci = static_cast<long long>(std::floor(p.x / join)), cj = static_cast<long long>(std::floor(p.y / join));
      for (long long di = -1; di <= 1; ++di)
        for (long long dj = -1; dj <= 1; ++dj)
          for (int k : cells[cell_key(ci + di, cj + dj)])
            if (distance(nodes[k], p) <= join) return k;
      cells[cell_key(ci, cj)].push_back(static_cast<int>(nodes.size()));
      nodes.push_back(p);
      return static_cast<int>(nodes.size()) - 1;
    };
    std::vector<std::array<int, 2>> ends(members.size());
    std::vector<std::vector<std::pair<int, int>>> at(0);  // node → (member, end)
    for (std::size_t m = 0; m < members.size(); ++m) {
      const Piece& p = pieces[members[m]];
      ends[m] = {node_at(p.points.front()), node_at(p.points.back())};
    }
    at.resize(nodes.size());
    for (std::size_t m = 0; m < members.size(); ++m)
      for (int k = 0; k < 2; ++k) at[ends[m][k]].push_back({static_cast<int>(m), k});
    std::vector<char> used(members.size(), 0);
    auto walk = [&](int first, int from_end) {
      DrawnShape shape{layer, "", {}, {}, pieces[members[first]].order};
      int m = first, end = from_end;  // enter piece m at its end `end`
      std::set<std::string> entities;
      while (true) {
        used[m] = 1;
        const Piece& p = pieces[members[m]];
        entities.insert(p.entity);
        shape.order = std::min(shape.order, p.order);
        std::vector<Point> pts = p.points;
        if (end == 1) std::reverse(pts.begin(), pts.end());
        for (std::size_t k = shape.points.empty() ? 0 : 1; k < pts.size(); ++k) shape.points.push_back(pts[k]);
        const int node = ends[m][1 - end];
        if (at[node].size() != 2) break;
        const auto& [next, next_end] = at[node][0].first == m && at[node][0].second == 1 - end ? at[node][1] : at[node][0];
        if (used[next]) {
          shape.entities = fmt::format("{}", fmt::join(entities, ", "));
          if (next == first) {  // back at the start: closed
            shape.points.pop_back();
            return std::pair{shape, true};
          }
          break;
        }
        m = next, end = next_end;
      }
      shape.entities = fmt::format("{}", fmt::join(entities, ", "));
      return std::pair{shape, false};
    };
    // Open chains start at ends that do not continue; what is left are closed loops.
    for (std::size_t n = 0; n < nodes.size(); ++n) {
      if (at[n].size() == 2) continue;
      for (const auto& [m, end] : at[n])
        if (!used[m]) drawing.chains.push_back(walk(m, end).first);
    }
    for (std::size_t m = 0; m < members.size(); ++m)
      if (!used[m]) {
        auto [shape, closed] = walk(static_cast<int>(m), 0);
        (closed ? drawing.outlines : drawing.chains).push_back(std::move(shape));
      }
  }

  // Duplicates: the same outline on the same layer (a hatch over its boundary polyline, a line drawn
  // twice) is kept once.
  {
    auto key_of = [](const DrawnShape& s) {
      std::vector<std::pair<long long, long long>> k;
      for (Point p : s.points) k.push_back({std::llround(p.x / 1e-5), std::llround(p.y / 1e-5)});
      const auto first = std::min_element(k.begin(), k.end());
      std::rotate(k.begin(), first, k.end());
      if (k.size() > 2 && k.back() < k[1]) std::reverse(k.begin() + 1, k.end());
      return std::pair{s.layer, k};
    };
    std::sort(drawing.outlines.begin(), drawing.outlines.end(), [](const DrawnShape& a, const DrawnShape& b) { return a.order < b.order; });
    std::map<std::pair<std::string, std::vector<std::pair<long long, long long>>>, std::string> seen;
    std::vector<DrawnShape> kept;
    for (DrawnShape& s : drawing.outlines) {
      const auto [it, fresh] = seen.emplace(key_of(s), s.entities);
      if (fresh || !s.islands.empty()) kept.push_back(std::move(s));
      else drawing.notes.push_back(fmt::format("layer '{}': {} repeats {} and was left out", s.layer, s.entities, it->second));
    }
    drawing.outlines = std::move(kept);
  }
  std::sort(drawing.chains.begin(), drawing.chains.end(), [](const DrawnShape& a, const DrawnShape& b) { return a.order < b.order; });

  // Units into metres, layer summaries.
  for (Point& p : drawing.chord_points) p = unit.metres * p;
  for (auto* list : {&drawing.outlines, &drawing.chains})
    for (DrawnShape& s : *list) {
      for (Point& p : s.points) p = unit.metres * p;
      for (auto& island : s.islands)
        for (Point& p : island) p = unit.metres * p;
      DrawingLayer& l = layers[s.layer];
      if (l.outlines + l.chains == 0) l.lower = l.upper = s.points.front();
      (list == &drawing.outlines ? l.outlines : l.chains) += 1;
      for (Point p : s.points) {
        l.lower = {std::min(l.lower.x, p.x), std::min(l.lower.y, p.y)};
        l.upper = {std::max(l.upper.x, p.x), std::max(l.upper.y, p.y)};
      }
    }
  for (const std::string& name : collector.layers_declared) layers[name];
  for (auto& [name, l] : layers) {
    l.name = name;
    drawing.layers.push_back(l);
  }
  return drawing;
}

}  // namespace edgeflux
