// The report's header and summary: key values, verdict, cautions and warnings.
#include <fmt/format.h>

#include <algorithm>
#include <cmath>

#include "core/sha256.h"
#include "physics/surface_resistance.h"
#include "report/html_parts.h"
#include "report/text_format.h"

namespace edgeflux::html {

std::string summary_section(const CrossSection& section, const Calculation& calc, const ReportProvenance& provenance) {
  const FieldResults& field = calc.heat_loss.field;
  const JunctionResults& j = calc.junction;
  const std::string title = section.title.empty() ? section.file : section.title;
  std::string h;
  auto add = [&](const std::string& s) { h += s; };
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
  return h;
}

}  // namespace edgeflux::html
