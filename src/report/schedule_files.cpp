#include "report/schedule_files.h"

#include <fmt/format.h>
#include <nlohmann/json.hpp>

#include <algorithm>
#include <cctype>

#include "physics/moisture_verdict.h"
#include "report/html_parts.h"
#include "report/number_format.h"
#include "report/text_format.h"

namespace edgeflux {

namespace {


/// fRsi and the criteria outcome of every kind of surface, e.g. "0.945 criterion met".
std::string verdict_text(const VariantSummary& v) {
  std::string text;
  for (const KindVerdict& k : v.verdicts)
    text += fmt::format("{}{}{} {}", text.empty() ? "" : "; ", k.kind == SurfaceKind::glazing ? "glazing " : "",
                        fixed(k.temperature_factor, digits::temperature_factor), criteria_outcome(k.criteria));
  return text.empty() ? "—" : text;
}

}  // namespace

std::string schedule_text(const Schedule& s) {
  const Project& p = s.project;
  std::string out = fmt::format("Thermal bridge schedule — {}\n", p.record.project.empty() ? p.file : p.record.project);
  std::string record;
  for (const auto& [label, value] : p.record.fields())
    if (!value->empty()) record += fmt::format("{}{}: {}", record.empty() ? "" : " · ", label, *value);
  if (!record.empty()) out += record + "\n";
  out += fmt::format("ψ in {} dimensions (the energy method's); lengths in m\n\n", dimension_system_name(p.system));
  std::size_t ref_width = 4, description_width = 11;
  for (const ScheduleRow& r : s.rows) {
    ref_width = std::max(ref_width, r.junction.reference.size());
    description_width = std::min<std::size_t>(40, std::max(description_width, r.junction.description.size()));
  }
  out += fmt::format("  {:<{}}  {:<{}} {:>8} {:>9} {:>9}  {:>8}  {}\n", "ref.", ref_width, "description", description_width, "ψ",
                     "length", "ψ·l [W/K]", "assumed", "fRsi and criteria");
  for (const ScheduleRow& r : s.rows) {
    std::string description = r.junction.description.substr(0, description_width);
    if (r.error.empty()) {
      out += fmt::format("  {:<{}}  {:<{}} {:>8} {:>9} {:>9}  {:>8}  {}{}{}\n", r.junction.reference, ref_width, description, description_width,
                         fixed(*r.psi, digits::psi), fixed(r.length, 2), fixed(*r.psi_length, 3),
                         r.junction.assumed_psi ? fixed(*r.junction.assumed_psi, digits::psi) : "—", verdict_text(r.result),
                         r.exceeds_assumed ? "   ! ψ above the assumed value" : "", r.from_cache ? "   (cached)" : "");
    } else {
      out += fmt::format("  {:<{}}  {:<{}} NOT CALCULATED: {}\n", r.junction.reference, ref_width, description, description_width, r.error);
    }
  }
  out += fmt::format("\n  H_TB = Σ ψ·l = {} W/K (estimated discretisation error ± {} W/K)", fixed(s.heat_transfer_coefficient, 3),
                     error_text(s.heat_transfer_coefficient_error, 3));
  if (s.u_surcharge)
    out += fmt::format("\n  ΔU_TB = H_TB / A = {} / {} = {} W/(m²K)", fixed(s.heat_transfer_coefficient, 3), fixed(*s.project.envelope_area, 1),
                       fixed(*s.u_surcharge, 4));
  out += "\n";
  const auto exceeded = std::count_if(s.rows.begin(), s.rows.end(), [](const ScheduleRow& r) { return r.exceeds_assumed; });
  if (exceeded > 0) out += fmt::format("  ! {} junction(s) exceed the ψ the energy calculation assumed\n", exceeded);
  if (s.failed > 0)
    out += fmt::format("  ! {} junction(s) not calculated: H_TB leaves them out and is INCOMPLETE\n", s.failed);
  const auto cached = std::count_if(s.rows.begin(), s.rows.end(), [](const ScheduleRow& r) { return r.from_cache; });
  if (cached > 0)
    out += fmt::format("  {} of {} results from the cache (inputs unchanged since they were solved); the others solved in this run\n", cached,
                       s.rows.size());
  for (const std::string& note : s.notes) out += "  note: " + note + "\n";
  out += "\nResults depend on the inputs and modelling choices; local building codes and a qualified professional decide compliance.\n";
  return out;
}

std::string schedule_csv(const Schedule& s) {
  std::string out = fmt::format("reference,description,detail,psi_{}_w_per_mk,psi_error_w_per_mk,length_m,psi_l_w_per_k,assumed_psi_w_per_mk,"
                                "assumed_source,exceeds_assumed,criteria,lengths_taken_from,error\n",
                                dimension_system_key(s.project.system));
  auto number = [](const std::optional<double>& v) { return v ? fmt::format("{:.9g}", *v) : std::string(); };
  for (const ScheduleRow& r : s.rows) {
    std::string taken;
    for (const TakenLength& l : r.junction.lengths) taken += fmt::format("{}{:g} m {}", taken.empty() ? "" : "; ", l.metres, l.where);
    out += fmt::format("{},{},{},{},{},{:.9g},{},{},{},{},{},{},{}\n", csv_field(r.junction.reference), csv_field(r.junction.description),
                       csv_field(r.junction.detail_file), number(r.psi), number(r.psi_error), r.length, number(r.psi_length),
                       number(r.junction.assumed_psi), csv_field(r.junction.assumed_source), r.exceeds_assumed ? "yes" : "no",
                       csv_field(r.error.empty() ? verdict_text(r.result) : ""), csv_field(taken), csv_field(r.error));
  }
  out += fmt::format("H_TB,,,,,,{:.9g},,,,,,{}\n", s.heat_transfer_coefficient, s.failed > 0 ? "incomplete: junctions not calculated" : "");
  if (s.u_surcharge) out += fmt::format("delta_U_TB,,,,,,{:.9g},,,,,,\n", *s.u_surcharge);
  return out;
}

std::string schedule_json(const Schedule& s) {
  nlohmann::ordered_json j;
  j["format"] = "edgeflux-schedule";
  j["format_version"] = 1;
  j["program_version"] = EDGEFLUX_VERSION;
  j["project_file"] = s.project.file;
  const JunctionRecord& r = s.project.record;
  j["record"] = {{"project", r.project}, {"client", r.client}, {"site", r.site}, {"drawing", r.drawing}, {"revision", r.revision},
                 {"assessor", r.assessor}, {"checker", r.checker}, {"date", r.date}};
  j["dimension_system"] = dimension_system_key(s.project.system);
  j["envelope_area_m2"] = s.project.envelope_area ? nlohmann::ordered_json(*s.project.envelope_area) : nullptr;
  auto& rows = j["junctions"] = nlohmann::ordered_json::array();
  for (const ScheduleRow& row : s.rows) {
    nlohmann::ordered_json lengths = nlohmann::ordered_json::array();
    for (const TakenLength& l : row.junction.lengths) lengths.push_back({{"metres", l.metres}, {"where", l.where}});
    nlohmann::ordered_json criteria = nlohmann::ordered_json::array();
    for (const KindVerdict& k : row.result.verdicts)
      for (const CriterionCheck& c : k.criteria)
        criteria.push_back({{"surfaces", k.kind == SurfaceKind::glazing ? "glazing" : "opaque"}, {"statement", criterion_statement(c, k.temperature_factor)},
                            {"met", c.met}});
    rows.push_back({{"reference", row.junction.reference}, {"description", row.junction.description}, {"detail_file", row.junction.detail_file},
                    {"parameters", row.junction.overrides}, {"lengths", lengths}, {"length_m", row.length},
                    {"psi_w_per_mk", row.psi ? nlohmann::ordered_json(*row.psi) : nullptr},
                    {"psi_error_w_per_mk", row.psi_error ? nlohmann::ordered_json(*row.psi_error) : nullptr},
                    {"psi_l_w_per_k", row.psi_length ? nlohmann::ordered_json(*row.psi_length) : nullptr},
                    {"temperature_factor_frsi", row.result.temperature_factor ? nlohmann::ordered_json(*row.result.temperature_factor) : nullptr},
                    {"criteria", criteria},
                    {"assumed_psi_w_per_mk", row.junction.assumed_psi ? nlohmann::ordered_json(*row.junction.assumed_psi) : nullptr},
                    {"assumed_source", row.junction.assumed_source}, {"exceeds_assumed", row.exceeds_assumed},
                    {"input_sha256", row.result.input_sha256}, {"from_cache", row.from_cache}, {"error", row.error.empty() ? nlohmann::ordered_json() : nlohmann::ordered_json(row.error)}});
  }
  j["heat_transfer_coefficient_h_tb_w_per_k"] = s.heat_transfer_coefficient;
  j["heat_transfer_coefficient_error_w_per_k"] = s.heat_transfer_coefficient_error;
  j["u_surcharge_w_per_m2k"] = s.u_surcharge ? nlohmann::ordered_json(*s.u_surcharge) : nullptr;
  j["junctions_not_calculated"] = s.failed;
  j["cautions"] = standard_cautions();
  return j.dump(2, ' ', false, nlohmann::ordered_json::error_handler_t::replace) + "\n";
}

std::string report_file_name(const std::string& reference) {
  std::string name;
  for (char c : reference) name += std::isalnum(static_cast<unsigned char>(c)) || c == '-' || c == '_' ? c : '_';
  return (name.empty() ? std::string("junction") : name) + ".html";
}

std::string schedule_page(const Schedule& s, const std::vector<std::string>& report_files, const std::string& generated) {
  using html::escape;
  const Project& p = s.project;
  const std::string title = p.record.project.empty() ? "Thermal bridge schedule" : "Thermal bridge schedule — " + p.record.project;
  std::string h = fmt::format("<!DOCTYPE html>\n<html lang=\"en\">\n<head>\n<meta charset=\"utf-8\">\n<title>{}</title>\n<style>{}"
                              "@page {{ @top-left {{ content: {}; }} @bottom-right {{ content: \"page \" counter(page) \" of \" counter(pages); }} }}\n"
                              "</style>\n</head>\n<body>\n",
                              escape(title), html::report_css,
                              html::css_string("Thermal bridge schedule" + (p.record.revision.empty() ? "" : " · rev. " + p.record.revision) + " · " +
                                               (p.record.date.empty() ? generated : p.record.date)));
  h += fmt::format("<header class=\"title-block\">\n<div class=\"kicker\">Thermal bridge schedule · ψ in {} dimensions · ISO 14683</div>\n<h1>{}</h1>\n"
                   "<dl class=\"record\">",
                   dimension_system_name(p.system), escape(p.record.project.empty() ? p.file : p.record.project));
  for (const auto& [label, value] : p.record.fields())
    h += fmt::format("<div><dt>{}</dt><dd>{}</dd></div>", label, value->empty() ? "<span class=\"blank\">—</span>" : escape(*value));
  h += fmt::format("<div class=\"wide\"><dt>Input</dt><dd>{} · calculated {} with edgeflux {}</dd></div></dl>\n</header>\n", escape(p.file),
                   escape(generated), EDGEFLUX_VERSION);
  h += fmt::format("<table class=\"compact\"><caption>Junctions (ψ in {} dimensions, lengths in m)</caption><tr><th>Ref.</th><th>Description</th>"
                   "<th class=\"num\">ψ [W/(m·K)]</th><th class=\"num\">l [m]</th><th class=\"num\">ψ·l [W/K]</th><th class=\"num\">assumed ψ</th>"
                   "<th>f<sub>Rsi</sub> and criteria</th></tr>\n",
                   dimension_system_name(p.system));
  for (std::size_t k = 0; k < s.rows.size(); ++k) {
    const ScheduleRow& r = s.rows[k];
    const std::string reference = k < report_files.size() && !report_files[k].empty()
                                      ? fmt::format("<a href=\"{}\">{}</a>", escape(report_files[k]), escape(r.junction.reference))
                                      : escape(r.junction.reference);
    if (!r.error.empty()) {
      h += fmt::format("<tr><td>{}</td><td>{}</td><td colspan=\"5\"><b>not calculated:</b> {}</td></tr>\n", reference, escape(r.junction.description),
                       escape(r.error));
      continue;
    }
    std::string taken;
    for (const TakenLength& l : r.junction.lengths) taken += fmt::format("<br><span class=\"small\">{} m: {}</span>", fixed(l.metres, 2), escape(l.where));
    h += fmt::format("<tr><td>{}</td><td>{}{}</td><td class=\"num\">{}</td><td class=\"num\">{}</td><td class=\"num\">{}</td><td class=\"num\">{}{}</td>"
                     "<td>{}</td></tr>\n",
                     reference, escape(r.junction.description), taken, fixed(*r.psi, digits::psi), fixed(r.length, 2), fixed(*r.psi_length, 3),
                     r.junction.assumed_psi ? fixed(*r.junction.assumed_psi, digits::psi) : "—",
                     r.exceeds_assumed ? " <b>exceeded</b>" : "", escape(verdict_text(r.result)));
  }
  h += fmt::format("<tr class=\"carried\"><td colspan=\"4\"><b>H<sub>TB</sub> = Σ ψ·l</b>{}</td><td class=\"num\"><b>{}</b></td><td colspan=\"2\">W/K, "
                   "estimated discretisation error ± {} W/K</td></tr>\n",
                   s.failed > 0 ? fmt::format(" — <b>incomplete</b>: {} junction(s) not calculated", s.failed) : "", fixed(s.heat_transfer_coefficient, 3),
                   error_text(s.heat_transfer_coefficient_error, 3));
  if (s.u_surcharge)
    h += fmt::format("<tr><td colspan=\"4\">ΔU<sub>TB</sub> = H<sub>TB</sub> / A = {} / {} m²</td><td class=\"num\"><b>{}</b></td><td colspan=\"2\">W/(m²K)</td></tr>\n",
                     fixed(s.heat_transfer_coefficient, 3), fixed(*p.envelope_area, 1), fixed(*s.u_surcharge, 4));
  h += "</table>\n";
  std::string sources;
  for (const ScheduleRow& r : s.rows)
    if (r.junction.assumed_psi)
      sources += fmt::format("<li>{}: assumed ψ {} — {}</li>", escape(r.junction.reference), fixed(*r.junction.assumed_psi, digits::psi),
                             escape(r.junction.assumed_source));
  if (!sources.empty()) h += "<p class=\"small\"><b>Sources of the assumed values</b></p><ul class=\"small\">" + sources + "</ul>\n";
  h += "<div class=\"cautions\"><h3>Cautions — read before using these results</h3><ul>\n";
  for (const std::string& c : standard_cautions()) h += "<li>" + escape(c) + "</li>\n";
  h += "</ul></div>\n</body>\n</html>\n";
  return h;
}

}  // namespace edgeflux
