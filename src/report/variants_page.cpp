// Writes sweep and comparison results: CSV for spreadsheets, an HTML page for people.
#include "report/variants_page.h"

#include <fmt/format.h>

#include <algorithm>
#include <cmath>
#include <map>
#include <set>

#include "physics/moisture_verdict.h"
#include "report/number_format.h"
#include "report/text_format.h"

namespace edgeflux {
namespace {

const char* system_column(DimensionSystem s) {
  return s == DimensionSystem::internal ? "psi_internal" : s == DimensionSystem::overall_internal ? "psi_overall_internal" : "psi_external";
}



std::optional<double> psi_of(const VariantSummary& v, DimensionSystem s) {
  for (const PsiValue& p : v.psi)
    if (p.system == s) return p.psi;
  return std::nullopt;
}

const KindVerdict* verdict_of(const VariantSummary& v, SurfaceKind kind) {
  for (const KindVerdict& k : v.verdicts)
    if (k.kind == kind) return &k;
  return nullptr;
}

std::set<DimensionSystem> systems_present(const std::vector<VariantSummary>& variants) {
  std::set<DimensionSystem> systems;
  for (const VariantSummary& v : variants)
    for (const PsiValue& p : v.psi) systems.insert(p.system);
  return systems;
}

// Colour-blind-safe qualitative palette (Okabe & Ito, 2008).
constexpr const char* palette[] = {"#0072B2", "#D55E00", "#009E73", "#CC79A7", "#E69F00", "#56B4E9", "#000000"};

struct Series {
  std::string name;
  std::vector<std::pair<double, double>> points;
};

/// A line plot as inline SVG: axes with round ticks, one polyline with markers per series, and
/// optional horizontal reference lines (value, label).
std::string line_plot(const std::string& title, const std::string& x_label, const std::string& y_label,
                      const std::vector<Series>& series, const std::vector<std::pair<double, std::string>>& references) {
  double x0 = 1e300, x1 = -1e300, y0 = 1e300, y1 = -1e300;
  for (const Series& s : series)
    for (auto [x, y] : s.points) x0 = std::min(x0, x), x1 = std::max(x1, x), y0 = std::min(y0, y), y1 = std::max(y1, y);
  for (const auto& r : references) y0 = std::min(y0, r.first), y1 = std::max(y1, r.first);
  if (x0 > x1) return "";
  if (x1 - x0 < 1e-12) x0 -= 1, x1 += 1;
  if (y1 - y0 < 1e-12) y0 -= 0.01, y1 += 0.01;
  const double pad = 0.08 * (y1 - y0);
  y0 -= pad, y1 += pad;
  const double width = 760, height = 380, left = 70, right = 230, top = 36, bottom = 50;
  auto sx = [&](double x) { return left + (x - x0) / (x1 - x0) * (width - left - right); };
  auto sy = [&](double y) { return height - bottom - (y - y0) / (y1 - y0) * (height - top - bottom); };
  auto ticks = [](double lo, double hi) {
    const double raw = (hi - lo) / 5, mag = std::pow(10, std::floor(std::log10(raw)));
    const double step = raw / mag < 2 ? 2 * mag : raw / mag < 5 ? 5 * mag : 10 * mag;
    std::vector<double> t;
    for (double v = std::ceil(lo / step) * step; v <= hi + 1e-9 * step; v += step) t.push_back(std::abs(v) < 1e-12 * step ? 0 : v);
    return t;
  };
  std::string svg = fmt::format(
      "<svg xmlns=\"http://www.w3.org/2000/svg\" viewBox=\"0 0 {0} {1}\" width=\"{0}\" height=\"{1}\" role=\"img\" "
      "aria-label=\"{2}\"><rect width=\"100%\" height=\"100%\" fill=\"white\"/>"
      "<text x=\"{3}\" y=\"22\" font-size=\"15\" font-weight=\"600\">{2}</text>",
      width, height, xml_escape(title), left);
  for (double t : ticks(x0, x1))
    svg += fmt::format("<line x1=\"{0:.1f}\" y1=\"{1}\" x2=\"{0:.1f}\" y2=\"{2}\" stroke=\"#ddd\"/><text x=\"{0:.1f}\" y=\"{3}\" "
                       "font-size=\"12\" text-anchor=\"middle\">{4:g}</text>",
                       sx(t), top, height - bottom, height - bottom + 16, t);
  for (double t : ticks(y0, y1))
    svg += fmt::format("<line x1=\"{0}\" y1=\"{1:.1f}\" x2=\"{2}\" y2=\"{1:.1f}\" stroke=\"#ddd\"/><text x=\"{3}\" y=\"{4:.1f}\" "
                       "font-size=\"12\" text-anchor=\"end\">{5:g}</text>",
                       left, sy(t), width - right, left - 6, sy(t) + 4, t);
  svg += fmt::format("<rect x=\"{}\" y=\"{}\" width=\"{}\" height=\"{}\" fill=\"none\" stroke=\"#444\"/>", left, top,
                     width - left - right, height - top - bottom);
  svg += fmt::format("<text x=\"{}\" y=\"{}\" font-size=\"13\" text-anchor=\"middle\">{}</text>", (left + width - right) / 2,
                     height - 12, xml_escape(x_label));
  svg += fmt::format("<text transform=\"translate(16 {}) rotate(-90)\" font-size=\"13\" text-anchor=\"middle\">{}</text>",
                     (top + height - bottom) / 2, xml_escape(y_label));
  for (const auto& [value, label] : references)
    svg += fmt::format("<line x1=\"{0}\" y1=\"{1:.1f}\" x2=\"{2}\" y2=\"{1:.1f}\" stroke=\"#B00020\" stroke-dasharray=\"6 4\" "
                       "stroke-width=\"1.5\"/><text x=\"{3}\" y=\"{4:.1f}\" font-size=\"12\" fill=\"#B00020\">{5}</text>",
                       left, sy(value), width - right, width - right + 6, sy(value) + 4, xml_escape(label));
  for (std::size_t i = 0; i < series.size(); ++i) {
    const char* colour = palette[i % std::size(palette)];
    std::string path;
    for (auto [x, y] : series[i].points) path += fmt::format("{:.1f},{:.1f} ", sx(x), sy(y));
    svg += fmt::format("<polyline points=\"{}\" fill=\"none\" stroke=\"{}\" stroke-width=\"2\"/>", path, colour);
    for (auto [x, y] : series[i].points)
      svg += fmt::format("<circle cx=\"{:.1f}\" cy=\"{:.1f}\" r=\"3.5\" fill=\"{}\"/>", sx(x), sy(y), colour);
    svg += fmt::format("<text x=\"{}\" y=\"{}\" font-size=\"12\" fill=\"{}\">{}</text>", width - right + 6,
                       top + 14 + 16 * i + (references.empty() ? 0 : 0), colour, xml_escape(series[i].name));
  }
  return svg + "</svg>";
}

}  // namespace

std::string variants_csv(const std::vector<VariantSummary>& variants, const std::vector<std::string>& parameter_names) {
  const auto systems = systems_present(variants);
  std::string out = "label";
  for (const std::string& name : parameter_names) out += "," + csv_field(name);
  out += ",l2d_w_per_mk,l2d_error_w_per_mk";
  for (DimensionSystem s : systems) out += fmt::format(",{0}_w_per_mk,{0}_error_w_per_mk", system_column(s));
  out += ",min_interior_surface_temperature_c,frsi";
  for (const char* kind : {"opaque", "glazing"}) out += fmt::format(",frsi_{0},required_frsi_{0},criteria_{0}", kind);
  out += ",criteria_statements,climate,input_sha256,nodes,error\n";
  auto number = [](const std::optional<double>& v) { return v ? fmt::format("{:.9g}", *v) : std::string(); };
  for (const VariantSummary& v : variants) {
    out += csv_field(v.label);
    for (const std::string& name : parameter_names)
      out += "," + (v.parameters.count(name) ? fmt::format("{:.9g}", v.parameters.at(name)) : std::string());
    out += "," + number(v.coupling_2d) + "," + number(v.coupling_2d_error);
    for (DimensionSystem s : systems) {
      std::optional<double> error;
      for (std::size_t i = 0; i < v.psi.size(); ++i)
        if (v.psi[i].system == s && i < v.psi_error.size()) error = v.psi_error[i];
      out += "," + number(psi_of(v, s)) + "," + number(error);
    }
    out += "," + number(v.min_surface_temperature) + "," + number(v.temperature_factor);
    std::string statements;
    for (SurfaceKind kind : {SurfaceKind::opaque, SurfaceKind::glazing}) {
      const KindVerdict* k = verdict_of(v, kind);
      out += "," + (k ? number(k->temperature_factor) + "," + number(k->required_temperature_factor) + "," + criteria_outcome(k->criteria) : ",,");
      if (k)
        for (const CriterionCheck& c : k->criteria)
          statements += (statements.empty() ? "" : "; ") + std::string(kind == SurfaceKind::glazing ? "glazing and frames: " : "opaque: ") +
                        criterion_statement(c, k->temperature_factor);
    }
    out += "," + csv_field(statements) + "," + csv_field(v.climate) + "," + v.input_sha256 + "," +
           (v.error.empty() ? std::to_string(v.nodes) : "") + "," + csv_field(v.error) + "\n";
  }
  return out;
}

std::string mesh_reuse_note(const std::vector<VariantSummary>& variants) {
  std::map<std::string, int> reused;  // leader's label → variants solved on its meshes
  for (const VariantSummary& v : variants)
    if (!v.meshes_from.empty()) ++reused[v.meshes_from];
  if (reused.empty()) return "";
  std::string note;
  for (const auto& [leader, count] : reused)
    note += fmt::format("{}{} {} solved on the meshes refined for \"{}\"", note.empty() ? "" : "; ", count,
                        count == 1 ? "variant was" : "variants were", leader);
  return note + " (same geometry, other conductivities), each with its own error estimate from its own values on "
                "those meshes, refined further where they were not fine enough for it; --from-scratch meshes every "
                "variant on its own.";
}

std::string variants_page(const std::string& heading, const std::vector<VariantSummary>& variants,
                          const std::vector<std::string>& parameter_names, const std::string& generated) {
  const auto systems = systems_present(variants);
  const bool glazing = std::any_of(variants.begin(), variants.end(), [](const VariantSummary& v) { return verdict_of(v, SurfaceKind::glazing); });
  std::set<std::string> climates;
  double largest_error = 0.0;
  for (const VariantSummary& v : variants) {
    if (!v.climate.empty()) climates.insert(v.climate);
    for (double e : v.psi_error) largest_error = std::max(largest_error, e);
  }
  std::string html = fmt::format(
      "<!DOCTYPE html><html lang=\"en\"><head><meta charset=\"utf-8\"><title>{0}</title><style>"
      "body{{font-family:\"DejaVu Sans\",system-ui,sans-serif;margin:2em;color:#222;max-width:1100px;font-size:14px}}"
      "table{{border-collapse:collapse;margin:1em 0;font-size:13px}}th,td{{border:1px solid #bbb;padding:3px 6px;text-align:right}}"
      "td{{white-space:nowrap}}th{{background:#eef2f6}}td.l,th.l{{text-align:left}}td.w{{white-space:normal;text-align:left;font-size:11px}}"
      ".notmet{{color:#B00020;font-weight:600}}.met{{color:#006B3C;font-weight:600}}"
      ".caution{{background:#fff8e1;border-left:4px solid #E69F00;padding:0.5em 1em}}figure{{margin:1em 0}}figure svg{{max-width:100%;height:auto}}"
      "code{{font-size:11px}}"
      "@page{{margin:14mm 12mm;@top-left{{content:\"{2}\";font-size:8pt;color:#555}}@bottom-right{{content:\"page \" counter(page) \" of \" counter(pages);font-size:8pt;color:#555}}}}"
      "@media print{{body{{margin:0;max-width:none;font-size:10px}}table{{font-size:9px}}figure{{break-inside:avoid}}tr{{break-inside:avoid}}}}"
      "</style></head><body><h1>{0}</h1>"
      "<p>edgeflux {1}, calculated {3}. ψ in W/(m·K), rounded to {4} decimals; largest estimated discretisation error of ψ over "
      "all variants {5} W/(m·K); * marks the dimension system carried forward. f<sub>Rsi</sub> from the surface-temperature run "
      "(ISO 13788: interior Rsi 0.25 m²K/W opaque, 0.13 glazing); opaque surfaces and glazing/frames are judged apart.</p>",
      xml_escape(heading), EDGEFLUX_VERSION, xml_escape(heading).substr(0, 80), xml_escape(generated), digits::psi,
      error_text(largest_error, digits::psi));
  if (const std::string note = mesh_reuse_note(variants); !note.empty()) html += "<p>" + xml_escape(note) + "</p>";
  html += "<p><b>Climate of the criteria:</b> ";
  for (const std::string& c : climates) html += xml_escape(c) + (c == *climates.rbegin() ? "" : "; ");
  html += climates.empty() ? "none (no interior/exterior pair)</p>" : "</p>";
  html += "<table><tr><th class=\"l\">variant</th>";
  for (DimensionSystem s : systems) html += fmt::format("<th>ψ {}</th>", dimension_system_name(s));
  html += "<th>L<sub>2D</sub></th><th>θ<sub>si,min</sub> [°C]</th><th>f<sub>Rsi</sub> opaque</th><th>required</th><th class=\"l\">opaque surfaces</th>";
  if (glazing) html += "<th>f<sub>Rsi</sub> glazing</th><th>required</th><th class=\"l\">glazing and frames</th>";
  html += "<th class=\"l\">input SHA-256</th></tr>";
  const std::size_t columns = systems.size() + 6 + (glazing ? 3 : 0);
  auto kind_cells = [](const VariantSummary& v, SurfaceKind kind) {
    const KindVerdict* k = verdict_of(v, kind);
    if (!k) return std::string("<td>—</td><td>—</td><td></td>");
    return fmt::format("<td>{}</td><td>{}</td><td class=\"l {}\">{}</td>", fixed(k->temperature_factor, digits::temperature_factor),
                       fixed(k->required_temperature_factor, digits::temperature_factor), k->met ? "met" : "notmet", criteria_outcome(k->criteria));
  };
  for (const VariantSummary& v : variants) {
    html += fmt::format("<tr><td class=\"l\">{}</td>", xml_escape(v.label));
    if (!v.error.empty()) {
      html += fmt::format("<td class=\"l notmet\" colspan=\"{}\">not calculated: {}</td></tr>", columns, xml_escape(v.error));
      continue;
    }
    for (DimensionSystem s : systems) {
      std::string cell = "—";
      if (auto p = psi_of(v, s)) cell = fixed(*p, digits::psi) + (v.carried_forward == s ? "*" : "");
      html += "<td>" + cell + "</td>";
    }
    html += fmt::format("<td>{}</td><td>{}</td>", v.coupling_2d ? fixed(*v.coupling_2d, digits::coupling) : "—",
                        v.min_surface_temperature ? fixed(*v.min_surface_temperature, digits::surface_temperature) : "—");
    html += kind_cells(v, SurfaceKind::opaque);
    if (glazing) html += kind_cells(v, SurfaceKind::glazing);
    html += fmt::format("<td class=\"l\"><code>{}</code></td></tr>", v.input_sha256.substr(0, 12));
    std::string statements;
    for (const KindVerdict& k : v.verdicts)
      for (const CriterionCheck& c : k.criteria)
        statements += fmt::format("{}{}: {}", statements.empty() ? "" : "; ", k.kind == SurfaceKind::glazing ? "glazing and frames" : "opaque",
                                  xml_escape(criterion_statement(c, k.temperature_factor)));
    if (!statements.empty()) html += fmt::format("<tr><td></td><td class=\"w\" colspan=\"{}\">{}</td></tr>", columns - 1, statements);
  }
  html += "</table>";

  if (!parameter_names.empty()) {
    // Lines against the first parameter, one per value of the second.
    const std::string& x_name = parameter_names[0];
    std::map<double, std::vector<const VariantSummary*>> groups;
    for (const VariantSummary& v : variants)
      if (v.error.empty()) groups[parameter_names.size() > 1 ? v.parameters.at(parameter_names[1]) : 0.0].push_back(&v);
    auto group_name = [&](double key, const std::string& quantity) {
      return parameter_names.size() > 1 ? fmt::format("{} = {:g}", parameter_names[1], key) : quantity;
    };
    std::vector<Series> psi_series, frsi_series;
    for (DimensionSystem s : systems)
      for (const auto& [key, members] : groups) {
        Series line{parameter_names.size() > 1 ? fmt::format("ψ {}, {}", dimension_system_name(s), group_name(key, ""))
                                               : fmt::format("ψ {}", dimension_system_name(s)), {}};
        for (const VariantSummary* v : members)
          if (auto p = psi_of(*v, s)) line.points.push_back({v->parameters.at(x_name), *p});
        psi_series.push_back(line);
      }
    std::optional<double> required;
    for (const auto& [key, members] : groups) {
      Series line{group_name(key, "fRsi"), {}};
      for (const VariantSummary* v : members) {
        if (v->temperature_factor) line.points.push_back({v->parameters.at(x_name), *v->temperature_factor});
        if (const KindVerdict* k = verdict_of(*v, SurfaceKind::opaque)) required = k->required_temperature_factor;
      }
      frsi_series.push_back(line);
    }
    html += "<figure>" + line_plot("Linear thermal transmittance ψ", x_name, "ψ [W/(m·K)]", psi_series, {}) + "</figure>";
    std::vector<std::pair<double, std::string>> limits;
    if (required) limits.push_back({*required, fmt::format("required (opaque) {:.3f}", *required)});
    html += "<figure>" + line_plot("Temperature factor fRsi", x_name, "fRsi [–]", frsi_series, limits) + "</figure>";
  }
  html += "<div class=\"caution\"><p><strong>Cautions</strong></p><ul>";
  for (const std::string& c : standard_cautions()) html += "<li>" + xml_escape(c) + "</li>";
  html += "</ul></div></body></html>\n";
  return html;
}

}  // namespace edgeflux
