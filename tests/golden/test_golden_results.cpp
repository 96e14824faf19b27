// Golden results: every example and every detail of the library gives the values recorded in
// tests/golden/results.tsv. A refactor must leave them unchanged; a change of the method must
// rewrite the file on purpose (EDGEFLUX_WRITE_GOLDEN=1 build/edgeflux_tests -tc="golden*") and say
// why in its commit.
#include <doctest/doctest.h>

#include <algorithm>
#include <cmath>
#include <cstdlib>
#include <filesystem>
#include <fmt/format.h>
#include <fstream>
#include <map>
#include <sstream>

#include "../test_support.h"

using namespace edgeflux;
namespace fs = std::filesystem;

namespace {

/// (file, quantity) → value, in a stable order.
using Results = std::map<std::pair<std::string, std::string>, double>;

void record(Results& r, const std::string& file, const Calculation& calc) {
  auto put = [&](const std::string& what, double v) { r[{file, what}] = v; };
  put("nodes", static_cast<double>(calc.mesh.n_points()));
  put("levels", static_cast<double>(calc.convergence.levels.size()));
  if (calc.heat_loss.field.coupling_2d) put("L2D", *calc.heat_loss.field.coupling_2d);
  for (std::size_t e = 0; e < calc.heat_loss.field.environments.size(); ++e)
    put(fmt::format("heat flow {}", e), calc.heat_loss.field.environments[e].heat_flow);
  for (const PsiValue& p : calc.junction.psi) put(fmt::format("psi {}", dimension_system_name(p.system)), p.psi);
  if (calc.junction.min_interior_surface) put("theta_si_min", calc.junction.min_interior_surface->temperature);
  if (calc.junction.temperature_factor) put("fRsi", *calc.junction.temperature_factor);
  if (calc.junction.junction_minimum) put("junction theta_si_min", calc.junction.junction_minimum->temperature);
  for (const PairPsi& pair : calc.junction.pair_psi)
    for (const PsiValue& p : pair.psi) put(fmt::format("psi {}-{} {}", pair.first, pair.second, dimension_system_name(p.system)), p.psi);
  for (const auto& p : calc.heat_loss.field.probes) put("probe " + p.name, p.temperature);
  if (calc.convergence.coupling_2d) put("L2D error bar", calc.convergence.coupling_2d->error);
}

Results compute() {
  Results r;
  for (const char* folder : {"examples", "details"}) {
    for (const fs::path file : test::detail_files_in(folder)) {
      const std::string name = std::string(folder) + "/" + file.filename().string();
      CAPTURE(name);
      record(r, name, calculate(read_detail_file(file.string()), {}));
    }
  }
  return r;
}

const std::string golden_file = test::source_path("tests/golden/results.tsv");

}  // namespace

TEST_CASE("golden results: every example and library detail gives its recorded values (refactors change nothing)") {
  const Results now = compute();
  if (std::getenv("EDGEFLUX_WRITE_GOLDEN")) {
    std::ofstream out(golden_file);
    out << "# file\tquantity\tvalue (%.17g) — written by EDGEFLUX_WRITE_GOLDEN=1 build/edgeflux_tests -tc=\"golden*\"\n";
    for (const auto& [key, value] : now) out << key.first << '\t' << key.second << '\t' << fmt::format("{:.17g}", value) << '\n';
    MESSAGE("wrote ", now.size(), " values to ", golden_file);
    return;
  }
  std::ifstream in(golden_file);
  REQUIRE_MESSAGE(in, "no " << golden_file);
  Results recorded;
  for (std::string line; std::getline(in, line);) {
    if (line.empty() || line[0] == '#') continue;
    std::istringstream fields(line);
    std::string file, what, value;
    std::getline(fields, file, '\t'), std::getline(fields, what, '\t'), std::getline(fields, value, '\t');
    recorded[{file, what}] = std::stod(value);
  }
  CHECK(recorded.size() == now.size());
  int identical = 0;
  for (const auto& [key, value] : recorded) {
    CAPTURE(key.first);
    CAPTURE(key.second);
    const auto found = now.find(key);
    REQUIRE_MESSAGE(found != now.end(), "no longer computed");
    // Bit-identical on the machine that wrote the file; 1e-12 of the value allows for another CPU's
    // BLAS kernels summing in another order (common practice). Any change of the mesh or the method
    // moves these values by 1e-7 or more.
    CHECK(std::abs(found->second - value) <= 1e-12 * std::max(std::abs(value), 1e-3));
    if (found->second == value) ++identical;
  }
  MESSAGE(identical, " of ", recorded.size(), " golden values bit-identical");
}
