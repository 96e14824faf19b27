// Writes sweep and comparison results: CSV for spreadsheets, an HTML page for people.
#include "report/variants_page.h"

#include <fmt/format.h>

#include <algorithm>
#include <cmath>
#include <map>
#include <set>

#include "physics/moisture_verdict.h"
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
  out += ",min_interior_surface_temperature_c,frsi,required_frsi,passes,nodes,error\n";
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
    out += "," + number(v.min_surface_temperature) + "," + number(v.temperature_factor) + "," +
           number(v.required_temperature_factor) + "," + (v.passes ? (*v.passes ? "yes" : "no") : "") + "," +
           (v.error.empty() ? std::to_string(v.nodes) : "") + "," + csv_field(v.error) + "\n";
  }
  return out;
}

std::string variants_page(const std::string& heading, const std::vector<VariantSummary>& variants,
                          const std::vector<std::string>& parameter_names) {
  const auto systems = systems_present(variants);
  std::string html = fmt::format(
      "<!DOCTYPE html><html lang=\"en\"><head><meta charset=\"utf-8\"><title>{0}</title><style>"
      "body{{font-family:system-ui,sans-serif;margin:2em;color:#222;max-width:1100px}}"
      "table{{border-collapse:collapse;margin:1em 0;font-size:14px}}th,td{{border:1px solid #bbb;padding:4px 8px;text-align:right;white-space:nowrap}}"
      "th{{background:#eef2f6}}td.l{{text-align:left}}.fail{{color:#B00020;font-weight:600}}.pass{{color:#006B3C;font-weight:600}}"
      ".caution{{background:#fff8e1;border-left:4px solid #E69F00;padding:0.5em 1em}}figure{{margin:1em 0}}"
      "@media print{{body{{margin:1cm}}figure{{break-inside:avoid}}}}</style></head><body><h1>{0}</h1>"
      "<p>edgeflux {1}. ψ in W/(m·K) with the estimated discretisation error; fRsi from the surface-temperature run "
      "(ISO 13788: interior Rsi 0.25 m²K/W).</p>",
      xml_escape(heading), EDGEFLUX_VERSION);
  html += "<table><tr><th class=\"l\">variant</th>";
  for (DimensionSystem s : systems) html += fmt::format("<th>ψ {}</th>", dimension_system_name(s));
  html += "<th>L2D</th><th>θsi,min [°C]</th><th>fRsi</th><th>required</th><th>verdict</th><th>nodes</th></tr>";
  for (const VariantSummary& v : variants) {
    html += fmt::format("<tr><td class=\"l\">{}</td>", xml_escape(v.label));
    if (!v.error.empty()) {
      html += fmt::format("<td class=\"l fail\" colspan=\"{}\">not calculated: {}</td></tr>", systems.size() + 6, xml_escape(v.error));
      continue;
    }
    for (DimensionSystem s : systems) {
      std::string cell = "—";
      for (std::size_t i = 0; i < v.psi.size(); ++i)
        if (v.psi[i].system == s) cell = fmt::format("{:+.4f} ± {:.4f}", v.psi[i].psi, v.psi_error[i]);
      html += "<td>" + cell + "</td>";
    }
    html += fmt::format("<td>{}</td><td>{}</td><td>{}</td><td>{}</td><td class=\"{}\">{}</td><td>{}</td></tr>",
                        v.coupling_2d ? fmt::format("{:.4f}", *v.coupling_2d) : "—",
                        v.min_surface_temperature ? fmt::format("{:.2f}", *v.min_surface_temperature) : "—",
                        v.temperature_factor ? fmt::format("{:.3f}", *v.temperature_factor) : "—",
                        v.required_temperature_factor ? fmt::format("{:.3f}", *v.required_temperature_factor) : "—",
                        v.passes ? (*v.passes ? "pass" : "fail") : "", v.passes ? (*v.passes ? "passes" : "fails") : "—",
                        v.nodes);
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
        if (v->required_temperature_factor) required = *v->required_temperature_factor;
      }
      frsi_series.push_back(line);
    }
    html += "<figure>" + line_plot("Linear thermal transmittance ψ", x_name, "ψ [W/(m·K)]", psi_series, {}) + "</figure>";
    std::vector<std::pair<double, std::string>> limits;
    if (required) limits.push_back({*required, fmt::format("required {:.3f}", *required)});
    html += "<figure>" + line_plot("Temperature factor fRsi", x_name, "fRsi [–]", frsi_series, limits) + "</figure>";
  }
  html += "<div class=\"caution\"><p><strong>Cautions</strong></p><ul>";
  for (const std::string& c : standard_cautions()) html += "<li>" + xml_escape(c) + "</li>";
  html += "</ul></div></body></html>\n";
  return html;
}

}  // namespace edgeflux
