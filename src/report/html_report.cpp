// Assembles the HTML report from the calculation and its drawings.
#include "report/html_report.h"

#include <fmt/format.h>

#include <algorithm>
#include <cmath>
#include <cstdlib>
#include <ctime>

#include "core/sha256.h"
#include "report/svg_support.h"
#include "report/text_format.h"
#include "physics/surface_resistance.h"

namespace edgeflux {
namespace {

using svg::escape;

// Numbers in tables use the ASCII minus, so they paste into spreadsheets as numbers.
std::string fixed(double v, int decimals) {
  if (std::abs(v) < 0.5 * std::pow(10.0, -decimals)) v = 0.0;
  return fmt::format("{:.{}f}", v, decimals);
}
std::string signed_fixed(double v, int decimals) {
  if (std::abs(v) < 0.5 * std::pow(10.0, -decimals)) v = 0.0;
  return fmt::format("{:+.{}f}", v, decimals);
}


std::string user_point(const CrossSection& section, Point p) {
  return fmt::format("({}, {}) {}", fixed(p.x / section.metres_per_unit, 1), fixed(p.y / section.metres_per_unit, 1), escape(section.unit));
}

const char* css = R"CSS(
:root { --ink: #1d232a; --muted: #56606b; --rule: #d3d8dd; --soft: #f4f6f8; --accent: #0b5a8a; --pass: #1b6e3a; --fail: #a4231c; --warn: #8a5a00; }
* { box-sizing: border-box; }
html { background: #e9ecef; }
body { font-family: "DejaVu Sans", "Liberation Sans", Arial, Helvetica, sans-serif; color: var(--ink); background: #fff;
       max-width: 200mm; margin: 0 auto; padding: 12mm 10mm 16mm; font-size: 10pt; line-height: 1.45; }
h1 { font-size: 17pt; margin: 0 0 2mm; line-height: 1.25; }
h2 { font-size: 12.5pt; margin: 8mm 0 2.5mm; padding-bottom: 1mm; border-bottom: 0.4mm solid var(--ink); }
h3 { font-size: 10.5pt; margin: 5mm 0 1.5mm; }
p { margin: 1.5mm 0; }
.kicker { text-transform: uppercase; letter-spacing: 0.08em; font-size: 8.5pt; color: var(--accent); font-weight: bold; margin-bottom: 1mm; }
.notes { color: #333; font-style: italic; }
.meta { display: grid; grid-template-columns: max-content 1fr; gap: 0.5mm 4mm; font-size: 8.5pt; color: var(--muted); margin: 3mm 0 0; }
.meta dt { font-weight: bold; } .meta dd { margin: 0; word-break: break-all; }
.key { display: grid; grid-template-columns: repeat(3, 1fr); gap: 2.5mm; margin: 3mm 0; }
.card { border: 0.3mm solid var(--rule); border-radius: 1.2mm; padding: 2.2mm 3mm; background: var(--soft); break-inside: avoid; }
.card .label { font-size: 8.5pt; color: var(--muted); }
.card .value { font-size: 15pt; font-weight: bold; }
.card .pm { font-size: 10pt; font-weight: normal; }
.card .unit { font-size: 9pt; font-weight: normal; color: var(--muted); }
.card .detail { font-size: 8.5pt; color: var(--muted); }
.verdict { border-left: 2mm solid var(--pass); background: #eef7f1; padding: 2.5mm 4mm; margin: 3mm 0; break-inside: avoid; }
.verdict.fails { border-left-color: var(--fail); background: #fbeeed; }
.badge { display: inline-block; font-weight: bold; color: #fff; background: var(--pass); border-radius: 1mm; padding: 0.3mm 2mm; margin-right: 2mm; }
.fails .badge { background: var(--fail); }
.cautions { border: 0.5mm solid var(--warn); background: #fff8e6; padding: 2.5mm 4mm; margin: 4mm 0; break-inside: avoid; }
.cautions h3 { margin-top: 0; color: var(--warn); }
.cautions ul, .warnings ul { margin: 1mm 0 0 5mm; padding: 0; }
.warnings { border: 0.5mm solid var(--fail); background: #fdf1f0; padding: 2.5mm 4mm; margin: 4mm 0; break-inside: avoid; }
.warnings h3 { margin-top: 0; color: var(--fail); }
table { border-collapse: collapse; width: 100%; margin: 2mm 0 3mm; font-size: 8.8pt; break-inside: avoid; }
th, td { border-bottom: 0.25mm solid var(--rule); padding: 1mm 2mm; text-align: left; vertical-align: top; }
th { background: var(--soft); font-weight: bold; border-bottom: 0.4mm solid #9aa3ad; }
td.nowrap { white-space: nowrap; }
td.num, th.num { text-align: right; font-variant-numeric: tabular-nums; white-space: nowrap; }
caption { caption-side: top; text-align: left; font-weight: bold; padding: 0 0 1mm; }
figure { margin: 4mm 0; break-inside: avoid; }
figure svg { display: block; max-width: 100%; height: auto; margin: 0 auto; }
figcaption { font-size: 8.5pt; color: var(--muted); margin-top: 2mm; }
figcaption b { color: var(--ink); }
.small { font-size: 8.5pt; color: var(--muted); }
.status { border: 0.3mm solid var(--rule); background: var(--soft); padding: 2mm 3mm; }
code, pre { font-family: "DejaVu Sans Mono", "Liberation Mono", monospace; font-size: 8pt; }
pre { white-space: pre-wrap; word-break: break-all; background: var(--soft); border: 0.3mm solid var(--rule); padding: 2mm; }
details summary { cursor: pointer; font-weight: bold; }
footer { margin-top: 8mm; font-size: 8pt; color: var(--muted); border-top: 0.3mm solid var(--rule); padding-top: 2mm; }
@page { size: A4; margin: 14mm 14mm 15mm 14mm; }
@media print {
  html { background: #fff; }
  body { max-width: none; margin: 0; padding: 0; font-size: 9pt; }
  .page-break { break-before: page; }
  h2 { break-after: avoid; }
  a { color: inherit; text-decoration: none; }
  details::details-content { content-visibility: visible; display: block; }
  details > pre { display: block; }
}
)CSS";

std::string key_card(const std::string& label, const std::string& value, const std::string& unit, const std::string& detail) {
  return fmt::format("<div class=\"card\"><div class=\"label\">{}</div><div class=\"value\">{} <span class=\"unit\">{}</span></div>{}</div>\n", label, value,
                     unit, detail.empty() ? "" : "<div class=\"detail\">" + detail + "</div>");
}

/// An estimated error in plain decimals, one significant digit rounded up, at most two digits finer
/// than the value it belongs to (shown with `decimals`): "0.00003"; smaller errors show as one unit
/// of that finest digit, an upper bound.
std::string error_text(double error, int decimals) {
  const int finest = decimals + 2;
  const double unit = std::pow(10.0, -finest);
  if (!(error >= unit)) return fmt::format("{:.{}f}", unit, finest);  // an upper bound at the finest digit shown
  const int d = std::clamp(static_cast<int>(-std::floor(std::log10(error))), decimals, finest);
  const double scale = std::pow(10.0, d);
  return fmt::format("{:.{}f}", std::ceil(error * scale - 1e-9) / scale, d);
}

/// " ± 0.00003" for a value with an estimated discretisation error, nothing without one.
std::string plus_minus(const std::optional<ErrorEstimate>& e, int decimals) {
  if (!e) return "";
  return " <span class=\"pm\">± " + error_text(e->error, decimals) + "</span>";
}


std::string climate_text(const Climate& c) {
  return fmt::format("{} °C and {} inside, {} °C outside", fixed(c.interior_temperature, 1),
                     c.interior_relative_humidity ? fixed(100 * *c.interior_relative_humidity, 0) + " % RH"
                                                  : fmt::format("humidity class {}", c.humidity_class.value_or(0)),
                     fixed(c.exterior_temperature, 1));
}

/// Evidence that the mesh is fine enough: the quantities on every mesh, the estimated errors and the
/// ISO 10211 doubling check; or, for a single fixed mesh, how to get that evidence.
std::string convergence_tables(const CrossSection& section, const Calculation& calc) {
  const Convergence& conv = calc.convergence;
  const JunctionResults& j = calc.junction;
  if (conv.levels.size() < 2)
    return "<p class=\"status\"><b>Mesh convergence:</b> one fixed mesh, no convergence evidence in this run. ISO 10211 asks that Σ|Φ| with n "
           "and 2n subdivisions differ by less than 1 %: repeat with twice the density and compare, or let edgeflux refine adaptively.</p>\n";
  std::string h = fmt::format("<table><caption>Mesh convergence ({} refinement, {} meshes)</caption><tr><th class=\"num\">Mesh</th><th class=\"num\">Nodes</th>",
                              conv.adaptive ? "adaptive" : "uniform", conv.levels.size());
  const bool has_l2d = std::any_of(conv.levels.begin(), conv.levels.end(), [](const ConvergenceLevel& l) { return l.coupling_2d.has_value(); });
  const bool has_min = std::any_of(conv.levels.begin(), conv.levels.end(), [](const ConvergenceLevel& l) { return l.min_surface_temperature.has_value(); });
  if (has_l2d) h += "<th class=\"num\">L<sub>2D</sub> [W/(m·K)]</th>";
  for (const PsiValue& p : j.psi) h += fmt::format("<th class=\"num\">ψ {} [W/(m·K)]</th>", dimension_system_name(p.system));
  if (has_min) h += "<th class=\"num\">θ<sub>si,min</sub> [°C]</th>";
  h += "<th class=\"num\">Σ|Φ| [W/m]</th></tr>\n";
  for (std::size_t k = 0; k < conv.levels.size(); ++k) {
    const ConvergenceLevel& l = conv.levels[k];
    h += fmt::format("<tr><td class=\"num\">{}</td><td class=\"num\">{}</td>", k + 1, l.nodes);
    if (has_l2d) h += fmt::format("<td class=\"num\">{}</td>", l.coupling_2d ? fixed(*l.coupling_2d, 5) : std::string("—"));
    for (std::size_t i = 0; i < j.psi.size(); ++i) h += fmt::format("<td class=\"num\">{}</td>", i < l.psi.size() ? fixed(l.psi[i], 4) : std::string("—"));
    if (has_min) h += fmt::format("<td class=\"num\">{}</td>", l.min_surface_temperature ? fixed(*l.min_surface_temperature, 3) : std::string("—"));
    h += fmt::format("<td class=\"num\">{}</td></tr>\n", fixed(l.sum_abs_heat_flow, 4));
  }
  auto error_cell = [](const std::optional<ErrorEstimate>& e, int decimals) {
    return fmt::format("<td class=\"num\">{}</td>", e ? "± " + error_text(e->error, decimals - 2) : std::string("—"));
  };
  h += "<tr><th colspan=\"2\">estimated error</th>";
  if (has_l2d) h += error_cell(conv.coupling_2d, 5);
  for (std::size_t i = 0; i < j.psi.size(); ++i)
    h += error_cell(i < conv.psi.size() ? std::optional<ErrorEstimate>(conv.psi[i]) : std::nullopt, 4);
  if (has_min) h += error_cell(conv.min_surface_temperature, 3);
  h += "<td></td></tr>\n";
  h += fmt::format("<tr><th colspan=\"2\">target</th>{}{}{}<td></td></tr>\n",
                   has_l2d ? fmt::format("<td class=\"num\">{:g} × L<sub>2D</sub></td>", conv.target.coupling_relative) : "",
                   [&] {
                     std::string s;
                     for (std::size_t i = 0; i < j.psi.size(); ++i) s += fmt::format("<td class=\"num\">± {:g}</td>", conv.target.psi_absolute);
                     return s;
                   }(),
                   has_min ? fmt::format("<td class=\"num\">± {:g} K</td>", conv.target.temperature_absolute) : "");
  h += "</table>\n";
  std::string status = conv.target_met ? "accuracy target met" : "<b>accuracy target NOT met</b>";
  if (!conv.stop_reason.empty()) status += " (" + escape(conv.stop_reason) + ")";
  if (conv.doubling)
    status += fmt::format("; ISO 10211 doubling check: Σ|Φ| {} W/m with {} nodes, {} W/m with {} nodes, change {:.3f} % (criterion &lt; 1 %): <b>{}</b>",
                          fixed(conv.doubling->coarse_sum, 4), conv.doubling->coarse_nodes, fixed(conv.doubling->fine_sum, 4), conv.doubling->fine_nodes,
                          100 * conv.doubling->relative_change, conv.doubling->passed ? "met" : "NOT MET");
  h += "<p class=\"small\">Errors are Richardson-type estimates from the last two meshes; " + status + ".</p>\n";
  (void)section;
  return h;
}

}  // namespace

std::string report_timestamp() {
  std::time_t now = std::time(nullptr);
  if (const char* epoch = std::getenv("SOURCE_DATE_EPOCH")) {
    char* end = nullptr;
    const long long v = std::strtoll(epoch, &end, 10);
    if (end && *end == '\0' && end != epoch) now = static_cast<std::time_t>(v);
  }
  std::tm utc{};
  gmtime_r(&now, &utc);
  char text[32];
  std::strftime(text, sizeof text, "%Y-%m-%d %H:%M UTC", &utc);
  return text;
}

std::string html_report(const CrossSection& section, const Calculation& calc, const std::vector<Drawing>& drawings,
                        const ReportProvenance& provenance) {
  const FieldResults& field = calc.heat_loss.field;
  const JunctionResults& j = calc.junction;
  const std::string title = section.title.empty() ? section.file : section.title;
  std::string h;
  auto add = [&](const std::string& s) { h += s; };

  add("<!DOCTYPE html>\n<html lang=\"en\">\n<head>\n<meta charset=\"utf-8\">\n");
  add("<meta name=\"viewport\" content=\"width=device-width, initial-scale=1\">\n");
  add(fmt::format("<meta name=\"generator\" content=\"edgeflux {}\">\n", EDGEFLUX_VERSION));
  add(fmt::format("<title>Thermal bridge assessment — {}</title>\n<style>{}</style>\n</head>\n<body>\n", escape(title), css));

  // --- Summary ----------------------------------------------------------------------------------
  add("<header>\n<div class=\"kicker\">Thermal bridge assessment · two-dimensional, steady state (ISO 10211)</div>\n");
  add(fmt::format("<h1>{}</h1>\n", escape(title)));
  if (!section.notes.empty()) add(fmt::format("<p class=\"notes\">{}</p>\n", escape(section.notes)));
  add("<dl class=\"meta\">");
  add(fmt::format("<dt>Input file</dt><dd>{}</dd>", escape(section.file)));
  add(fmt::format("<dt>SHA-256</dt><dd><code>{}</code></dd>", sha256_hex(provenance.input_text)));
  add(fmt::format("<dt>Calculated</dt><dd>{} with edgeflux {}</dd>", escape(provenance.generated), EDGEFLUX_VERSION));
  add("</dl>\n</header>\n");

  add("<section id=\"summary\">\n<h2>Summary</h2>\n<div class=\"key\">\n");
  const Convergence& conv = calc.convergence;
  if (field.coupling_2d)
    add(key_card("Thermal coupling coefficient L<sub>2D</sub>", fixed(*field.coupling_2d, 4) + plus_minus(conv.coupling_2d, 4), "W/(m·K)",
                 "heat-loss run, per metre of junction"));
  for (std::size_t i = 0; i < j.psi.size(); ++i) {
    const PsiValue& p = j.psi[i];
    add(key_card(fmt::format("ψ, {} dimensions", dimension_system_name(p.system)),
                 fixed(p.psi, 3) + plus_minus(i < conv.psi.size() ? std::optional<ErrorEstimate>(conv.psi[i]) : std::nullopt, 3), "W/(m·K)",
                 "ψ = L<sub>2D</sub> − Σ U·l"));
  }
  if (j.min_interior_surface) {
    const SurfaceMinimum& m = *j.min_interior_surface;
    add(key_card("Lowest interior surface temperature θ<sub>si,min</sub>", fixed(m.temperature, 2) + plus_minus(conv.min_surface_temperature, 2), "°C",
                 fmt::format("at {} on “{}”, surface-temperature run", user_point(section, m.at), escape(section.surfaces[m.surface].name))));
  }
  if (j.temperature_factor) add(key_card("Temperature factor f<sub>Rsi</sub>", fixed(*j.temperature_factor, 3), "", "(θsi,min − θe)/(θi − θe)"));
  if (!field.coupling_2d && section.environments.size() > 2)
    add(key_card("Environments", fmt::format("{}", section.environments.size()), "", "see the coupling coefficients and g factors below"));
  add("</div>\n");
  if (conv.coupling_2d || !conv.psi.empty() || conv.min_surface_temperature)
    add(fmt::format("<p class=\"small\">± : estimated remaining discretisation error from {} successive meshes (see “Mesh convergence”); {}.</p>\n",
                    conv.levels.size(), conv.target_met ? "the accuracy target is met" : "<b>the accuracy target is NOT met</b>: " + escape(conv.stop_reason)));

  for (const MoistureResult& m : j.moisture) {
    const MoistureAssessment& a = m.assessment;
    add(fmt::format("<div class=\"verdict{}\"><span class=\"badge\">{}</span><b>{} surfaces — {}</b><br>", a.passes ? "" : " fails",
                    a.passes ? "PASS" : "FAIL", m.kind == SurfaceKind::glazing ? "Glazing and frame" : "Opaque", escape(a.governing_requirement)));
    add(fmt::format("f<sub>Rsi</sub> = {} against the required {}: margin {}. ", fixed(a.actual_temperature_factor, 3), fixed(a.required_temperature_factor, 3),
                    signed_fixed(a.margin, 3)));
    if (j.climate)
      add(fmt::format("Climate {}{}; rule preset “{}”. ", climate_text(*j.climate), j.climate_assumed ? " — <b>assumed, the detail file gives none</b>" : "",
                      escape(j.climate->rule)));
    add(fmt::format("<br><span class=\"small\">{}</span></div>\n", escape(a.verdict)));
  }

  add("<div class=\"cautions\"><h3>Cautions — read before using these results</h3><ul>\n");
  for (const std::string& c : j.cautions) add("<li>" + escape(c) + "</li>\n");
  add("</ul></div>\n");
  if (!j.warnings.empty()) {
    add("<div class=\"warnings\"><h3>Warnings from this calculation</h3><ul>\n");
    for (const std::string& w : j.warnings) add("<li>" + escape(w) + "</li>\n");
    add("</ul></div>\n");
  }
  add("</section>\n");

  // --- Drawings ---------------------------------------------------------------------------------
  for (std::size_t i = 0; i < drawings.size(); ++i) {
    const Drawing& d = drawings[i];
    add(fmt::format("<section class=\"page-break\" id=\"{}\">\n<h2>Figure {} — {}</h2>\n<figure>\n{}<figcaption><b>Figure {}.</b> {}</figcaption>\n</figure>\n",
                    d.id, i + 1, escape(d.title), d.svg, i + 1, escape(d.caption)));
    if (d.id == "surface-temperature") break;  // the tables follow on the same page
    add("</section>\n");
  }
  const bool plot_open = !drawings.empty() && drawings.back().id == "surface-temperature";

  // --- Tables -----------------------------------------------------------------------------------
  add(plot_open ? "" : "<section>\n");
  add("<h2>Input data and results</h2>\n");
  add("<table><caption>Materials</caption><tr><th>Material</th><th class=\"num\">λ [W/(m·K)]</th><th>Source of λ</th><th>Regions</th></tr>\n");
  for (std::size_t m = 0; m < section.materials.size(); ++m) {
    std::string regions;
    for (const Region& r : section.regions)
      if (r.material == m) regions += (regions.empty() ? "" : ", ") + escape(r.name);
    add(fmt::format("<tr><td>{}</td><td class=\"num\">{}</td><td>{}</td><td>{}</td></tr>\n", escape(section.materials[m].id),
                    conductivity_text(section.materials[m].conductivity), escape(section.materials[m].source), regions));
  }
  add("</table>\n");

  add("<table><caption>Environments</caption><tr><th>Environment</th><th>Side</th><th class=\"num\">θ [°C]</th><th class=\"num\">Φ into the section [W/m]</th></tr>\n");
  for (const EnvironmentFlow& flow : field.environments) {
    const Environment& e = section.environments[flow.environment];
    add(fmt::format("<tr><td>{}</td><td>{}</td><td class=\"num\">{}</td><td class=\"num\">{}</td></tr>\n", escape(e.id), side_name(e.side),
                    fixed(e.temperature, 2), fixed(flow.heat_flow, 3)));
  }
  add("</table>\n");

  add("<table><caption>Surfaces and surface resistances (Rs of the heat-loss run per ISO 6946; of the surface-temperature run per ISO 13788)</caption>"
      "<tr><th>Surface</th><th>Environment</th><th>Kind</th><th class=\"num\">Rs heat loss [m²K/W]</th><th class=\"num\">Rs surface temp. [m²K/W]</th>"
      "<th class=\"num\">Φ [W/m]</th></tr>\n");
  for (std::size_t s = 0; s < section.surfaces.size(); ++s) {
    const Surface& surface = section.surfaces[s];
    add(fmt::format("<tr><td>{}</td><td>{}</td><td>{}</td><td class=\"num\">{}</td><td class=\"num\">{}</td><td class=\"num\">{}</td></tr>\n", escape(surface.name),
                    escape(section.environments[surface.environment].id), surface.kind == SurfaceKind::glazing ? "glazing/frame" : "opaque",
                    surface.is_fixed_temperature() ? std::string("0 (fixed θ)") : fixed(surface.resistance, 2), fixed(temperature_run_resistance(section, surface), 2),
                    s < field.surface_heat_flow.size() ? fixed(field.surface_heat_flow[s], 3) : std::string("—")));
  }
  add("</table>\n");

  add(fmt::format("<table><caption>Heat flows and energy balance (heat-loss run)</caption><tr><th>Quantity</th><th class=\"num\">Value</th><th>Note</th></tr>\n"
                  "<tr><td>Σ Φ over all environments</td><td class=\"num\">{:.2e} W/m</td><td>zero for a conserving solution</td></tr>\n"
                  "<tr><td>Σ Φ / (½ Σ |Φ|)</td><td class=\"num\">{:.1e}</td><td>ISO 10211 criterion &lt; 1e-4: <b>{}</b></td></tr>\n",
                  field.balance.net, field.balance.relative, std::abs(field.balance.relative) < 1e-4 ? "met" : "NOT MET"));
  if (field.coupling_2d)
    add(fmt::format("<tr><td>L<sub>2D</sub> = Φ / (θi − θe)</td><td class=\"num\">{} W/(m·K)</td><td>independent of the dimension system</td></tr>\n",
                    fixed(*field.coupling_2d, 5)));
  add("</table>\n");

  if (!j.flanking.empty()) {
    add("<table><caption>Flanking elements (U from the layer stack at the cut-off plane, ISO 6946, unless stated)</caption><tr><th>Element</th>"
        "<th class=\"num\">U [W/(m²K)]</th><th>Layer stack at the cut-off</th><th class=\"num\">l internal [m]</th><th class=\"num\">l overall int. [m]</th>"
        "<th class=\"num\">l external [m]</th><th class=\"num\">1D check [K]</th></tr>\n");
    for (const FlankingResult& f : j.flanking) {
      std::string stack = fmt::format("Rs {} | ", fixed(f.start_resistance, 2));
      for (const FlankingLayer& l : f.layers) stack += fmt::format("{} {} mm (λ {:.3g}) | ", escape(l.material), fixed(l.thickness * 1000, 0), l.conductivity);
      stack += fmt::format("Rs {}", fixed(f.end_resistance, 2));
      auto len = [&](int s) { return f.length[s] ? fixed(*f.length[s], 3) : std::string("—"); };
      add(fmt::format("<tr><td class=\"nowrap\">{}</td><td class=\"num\">{}{}</td><td>{}</td><td class=\"num\">{}</td><td class=\"num\">{}</td><td class=\"num\">{}</td>"
                      "<td class=\"num\">{}</td></tr>\n",
                      escape(f.id), fixed(f.u_value, 4), f.u_value_stated ? " (stated)" : "", stack, len(0), len(1), len(2), fixed(f.deviation_from_1d, 3)));
    }
    add("</table>\n<p class=\"small\">1D check: the largest difference, along the cut-off plane, between the computed temperatures and the 1D profile of "
        "the layer stack. A large value means the cut-off plane is too close to the junction.</p>\n");
  }
  if (!j.psi.empty() && calc.heat_loss.field.coupling_2d) {
    add("<table><caption>Linear thermal transmittance ψ = L<sub>2D</sub> − Σ U<sub>j</sub>·l<sub>j</sub></caption><tr><th>Dimension system</th>"
        "<th class=\"num\">L<sub>2D</sub></th><th>Σ U·l</th><th class=\"num\">ψ [W/(m·K)]</th></tr>\n");
    for (const PsiValue& p : j.psi) {
      std::string terms;
      double sum = 0;
      for (const FlankingResult& f : j.flanking)
        if (const auto& l = f.length[static_cast<int>(p.system)]) {
          terms += fmt::format("{}{} × {}", terms.empty() ? "" : " + ", fixed(f.u_value, 4), fixed(*l, 3));
          sum += f.u_value * *l;
        }
      add(fmt::format("<tr><td>{}</td><td class=\"num\">{}</td><td>{} = {}</td><td class=\"num\"><b>{}</b></td></tr>\n", dimension_system_name(p.system),
                      fixed(*calc.heat_loss.field.coupling_2d, 4), terms, fixed(sum, 4), fixed(p.psi, 3)));
    }
    add("</table>\n");
  }

  if (section.environments.size() > 2 && !j.coupling.empty()) {
    add("<table><caption>Coupling matrix ∂Φ<sub>i</sub>/∂θ<sub>j</sub> [W/(m·K)] (heat-loss run; L<sub>ij</sub> = −entry for i ≠ j; rows sum to zero)</caption><tr><th></th>");
    for (const Environment& e : section.environments) add(fmt::format("<th class=\"num\">{}</th>", escape(e.id)));
    add("</tr>\n");
    for (std::size_t i = 0; i < section.environments.size(); ++i) {
      add(fmt::format("<tr><th>{}</th>", escape(section.environments[i].id)));
      for (double v : j.coupling[i]) add(fmt::format("<td class=\"num\">{}</td>", fixed(v, 5)));
      add("</tr>\n");
    }
    add("</table>\n");
    if (!j.weighting_factors.empty()) {
      add("<table><caption>Temperature weighting factors g at θ<sub>si,min</sub> (surface-temperature run): θsi = Σ g<sub>j</sub>·θ<sub>j</sub></caption><tr>");
      for (const Environment& e : section.environments) add(fmt::format("<th class=\"num\">g [{}]</th>", escape(e.id)));
      add("</tr><tr>");
      for (double g : j.weighting_factors) add(fmt::format("<td class=\"num\">{}</td>", fixed(g, 4)));
      add("</tr></table>\n");
    }
  }

  if (!j.moisture.empty()) {
    add("<table><caption>Condensation and mould (ISO 13788)</caption><tr><th>Surfaces</th><th class=\"num\">p<sub>i</sub> [Pa]</th><th class=\"num\">dew point [°C]</th>"
        "<th class=\"num\">θsi for 80 % RH [°C]</th><th class=\"num\">fRsi,min mould</th><th class=\"num\">fRsi,min cond.</th><th class=\"num\">required</th>"
        "<th class=\"num\">fRsi</th><th class=\"num\">margin</th></tr>\n");
    for (const MoistureResult& m : j.moisture) {
      const MoistureAssessment& a = m.assessment;
      add(fmt::format("<tr><td>{}</td><td class=\"num\">{}</td><td class=\"num\">{}</td><td class=\"num\">{}</td><td class=\"num\">{}</td><td class=\"num\">{}</td>"
                      "<td class=\"num\">{}</td><td class=\"num\">{}</td><td class=\"num\">{}</td></tr>\n",
                      m.kind == SurfaceKind::glazing ? "glazing/frame" : "opaque", fixed(a.interior_vapour_pressure, 0), fixed(a.dew_point, 2),
                      fixed(a.mould_surface_temperature, 2), fixed(a.mould_temperature_factor, 3), fixed(a.condensation_temperature_factor, 3),
                      fixed(a.required_temperature_factor, 3), fixed(a.actual_temperature_factor, 3), signed_fixed(a.margin, 3)));
    }
    add("</table>\n");
  }

  if (!field.probes.empty()) {
    add("<table><caption>Probes (P1, P2, … in Figure 1)</caption><tr><th></th><th>Probe</th><th>Location</th><th class=\"num\">θ heat-loss run [°C]</th>"
        "<th class=\"num\">θ surface-temp. run [°C]</th></tr>\n");
    for (std::size_t i = 0; i < field.probes.size(); ++i) {
      const ProbeReading& p = field.probes[i];
      const ProbeReading* q = i < calc.surface_temperature.field.probes.size() ? &calc.surface_temperature.field.probes[i] : nullptr;
      add(fmt::format("<tr><td>P{}</td><td>{}</td><td>{}</td><td class=\"num\">{}</td><td class=\"num\">{}</td></tr>\n", i + 1, escape(p.name),
                      user_point(section, p.at), fixed(p.temperature, 3), q ? fixed(q->temperature, 3) : std::string("—")));
    }
    add("</table>\n");
  }

  const SolveInfo& info = calc.heat_loss.info;
  add(fmt::format("<table><caption>Mesh and solver</caption><tr><th>Item</th><th>Value</th></tr>\n"
                  "<tr><td>Mesh</td><td>{} mesher: {} nodes, {} triangles</td></tr>\n"
                  "<tr><td>Linear solver</td><td>{}, {} unknowns; solved {}</td></tr>\n"
                  "<tr><td>Time</td><td>mesh {:.3f} s, both runs (assembly, factorisation, solves) {:.3f} s, results {:.3f} s</td></tr>\n"
                  "</table>\n",
                  escape(calc.mesh.mesher), calc.mesh.n_points(), calc.mesh.n_triangles(), escape(info.solver), info.n_unknowns,
                  info.ok && calc.surface_temperature.info.ok ? "without fault in both runs" : "WITH A FAULT: " + escape(info.message),
                  calc.timings.mesh_seconds, calc.timings.solve_seconds, calc.timings.results_seconds));
  add(convergence_tables(section, calc));
  add("</section>\n");

  // --- Method, validation, provenance --------------------------------------------------------
  add("<section class=\"page-break\" id=\"method\">\n<h2>Method and validation</h2>\n");
  add(fmt::format(
      "<p>Steady-state two-dimensional heat conduction, solved by vertex-centred finite volumes on a {} mesh (graded constrained Delaunay "
      "triangulation, or a rectilinear grid for rectilinear sections): each node's control volume is bounded by the medians of the triangles "
      "around it (median-dual), conductivity is constant per triangle, surface resistances enter as exchange with the environment "
      "temperature. The symmetric positive-definite system is solved by sparse Cholesky factorisation ({}).</p>\n",
      escape(calc.mesh.mesher), escape(info.solver)));
  add("<p>Two runs share the mesh: the <b>heat-loss run</b> with the surface resistances of the detail file (ISO 6946) gives Φ, L<sub>2D</sub> and ψ; "
      "the <b>surface-temperature run</b> with interior Rsi = 0.25 m²K/W on opaque surfaces and 0.13 m²K/W on glazing (ISO 13788) gives θ<sub>si,min</sub>, "
      "f<sub>Rsi</sub> and the moisture verdict. ψ = L<sub>2D</sub> − Σ U<sub>j</sub>·l<sub>j</sub> with U<sub>j</sub> from the layer stack of each "
      "flanking element at its cut-off plane (or as stated) and l<sub>j</sub> in the named dimension system (ISO 14683).</p>\n");
  if (provenance.validation) {
    const ConformityReport& v = *provenance.validation;
    int failed = 0;
    double worst_case1 = 0.0;
    for (const ConformityRow& r : v.rows) {
      failed += r.passed() ? 0 : 1;
      if (r.reference_case == "Case 1") worst_case1 = std::max(worst_case1, std::abs(r.computed - r.reference));
    }
    add(fmt::format("<p class=\"status\"><b>Validation status:</b> ISO 10211 Cases 1 and 2 were solved by this program at the time of this "
                    "report: {} of {} reference values within the standard's tolerance; Case 1 largest difference {:.3f} K (tolerance 0.1 K). "
                    "Classification: {}. <code>edgeflux conformity</code> prints the full table.</p>\n",
                    v.rows.size() - failed, v.rows.size(), worst_case1, escape(v.classification())));
    add("<table><tr><th>Case 2</th><th>reference</th><th>computed</th><th>difference</th><th>tolerance</th><th>result</th></tr>\n");
    for (const ConformityRow& r : v.rows)
      if (r.reference_case == "Case 2")
        add(fmt::format("<tr><td>{}</td><td>{:.1f} {}</td><td>{:.3f}</td><td>{:+.3f}</td><td>{:.1f}</td><td>{}</td></tr>\n", escape(r.quantity),
                        r.reference, escape(r.unit), r.computed, r.computed - r.reference, r.tolerance, r.passed() ? "pass" : "FAIL"));
    add("</table>\n");
  } else {
    add("<p class=\"status\"><b>Validation status:</b> not run for this report; <code>edgeflux conformity</code> solves ISO 10211 Cases 1 "
        "and 2 and prints the conformity table.</p>\n");
  }
  add("<h3>Provenance</h3>\n<dl class=\"meta\">");
  add(fmt::format("<dt>Program</dt><dd>edgeflux {}</dd><dt>Calculated</dt><dd>{}</dd><dt>Input file</dt><dd>{}</dd><dt>SHA-256 of the input</dt><dd><code>{}</code></dd>",
                  EDGEFLUX_VERSION, escape(provenance.generated), escape(section.file), sha256_hex(provenance.input_text)));
  add(fmt::format("<dt>Re-run</dt><dd><code>edgeflux solve {} --report {}.html</code> with the file below saved under that name</dd>", escape(section.file),
                  "report"));
  add("</dl>\n");
  add(fmt::format("<details><summary>Input file as calculated ({} bytes)</summary>\n<pre>{}</pre>\n</details>\n", provenance.input_text.size(),
                  escape(provenance.input_text)));
  add("</section>\n");
  add(fmt::format("<footer>edgeflux {} · {} · {}</footer>\n</body>\n</html>\n", EDGEFLUX_VERSION, escape(title), escape(provenance.generated)));
  return h;
}

}  // namespace edgeflux
