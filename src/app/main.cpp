// The edgeflux command line: the only place that knows about exit codes.
//   0  success            2  a problem in the input (message says where and how to fix it)
//   1  usage error        3  numerical failure or internal error
//   4  the conformity check found a value outside the ISO 10211 tolerance
#include <CLI/CLI.hpp>
#include <sys/resource.h>
#include <unistd.h>
#include <fmt/format.h>
#include <fmt/ranges.h>

#include <algorithm>
#include <cmath>
#include <cstdint>
#include <cstdio>
#include <cerrno>
#include <cstdlib>
#include <cstring>
#include <filesystem>
#include <fstream>
#include <iostream>
#include <numbers>
#include <optional>
#include <sstream>

#include "app/output_writer.h"
#include "app/watch.h"
#include "core/atomic_file.h"
#include "core/error.h"
#include "input/material_library.h"
#include "input/read_detail_file.h"
#include "pipeline/calculate.h"
#include "pipeline/import_drawing.h"
#include "pipeline/variants.h"
#include "report/import_files.h"
#include "report/import_picture.h"
#include "report/json_results.h"
#include "physics/ground_floor.h"
#include "project/read_project_file.h"
#include "project/run_project.h"
#include "report/number_format.h"
#include "report/schedule_files.h"
#include "report/variants_page.h"
#include "report/html_report.h"
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
  std::vector<std::string> parameter_settings;  ///< "name=value"
  std::string carry_forward;                    ///< dimension system word, overrides the file
  std::string appendices = "all";
  AccuracyTarget target;
  OutputRequest outputs;  ///< --report, --svg-dir, --png-dir, --vtu, --surface-csv
};

/// "name=value" pairs from --set into overrides; a malformed pair is a usage error of the input.
ParameterOverrides parse_settings(const std::vector<std::string>& settings) {
  ParameterOverrides overrides;
  for (const std::string& setting : settings) {
    const auto eq = setting.find('=');
    char* end = nullptr;
    const double value = eq == std::string::npos ? 0.0 : std::strtod(setting.c_str() + eq + 1, &end);
    if (eq == std::string::npos || eq == 0 || end == setting.c_str() + eq + 1 || *end != '\0' || !std::isfinite(value))
      throw_input_error({"command line", 0}, "--set " + setting, "is not of the form name=number",
                        "write e.g. --set insulation_thickness=160");
    if (!overrides.emplace(setting.substr(0, eq), value).second)
      throw_input_error({"command line", 0}, "--set " + setting, fmt::format("sets '{}' a second time", setting.substr(0, eq)),
                        "give each parameter once");
  }
  return overrides;
}

std::string read_whole_file(const std::string& path) {
  std::ifstream in(path, std::ios::binary);
  if (!in)
    throw_input_error({path, 0}, "detail file", "cannot be read again to embed it in the report",
                      "keep the file in place while edgeflux runs");
  std::ostringstream text;
  text << in.rdbuf();
  return text.str();
}

/// Before any output file replaces an old one: the printed summary must have reached standard
/// output, or the run fails with the old files untouched.
void require_summary_written() {
  if (std::fflush(stdout) != 0 || std::ferror(stdout))
    throw_input_error({"standard output", 0}, "printed summary", fmt::format("could not be written ({})", std::strerror(errno)),
                      "free space on the disk or check where the output is redirected; no output file was changed");
}

/// --carry-forward: the system must have a length for every flanking element, as in the file.
void carry_forward(CrossSection& section, DimensionSystem system) {
  if (section.flanking_elements.empty())
    throw_input_error({"command line", 0}, "--carry-forward", fmt::format("names a dimension system, but {} has no flanking elements", section.file),
                      "add <flanking-elements> to the detail (their U and lengths define ψ), or leave out --carry-forward");
  for (const FlankingElement& f : section.flanking_elements)
    if (!f.length[static_cast<int>(system)])
      throw_input_error({"command line", 0}, "--carry-forward " + std::string(dimension_system_word(system)),
                        fmt::format("flanking element '{}' has no {} length ({}:{})", f.id, dimension_system_name(system), f.where.file, f.where.line),
                        "choose a system the detail gives lengths for, or add that length to the element");
  section.carried_forward = system;
}

int run_solve(const SolveArgs& args) {
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
  options.sensitivities = true;

  CrossSection section = read_detail_file(args.detail_file, parse_settings(args.parameter_settings), arc_tolerance_for(options.target));
  // The output paths are checked before the solve too, so a long run is not wasted on a bad path.
  {
    std::vector<OutputFile> planned;
    for (const std::string* path : {&args.json_file, &args.outputs.html_report, &args.outputs.vtu_file, &args.outputs.surface_csv})
      if (!path->empty()) planned.push_back({*path, ""});
    for (const std::string* folder : {&args.outputs.svg_folder, &args.outputs.png_folder})
      if (!folder->empty()) planned.push_back({(std::filesystem::path(*folder) / "detail.svg").string(), "", true});
    check_output_paths(planned, {args.detail_file});
  }
  if (!args.carry_forward.empty()) carry_forward(section, *dimension_system_from_word(args.carry_forward));
  const Calculation calc = calculate(section, options);
  // Every output is built in memory first, so a failure leaves no file behind.
  std::vector<OutputFile> files;
  if (!args.json_file.empty()) files.push_back({args.json_file, json_results(section, calc)});
  ReportProvenance provenance;
  if (!args.outputs.html_report.empty()) {
    // The report embeds the detail file and carries the validation of the very build that made it.
    provenance = {read_whole_file(args.detail_file), report_timestamp(), iso10211_conformity()};
  }
  OutputRequest outputs = args.outputs;
  outputs.report_appendices = args.appendices == "all";
  for (OutputFile& f : build_output_files(section, calc, outputs, provenance)) files.push_back(std::move(f));
  check_output_paths(files, {args.detail_file});  // every path is checked before the first file is written
  fmt::print("{}", summary_text(section, calc));
  require_summary_written();
  write_output_files(files);
  for (const OutputFile& f : files) fmt::print("Written: {}\n", f.path);
  return 0;
}

struct WatchArgs {
  std::string detail_file, report_file;
  std::vector<std::string> parameter_settings;
  AccuracyTarget target;
  int runs = 0;
  bool quiet = false;
};

/// `edgeflux watch`: the detail solved on every save, its report page kept current.
int run_watch(const WatchArgs& args) {
  WatchSettings settings;
  settings.detail_file = args.detail_file;
  settings.overrides = parse_settings(args.parameter_settings);
  settings.report_file = args.report_file;
  settings.runs = args.runs;
  settings.quiet = args.quiet;
  // A file that is not there at the start is a mistyped path, not an edit in progress.
  if (!std::filesystem::is_regular_file(args.detail_file))
    throw_input_error({args.detail_file, 0}, "detail file", "does not exist or is not a file",
                      "check the path; watch re-solves a detail file that exists each time it is saved");
  check_output_paths({{args.report_file, ""}}, {args.detail_file});
  if (!args.quiet)
    fmt::print(stderr, "edgeflux watch: solving {} on every save, page {} (open it in a browser; Ctrl-C ends)\n",
               args.detail_file, args.report_file);
  return watch_detail(settings, [&] {
    CalculationOptions options;
    options.target = args.target;
    options.sensitivities = true;
    const CrossSection section = read_detail_file(args.detail_file, settings.overrides, arc_tolerance_for(options.target));
    const Calculation calc = calculate(section, options);
    WatchedResult result;
    result.report_html = html_report(section, calc, report_drawings(section, calc), {read_whole_file(args.detail_file), report_timestamp(), std::nullopt});
    if (calc.heat_loss.field.coupling_2d) result.summary_line = fmt::format("L2D {} W/(m·K)", fixed(*calc.heat_loss.field.coupling_2d, digits::coupling));
    for (const PsiValue& p : calc.junction.psi)
      result.summary_line += fmt::format(", ψ {} {}", dimension_system_name(p.system), fixed(p.psi, digits::psi));
    if (calc.junction.temperature_factor)
      result.summary_line += fmt::format(", fRsi {}", fixed(*calc.junction.temperature_factor, digits::temperature_factor));
    return result;
  });
}

/// "name=from:to:steps" into a range.
ParameterRange parse_range(const std::string& text) {
  ParameterRange range;
  const auto eq = text.find('=');
  bool ok = eq != std::string::npos && eq > 0;
  if (ok) {
    range.name = text.substr(0, eq);
    ok = std::sscanf(text.c_str() + eq + 1, "%lf:%lf:%d", &range.from, &range.to, &range.steps) == 3 &&
         std::isfinite(range.from) && std::isfinite(range.to) && range.steps >= 2 && range.steps <= 1000;
  }
  if (!ok)
    throw_input_error({"command line", 0}, "--vary " + text, "is not of the form name=from:to:steps (2 ≤ steps ≤ 1000)",
                      "write e.g. --vary insulation_thickness=80:240:5");
  return range;
}

/// Prints the variants as a table and writes the CSV and the page, all built before any is written.
int finish_variants(const std::string& heading, const std::vector<VariantSummary>& variants,
                    const std::vector<std::string>& parameter_names, const std::string& csv_file,
                    const std::string& page_file, const std::vector<std::string>& inputs) {
  fmt::print("{}\n\n", heading);
  // The first column is as wide as the longest label, so long parameter names keep the columns aligned.
  std::size_t width = 7;
  for (const VariantSummary& v : variants) width = std::max(width, v.label.size());
  const bool glazing = std::any_of(variants.begin(), variants.end(), [](const VariantSummary& v) {
    return std::any_of(v.verdicts.begin(), v.verdicts.end(), [](const KindVerdict& k) { return k.kind == SurfaceKind::glazing; });
  });
  auto kind_columns = [](const VariantSummary& v, SurfaceKind kind) {
    for (const KindVerdict& k : v.verdicts)
      if (k.kind == kind)
        return fmt::format("{:>7} {:>9}  {:<19}", fixed(k.temperature_factor, digits::temperature_factor),
                           fixed(k.required_temperature_factor, digits::temperature_factor), criteria_outcome(k.criteria));
    return fmt::format("{:>7} {:>9}  {:<19}", "—", "—", "");
  };
  fmt::print("  {:<{}} {:>11} {:>11}  {:>7} {:>9}  {:<19}{}\n", "variant", width, "ψ external", "ψ internal", "fRsi", "required",
             "opaque surfaces", glazing ? fmt::format(" {:>7} {:>9}  {}", "fRsi", "required", "glazing and frames") : "");
  int failed = 0;
  double largest_error = 0.0;
  for (const VariantSummary& v : variants) {
    if (!v.error.empty()) {
      fmt::print("  {:<{}} not calculated: {}\n", v.label, width, v.error);
      ++failed;
      continue;
    }
    auto psi = [&](DimensionSystem s) {
      for (std::size_t i = 0; i < v.psi.size(); ++i)
        if (v.psi[i].system == s) return fixed(v.psi[i].psi, digits::psi) + (v.carried_forward == s ? "*" : " ");
      return std::string("— ");
    };
    for (double e : v.psi_error) largest_error = std::max(largest_error, e);
    fmt::print("  {:<{}} {:>11} {:>11}  {}{}\n", v.label, width, psi(DimensionSystem::external), psi(DimensionSystem::internal),
               kind_columns(v, SurfaceKind::opaque), glazing ? " " + kind_columns(v, SurfaceKind::glazing) : "");
  }
  fmt::print("\n  ψ in W/(m·K); * the system carried forward; largest estimated discretisation error of ψ: {} W/(m·K).\n"
             "  fRsi from the surface-temperature run (ISO 13788, Rsi 0.25 opaque, 0.13 glazing); required: the highest criterion"
             " (ISO 13788 and any national minimum), each stated in the page and the CSV.\n",
             error_text(largest_error, digits::psi));
  if (const std::string note = mesh_reuse_note(variants); !note.empty()) fmt::print("  {}\n", note);
  std::vector<OutputFile> files;
  if (!csv_file.empty()) files.push_back({csv_file, variants_csv(variants, parameter_names)});
  if (!page_file.empty()) files.push_back({page_file, variants_page(heading, variants, parameter_names, report_timestamp())});
  check_output_paths(files, inputs);
  require_summary_written();
  write_output_files(files);
  for (const OutputFile& f : files) fmt::print("Written: {}\n", f.path);
  fmt::print("\nResults depend on the inputs and modelling choices; local building codes and a qualified professional "
             "decide compliance.\n");
  return failed == 0 ? 0 : 2;
}

struct ImportArgs {
  std::string drawing, detail, picture, unit;
  std::vector<std::string> mappings;
};

/// Lists the drawing's layers and what the mapping makes of it; writes the starting detail and
/// the numbered picture when asked, both built before either is written.
int run_import(const ImportArgs& args) {
  ImportOptions options;
  options.mappings = args.mappings;
  if (!args.unit.empty()) options.unit = args.unit;
  const DrawingImport import = import_drawing(args.drawing, options);
  std::vector<OutputFile> files;
  if (!args.detail.empty())
    files.push_back({args.detail, starting_detail_xml(import, args.drawing, args.detail, args.picture)});
  if (!args.picture.empty()) files.push_back({args.picture, import_picture_svg(import)});
  check_output_paths(files, {args.drawing});
  fmt::print("{}", import_summary_text(import));
  require_summary_written();
  write_output_files(files);
  for (const OutputFile& f : files) fmt::print("Written: {}\n", f.path);
  if (!args.detail.empty())
    fmt::print("Next: fill in the conductivities marked \"?\", choose the surfaces from S1…S{} in {}, then "
               "edgeflux solve {}\n", import.runs.size(), args.detail, args.detail);
  return 0;
}

/// Solving needs this much address space: below it the BLAS library's buffer allocation (128 MB
/// per thread) retries for ever instead of failing (measured: 450 MB hangs, 500 MB solves the demo).
constexpr std::uint64_t min_address_space_bytes = 640ull << 20;

/// A clear failure instead of a hang when `ulimit -v` leaves too little address space to solve.
std::optional<std::string> address_space_too_small() {
  rlimit limit{};
  if (::getrlimit(RLIMIT_AS, &limit) != 0 || limit.rlim_cur == RLIM_INFINITY || limit.rlim_cur >= min_address_space_bytes)
    return std::nullopt;
  return fmt::format("the process may use only {} MB of address space (ulimit -v); solving needs at least {} MB: raise "
                     "the limit", limit.rlim_cur >> 20, min_address_space_bytes >> 20);
}

/// The exit code after making sure the printed results reached standard output: a full disk or
/// a closed pipe there is an error, not a silent empty file.
int with_output_flushed(int code) {
  if (std::fflush(stdout) != 0 || std::ferror(stdout)) {
    fmt::print(stderr, "edgeflux: error: standard output: what was printed could not be written ({}). Fix: free space on the "
                       "disk or check where the output is redirected\n", std::strerror(errno));
    return 2;
  }
  return code;
}

/// A number in [lo, hi]; "nan" and "inf" are refused (CLI11's Range lets NaN through, since every
/// comparison with it is false).
CLI::Validator finite_range(double lo, double hi) {
  return CLI::Validator(
      [lo, hi](std::string& text) -> std::string {
        char* end = nullptr;
        const double v = std::strtod(text.c_str(), &end);
        if (end == text.c_str() || *end != '\0' || !std::isfinite(v)) return "\"" + text.substr(0, 40) + "\" is not a finite number";
        if (v < lo || v > hi) return fmt::format("{} is outside [{}, {}]", text.substr(0, 40), lo, hi);
        return "";
      },
      fmt::format("NUMBER in [{}, {}]", lo, hi));
}

std::function<void(int, int)> variant_progress(bool quiet) {
  if (quiet) return {};
  return [](int done, int total) { fmt::print(stderr, "\redgeflux: {}/{} variants solved{}", done, total, done == total ? "\n" : ""); };
}

struct ProjectArgs {
  std::string file, csv, json, cache, hand_in;
  int jobs = 0;
  bool quiet = false, no_cache = false, from_scratch = false;
};

struct GroundArgs {
  double area = 0, perimeter = 0, wall = 0, floor_resistance = 0, soil = 2.0;
};

/// `edgeflux project`: every junction of a project file solved, the schedule printed and written.
int run_project_command(const ProjectArgs& project) {
  const Project p = read_project_file(project.file);
  std::vector<OutputFile> planned;
  for (const std::string* path : {&project.csv, &project.json})
    if (!path->empty()) planned.push_back({*path, ""});
  if (!project.hand_in.empty()) planned.push_back({(std::filesystem::path(project.hand_in) / "index.html").string(), "", true});
  std::vector<std::string> inputs{project.file};
  for (const ProjectJunction& j : p.junctions) inputs.push_back(j.detail_file);
  check_output_paths(planned, inputs);
  auto progress = project.quiet ? std::function<void(int, int)>() : [](int done, int total) {
    fmt::print(stderr, "\redgeflux: {}/{} junctions solved{}", done, total, done == total ? "\n" : "");
  };
  const std::string cache = project.no_cache ? std::string()
                            : !project.cache.empty() ? project.cache
                                                     : (std::filesystem::path(project.file).parent_path() / ".edgeflux-cache").string();
  // The hand-in set needs every junction's report, so every junction is solved in this run.
  std::vector<std::string> reports(p.junctions.size());
  const std::string generated = report_timestamp();
  CalculationHook build_report;
  if (!project.hand_in.empty())
    build_report = [&](std::size_t k, const CrossSection& section, const Calculation& calc) {
      // The junction's report carries the project's record and the junction's reference.
      CrossSection in_project = section;
      in_project.record = record_in_project(section.record, p.record, p.junctions[k].reference);
      reports[k] = html_report(in_project, calc, report_drawings(in_project, calc), {read_whole_file(section.file), generated, std::nullopt});
    };
  CalculationOptions options;
  options.reuse_meshes = !project.from_scratch;
  const Schedule schedule = run_project(p, options, project.jobs, progress, cache, build_report);
  std::vector<OutputFile> files;
  if (!project.csv.empty()) files.push_back({project.csv, schedule_csv(schedule)});
  if (!project.json.empty()) files.push_back({project.json, schedule_json(schedule)});
  if (!project.hand_in.empty()) {
    std::vector<std::string> links(p.junctions.size());
    for (std::size_t k = 0; k < p.junctions.size(); ++k)
      if (!reports[k].empty()) {
        links[k] = report_file_name(p.junctions[k].reference);
        files.push_back({(std::filesystem::path(project.hand_in) / links[k]).string(), reports[k], true});
      }
    files.push_back({(std::filesystem::path(project.hand_in) / "index.html").string(), schedule_page(schedule, links, generated), true});
  }
  check_output_paths(files, inputs);
  fmt::print("{}", schedule_text(schedule));
  require_summary_written();
  write_output_files(files);
  for (const OutputFile& f : files) fmt::print("Written: {}\n", f.path);
  return with_output_flushed(schedule.failed == 0 ? 0 : 2);
}

/// `edgeflux ground`: Ug of a slab on ground by ISO 13370, with its derivation.
int run_ground(const GroundArgs& ground) {
  SlabOnGround floor;
  floor.characteristic_dimension = characteristic_dimension(ground.area, ground.perimeter);
  floor.wall_thickness = ground.wall;
  floor.floor_resistance = ground.floor_resistance;
  floor.ground_conductivity = ground.soil;
  const GroundFloorU u = slab_on_ground_u(floor);
  fmt::print("Slab-on-ground floor, ISO 13370\n"
             "  B' = A / (0.5·P) = {:.2f} / (0.5 · {:.2f}) = {:.3f} m\n"
             "  dt = w + λ·(Rsi + Rf + Rse) = {:.3f} + {:.2f} · ({:.2f} + {:.3f} + {:.2f}) = {:.3f} m\n",
             ground.area, ground.perimeter, floor.characteristic_dimension, floor.wall_thickness, floor.ground_conductivity,
             floor.interior_resistance, floor.floor_resistance, floor.exterior_resistance, u.equivalent_thickness);
  if (u.well_insulated)
    fmt::print("  dt ≥ B' (well insulated): Ug = λ / (0.457·B' + dt) = {:.2f} / ({:.3f} + {:.3f}) = {:.3f} W/(m²K)\n", floor.ground_conductivity,
               0.457 * floor.characteristic_dimension, u.equivalent_thickness, u.u_value);
  else
    fmt::print("  dt < B': Ug = 2λ / (π·B' + dt) · ln(π·B'/dt + 1) = {:.2f} / {:.3f} · ln({:.3f}) = {:.3f} W/(m²K)\n", 2 * floor.ground_conductivity,
               std::numbers::pi * floor.characteristic_dimension + u.equivalent_thickness,
               std::numbers::pi * floor.characteristic_dimension / u.equivalent_thickness + 1.0, u.u_value);
  fmt::print("Rsi 0.17 (heat flow downwards) and Rse 0.04 m²K/W (ISO 6946). Results depend on the inputs; local building codes and a "
             "qualified professional decide compliance.\n");
  return with_output_flushed(0);
}

}  // namespace

int main(int argc, char** argv) {
  // Everything printed stays in one buffer until the end (or until checked before output files are
  // replaced), so a standard output that cannot take it is found by one flush, never half-way
  // through a print.
  static char stdout_buffer[1 << 20];
  if (!::isatty(STDOUT_FILENO)) std::setvbuf(stdout, stdout_buffer, _IOFBF, sizeof stdout_buffer);
  CLI::App app{"edgeflux: two-dimensional thermal bridge assessment of building-envelope junctions "
               "(steady-state conduction, ISO 10211 methods)"};
  app.require_subcommand(1);
  app.set_version_flag("--version", fmt::format("edgeflux {}\n"
                                                "Licence GPL-3.0-or-later <https://www.gnu.org/licenses/gpl-3.0.html>: you may "
                                                "change and share it; there is no warranty.\n"
                                                "Results depend on inputs and modelling choices; building codes and qualified "
                                                "professionals decide compliance.", EDGEFLUX_VERSION));

  SolveArgs solve;
  CLI::App* solve_cmd = app.add_subcommand("solve", "Solve a detail file: heat flows, L2D, surface and probe temperatures");
  solve_cmd->add_option("detail", solve.detail_file, "Detail file (XML, see docs/detail-format.md)")->required();
  solve_cmd->add_option("--json", solve.json_file, "Also write the results as JSON to this file");
  solve_cmd->add_option("--density", solve.density, "Mesh density factor (overrides the file; 2 ≈ twice the elements per length)")
      ->check(finite_range(MeshSettings::min_density, MeshSettings::max_density));
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
      ->check(finite_range(1e-6, 0.1));
  solve_cmd->add_option("--psi-target", solve.target.psi_absolute, "Accuracy asked of ψ in W/(m·K), default 0.0005")
      ->check(finite_range(1e-7, 0.1));
  solve_cmd->add_option("--temperature-target", solve.target.temperature_absolute,
                        "Accuracy asked of the minimum interior surface temperature in K, default 0.01")
      ->check(finite_range(1e-6, 1.0));
  solve_cmd->add_option("--set", solve.parameter_settings,
                        "Override a <parameter> of the detail file, e.g. --set insulation_thickness=160 (repeatable)");
  solve_cmd->add_option("--carry-forward", solve.carry_forward,
                        "Dimension system of the energy calculation the ψ goes into; marks that ψ (overrides the file)")
      ->check(CLI::IsMember({"internal", "overall-internal", "external"}));
  solve_cmd->add_option("--appendices", solve.appendices,
                        "all (default): the report has the junction sheet and its appendices; none: the sheet alone")
      ->check(CLI::IsMember({"all", "none"}));
  solve_cmd->add_flag("--fixed-mesh", solve.fixed_mesh,
                      "Solve once on the mesh of --density instead of refining to the accuracy targets");

  ProjectArgs project;
  CLI::App* project_cmd = app.add_subcommand(
      "project", "Solve every junction of a project file in parallel: the schedule of ψ, lengths and ψ·l, and H_TB");
  project_cmd->add_option("project", project.file, "Project file (XML, see docs/project-format.md)")->required();
  project_cmd->add_option("--csv", project.csv, "Write the schedule as CSV to this file");
  project_cmd->add_option("--json", project.json, "Write the schedule as JSON to this file");
  project_cmd->add_option("--jobs", project.jobs, "Parallel calculations (default: all cores)")->check(CLI::Range(0, 256));
  project_cmd->add_flag("-q,--quiet", project.quiet, "Do not print progress");
  project_cmd->add_option("--cache", project.cache,
                          "Folder of results kept between runs (default: .edgeflux-cache beside the project file); unchanged junctions are not solved again");
  project_cmd->add_flag("--no-cache", project.no_cache, "Solve every junction, and keep no results");
  project_cmd->add_flag("--from-scratch", project.from_scratch,
                        "Mesh and refine every junction on its own (by default a junction that differs from an earlier "
                        "one only in conductivities is solved on that one's meshes)");
  project_cmd->add_option("--hand-in", project.hand_in,
                          "Write the hand-in set into this folder: index.html (the schedule, linked) and each junction's report");

  WatchArgs watch;
  CLI::App* watch_cmd = app.add_subcommand(
      "watch", "Solve a detail again every time it is saved and keep its HTML report current (the page reloads itself; "
               "an input error shows in the page)");
  watch_cmd->add_option("detail", watch.detail_file, "Detail file (XML, see docs/detail-format.md)")->required();
  watch_cmd->add_option("--report", watch.report_file, "The HTML page to keep current; open it in a browser")->required();
  watch_cmd->add_option("--set", watch.parameter_settings, "Override a parameter: name=value (repeatable)");
  watch_cmd->add_option("--target", watch.target.coupling_relative, "Relative accuracy asked of L2D, default 0.001")
      ->check(finite_range(1e-6, 0.1));
  watch_cmd->add_option("--runs", watch.runs, "Stop after this many solves (default: run until Ctrl-C)")->check(CLI::Range(0, 1000000));
  watch_cmd->add_flag("-q,--quiet", watch.quiet, "Print nothing while watching");

  GroundArgs ground;
  CLI::App* ground_cmd = app.add_subcommand("ground", "U-value of a slab-on-ground floor by ISO 13370, with its derivation");
  ground_cmd->add_option("--area", ground.area, "Floor area A, m²")->required()->check(finite_range(1e-6, 1e9));
  ground_cmd->add_option("--perimeter", ground.perimeter, "Exposed perimeter P, m")->required()->check(finite_range(1e-6, 1e9));
  ground_cmd->add_option("--wall-thickness", ground.wall, "Full thickness w of the external walls, m")->required()->check(finite_range(0, 10));
  ground_cmd->add_option("--floor-resistance", ground.floor_resistance, "Thermal resistance Rf of the floor construction, m²K/W")
      ->required()->check(finite_range(0, 100));
  ground_cmd->add_option("--soil-conductivity", ground.soil, "λ of the ground, W/(m·K): 2.0 when unknown (ISO 13370), 1.5 clay or silt, 3.5 rock")
      ->check(finite_range(0.01, 10));

  std::string material_search;
  CLI::App* materials_cmd = app.add_subcommand(
      "materials", "List the built-in material library (λ, density, source); give a word to search ids, categories and sources");
  materials_cmd->add_option("search", material_search, "Text to look for, e.g. concrete or insulation");

  struct VariantArgs {
    std::vector<std::string> inputs, ranges;
    std::string csv, page;
    int jobs = 0;
    bool quiet = false, from_scratch = false;
    AccuracyTarget target;
  } sweep, compare;
  CLI::App* sweep_cmd = app.add_subcommand(
      "sweep", "Solve a detail over a range of one or two parameters in parallel; table, CSV and a page with ψ and fRsi plots");
  sweep_cmd->add_option("detail", sweep.inputs, "Detail file with <parameter>s")->required()->expected(1);
  sweep_cmd->add_option("--vary", sweep.ranges, "name=from:to:steps (once or twice; the first is the plots' x axis)")
      ->required()->expected(1, 2);
  CLI::App* compare_cmd = app.add_subcommand("compare", "Solve two or more details in parallel and put them side by side");
  compare_cmd->add_option("details", compare.inputs, "Detail files")->required()->expected(2, 1000);
  for (auto [cmd, args] : {std::pair{sweep_cmd, &sweep}, std::pair{compare_cmd, &compare}}) {
    cmd->add_option("--csv", args->csv, "Write the table as CSV to this file");
    cmd->add_option("--page", args->page, "Write an HTML page with the table (and plots for sweeps) to this file");
    cmd->add_option("--jobs", args->jobs, "Parallel calculations (default: all cores)")->check(CLI::Range(0, 256));
    cmd->add_option("--target", args->target.coupling_relative, "Relative accuracy asked of L2D, default 0.001")
        ->check(finite_range(1e-6, 0.1));
    cmd->add_flag("-q,--quiet", args->quiet, "Do not print progress");
    cmd->add_flag("--from-scratch", args->from_scratch,
                  "Mesh and refine every variant on its own (by default a variant that differs from an earlier one only "
                  "in conductivities is solved on that one's meshes)");
  }

  ImportArgs import_args;
  CLI::App* import_cmd = app.add_subcommand(
      "import", "Read a DXF drawing: list its layers, and write a starting detail file whose regions come from the "
                "drawing, with a picture that numbers every region and outline run");
  import_cmd->add_option("drawing", import_args.drawing, "DXF file (R12 or later, ASCII)")->required();
  import_cmd->add_option("--map", import_args.mappings,
                         "LAYER=MATERIAL or LAYER=MATERIAL:LIBRARY-ENTRY (repeatable); a MATERIAL that is a library "
                         "entry takes its λ. Without --map every layer with closed outlines becomes a material");
  import_cmd->add_option("--units", import_args.unit, "Unit of the drawing's coordinates, overriding $INSUNITS")
      ->check(CLI::IsMember({"mm", "cm", "m", "in", "ft"}));
  import_cmd->add_option("-o,--detail", import_args.detail, "Write the starting detail file (XML) here");
  import_cmd->add_option("--picture", import_args.picture, "Write the numbered picture of regions and outline runs (SVG) here");

  bool conformity_quiet = false;
  CLI::App* conformity_cmd = app.add_subcommand(
      "conformity", "Solve the ISO 10211 validation cases 1 and 2 (built in) and print the conformity table; "
                    "exits with 4 if any value is outside the standard's tolerance");
  conformity_cmd->add_flag("-q,--quiet", conformity_quiet, "Do not print progress");

  // An unknown command is named, with the ones there are (the parser would only say that a
  // command is required).
  std::vector<std::string> names;
  for (const CLI::App* command : app.get_subcommands({})) names.push_back(command->get_name());
  if (argc > 1 && argv[1][0] != '-' && std::find(names.begin(), names.end(), argv[1]) == names.end()) {
    fmt::print(stderr, "edgeflux: error: \"{}\" is not a command; the commands are {} (edgeflux --help)\n",
               std::string(argv[1]).substr(0, 60), fmt::join(names, ", "));
    return 1;
  }
  try {
    app.parse(argc, argv);
  } catch (const CLI::ParseError& e) {
    const int code = with_output_flushed(app.exit(e));  // prints the help or the usage message
    return code == 0 || code == 2 ? code : 1;
  }
  if (*solve_cmd || *sweep_cmd || *compare_cmd || *conformity_cmd || *watch_cmd)
    if (const auto problem = address_space_too_small()) {
      fmt::print(stderr, "edgeflux: failed: {}\n", *problem);
      return 3;
    }
  try {
    if (*solve_cmd) return with_output_flushed(run_solve(solve));
    if (*import_cmd) return with_output_flushed(run_import(import_args));
    if (*sweep_cmd || *compare_cmd) {
      const bool is_sweep = sweep_cmd->parsed();
      VariantArgs& args = is_sweep ? sweep : compare;
      CalculationOptions options;
      options.target = args.target;
      options.reuse_meshes = !args.from_scratch;
      if (is_sweep) {
        std::vector<ParameterRange> ranges;
        for (const std::string& r : args.ranges) {
          ranges.push_back(parse_range(r));
          if (ranges.size() == 2 && ranges[0].name == ranges[1].name)
            throw_input_error({"command line", 0}, "--vary " + r, fmt::format("varies {} a second time", ranges[1].name),
                              "vary two different parameters, or one over a single range");
        }
        read_detail_file(args.inputs[0]);  // a broken file is reported once, before any variant runs
        std::vector<std::string> names;
        for (const ParameterRange& r : ranges) names.push_back(r.name);
        const auto variants = run_sweep(args.inputs[0], ranges, options, args.jobs, variant_progress(args.quiet));
        return with_output_flushed(
            finish_variants("Parameter sweep of " + args.inputs[0], variants, names, args.csv, args.page, args.inputs));
      }
      for (const std::string& f : args.inputs) read_detail_file(f);
      const auto variants = run_comparison(args.inputs, options, args.jobs, variant_progress(args.quiet));
      return with_output_flushed(finish_variants("Comparison of " + std::to_string(args.inputs.size()) + " details", variants,
                                                 {}, args.csv, args.page, args.inputs));
    }
    if (*project_cmd) return run_project_command(project);
    if (*watch_cmd) return with_output_flushed(run_watch(watch));
    if (*ground_cmd) return run_ground(ground);
    if (*materials_cmd) {
      const auto found = search_material_library(material_search);
      fmt::print("{:<28} {:>10} {:>9}  {:<10} {}\n", "id", "λ [W/mK]", "ρ [kg/m³]", "basis", "source");
      for (const LibraryMaterial& m : found)
        fmt::print("{:<28} {:>10.3f} {:>9}  {:<10} {}\n", m.id, m.conductivity,
                   m.density ? fmt::format("{:.0f}", *m.density) : "—", m.basis, m.source);
      fmt::print("{} of {} entries. Use one in a detail file as <material id=\"...\" library=\"ENTRY\"/>; "
                 "\"typical\" values must be replaced by the product's declared value.\n",
                 found.size(), material_library().size());
      return with_output_flushed(found.empty() ? 2 : 0);
    }
    if (*conformity_cmd) {
      const ConformityReport report = iso10211_conformity(
          conformity_quiet ? std::function<void(const std::string&)>() : [](const std::string& stage) {
            fmt::print(stderr, "edgeflux: solving {}…\n", stage);
          });
      fmt::print("{}", conformity_text(report));
      return with_output_flushed(report.passed() ? 0 : 4);
    }
  } catch (const InputError& e) {
    fmt::print(stderr, "edgeflux: error: {}\n", e.what());
    return 2;
  } catch (const std::bad_alloc&) {
    fmt::print(stderr, "edgeflux: failed: the memory ran out (meshing or solving a section this fine needs more): lower "
                       "the density or the accuracy target, or run on a machine with more memory\n");
    return 3;
  } catch (const std::exception& e) {
    fmt::print(stderr, "edgeflux: failed: {}\n", e.what());
    return 3;
  }
  return 1;
}
