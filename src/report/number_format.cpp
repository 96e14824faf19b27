#include "report/number_format.h"

#include <fmt/format.h>

#include <algorithm>
#include <cmath>
#include <vector>

namespace edgeflux {

std::string fixed(double v, int decimals) {
  if (std::abs(v) < 0.5 * std::pow(10.0, -decimals)) v = 0.0;
  return fmt::format("{:.{}f}", v, decimals);
}

std::string signed_fixed(double v, int decimals) {
  if (std::abs(v) < 0.5 * std::pow(10.0, -decimals)) v = 0.0;
  return fmt::format("{:+.{}f}", v, decimals);
}

std::string error_text(double error, int decimals) {
  const int finest = decimals + 2;
  const double unit = std::pow(10.0, -finest);
  if (!(error >= unit)) return fmt::format("{:.{}f}", unit, finest);  // an upper bound at the finest digit shown
  const int d = std::clamp(static_cast<int>(-std::floor(std::log10(error))), decimals, finest);
  const double scale = std::pow(10.0, d);
  return fmt::format("{:.{}f}", std::ceil(error * scale - 1e-9) / scale, d);
}

std::string point_text(Point p, double metres_per_unit, const std::string& unit) {
  // Whole millimetres: the decimals of the user's unit that resolve 1 mm.
  const int decimals = std::clamp(static_cast<int>(std::lround(std::log10(metres_per_unit / 0.001))), 0, 6);
  return fmt::format("({}, {}) {}", fixed(p.x / metres_per_unit, decimals), fixed(p.y / metres_per_unit, decimals), unit);
}

std::string accuracy_statement(const Convergence& c) {
  struct Item { const char* name; double error; int decimals; const char* unit; };
  std::vector<Item> items;
  if (c.coupling_2d) items.push_back({"L2D", c.coupling_2d->error, digits::coupling, " W/(m·K)"});
  double psi_error = -1;
  for (const ErrorEstimate& e : c.psi) psi_error = std::max(psi_error, e.error);
  if (psi_error >= 0) items.push_back({"ψ", psi_error, digits::psi, " W/(m·K)"});
  if (c.min_surface_temperature) items.push_back({"θsi,min", c.min_surface_temperature->error, digits::surface_temperature, " K"});
  if (items.empty()) return "";
  std::string small, large;
  for (const Item& i : items) {
    if (i.error < 0.5 * std::pow(10.0, -i.decimals)) {
      small += (small.empty() ? "" : ", ") + std::string(i.name);
    } else {
      large += fmt::format("{}{} ± {}{}", large.empty() ? "" : ", ", i.name, error_text(i.error, i.decimals), i.unit);
    }
  }
  std::string s = "estimated discretisation error";
  if (!small.empty()) s += " below half a unit of the last digit shown for " + small;
  if (!large.empty()) s += (small.empty() ? ": " : "; larger for ") + large;
  return s;
}

double printed_product(double u_value, double length) {
  const double u = std::stod(fixed(u_value, digits::u_value)), l = std::stod(fixed(length, digits::length));
  return u * l;
}

}  // namespace edgeflux
