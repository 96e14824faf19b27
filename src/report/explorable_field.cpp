// The explorable temperature field of the report: its data (the mesh or a raster sample), the
// JSON block that carries them, and the markup around the picture.
#include "report/explorable_field.h"

#include <fmt/format.h>

#include <nlohmann/json.hpp>

#include <algorithm>
#include <cmath>
#include <optional>

#include "mesh/triangle_locator.h"
#include "report/drawing_layout.h"
#include "report/explorable_field_script.h"
#include "report/number_format.h"

namespace edgeflux {

using namespace layout;

namespace {

/// The sample in place of a mesh too large to embed: first the solver's triangles along the
/// boundary (so the surfaces read exactly), then grid cells over the section's bounding box, two
/// triangles each, as many as the remaining triangles allow (at least 500 cells).
ExplorableMesh raster_sample(const Calculation& calc, int max_triangles) {
  const TriMesh& mesh = calc.mesh;
  const std::vector<double>& T = calc.surface_temperature.temperature;
  const std::vector<Point>& flux = calc.heat_loss.field.heat_flux;
  const Bounds b = section_bounds(mesh);
  const TriangleLocator locator(mesh);
  ExplorableMesh out;
  std::vector<int> mesh_index(mesh.points.size(), -1);
  std::vector<bool> taken(mesh.triangles.size(), false);
  for (const BoundaryEdge& e : mesh.boundary_edges) {
    if (e.triangle < 0 || taken[e.triangle]) continue;
    taken[e.triangle] = true;
    std::array<int, 3> tri{};
    for (int k = 0; k < 3; ++k) {
      const int v = mesh.triangles[e.triangle][k];
      if (mesh_index[v] < 0) {
        mesh_index[v] = static_cast<int>(out.points.size());
        out.points.push_back(mesh.points[v]);
        out.temperature.push_back(T[v]);
      }
      tri[k] = mesh_index[v];
    }
    out.triangles.push_back(tri);
    out.heat_flux.push_back(norm(flux[e.triangle]));
    out.material.push_back(mesh.triangle_material[e.triangle]);
  }
  out.boundary_triangles = static_cast<int>(out.triangles.size());
  const double cells = std::max(500.0, (max_triangles - static_cast<double>(out.triangles.size())) / 2.0);
  out.raster_step = std::sqrt(b.width() * b.height() / cells);
  const int nx = static_cast<int>(std::floor(b.width() / out.raster_step)) + 1, ny = static_cast<int>(std::floor(b.height() / out.raster_step)) + 1;
  std::vector<int> node(static_cast<std::size_t>(nx) * ny, -1);
  std::vector<double> value(node.size(), 0.0);
  for (int j = 0; j < ny; ++j)
    for (int i = 0; i < nx; ++i) {
      const Point p{b.x0 + i * out.raster_step, b.y0 + j * out.raster_step};
      if (const auto t = locator.value_at(T, p)) node[static_cast<std::size_t>(j) * nx + i] = 0, value[static_cast<std::size_t>(j) * nx + i] = *t;
    }
  // Number only the points a kept triangle uses.
  std::vector<int> index(node.size(), -1);
  auto point_index = [&](int i, int j) {
    const std::size_t k = static_cast<std::size_t>(j) * nx + i;
    if (index[k] < 0) {
      index[k] = static_cast<int>(out.points.size());
      out.points.push_back({b.x0 + i * out.raster_step, b.y0 + j * out.raster_step});
      out.temperature.push_back(value[k]);
    }
    return index[k];
  };
  auto inside = [&](int i, int j) { return node[static_cast<std::size_t>(j) * nx + i] >= 0; };
  for (int j = 0; j + 1 < ny; ++j)
    for (int i = 0; i + 1 < nx; ++i) {
      if (!(inside(i, j) && inside(i + 1, j) && inside(i, j + 1) && inside(i + 1, j + 1))) continue;
      for (const std::array<std::array<int, 2>, 3>& corners : {std::array<std::array<int, 2>, 3>{{{0, 0}, {1, 0}, {1, 1}}},
                                                               std::array<std::array<int, 2>, 3>{{{0, 0}, {1, 1}, {0, 1}}}}) {
        Point centroid{0, 0};
        for (const auto& c : corners) centroid = centroid + (1.0 / 3.0) * Point{b.x0 + (i + c[0]) * out.raster_step, b.y0 + (j + c[1]) * out.raster_step};
        const int t = locator.triangle_at(centroid);
        if (t < 0) continue;  // the corners are inside, the middle is not: a notch in the outline
        std::array<int, 3> tri{};
        for (int k = 0; k < 3; ++k) tri[k] = point_index(i + corners[k][0], j + corners[k][1]);
        out.triangles.push_back(tri);
        out.heat_flux.push_back(norm(flux[t]));
        out.material.push_back(mesh.triangle_material[t]);
      }
    }
  return out;
}

/// Numbers of an array, comma-separated.
template <typename T, typename F>
std::string joined(const std::vector<T>& values, F&& format) {
  std::string s;
  s.reserve(values.size() * 8);
  for (std::size_t i = 0; i < values.size(); ++i) {
    if (i) s += ',';
    s += format(values[i]);
  }
  return s;
}

/// Figure numbers as the report gives them: Figures 1 and 2 on the sheet, then the other drawings
/// in Appendix B in their order (html_tables.cpp, mesh_appendix). The number of drawing `id`, or
/// with an empty id the number after the last.
int figure_number(const std::vector<Drawing>& drawings, const std::string& id) {
  int number = 3;
  for (const Drawing& d : drawings) {
    if (d.id == "detail" || d.id == "temperature") continue;
    if (d.id == id) return number;
    ++number;
  }
  return number;
}

bool has_drawing(const std::vector<Drawing>& drawings, const char* id) {
  return std::any_of(drawings.begin(), drawings.end(), [&](const Drawing& d) { return d.id == id; });
}

}  // namespace

ExplorableMesh explorable_mesh(const Calculation& calc, int max_triangles) {
  const TriMesh& mesh = calc.mesh;
  if (mesh.n_triangles() > max_triangles) return raster_sample(calc, max_triangles);
  ExplorableMesh out;
  out.points = mesh.points;
  out.triangles = mesh.triangles;
  out.temperature = calc.surface_temperature.temperature;
  out.material = mesh.triangle_material;
  for (const Point& q : calc.heat_loss.field.heat_flux) out.heat_flux.push_back(norm(q));
  return out;
}

std::string explorable_field_json(const CrossSection& section, const Calculation& calc, const ExplorableMesh& data) {
  const Bounds b = section_bounds(calc.mesh);
  const PaperFrame f = field_frame(b);  // the frame of Figures 2 and 4, whose fills the picture re-uses
  const Box box = paper_box(f, b).grown(2.0);
  // paper = a·world + c per axis, read off the frame, so the page never restates its formula.
  const Point origin = f.to_paper({0, 0}), one = f.to_paper({1, 1});
  nlohmann::json materials = nlohmann::json::array();
  for (const Material& m : section.materials) materials.push_back(m.id);
  std::string j = "{";
  j += fmt::format("\"raster_step_m\":{},", data.raster_step);
  j += fmt::format("\"map\":[{},{},{},{}],", one.x - origin.x, origin.x, one.y - origin.y, origin.y);
  j += fmt::format("\"viewbox\":[{},{},{},{}],", svg::num(box.x0), svg::num(box.y0), svg::num(box.x1 - box.x0), svg::num(box.y1 - box.y0));
  j += fmt::format("\"seam\":{},\"theta_decimals\":{},\"q_decimals\":{},", field_seam_width, digits::surface_temperature, heat_flux_density_decimals);
  // Points in whole µm (the geometry grid is 10 µm); θ to 1e-5 K and |q| to 1e-3 W/m², well below
  // the digits shown, so the read-out is the solver's linear field rounded for display.
  j += "\"x_um\":[" + joined(data.points, [](Point p) { return fmt::format("{}", std::llround(p.x * 1e6)); }) + "],";
  j += "\"y_um\":[" + joined(data.points, [](Point p) { return fmt::format("{}", std::llround(p.y * 1e6)); }) + "],";
  j += "\"theta\":[" + joined(data.temperature, [](double t) { return fmt::format("{:.5f}", t); }) + "],";
  j += "\"triangles\":[" + joined(data.triangles, [](const std::array<int, 3>& t) { return fmt::format("{},{},{}", t[0], t[1], t[2]); }) + "],";
  j += "\"q\":[" + joined(data.heat_flux, [](double q) { return fmt::format("{:.3f}", q); }) + "],";
  j += "\"material\":[" + joined(data.material, [](int m) { return fmt::format("{}", m); }) + "],";
  j += "\"materials\":" + materials.dump() + "}";
  // Inside <script> only "</" could end the element early; JSON allows "<" as \u003c in strings,
  // and nowhere else can it occur.
  std::string safe;
  safe.reserve(j.size());
  for (char c : j) safe += c == '<' ? std::string("\\u003c") : std::string(1, c);
  return safe;
}

std::string explorable_field_section(const CrossSection& section, const Calculation& calc, const std::vector<Drawing>& drawings, int max_triangles) {
  if (!has_drawing(drawings, "temperature") || calc.mesh.triangles.empty()) return "";
  const bool with_flux = has_drawing(drawings, "heat-flux");
  const ExplorableMesh data = explorable_mesh(calc, max_triangles);
  const Bounds b = section_bounds(calc.mesh);
  const PaperFrame f = field_frame(b);
  const Box box = paper_box(f, b).grown(2.0);
  const std::vector<double>& T = calc.surface_temperature.temperature;
  const TemperatureScale scale = temperature_scale(T);
  const int number = figure_number(drawings, "");

  // Shared by the screen picture and its printed copy: isotherms and the section's lines, drawn
  // at a constant width on screen whatever the zoom.
  std::string lines;
  for (double level : scale.isotherm_levels())
    for (const auto& line : isotherm(calc.mesh, f, T, level).lines)
      for (std::size_t i = 0; i < line.size(); ++i) lines += fmt::format("{}{} {}", i == 0 ? "M" : "L", num(line[i].x), num(line[i].y));
  std::string defs = "<defs>\n";
  defs += fmt::format("<g id=\"xf-isolines\" fill=\"none\" stroke-linejoin=\"round\"><path d=\"{0}\" stroke=\"#fff\" stroke-opacity=\"0.75\" "
                      "stroke-width=\"2.4\" vector-effect=\"non-scaling-stroke\"/><path d=\"{0}\" stroke=\"#111\" stroke-width=\"1\" "
                      "vector-effect=\"non-scaling-stroke\"/></g>\n",
                      lines);
  defs += "<g id=\"xf-outline\">\n" + section_overlay(section, calc.mesh, f) + "</g>\n";  // widths: explorable_field_css
  // The ring at θsi,min, in each picture (not shared: the script shrinks the screen one's radius
  // as it zooms, like the seams, so it keeps its size on screen).
  std::string ring;
  if (calc.junction.min_interior_surface) {
    const Point p = f.to_paper(calc.junction.min_interior_surface->at);
    ring = fmt::format("<circle class=\"xf-ring\" cx=\"{0}\" cy=\"{1}\" r=\"1.3\" fill=\"none\" stroke=\"#fff\" stroke-width=\"3.5\" "
                       "vector-effect=\"non-scaling-stroke\"/><circle class=\"xf-ring\" cx=\"{0}\" cy=\"{1}\" r=\"1.3\" fill=\"none\" "
                       "stroke=\"#000\" stroke-width=\"1.5\" vector-effect=\"non-scaling-stroke\"/>",
                       num(p.x), num(p.y));
  }
  defs += "</defs>\n";
  const std::string view_box = fmt::format("{} {} {} {}", num(box.x0), num(box.y0), num(box.x1 - box.x0), num(box.y1 - box.y0));
  const std::string size = fmt::format("width=\"{}mm\" height=\"{}mm\" viewBox=\"{}\"", num(box.x1 - box.x0), num(box.y1 - box.y0), view_box);
  const std::string seam = fmt::format("stroke-width=\"{}\" stroke-linejoin=\"round\"", num(field_seam_width));

  std::string h = "<section class=\"appendix\" id=\"appendix-explore\">\n";
  h += fmt::format("<style>{}</style>\n", explorable_field_css);
  h += "<h3 class=\"xf-heading\">Explorable temperature field</h3>\n";
  h += "<figure id=\"explore\" class=\"xf\">\n";
  h += "<div class=\"xf-controls\" role=\"group\" aria-label=\"Picture controls\">"
       "<label><input type=\"checkbox\" id=\"xf-isotherms\" checked> isotherms</label>";
  if (with_flux)
    h += "<span>colour: <label><input type=\"radio\" name=\"xf-colour\" value=\"theta\" checked> θ</label> "
         "<label><input type=\"radio\" name=\"xf-colour\" value=\"q\"> |q|</label></span>";
  h += "<span><button type=\"button\" id=\"xf-zoom-in\" title=\"Zoom in\">+</button> <button type=\"button\" id=\"xf-zoom-out\" title=\"Zoom out\">−</button> "
       "<button type=\"button\" id=\"xf-reset\">reset</button></span></div>\n";
  h += "<div class=\"xf-readout\"><span class=\"xf-hint\">Point at the picture or tap it to read θ, |q| and the material; "
       "wheel or +/− to zoom, drag to move.</span><span class=\"xf-values\" hidden>θ = <b data-xf=\"theta\"></b> °C · |q| = <b data-xf=\"q\"></b> "
       "W/m² · <b data-xf=\"material\"></b></span></div>\n";
  h += fmt::format("<div class=\"xf-stage\"><svg xmlns=\"http://www.w3.org/2000/svg\" id=\"xf-svg\" class=\"xf-svg\" {} role=\"img\">\n"
                   "<title>Explorable temperature field</title>\n",
                   size);
  h += defs;
  h += fmt::format("<rect x=\"{}\" y=\"{}\" width=\"{}\" height=\"{}\" fill=\"#fff\"/>\n", num(box.x0), num(box.y0), num(box.x1 - box.x0), num(box.y1 - box.y0));
  h += fmt::format("<g id=\"xf-theta\"><use class=\"xf-fill\" href=\"#temperature-bands\" {}/></g>\n", seam);
  if (with_flux) h += fmt::format("<g id=\"xf-q\" display=\"none\"><use class=\"xf-fill\" href=\"#heat-flux-classes\" {}/></g>\n", seam);
  h += "<use href=\"#xf-outline\"/>\n<g id=\"xf-iso\"><use href=\"#xf-isolines\"/></g>\n" + ring + "\n";
  h += "<circle id=\"xf-cursor\" r=\"1\" fill=\"none\" stroke=\"#e00\" stroke-width=\"2\" vector-effect=\"non-scaling-stroke\" display=\"none\"/>\n";
  h += "</svg></div>\n";
  // The printed figure: the same layers at the full view, with no controls.
  h += fmt::format("<svg xmlns=\"http://www.w3.org/2000/svg\" class=\"xf-print\" {} role=\"img\"><title>Temperature field</title>\n"
                   "<use href=\"#temperature-bands\" {}/><use href=\"#xf-outline\"/><use href=\"#xf-isolines\"/>{}</svg>\n",
                   size, seam, ring);
  const std::string flux_figure = with_flux ? fmt::format(" (as Figure {})", figure_number(drawings, "heat-flux")) : "";
  std::string caption = fmt::format(
      "θ of the surface-temperature run (as Figure 2), interpolated linearly in the triangle under the pointer from the nodal "
      "temperatures; |q| of the heat-loss run{}, constant on each triangle; and the triangle's material. Colours as in the figures "
      "named; isotherms every {} K{}. ",
      flux_figure, num(scale.step), calc.junction.min_interior_surface ? "; the ring marks θsi,min" : "");
  if (data.raster_step > 0)
    caption += fmt::format("The mesh has {} triangles, too many to embed: the read-out uses the solver's triangles along the outline, so "
                           "the surfaces read exactly, and inside a regular raster sample every {} mm (the solver's values at the raster "
                           "points, linear between them); in the strip between the two it reads the nearest point of either. ",
                           calc.mesh.n_triangles(), fixed(data.raster_step * 1000.0, 1));
  else
    caption += fmt::format("The read-out uses the final mesh itself ({} triangles), so it shows the solver's own linear field. ", calc.mesh.n_triangles());
  caption += "On screen it can be zoomed and explored; printed, it shows the whole field.";
  h += fmt::format("<figcaption><b>Figure {}. Explorable temperature field.</b> {}</figcaption>\n</figure>\n", number, escape(caption));
  h += "<script type=\"application/json\" id=\"xf-data\">" + explorable_field_json(section, calc, data) + "</script>\n";
  h += fmt::format("<script>{}</script>\n", explorable_field_script);
  h += "</section>\n";
  return h;
}

}  // namespace edgeflux
