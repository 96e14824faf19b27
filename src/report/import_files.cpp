#include "report/import_files.h"

#include <fmt/format.h>

#include <filesystem>
#include <set>

#include "report/svg_support.h"

namespace edgeflux {

namespace {

/// Millimetres to 0.001 mm without trailing zeros.
std::string mm(double metres) {
  std::string s = fmt::format("{:.3f}", metres * 1000.0);
  while (s.back() == '0') s.pop_back();
  if (s.back() == '.') s.pop_back();
  return s == "-0" ? "0" : s;
}

/// XML comments may not hold "--".
std::string comment_text(std::string text) {
  for (std::size_t k; (k = text.find("--")) != std::string::npos;) text.replace(k, 2, "- -");
  return text;
}

std::string path_text(const OutlineRun& run) {
  std::string text;
  for (Point p : run.points) text += (text.empty() ? "" : " ") + mm(p.x) + "," + mm(p.y);
  if (run.closed) text += " " + mm(run.points.front().x) + "," + mm(run.points.front().y);
  return text;
}

std::string run_ends(const OutlineRun& run) {
  const Point a = run.points.front(), b = run.closed ? run.points.front() : run.points.back();
  return fmt::format("({}, {}) to ({}, {}) mm", mm(a.x), mm(a.y), mm(b.x), mm(b.y));
}

}  // namespace

std::string import_summary_text(const DrawingImport& import) {
  const CadDrawing& d = import.drawing;
  std::string out = fmt::format("Drawing {} (unit: {}{})\n\n", d.file, d.unit, d.unit_stated ? ", from $INSUNITS" : ", none stated: assumed");
  out += fmt::format("  {:<24} {:>8} {:>9} {:>7}   {}\n", "layer", "entities", "outlines", "chains", "extent [mm]");
  std::set<std::string> mapped(import.mapped_layers.begin(), import.mapped_layers.end());
  for (const DrawingLayer& l : d.layers) {
    if (l.entities == 0) continue;  // layers every drawing has (0, definition points) when empty
    const std::string extent = l.outlines + l.chains > 0
                                   ? fmt::format("({}, {}) to ({}, {})", mm(l.lower.x), mm(l.lower.y), mm(l.upper.x), mm(l.upper.y))
                                   : "—";
    out += fmt::format("{} {:<24} {:>8} {:>9} {:>7}   {}\n", mapped.count(l.name) ? "*" : " ", l.name, l.entities, l.outlines,
                       l.chains, extent);
  }
  out += "  (* mapped to a material)\n";
  if (!d.ignored.empty()) {
    std::string list;
    for (const auto& [type, count] : d.ignored) list += fmt::format("{}{} {}", list.empty() ? "" : ", ", count, type);
    out += fmt::format("  left out (annotation and other entities): {}\n", list);
  }
  for (const std::string& s : d.splines) out += fmt::format("  spline not read: {}\n", s);

  out += fmt::format("\nMaterials ({}):\n", import.materials.size());
  for (const ImportedMaterial& m : import.materials) {
    std::string layers;
    for (const std::string& l : m.layers) layers += (layers.empty() ? "" : ", ") + l;
    out += fmt::format("  {:<24} {}  from layer{} {}\n", m.id,
                       m.library ? fmt::format("λ {:.3f} W/(m·K) ({})", m.library->conductivity, m.library->id)
                                 : std::string("λ to be filled in"),
                       m.layers.size() == 1 ? "" : "s", layers);
  }
  out += fmt::format("\nRegions: {} (R1 … R{} in the picture, painted in this order)\n", import.section.regions.size(),
                     import.section.regions.size());
  out += fmt::format("Candidate surfaces: {} runs of the outline between corners (S1 … S{}):\n", import.runs.size(), import.runs.size());
  for (std::size_t k = 0; k < import.runs.size(); ++k) {
    const OutlineRun& run = import.runs[k];
    out += fmt::format("  S{:<3} {:>9.1f} mm  {}{}  along {}\n", k + 1, run.length * 1000.0, run_ends(run), run.closed ? " (closed loop)" : "",
                       import.section.regions[run.region].name);
  }
  for (const std::string& w : import.warnings) out += fmt::format("  ! {}\n", w);
  out += fmt::format("Read and analysed in {:.3f} s.\n", import.seconds);
  return out;
}

std::string starting_detail_xml(const DrawingImport& import, const std::string& drawing_path, const std::string& detail_path,
                                const std::string& picture_path) {
  namespace fs = std::filesystem;
  const fs::path folder = fs::absolute(fs::path(detail_path)).parent_path();
  const std::string drawing_ref = fs::relative(fs::absolute(fs::path(drawing_path)), folder).generic_string();
  const std::string picture_ref =
      picture_path.empty() ? "" : fs::relative(fs::absolute(fs::path(picture_path)), folder).generic_string();

  std::string x = "<?xml version=\"1.0\" encoding=\"UTF-8\"?>\n";
  x += fmt::format(
      "<!-- Starting detail written by 'edgeflux import' from {}. Before solving:\n"
      "     1. give every material with conductivity=\"?\" its design value λ in W/(m·K) and its source\n"
      "        (the product's declared value, ISO 10456, or 'edgeflux materials');\n"
      "     2. pick the surfaces from the candidates below by their numbers S1, S2, … {}: uncomment\n"
      "        each face exposed to a room or to the outside and set its environment and resistance;\n"
      "        runs left commented out are adiabatic (cut-off planes, symmetry lines);\n"
      "     3. set the environments' temperatures, and add flanking elements for ψ (docs/detail-format.md).\n"
      "     The geometry stays in the drawing: when it is revised, solve this file again. -->\n",
      comment_text(drawing_ref), picture_ref.empty() ? "(edgeflux import … --picture shows them)"
                                                      : "in the picture " + comment_text(picture_ref));
  x += "<edgeflux-detail format=\"1\" units=\"mm\">\n";
  x += fmt::format("  <title>{}</title>\n", svg::escape(import.section.title));
  x += "  <materials>\n";
  for (const ImportedMaterial& m : import.materials) {
    if (m.library)
      x += fmt::format("    <material id=\"{}\" library=\"{}\"/>\n", svg::escape(m.id), svg::escape(m.library->id));
    else
      x += fmt::format("    <material id=\"{}\" conductivity=\"?\" source=\"?\"/>\n", svg::escape(m.id));
  }
  x += "  </materials>\n  <regions>\n";
  x += fmt::format("    <drawing file=\"{}\" units=\"{}\">\n", svg::escape(drawing_ref), import.drawing.unit);
  for (const ImportedMaterial& m : import.materials)
    for (const std::string& layer : m.layers)
      x += fmt::format("      <layer name=\"{}\" material=\"{}\"/>\n", svg::escape(layer), svg::escape(m.id));
  x += "    </drawing>\n  </regions>\n";
  x += "  <environments>\n"
       "    <environment id=\"inside\" temperature=\"20\" side=\"interior\"/>\n"
       "    <environment id=\"outside\" temperature=\"-5\" side=\"exterior\"/>\n"
       "  </environments>\n  <boundaries>\n";
  x += "    <!-- Candidate surfaces: the outline between its corners, numbered as in the picture.\n"
       "         resistance: rsi-horizontal, rsi-upward, rsi-downward, rse, or a value in m²K/W. -->\n";
  for (std::size_t k = 0; k < import.runs.size(); ++k) {
    const OutlineRun& run = import.runs[k];
    x += fmt::format("    <!-- S{}: {:.1f} mm along {} -->\n", k + 1, run.length * 1000.0,
                     comment_text(import.section.regions[run.region].name));
    x += fmt::format("    <!-- <surface name=\"S{}\" environment=\"?\" resistance=\"?\" path=\"{}\"/> -->\n", k + 1,
                     path_text(run));
  }
  std::set<std::string> mapped(import.mapped_layers.begin(), import.mapped_layers.end());
  for (const DrawingLayer& l : import.drawing.layers)
    if (l.chains > 0 && !mapped.count(l.name))
      x += fmt::format("    <!-- open lines on layer {}: <surface name=\"{}\" environment=\"?\" resistance=\"?\" "
                       "drawing-layer=\"{}\"/> -->\n",
                       comment_text(l.name), comment_text(svg::escape(l.name)), comment_text(svg::escape(l.name)));
  x += "  </boundaries>\n</edgeflux-detail>\n";
  return x;
}

}  // namespace edgeflux
