// Error estimates from successive meshes and the ISO 10211 doubling check.
#include "results/convergence.h"

#include <algorithm>
#include <cmath>

namespace edgeflux {

ErrorEstimate richardson_estimate(const std::vector<int>& nodes, const std::vector<double>& values) {
  const std::size_t k = values.size() - 1;
  ErrorEstimate e;
  e.value = values[k];
  const double n2 = nodes[k], n1 = nodes[k - 1];
  const double d2 = values[k] - values[k - 1];
  if (k >= 2) {
    // Observed rate: solve (n2^−a − n1^−a) / (n1^−a − n0^−a) = d2/d1 for a (the left side falls
    // as a grows); only meaningful when the levels approach monotonically.
    const double n0 = nodes[k - 2], d1 = values[k - 1] - values[k - 2];
    if (d1 != 0.0 && d2 / d1 > 0.0) {
      auto g = [&](double a) { return (std::pow(n2, -a) - std::pow(n1, -a)) / (std::pow(n1, -a) - std::pow(n0, -a)); };
      double lo = 0.01, hi = 10.0;
      for (int i = 0; i < 100; ++i) {
        const double mid = 0.5 * (lo + hi);
        (g(mid) > d2 / d1 ? lo : hi) = mid;
      }
      e.observed_rate = 0.5 * (lo + hi);
    }
  }
  // The rate behind the bar: the fitted one, held between 0.5 (error ∝ h, the slowest seen on the
  // reference cases) and 0.6. The asymptotic rate of a heat flow near a re-entrant right-angle
  // corner is 2/3 (error ∝ h^(4/3)), but before the asymptotic range fitted rates run ahead of the
  // true one: capped at 2/3, the Case 2 bar after level 4 came out at 0.0140 % against a true error
  // of 0.0141 %; capped at 0.6 it is 0.0165 %. Without a fit (two levels, or changes of opposite
  // sign): 0.5.
  const double rate = e.observed_rate > 0.0 ? std::clamp(e.observed_rate, 0.5, 0.6) : 0.5;
  const double factor = std::pow(n2, -rate) / (std::pow(n1, -rate) - std::pow(n2, -rate));
  // Adaptive refinement may leave the neighbourhood of a value almost untouched for a level, so
  // one small change proves little: the bar uses the larger of the last two changes.
  double change = std::abs(d2);
  if (k >= 2) change = std::max(change, std::abs(values[k - 1] - values[k - 2]) * std::pow(n1 / n2, rate));
  e.error = change * factor;
  return e;
}

void estimate_errors(Convergence& c) {
  const std::size_t n = c.levels.size();
  if (n < 2) return;
  std::vector<int> nodes;
  for (const auto& level : c.levels) nodes.push_back(level.nodes);
  auto series = [&](auto get) {
    std::vector<double> v;
    for (const auto& level : c.levels) v.push_back(get(level));
    return richardson_estimate(nodes, v);
  };
  if (c.levels.back().coupling_2d) c.coupling_2d = series([](const ConvergenceLevel& l) { return *l.coupling_2d; });
  c.psi.clear();
  for (std::size_t p = 0; p < c.levels.back().psi.size(); ++p)
    c.psi.push_back(series([p](const ConvergenceLevel& l) { return l.psi[p]; }));
  if (c.levels.back().min_surface_temperature)
    c.min_surface_temperature = series([](const ConvergenceLevel& l) { return *l.min_surface_temperature; });
  c.heat_flows.clear();
  for (std::size_t e = 0; e < c.levels.back().heat_flows.size(); ++e)
    c.heat_flows.push_back(series([e](const ConvergenceLevel& l) { return l.heat_flows[e]; }));

  c.probes.clear();
  for (std::size_t p = 0; p < c.levels.back().probes.size(); ++p)
    c.probes.push_back(series([p](const ConvergenceLevel& l) { return l.probes[p]; }));

  // Doubling check: the finest level against the level with about a quarter of its nodes.
  const ConvergenceLevel& fine = c.levels.back();
  std::size_t coarse = 0;
  for (std::size_t i = 0; i + 1 < n; ++i)
    if (std::abs(std::log(4.0 * c.levels[i].nodes / fine.nodes)) < std::abs(std::log(4.0 * c.levels[coarse].nodes / fine.nodes)))
      coarse = i;
  DoublingCheck d;
  d.coarse_nodes = c.levels[coarse].nodes;
  d.fine_nodes = fine.nodes;
  d.coarse_sum = c.levels[coarse].sum_abs_heat_flow;
  d.fine_sum = fine.sum_abs_heat_flow;
  d.relative_change = std::abs(d.fine_sum - d.coarse_sum) / d.fine_sum;
  d.passed = d.relative_change < 0.01;
  c.doubling = d;
}

bool meets_target(const Convergence& c) {
  if (c.levels.size() < 3) return false;
  for (const auto& p : c.probes)
    if (p.error > c.target.temperature_absolute) return false;
  if (c.min_surface_temperature && c.min_surface_temperature->error > c.target.temperature_absolute) return false;
  if (c.singular_heat_flow) return true;
  if (c.coupling_2d) {
    if (c.coupling_2d->error > c.target.coupling_relative * std::abs(c.coupling_2d->value)) return false;
  } else {
    double largest = 0.0;
    for (const auto& h : c.heat_flows) largest = std::max(largest, std::abs(h.value));
    for (const auto& h : c.heat_flows)
      if (h.error > c.target.coupling_relative * largest) return false;
  }
  for (const auto& p : c.psi)
    if (p.error > c.target.psi_absolute) return false;
  return true;
}

}  // namespace edgeflux
