// Builds the JSON document of a calculation.
#include "report/json_results.h"

namespace edgeflux {
namespace {
nlohmann::ordered_json located(const LocatedTemperature& t) {
  return {{"temperature_c", t.temperature}, {"x_m", t.at.x}, {"y_m", t.at.y}};
}
}  // namespace

nlohmann::ordered_json json_results(const CrossSection& section, const Calculation& calc) {
  nlohmann::ordered_json j;
  j["format"] = "edgeflux-results";
  j["format_version"] = 1;
  j["program_version"] = EDGEFLUX_VERSION;
  j["title"] = section.title;
  j["input_file"] = section.file;
  auto& envs = j["environments"] = nlohmann::ordered_json::array();
  for (const EnvironmentFlow& flow : calc.field.environments) {
    const Environment& e = section.environments[flow.environment];
    nlohmann::ordered_json entry{{"id", e.id}, {"temperature_c", e.temperature}, {"heat_flow_w_per_m", flow.heat_flow}};
    if (flow.coldest_surface) entry["coldest_surface"] = located(*flow.coldest_surface);
    if (flow.warmest_surface) entry["warmest_surface"] = located(*flow.warmest_surface);
    envs.push_back(entry);
  }
  j["energy_balance"] = {{"net_heat_flow_w_per_m", calc.field.balance.net},
                         {"relative", calc.field.balance.relative}};
  j["coupling_coefficient_2d_w_per_mk"] =
      calc.field.coupling_2d ? nlohmann::ordered_json(*calc.field.coupling_2d) : nlohmann::ordered_json();
  // The minimum surface temperature over interior surfaces (all surfaces if none is interior).
  std::optional<LocatedTemperature> coldest_interior;
  for (const EnvironmentFlow& flow : calc.field.environments) {
    const bool interior = section.environments[flow.environment].side == Side::interior;
    if (interior && flow.coldest_surface &&
        (!coldest_interior || flow.coldest_surface->temperature < coldest_interior->temperature))
      coldest_interior = flow.coldest_surface;
  }
  j["min_interior_surface"] = coldest_interior ? located(*coldest_interior) : nlohmann::ordered_json();
  auto& probes = j["probes"] = nlohmann::ordered_json::array();
  for (const ProbeReading& p : calc.field.probes)
    probes.push_back({{"name", p.name}, {"x_m", p.at.x}, {"y_m", p.at.y}, {"temperature_c", p.temperature}});
  j["mesh"] = {{"mesher", calc.mesh.mesher}, {"nodes", calc.mesh.n_points()}, {"triangles", calc.mesh.n_triangles()}};
  j["solver"] = {{"linear_solver", calc.solution.info.solver}, {"unknowns", calc.solution.info.n_unknowns}};
  j["timings_s"] = {{"mesh", calc.timings.mesh_seconds}, {"assemble", calc.solution.info.assemble_seconds},
                    {"factorize", calc.solution.info.factorize_seconds}, {"solve", calc.solution.info.solve_seconds}};
  return j;
}

}  // namespace edgeflux
