// DXF drawings read with dxflib into plain outlines and chains (see the header).
#include "input/read_drawing.h"

#include "core/utf8.h"
#include "input/drawing_entities.h"

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

/// An entity handle as CAD programs show it (hexadecimal), "?" when the file gives none.
std::string hex_handle(int handle) { return handle > 0 ? fmt::format("{:X}", handle) : std::string("?"); }

class Collector : public DL_CreationAdapter {
 public:
  RawDrawing raw;

  void addLayer(const DL_LayerData& d) override { raw.layers_declared.push_back(valid_utf8(d.name)); }
  void addBlock(const DL_BlockData& d) override {
    current_ = valid_utf8(d.name);
    raw.block_base[current_] = {d.bpx, d.bpy};
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
    e.block = valid_utf8(d.name), e.a = {d.ipx, d.ipy}, e.scale = {d.sx, d.sy}, e.angle = d.angle;
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
  /// anonymous raw.blocks (*D…, *X…) a CAD program writes to show a dimension or a hatch.
  void ignore(const char* type) {
    if (current_.empty() || current_[0] != '*') ++raw.ignored[type];
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
    if (key == "$INSUNITS") raw.insunits = value;
  }

  double tolerance = 1e-4;



 private:
  RawEntity start(RawEntity::Kind kind, const char* type) {
    RawEntity e{};
    e.kind = kind;
    e.type = type;
    e.layer = valid_utf8(getAttributes().getLayer());
    e.handle = hex_handle(getAttributes().getHandle());
    e.mirrored = getExtrusion() != nullptr && getExtrusion()->getDirection()[2] < 0.0;
    return e;
  }
  void push(RawEntity e) { raw.blocks[current_].push_back(std::move(e)); }
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
  if (collector.raw.blocks.find("") == collector.raw.blocks.end() && collector.raw.blocks.empty())
    throw_input_error(where, "drawing", "contains no entities", "check that the section is drawn in model space");

  // Unit.
  UnitInfo unit{"mm", 0.001};
  if (options.unit) {
    unit = unit_named(*options.unit);
    if (unit.metres == 0.0)
      throw_input_error(where, "drawing", fmt::format("unit \"{}\" is not known", *options.unit),
                        "use units=\"mm\", \"cm\", \"m\", \"in\" or \"ft\"");
    drawing.unit_stated = true;
  } else if (const UnitInfo stated = unit_of_insunits(collector.raw.insunits); stated.metres > 0.0) {
    unit = stated;
    drawing.unit_stated = true;
  }
  drawing.unit = unit.name;
  drawing.metres_per_unit = unit.metres;
  RawDrawing raw = std::move(collector.raw);
  drawing.ignored = raw.ignored;
  assemble_drawing(drawing, raw, options.arc_tolerance, where);
  return drawing;
}

}  // namespace edgeflux
