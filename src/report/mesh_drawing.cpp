// The mesh drawing: the final triangles over the section, for checking the refinement.
#include <fmt/format.h>

#include <algorithm>
#include <cmath>
#include <functional>
#include <map>
#include <optional>

#include "report/colour_map.h"
#include "report/drawing_layout.h"
#include "report/field_quantities.h"
#include "report/material_fills.h"
#include "report/svg_drawings.h"

namespace edgeflux {

using namespace layout;

Drawing mesh_drawing(const CrossSection& section, const Calculation& calc) {
  const TriMesh& mesh = calc.mesh;
  const Bounds b = section_bounds(mesh);
  const PaperFrame f = field_frame(b);
  const Box drawing = paper_box(f, b);
  Box extent = drawing;
  const auto fills = material_fills(section);
  std::string body = region_fills(section, f, "mesh", false, fills, "none", 0);
  std::vector<std::pair<int, int>> edges;
  for (const auto& t : mesh.triangles)
    for (int i = 0; i < 3; ++i) edges.push_back({std::min(t[i], t[(i + 1) % 3]), std::max(t[i], t[(i + 1) % 3])});
  std::sort(edges.begin(), edges.end());
  edges.erase(std::unique(edges.begin(), edges.end()), edges.end());
  std::string d;
  for (const auto& [a, c] : edges) {
    const Point p = f.to_paper(mesh.points[a]), q = f.to_paper(mesh.points[c]);
    d += fmt::format("M{} {}L{} {}", num(p.x), num(p.y), num(q.x), num(q.y));
  }
  body += fmt::format("<path d=\"{}\" fill=\"none\" stroke=\"#1f2d3d\" stroke-width=\"0.07\"/>\n", d);
  body += fmt::format("<path d=\"{}\" fill=\"none\" stroke=\"#000\" stroke-width=\"0.3\"/>\n", outline_d(f, mesh));
  body += scale_bar({drawing.x0, extent.y1 + 4}, f, extent);
  Drawing out;
  out.id = "mesh";
  out.title = "Mesh";
  out.caption = fmt::format("The {} mesh the solver used: {} nodes, {} triangles, over the material areas; scale 1:{}. Each node carries one "
                            "temperature; its control volume is bounded by the medians of the triangles around it.",
                            mesh.mesher, mesh.n_points(), mesh.n_triangles(), num(f.denominator));
  out.svg = finish(out.title, fmt::format("Mesh: {} nodes, {} triangles · scale 1:{}", mesh.n_points(), mesh.n_triangles(), num(f.denominator)), "",
                   body, extent);
  return out;
}

}  // namespace edgeflux
