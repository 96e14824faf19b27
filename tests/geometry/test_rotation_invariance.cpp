// The same section turned and moved must give the same results, up to mesh noise well inside the
// error bars: every shipped detail, example and ISO 10211 reference case at three angles that are
// not multiples of 90°, and once far from the origin.
#include <doctest/doctest.h>

#include <algorithm>
#include <cmath>
#include <filesystem>

#include "../support/transformed_section.h"
#include "../test_support.h"

using namespace edgeflux;
namespace fs = std::filesystem;

namespace {

/// |a − b| within the two error bars together (common practice: two estimates of one value agree
/// when their difference is inside their combined uncertainty). A floor of 1e-9 of the value allows
/// for rounding where both bars are zero.
bool agree(double a, double ea, double b, double eb) {
  return std::abs(a - b) <= ea + eb + 1e-9 * std::max(std::abs(a), std::abs(b));
}

/// With `promise`, each bar is at least the target accuracy `target` of that quantity.
void check_agree(ErrorEstimate b, ErrorEstimate t, const char* what, double target = 0.0) {
  b.error = std::max(b.error, target), t.error = std::max(t.error, target);
  CHECK_MESSAGE(agree(b.value, b.error, t.value, t.error),
                what << ": unturned " << b.value << " ± " << b.error << ", turned " << t.value << " ± " << t.error);
}

struct Figures {
  double largest_relative_l2d = 0.0;  ///< over all turned runs
};

void compare(const Calculation& base, const Calculation& turned, Figures& figures, bool promise = false) {
  const AccuracyTarget& target = base.convergence.target;
  auto aim = [&](double value) { return promise ? value : 0.0; };
  REQUIRE(std::abs(turned.heat_loss.field.balance.relative) < 1e-4);  // ISO 10211 energy balance
  REQUIRE(turned.convergence.heat_flows.size() == base.convergence.heat_flows.size());
  if (base.convergence.coupling_2d) {
    REQUIRE(turned.convergence.coupling_2d);
    const ErrorEstimate &b = *base.convergence.coupling_2d, &t = *turned.convergence.coupling_2d;
    check_agree(b, t, "L2D", aim(target.coupling_relative * std::abs(b.value)));
    // Where two fixed temperatures meet, L2D grows without bound with the mesh: no figure of merit.
    if (!base.convergence.singular_heat_flow)
      figures.largest_relative_l2d = std::max(figures.largest_relative_l2d, std::abs(t.value - b.value) / b.value);
  }
  if (!base.convergence.singular_heat_flow)
    for (std::size_t e = 0; e < base.convergence.heat_flows.size(); ++e) {
      check_agree(base.convergence.heat_flows[e], turned.convergence.heat_flows[e], "heat flow",
                  aim(target.coupling_relative * std::abs(base.convergence.heat_flows[e].value)));
    }
  REQUIRE(turned.convergence.psi.size() == base.convergence.psi.size());
  for (std::size_t k = 0; k < base.convergence.psi.size(); ++k) {
    check_agree(base.convergence.psi[k], turned.convergence.psi[k], "psi", aim(target.psi_absolute));
  }
  REQUIRE(turned.convergence.min_surface_temperature.has_value() == base.convergence.min_surface_temperature.has_value());
  if (base.convergence.min_surface_temperature) {
    check_agree(*base.convergence.min_surface_temperature, *turned.convergence.min_surface_temperature, "θsi,min",
                aim(target.temperature_absolute));
  }
  REQUIRE(turned.convergence.probes.size() == base.convergence.probes.size());
  for (std::size_t k = 0; k < base.convergence.probes.size(); ++k) {
    check_agree(base.convergence.probes[k], turned.convergence.probes[k], "probe", aim(target.temperature_absolute));
  }
}

std::vector<std::string> shipped_files() {
  std::vector<std::string> files;
  for (const char* folder : {"details", "examples"})
    for (const std::string& file : test::detail_files_in(folder)) files.push_back(file);
  for (const char* name : {"iso10211_case1.xml", "iso10211_case2.xml"})
    files.push_back(test::source_path(std::string("tests/reference/") + name));
  std::sort(files.begin(), files.end());
  return files;
}

}  // namespace

// Rotations whose cosine and sine are exact decimals (the 3-4-5 and 7-24-25 triangles) take every
// point with coordinates in whole 0.25 mm onto the 0.01 mm grid exactly, so the turned section is
// the same section to the last digit and only the mesh differs: the results must agree within their
// error bars, which estimate exactly that difference.
TEST_CASE("rotation and translation invariance on the grid: every detail, example and reference case turned by "
          "16.26°, 36.87° and 106.26° and moved far from the origin agrees within the error bars "
          "(physics: conduction is isotropic and translation-invariant)") {
  Figures figures;
  CalculationOptions options;
  options.mesher = MeshSettings::Mesher::delaunay;  // a turned section is no longer rectilinear
  struct Turn { double c, s; const char* name; };
  const Turn turns[] = {{0.96, 0.28, "16.26°"}, {0.8, 0.6, "36.87°"}, {-0.28, 0.96, "106.26°"}};
  for (const std::string& file : shipped_files()) {
    CAPTURE(file);
    const CrossSection section = read_detail_file(file);
    const Calculation base = calculate(section, options);
    for (const Turn& turn : turns) {
      CAPTURE(turn.name);
      compare(base, calculate(test::transformed_section(section, turn.c, turn.s, {}, 0), options), figures);
    }
    // Far from the origin, as a site plan's coordinates put a detail: (12 345.678, −9 876.543) m.
    const Point far{12345.678, -9876.543};
    CAPTURE(far.x);
    compare(base, calculate(test::transformed_section(section, 0.8, 0.6, far, 0), options), figures);
  }
  MESSAGE("largest relative L2D difference over all turned and moved runs on the grid: " << figures.largest_relative_l2d);
}

// A drawing at an arbitrary angle, its coordinates rounded to 12 digits: the corners move by up to
// 0.007 mm onto the 0.01 mm grid, which changes a 140 mm insulation layer by 0.01 % and θsi by
// about 10⁻⁴ K. Each result promises to be within its target accuracy of the converged value for
// the section as drawn; two drawings of one section must therefore agree within the sum of both
// promises (error bar or target, whichever is larger).
TEST_CASE("rotation invariance of CAD-rounded sections: every detail, example and reference case at 17°, 30° and "
          "131° agrees within the accuracy each result promises (physics: conduction is isotropic)") {
  Figures figures;
  CalculationOptions options;
  options.mesher = MeshSettings::Mesher::delaunay;
  for (const std::string& file : shipped_files()) {
    CAPTURE(file);
    const CrossSection section = read_detail_file(file);
    const Calculation base = calculate(section, options);
    for (double degrees : {17.0, 30.0, 131.0}) {
      CAPTURE(degrees);
      compare(base, calculate(test::turned_section(section, degrees), options), figures, true);
    }
  }
  MESSAGE("largest relative L2D difference over all CAD-rounded turned runs: " << figures.largest_relative_l2d);
}
