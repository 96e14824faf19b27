// Builds the JSON document of a calculation.
#include "report/json_results.h"

#include <nlohmann/json.hpp>

#include "report/text_format.h"

namespace edgeflux {
namespace {
nlohmann::ordered_json located(const LocatedTemperature& t) {
  return {{"temperature_c", t.temperature}, {"x_m", t.at.x}, {"y_m", t.at.y}};
}
}  // namespace

std::string json_results(const CrossSection& section, const Calculation& calc) {
  nlohmann::ordered_json j;
  j["format"] = "edgeflux-results";
  j["format_version"] = 1;
  j["program_version"] = EDGEFLUX_VERSION;
  j["title"] = section.title;
  j["input_file"] = section.file;
  {
    const JunctionRecord& r = section.record;
    j["record"] = {{"reference", r.reference}, {"project", r.project}, {"client", r.client}, {"site", r.site}, {"drawing", r.drawing},
                   {"revision", r.revision}, {"assessor", r.assessor}, {"checker", r.checker}, {"date", r.date}};
  }
  auto& envs = j["environments"] = nlohmann::ordered_json::array();
  for (const EnvironmentFlow& flow : calc.heat_loss.field.environments) {
    const Environment& e = section.environments[flow.environment];
    nlohmann::ordered_json entry{{"id", e.id}, {"temperature_c", e.temperature}, {"heat_flow_w_per_m", flow.heat_flow}};
    if (flow.coldest_surface) entry["coldest_surface"] = located(*flow.coldest_surface);
    if (flow.warmest_surface) entry["warmest_surface"] = located(*flow.warmest_surface);
    envs.push_back(entry);
  }
  j["energy_balance"] = {{"net_heat_flow_w_per_m", calc.heat_loss.field.balance.net},
                         {"relative", calc.heat_loss.field.balance.relative}};
  j["coupling_coefficient_2d_w_per_mk"] =
      calc.heat_loss.field.coupling_2d ? nlohmann::ordered_json(*calc.heat_loss.field.coupling_2d) : nlohmann::ordered_json();
  const JunctionResults& junction = calc.junction;
  auto& flanking = j["flanking_elements"] = nlohmann::ordered_json::array();
  for (const FlankingResult& f : junction.flanking) {
    nlohmann::ordered_json entry{{"id", f.id}, {"u_value_w_per_m2k", f.u_value}, {"u_value_stated", f.u_value_stated},
                                 {"layer_stack_u_value_w_per_m2k", f.stack_u_value ? nlohmann::ordered_json(*f.stack_u_value) : nullptr},
                                 {"surface_resistances_m2k_per_w", {f.start_resistance, f.end_resistance}}};
    auto& layers = entry["layers"] = nlohmann::ordered_json::array();
    for (const FlankingLayer& l : f.layers)
      layers.push_back({{"material", l.material}, {"thickness_m", l.thickness}, {"conductivity_w_per_mk", l.conductivity}});
    auto& lengths = entry["lengths_m"] = nlohmann::ordered_json::object();
    for (DimensionSystem s : all_dimension_systems)
      if (const auto& l = f.length[static_cast<int>(s)]) lengths[dimension_system_key(s)] = *l;
    entry["deviation_from_1d_k"] = f.deviation_from_1d;
    flanking.push_back(entry);
  }
  auto& psi = j["psi_w_per_mk"] = nlohmann::ordered_json::object();
  for (const PsiValue& p : junction.psi) psi[dimension_system_key(p.system)] = p.psi;
  j["carried_forward_system"] = section.carried_forward ? nlohmann::ordered_json(dimension_system_key(*section.carried_forward)) : nullptr;
  if (!junction.pair_psi.empty()) {
    auto& pairs = j["psi_per_environment_pair"] = nlohmann::ordered_json::array();
    for (const PairPsi& p : junction.pair_psi) {
      nlohmann::ordered_json values = nlohmann::ordered_json::object();
      for (const PsiValue& v : p.psi) values[dimension_system_key(v.system)] = v.psi;
      pairs.push_back({{"environments", {section.environments[p.first].id, section.environments[p.second].id}},
                       {"coupling_coefficient_w_per_mk", p.coupling}, {"flanking_elements", p.elements}, {"psi_w_per_mk", values}});
    }
  }
  j["min_interior_surface"] = nullptr;
  if (junction.min_interior_surface) {
    const SurfaceMinimum& m = *junction.min_interior_surface;
    j["min_interior_surface"] = {{"temperature_c", m.temperature}, {"x_m", m.at.x}, {"y_m", m.at.y},
                                 {"surface", section.surfaces[m.surface].name}, {"run", "surface_temperature"},
                                 {"plain_element_governs", junction.plain_element_governs ? nlohmann::ordered_json(*junction.plain_element_governs) : nullptr}};
  }
  j["junction_min_interior_surface"] = nullptr;
  if (junction.junction_minimum) {
    const SurfaceMinimum& m = *junction.junction_minimum;
    j["junction_min_interior_surface"] = {{"temperature_c", m.temperature}, {"x_m", m.at.x}, {"y_m", m.at.y}, {"surface", section.surfaces[m.surface].name}};
  }
  j["temperature_factor_frsi"] = junction.temperature_factor ? nlohmann::ordered_json(*junction.temperature_factor) : nullptr;
  if (section.environments.size() > 2) {
    j["coupling_matrix_w_per_mk"] = junction.coupling;
    j["weighting_factors_g"] = junction.weighting_factors;
  }
  j["climate"] = nullptr;
  if (junction.climate) {
    const Climate& c = *junction.climate;
    j["climate"] = {{"interior_temperature_c", c.interior_temperature},
                    {"interior_relative_humidity", c.interior_relative_humidity ? nlohmann::ordered_json(*c.interior_relative_humidity) : nullptr},
                    {"humidity_class", c.humidity_class ? nlohmann::ordered_json(*c.humidity_class) : nullptr},
                    {"exterior_temperature_c", c.exterior_temperature}, {"rule", c.rule}, {"assumed", junction.climate_assumed}};
  }
  auto& moisture = j["moisture"] = nlohmann::ordered_json::array();
  for (const MoistureResult& m : junction.moisture) {
    const MoistureAssessment& a = m.assessment;
    moisture.push_back({{"surfaces", m.kind == SurfaceKind::glazing ? "glazing" : "opaque"},
                        {"min_surface_temperature_c", m.minimum.temperature}, {"x_m", m.minimum.at.x}, {"y_m", m.minimum.at.y},
                        {"temperature_factor_frsi", m.temperature_factor},
                        {"interior_vapour_pressure_pa", a.interior_vapour_pressure}, {"dew_point_c", a.dew_point},
                        {"mould_min_surface_temperature_c", a.mould_surface_temperature},
                        {"mould_frsi_min", a.mould_temperature_factor}, {"condensation_frsi_min", a.condensation_temperature_factor},
                        {"required_frsi", a.required_temperature_factor}, {"governing_requirement", a.governing_requirement},
                        {"passes", a.passes}, {"margin", a.margin}, {"outcome", criteria_outcome(a.criteria)},
                        {"criteria", [&] {
                           auto list = nlohmann::ordered_json::array();
                           for (const CriterionCheck& c : a.criteria)
                             list.push_back({{"criterion", c.criterion}, {"required_frsi", c.required}, {"met", c.met}, {"governs", c.governs},
                                             {"statement", criterion_statement(c, a.actual_temperature_factor)}});
                           return list;
                         }()},
                        {"verdict", a.verdict}});
  }
  const Convergence& conv = calc.convergence;
  auto estimate = [](const std::optional<ErrorEstimate>& e) {
    return e ? nlohmann::ordered_json{{"value", e->value}, {"error", e->error}, {"observed_rate", e->observed_rate}}
             : nlohmann::ordered_json();
  };
  nlohmann::ordered_json convergence{{"adaptive", conv.adaptive},
                                     {"target", {{"coupling_relative", conv.target.coupling_relative},
                                                 {"psi_w_per_mk", conv.target.psi_absolute},
                                                 {"temperature_k", conv.target.temperature_absolute}}},
                                     {"target_met", conv.target_met},
                                     {"stop_reason", conv.stop_reason},
                                     {"singular_heat_flow", conv.singular_heat_flow}};
  auto& levels = convergence["levels"] = nlohmann::ordered_json::array();
  for (const ConvergenceLevel& l : conv.levels)
    levels.push_back({{"nodes", l.nodes}, {"seconds", l.seconds}, {"sum_abs_heat_flow_w_per_m", l.sum_abs_heat_flow},
                      {"coupling_coefficient_2d_w_per_mk", l.coupling_2d ? nlohmann::ordered_json(*l.coupling_2d) : nullptr},
                      {"min_interior_surface_temperature_c",
                       l.min_surface_temperature ? nlohmann::ordered_json(*l.min_surface_temperature) : nullptr}});
  convergence["coupling_coefficient_2d_w_per_mk"] = estimate(conv.coupling_2d);
  auto& psi_errors = convergence["psi_w_per_mk"] = nlohmann::ordered_json::object();
  for (std::size_t i = 0; i < junction.psi.size() && i < conv.psi.size(); ++i)
    psi_errors[dimension_system_key(junction.psi[i].system)] = estimate(conv.psi[i]);
  convergence["min_interior_surface_temperature_c"] = estimate(conv.min_surface_temperature);
  auto& flow_errors = convergence["heat_flow_w_per_m"] = nlohmann::ordered_json::object();
  for (std::size_t e = 0; e < conv.heat_flows.size(); ++e) flow_errors[section.environments[e].id] = estimate(conv.heat_flows[e]);
  if (conv.doubling)
    convergence["iso10211_doubling_check"] = {{"coarse_nodes", conv.doubling->coarse_nodes},
                                               {"fine_nodes", conv.doubling->fine_nodes},
                                               {"coarse_sum_abs_heat_flow_w_per_m", conv.doubling->coarse_sum},
                                               {"fine_sum_abs_heat_flow_w_per_m", conv.doubling->fine_sum},
                                               {"relative_change", conv.doubling->relative_change},
                                               {"passed", conv.doubling->passed}};
  j["convergence"] = convergence;
  j["sensitivities"] = nullptr;
  if (calc.sensitivities) {
    const Sensitivities& s = *calc.sensitivities;
    auto& sens = j["sensitivities"] = nlohmann::ordered_json::object();
    auto optional = [](const std::optional<double>& v) { return v ? nlohmann::ordered_json(*v) : nlohmann::ordered_json(nullptr); };
    auto& inputs = sens["inputs"] = nlohmann::ordered_json::array();
    for (const InputSensitivity& in : s.inputs) {
      const bool material = in.kind == InputSensitivity::Kind::conductivity;
      nlohmann::ordered_json d_psi = nlohmann::ordered_json::object();
      for (std::size_t i = 0; i < in.psi.size() && i < junction.psi.size(); ++i) d_psi[dimension_system_key(junction.psi[i].system)] = in.psi[i];
      const double p = material ? in.value : in.temperature_run_value;
      inputs.push_back({{"kind", material ? "conductivity" : "surface_resistance"},
                        {material ? "material" : "surface", in.name},
                        {"value", in.value},
                        {"temperature_run_value", material ? nlohmann::ordered_json(nullptr) : nlohmann::ordered_json(in.temperature_run_value)},
                        {"relative_uncertainty", material ? nlohmann::ordered_json(in.relative_uncertainty) : nlohmann::ordered_json(nullptr)},
                        {"d_coupling_2d", optional(in.coupling)},
                        {"elasticity_coupling_2d", in.coupling && calc.heat_loss.field.coupling_2d
                                                       ? optional(elasticity(*in.coupling, in.value, *calc.heat_loss.field.coupling_2d))
                                                       : nlohmann::ordered_json(nullptr)},
                        {"d_psi", d_psi},
                        {"d_min_surface_temperature", optional(in.min_surface_temperature)},
                        {"d_temperature_factor", optional(in.temperature_factor)},
                        {"elasticity_temperature_factor", in.temperature_factor && junction.temperature_factor
                                                              ? optional(elasticity(*in.temperature_factor, p, *junction.temperature_factor))
                                                              : nlohmann::ordered_json(nullptr)}});
    }
    auto range = [](const FirstOrderRange& r) {
      return nlohmann::ordered_json{{"value", r.value}, {"independent", r.independent}, {"worst_case", r.worst_case}};
    };
    nlohmann::ordered_json psi_ranges = nlohmann::ordered_json::object();
    for (std::size_t i = 0; i < s.psi.size() && i < junction.psi.size(); ++i) psi_ranges[dimension_system_key(junction.psi[i].system)] = range(s.psi[i]);
    sens["uncertainty"] = {{"psi", psi_ranges},
                           {"temperature_factor", s.temperature_factor ? range(*s.temperature_factor) : nlohmann::ordered_json(nullptr)}};
    sens["verdict_robustness"] = nullptr;
    if (s.verdict)
      sens["verdict_robustness"] = {{"surface_kind", s.verdict->kind == SurfaceKind::glazing ? "glazing" : "opaque"},
                                    {"temperature_factor", s.verdict->temperature_factor},
                                    {"worst_temperature_factor", s.verdict->worst_temperature_factor},
                                    {"required_temperature_factor", s.verdict->required_temperature_factor},
                                    {"still_met", s.verdict->still_met}};
    sens["energy_identity_relative"] = optional(s.energy_identity_relative);
    sens["seconds"] = s.seconds;
  }
  j["warnings"] = junction.warnings;
  j["cautions"] = junction.cautions;
  auto& probes = j["probes"] = nlohmann::ordered_json::array();
  for (const ProbeReading& p : calc.heat_loss.field.probes)
    probes.push_back({{"name", p.name}, {"x_m", p.at.x}, {"y_m", p.at.y}, {"temperature_c", p.temperature}});
  j["mesh"] = {{"mesher", calc.mesh.mesher}, {"nodes", calc.mesh.n_points()}, {"triangles", calc.mesh.n_triangles()}};
  j["solver"] = {{"linear_solver", calc.heat_loss.info.solver}, {"unknowns", calc.heat_loss.info.n_unknowns}};
  j["timings_s"] = {{"mesh", calc.timings.mesh_seconds}, {"assemble", calc.heat_loss.info.assemble_seconds},
                    {"factorize", calc.heat_loss.info.factorize_seconds}, {"solve", calc.heat_loss.info.solve_seconds}};
  // A file name that is not UTF-8 is written with U+FFFD in its place, not refused after the solve.
  return j.dump(2, ' ', false, nlohmann::ordered_json::error_handler_t::replace) + "\n";
}

}  // namespace edgeflux
