// The junction sheet: the one or two pages a consultant signs. Title block with the record, the
// results a consultant carries forward, the verdict criterion by criterion, the detail and the
// temperature field, materials and boundary conditions, cautions and sign-off.
#include <fmt/format.h>

#include <algorithm>

#include "core/sha256.h"
#include "physics/surface_resistance.h"
#include "report/html_parts.h"
#include "report/text_format.h"

namespace edgeflux::html {

namespace {

/// Characters of the detail's notes the sheet shows when the appendices carry the rest.
constexpr std::size_t max_sheet_notes = 450;

std::string title_block(const CrossSection& section, const ReportProvenance& provenance) {
  const JunctionRecord& r = section.record;
  const std::string title = section.title.empty() ? section.file : section.title;
  std::string h = "<header class=\"title-block\">\n<div class=\"kicker\">Junction sheet · thermal bridge, two-dimensional, steady state (ISO 10211)</div>\n";
  h += fmt::format("<h1>{}{}</h1>\n", r.reference.empty() ? "" : "<span class=\"ref\">" + escape(r.reference) + "</span> ", escape(title));
  h += "<dl class=\"record\">";
  auto item = [&](const char* label, const std::string& value) {
    h += fmt::format("<div><dt>{}</dt><dd>{}</dd></div>", label, value.empty() ? "<span class=\"blank\">—</span>" : escape(value));
  };
  for (const auto& [label, value] : r.fields()) item(label, *value);
  const std::string file = section.file.substr(section.file.find_last_of('/') == std::string::npos ? 0 : section.file.find_last_of('/') + 1);
  h += fmt::format("<div class=\"wide\"><dt>Input</dt><dd>{} (SHA-256 <code>{}</code>) · calculated {} with edgeflux {}</dd></div>", escape(file),
                   sha256_hex(provenance.input_text).substr(0, 16), escape(provenance.generated), EDGEFLUX_VERSION);
  h += "</dl>\n</header>\n";
  return h;
}

std::string row(const std::string& label, const std::string& value, const std::string& note, const char* css = "") {
  return fmt::format("<tr class=\"{}\"><th>{}</th><td class=\"num\">{}</td><td>{}</td></tr>\n", css, label, value, note);
}

std::string psi_rows(const CrossSection& section, const Calculation& calc) {
  const JunctionResults& j = calc.junction;
  std::string h;
  // The value carried forward first and marked; the other systems beside it for reference.
  std::vector<std::size_t> order(j.psi.size());
  for (std::size_t i = 0; i < order.size(); ++i) order[i] = i;
  std::stable_partition(order.begin(), order.end(), [&](std::size_t i) { return section.carried_forward == j.psi[i].system; });
  // With a system carried forward, the others share one row for reference.
  std::string others;
  for (std::size_t i : order) {
    const PsiValue& p = j.psi[i];
    const bool carried = section.carried_forward == p.system;
    if (section.carried_forward && !carried) {
      others += fmt::format("{}{} {}", others.empty() ? "" : ", ", dimension_system_name(p.system), fixed(p.psi, digits::psi));
      continue;
    }
    h += row(fmt::format("ψ, {} dimensions", dimension_system_name(p.system)), fixed(p.psi, digits::psi) + " W/(m·K)",
             carried ? fmt::format("<b>carried forward</b> into the energy calculation ({} dimensions)", dimension_system_name(p.system))
                     : "ψ = L<sub>2D</sub> − Σ U·l",
             carried ? "carried" : "");
  }
  if (!others.empty()) h += row("ψ in the other dimension systems", "", "for reference: " + others + " W/(m·K)");
  if (!j.psi.empty() && !section.carried_forward)
    h += row("", "", "<span class=\"small\">No dimension system is marked as carried forward: name the one the energy calculation uses "
                     "(<code>carry-forward</code> in the detail, or <code>--carry-forward</code>).</span>");
  for (const PairPsi& pair : j.pair_psi)
    for (const PsiValue& p : pair.psi)
      h += row(fmt::format("ψ {}–{}, {} dimensions", escape(section.environments[pair.first].id), escape(section.environments[pair.second].id),
                           dimension_system_name(p.system)),
               fixed(p.psi, digits::psi) + " W/(m·K)",
               fmt::format("coupling coefficient L = {} W/(m·K) of this pair less U·l of “{}”", fixed(pair.coupling, digits::coupling),
                           escape(fmt::format("{}", fmt::join(pair.elements, "”, “")))),
               section.carried_forward == p.system ? "carried" : "");
  return h;
}

std::string results_table(const CrossSection& section, const Calculation& calc) {
  const FieldResults& field = calc.heat_loss.field;
  const JunctionResults& j = calc.junction;
  std::string h = "<table class=\"results\"><caption>Results</caption>\n";
  h += psi_rows(section, calc);
  if (field.coupling_2d)
    h += row("Thermal coupling coefficient L<sub>2D</sub>", fixed(*field.coupling_2d, digits::coupling) + " W/(m·K)",
             fmt::format("heat-loss run, {} → {}, per metre of junction", escape(section.environments[field.environments.front().environment].id),
                         escape(section.environments[field.environments.back().environment].id)));
  if (j.min_interior_surface) {
    const SurfaceMinimum& m = *j.min_interior_surface;
    std::string where = fmt::format("at {} on “{}”", user_point(section, m.at), escape(section.surfaces[m.surface].name));
    if (j.plain_element_governs)
      where += fmt::format(", the plain element “{}” at its cut-off plane: the undisturbed element governs", escape(*j.plain_element_governs));
    h += row("Lowest interior surface temperature θ<sub>si,min</sub>", fixed(m.temperature, digits::surface_temperature) + " °C", where);
    if (j.plain_element_governs && j.junction_minimum)
      h += row("The junction's own lowest θ<sub>si</sub>", fixed(j.junction_minimum->temperature, digits::surface_temperature) + " °C",
               fmt::format("at {} on “{}”, away from the cut-off planes", user_point(section, j.junction_minimum->at),
                           escape(section.surfaces[j.junction_minimum->surface].name)));
    else if (j.plain_element_governs)
      h += row("The junction's own lowest θ<sub>si</sub>", "—", "the interior surfaces warm steadily towards the junction: it has no colder point of its own");
  }
  if (j.moisture.size() > 1) {
    // Opaque surfaces and glazing/frames are judged apart, each at its own coldest point.
    for (const MoistureResult& m : j.moisture)
      h += row(fmt::format("Temperature factor f<sub>Rsi</sub>, {}", m.kind == SurfaceKind::glazing ? "glazing and frame" : "opaque surfaces"),
               fixed(m.temperature_factor, digits::temperature_factor),
               fmt::format("at {} ({} °C), interior Rsi {} m²K/W (ISO 13788)", user_point(section, m.minimum.at),
                           fixed(m.minimum.temperature, digits::surface_temperature), m.kind == SurfaceKind::glazing ? "0.13" : "0.25"));
  } else if (j.temperature_factor) {
    h += row("Temperature factor f<sub>Rsi</sub>", fixed(*j.temperature_factor, digits::temperature_factor),
             "(θ<sub>si,min</sub> − θ<sub>e</sub>) / (θ<sub>i</sub> − θ<sub>e</sub>), interior Rsi 0.25 m²K/W (ISO 13788)");
  }
  for (const MoistureResult& m : j.moisture) {
    const char* surfaces = m.kind == SurfaceKind::glazing ? "glazing and frame" : "opaque";
    for (const CriterionCheck& c : m.assessment.criteria)
      h += row(fmt::format("Criterion, {} surfaces", surfaces), c.met ? "met" : "<b>NOT met</b>", escape(criterion_statement(c, m.assessment.actual_temperature_factor)),
               c.met ? "criterion" : "criterion not-met");
  }
  if (j.climate)
    h += row("Climate of the criteria", "", escape(climate_text(*j.climate)) + (j.climate_assumed ? " — <b>assumed, the detail file gives none</b>" : ""));
  const std::string accuracy = accuracy_statement(calc.convergence);
  h += "</table>\n";
  const Convergence& conv = calc.convergence;
  h += fmt::format("<p class=\"small\">Accuracy: {}{}. Values are rounded as reported in practice: ψ to {} decimals, L<sub>2D</sub> to {}, θ to {}, "
                   "f<sub>Rsi</sub> to {}.</p>\n",
                   accuracy.empty() ? "one fixed mesh, no error estimate (see the appendix)" : escape(accuracy),
                   conv.levels.size() > 1 && !conv.target_met ? "; <b>the accuracy target is NOT met</b>: " + escape(conv.stop_reason) : "",
                   digits::psi, digits::coupling, digits::surface_temperature, digits::temperature_factor);
  return h;
}

std::string materials_table(const CrossSection& section) {
  std::string h = "<table class=\"compact\"><caption>Materials</caption><tr><th>Material</th><th class=\"num\">λ [W/(m·K)]</th>"
                  "<th class=\"num\">ρ [kg/m³]</th><th>Source of λ</th></tr>\n";
  for (const Material& m : section.materials) {
    // A typical declared value is a placeholder for the product's own: say so where it is read.
    const std::string kind = m.basis == "typical" ? "<b>typical declared value, to be replaced by the product's:</b> "
                             : m.basis == "normative" ? "tabulated design value: "
                                                      : "";
    h += fmt::format("<tr><td>{}</td><td class=\"num\">{}</td><td class=\"num\">{}</td><td>{}{}</td></tr>\n", escape(m.id),
                     conductivity_text(m.conductivity), m.density ? fmt::format("{:.0f}", *m.density) : std::string("—"), kind, escape(m.source));
  }
  return h + "</table>\n";
}

std::string boundary_table(const CrossSection& section) {
  std::string h = "<table class=\"compact\"><caption>Boundary conditions <span class=\"small\">(Rs heat loss: ISO 6946 or as given, for Φ, L<sub>2D</sub> and ψ; "
                  "Rs surface temperature: ISO 13788, for θ<sub>si</sub> and f<sub>Rsi</sub>; edges without a surface are adiabatic)</span></caption>"
                  "<tr><th>Surface</th><th>Environment</th>"
                  "<th class=\"num\">θ [°C]</th><th class=\"num\">Rs heat loss [m²K/W]</th><th class=\"num\">Rs surface temp. [m²K/W]</th></tr>\n";
  for (const Surface& s : section.surfaces) {
    const Environment& e = section.environments[s.environment];
    h += fmt::format("<tr><td>{}{}</td><td>{} ({})</td><td class=\"num\">{}</td><td class=\"num\">{}</td><td class=\"num\">{}</td></tr>\n", escape(s.name),
                     s.kind == SurfaceKind::glazing ? " (glazing/frame)" : "", escape(e.id), side_name(e.side), fixed(e.temperature, 1),
                     s.is_fixed_temperature() ? std::string("0 (fixed θ)") : fixed(s.resistance, 2), fixed(temperature_run_resistance(section, s), 2));
  }
  h += "</table>\n";
  return h;
}

std::string psi_derivation(const CrossSection& section, const Calculation& calc) {
  const JunctionResults& j = calc.junction;
  if (j.psi.empty() || !calc.heat_loss.field.coupling_2d) return "";
  std::string h = "<table class=\"compact\"><caption>ψ = L<sub>2D</sub> − Σ U·l</caption><tr><th>Dimension system</th><th class=\"num\">L<sub>2D</sub></th>"
                  "<th>Σ U·l (U [W/(m²K)] × l [m], as printed)</th><th class=\"num\">ψ [W/(m·K)]</th></tr>\n";
  for (const PsiValue& p : j.psi) {
    std::string terms;
    double sum = 0;
    for (const FlankingResult& f : j.flanking)
      if (const auto& l = f.length[static_cast<int>(p.system)]) {
        terms += fmt::format("{}{} × {}", terms.empty() ? "" : " + ", fixed(f.u_value, digits::u_value), fixed(*l, digits::length));
        sum += printed_product(f.u_value, *l);
      }
    h += fmt::format("<tr class=\"{}\"><td>{}</td><td class=\"num\">{}</td><td>{} = {}</td><td class=\"num\">{}</td></tr>\n",
                     section.carried_forward == p.system ? "carried" : "", dimension_system_name(p.system),
                     fixed(*calc.heat_loss.field.coupling_2d, digits::coupling), terms, fixed(sum, digits::coupling), fixed(p.psi, digits::psi));
  }
  return h + "</table>\n<p class=\"small\">The sums multiply out from the printed U and l; ψ is computed from the unrounded values "
             "(U of each element from its layer stack at the cut-off, ISO 6946, unless stated), so its last digit may differ by one.</p>\n";
}

std::string cautions_and_warnings(const JunctionResults& j) {
  std::string h = "<div class=\"cautions\"><h3>Cautions — read before using these results</h3><ul>\n";
  for (const std::string& c : j.cautions) h += "<li>" + escape(c) + "</li>\n";
  h += "<li>“Criterion met” states that a calculated value meets a stated limit in the stated climate; it is not a declaration "
       "of compliance.</li>\n</ul></div>\n";
  if (!j.warnings.empty()) {
    h += "<div class=\"warnings\"><h3>Warnings from this calculation</h3><ul>\n";
    for (const std::string& w : j.warnings) h += "<li>" + escape(w) + "</li>\n";
    h += "</ul></div>\n";
  }
  return h;
}

std::string sign_off(const JunctionRecord& r) {
  return fmt::format("<table class=\"sign-off\"><tr><th>Assessed by</th><td>{}</td><th>Signature</th><td class=\"line\"></td><th>Date</th>"
                     "<td class=\"line\"></td></tr>\n<tr><th>Checked by</th><td>{}</td><th>Signature</th><td class=\"line\"></td><th>Date</th>"
                     "<td class=\"line\"></td></tr></table>\n",
                     escape(r.assessor), escape(r.checker));
}

std::string figure(const Drawing& d, int number, const char* css) {
  return fmt::format("<figure class=\"{}\" id=\"{}\">\n{}<figcaption><b>Figure {}. {}.</b> {}</figcaption>\n</figure>\n", css, d.id, d.svg, number,
                     escape(d.title), escape(d.caption));
}

}  // namespace

std::string junction_sheet(const CrossSection& section, const Calculation& calc, const std::vector<Drawing>& drawings,
                           const ReportProvenance& provenance, bool with_appendices) {
  auto find = [&](const char* id) -> const Drawing* {
    for (const Drawing& d : drawings)
      if (d.id == id) return &d;
    return nullptr;
  };
  std::string h = "<section class=\"sheet\" id=\"sheet\">\n";
  h += title_block(section, provenance);
  h += results_table(section, calc);
  // The detail and its temperature field side by side, so the first page holds what a reader looks at.
  h += "<div class=\"figure-row\">\n";
  if (const Drawing* d = find("detail")) h += figure(*d, 1, "sheet-figure");
  if (const Drawing* d = find("temperature")) h += figure(*d, 2, "sheet-figure");
  // The rest flows on: a page break forced here would strand a half-empty page when the figures
  // move over.
  h += "</div>\n";
  if (!section.notes.empty()) {
    // A long description would push the sheet onto a third page: its first sentences here, all of
    // it in Appendix A.
    std::string notes = section.notes;
    bool shortened = false;
    if (with_appendices && notes.size() > max_sheet_notes) {
      const std::size_t stop = notes.rfind(". ", max_sheet_notes);
      notes = notes.substr(0, stop == std::string::npos || stop < 100 ? max_sheet_notes : stop + 1);
      shortened = true;
    }
    h += fmt::format("<p class=\"notes\"><b>Description.</b> {}{}</p>\n", escape(notes), shortened ? " <i>(continued in Appendix A)</i>" : "");
  }
  h += materials_table(section);
  h += boundary_table(section);
  h += psi_derivation(section, calc);
  h += cautions_and_warnings(calc.junction);
  h += sign_off(section.record);
  h += "</section>\n";
  return h;
}

}  // namespace edgeflux::html
