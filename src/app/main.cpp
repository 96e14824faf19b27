// The edgeflux command line: the only place that knows about exit codes.
//   0  success            2  a problem in the input (message says where and how to fix it)
//   1  usage error        3  numerical failure or internal error
//   4  the conformity check found a value outside the ISO 10211 tolerance
#include <CLI/CLI.hpp>
#include <fmt/format.h>

#include <cstdio>
#include <iostream>

#include "core/atomic_file.h"
#include "core/error.h"
#include "input/read_detail_file.h"
#include "pipeline/calculate.h"
#include "report/json_results.h"
#include "report/output_files.h"
#include "report/summary_text.h"
#include "validation/iso10211_conformity.h"

namespace {

using namespace edgeflux;

struct SolveArgs {
  std::string detail_file;
  std::string json_file;
  double density = 0.0;
  std::string mesher;
  std::string solver = "cholesky";
  bool quiet = false;
  bool fixed_mesh = false;
  AccuracyTarget target;
  OutputRequest outputs;  ///< --report, --svg-dir, --png-dir, --vtu, --surface-csv
};

int run_solve(const SolveArgs& args) {
  const CrossSection section = read_detail_file(args.detail_file);
  CalculationOptions options;
  if (args.density > 0.0) options.density = args.density;
  if (args.mesher == "grid") options.mesher = MeshSettings::Mesher::grid;
  else if (args.mesher == "delaunay") options.mesher = MeshSettings::Mesher::delaunay;
  else if (args.mesher == "automatic") options.mesher = MeshSettings::Mesher::automatic;
  if (args.solver == "ldlt") options.solve.solver = LinearSolver::simplicial_ldlt;
  else if (args.solver == "cg") options.solve.solver = LinearSolver::conjugate_gradient;
  if (!args.quiet) options.progress = [](const std::string& stage) { fmt::print(stderr, "edgeflux: {}…\n", stage); };
  options.adaptive = !args.fixed_mesh;
  options.target = args.target;

  const Calculation calc = calculate(section, options);
  // Every output is built in memory first, so a failure leaves no file behind.
  std::vector<OutputFile> files;
  if (!args.json_file.empty()) files.push_back({args.json_file, json_results(section, calc).dump(2) + "\n"});
  for (OutputFile& f : build_output_files(section, calc, args.outputs)) files.push_back(std::move(f));
  check_output_paths(files);  // every path is checked before the first file is written
  fmt::print("{}", summary_text(section, calc));
  write_output_files(files);
  for (const OutputFile& f : files) fmt::print("Written: {}\n", f.path);
  return 0;
}

}  // namespace

int main(int argc, char** argv) {
  CLI::App app{"edgeflux — two-dimensional thermal bridge assessment of building-envelope junctions "
               "(steady-state conduction, ISO 10211 methods)"};
  app.require_subcommand(1);
  app.set_version_flag("--version", std::string(EDGEFLUX_VERSION));

  SolveArgs solve;
  CLI::App* solve_cmd = app.add_subcommand("solve", "Solve a detail file: heat flows, L2D, surface and probe temperatures");
  solve_cmd->add_option("detail", solve.detail_file, "Detail file (XML, see docs/detail-format.md)")->required();
  solve_cmd->add_option("--json", solve.json_file, "Also write the results as JSON to this file");
  solve_cmd->add_option("--density", solve.density, "Mesh density factor (overrides the file; 2 ≈ twice the elements per length)")
      ->check(CLI::Range(0.01, 64.0));
  solve_cmd->add_option("--mesher", solve.mesher, "Mesher: automatic, grid (rectilinear sections) or delaunay")
      ->check(CLI::IsMember({"automatic", "grid", "delaunay"}));
  solve_cmd->add_option("--solver", solve.solver, "Linear solver: cholesky (default), ldlt or cg")
      ->check(CLI::IsMember({"cholesky", "ldlt", "cg"}));
  solve_cmd->add_flag("-q,--quiet", solve.quiet, "Do not print progress");
  solve_cmd->add_option("--report", solve.outputs.html_report, "Write the HTML report (self-contained, prints to A4) to this file");
  solve_cmd->add_option("--svg-dir", solve.outputs.svg_folder, "Write the report drawings as SVG files into this folder");
  solve_cmd->add_option("--png-dir", solve.outputs.png_folder, "Write the report drawings as PNG files into this folder");
  solve_cmd->add_option("--vtu", solve.outputs.vtu_file, "Write mesh, temperatures and heat flux as VTK XML (.vtu) to this file");
  solve_cmd->add_option("--surface-csv", solve.outputs.surface_csv, "Write interior surface temperatures along the surface as CSV to this file");

  solve_cmd->add_option("--target", solve.target.coupling_relative,
                        "Relative accuracy asked of L2D (and of each heat flow), default 0.001 = 0.1 %")
      ->check(CLI::Range(1e-6, 0.1));
  solve_cmd->add_option("--psi-target", solve.target.psi_absolute, "Accuracy asked of ψ in W/(m·K), default 0.0005")
      ->check(CLI::Range(1e-7, 0.1));
  solve_cmd->add_option("--temperature-target", solve.target.temperature_absolute,
                        "Accuracy asked of the minimum interior surface temperature in K, default 0.01")
      ->check(CLI::Range(1e-6, 1.0));
  solve_cmd->add_flag("--fixed-mesh", solve.fixed_mesh,
                      "Solve once on the mesh of --density instead of refining to the accuracy targets");

  bool conformity_quiet = false;
  CLI::App* conformity_cmd = app.add_subcommand(
      "conformity", "Solve the ISO 10211 validation cases 1 and 2 (built in) and print the conformity table; "
                    "exits with 4 if any value is outside the standard's tolerance");
  conformity_cmd->add_flag("-q,--quiet", conformity_quiet, "Do not print progress");

  try {
    app.parse(argc, argv);
  } catch (const CLI::ParseError& e) {
    const int code = app.exit(e);  // prints the help or the usage message
    return code == 0 ? 0 : 1;
  }
  try {
    if (*solve_cmd) return run_solve(solve);
    if (*conformity_cmd) {
      const ConformityReport report = iso10211_conformity(
          conformity_quiet ? std::function<void(const std::string&)>() : [](const std::string& stage) {
            fmt::print(stderr, "edgeflux: solving {}…\n", stage);
          });
      fmt::print("{}", conformity_text(report));
      return report.passed() ? 0 : 4;
    }
  } catch (const InputError& e) {
    fmt::print(stderr, "edgeflux: error: {}\n", e.what());
    return 2;
  } catch (const std::exception& e) {
    fmt::print(stderr, "edgeflux: failed: {}\n", e.what());
    return 3;
  }
  return 1;
}
