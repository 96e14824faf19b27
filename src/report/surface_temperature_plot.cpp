// The interior surface temperature plot: the surface temperature along each interior surface in
// the surface-temperature run, with the mould and condensation limits of the climate.
#include <fmt/format.h>

#include <algorithm>
#include <cmath>
#include <functional>
#include <map>
#include <optional>

#include "report/colour_map.h"
#include "report/drawing_layout.h"
#include "report/field_quantities.h"
#include "report/material_fills.h"
#include "physics/linear_transmittance.h"
#include "report/svg_drawings.h"

namespace edgeflux {

using namespace layout;

Drawing surface_temperature_plot(const CrossSection& section, const Calculation& calc) {
  const JunctionResults& j = calc.junction;
  const std::vector<SurfaceSample> walk = interior_surface_walk(section, calc.mesh);
  Drawing out;
  out.id = "surface-temperature";
  out.title = "Interior surface temperature";
  const double plot_x0 = 16, plot_y0 = 9, plot_w = 138, plot_h = 72;
  Box extent{0, plot_y0 - 1, plot_x0 + plot_w + 22, plot_y0 + plot_h + 10};
  std::string body;
  if (walk.empty()) {
    body += fmt::format("<text x=\"0\" y=\"10\" font-size=\"{}\">No interior surface: mark the room environment side=\"interior\".</text>\n", num(font_size));
    out.caption = "The section has no surface facing an interior environment.";
    out.svg = finish(out.title, out.title, "", body, {0, 0, 120, 14});
    return out;
  }
  // In the verdict's climate when it differs from the design temperatures: θ = θe + f·(θi − θe).
  std::function<double(double)> to_climate = [](double t) { return t; };
  bool mapped = false;
  double theta_i = 0, theta_e = 0;
  const bool has_pair = j.interior_environment && j.exterior_environment;
  if (has_pair) {
    theta_i = section.environments[*j.interior_environment].temperature;
    theta_e = section.environments[*j.exterior_environment].temperature;
  }
  if (has_pair && j.climate && theta_i != theta_e) {
    const double ci = j.climate->interior_temperature, ce = j.climate->exterior_temperature;
    if (std::abs(ci - theta_i) > 1e-9 || std::abs(ce - theta_e) > 1e-9) {
      mapped = true;
      to_climate = [=](double t) { return surface_temperature_for_factor(temperature_factor(t, theta_i, theta_e), ci, ce); };
    }
  }
  std::vector<double> theta;
  for (const SurfaceSample& s : walk) theta.push_back(to_climate(calc.surface_temperature.temperature[s.node]));
  const MoistureAssessment* mould = nullptr;
  for (const MoistureResult& m : j.moisture)
    if (m.kind == SurfaceKind::opaque) mould = &m.assessment;
  const MoistureAssessment* any = j.moisture.empty() ? nullptr : &j.moisture.front().assessment;

  double y_lo = *std::min_element(theta.begin(), theta.end()), y_hi = *std::max_element(theta.begin(), theta.end());
  if (any) y_lo = std::min(y_lo, any->dew_point);
  if (mould) y_lo = std::min(y_lo, mould->mould_surface_temperature);
  const double y_step = svg::nice_step(std::max(y_hi - y_lo, 1.0), 6);
  y_lo = std::floor((y_lo - 0.3 * y_step) / y_step) * y_step;
  y_hi = std::ceil((y_hi + 0.1 * y_step) / y_step) * y_step;
  const double x_len = std::max(walk.back().distance, 1e-9);
  const double x_step = svg::nice_step(x_len, 8);
  auto X = [&](double d) { return plot_x0 + plot_w * d / x_len; };
  auto Y = [&](double t) { return plot_y0 + plot_h * (1.0 - (t - y_lo) / (y_hi - y_lo)); };

  // Surfaces along the walk: alternate shading and names above the plot.
  std::string bands;
  std::vector<std::pair<std::size_t, std::size_t>> runs;  // sample ranges of one surface
  for (std::size_t i = 1; i < walk.size(); ++i) {
    const int surface = walk[i].surface;
    if (walk[i].chain != walk[i - 1].chain)
      runs.push_back({i, i});  // a new stretch starts at its own first node
    else if (runs.empty() || walk[runs.back().second].surface != surface || walk[runs.back().second].chain != walk[i].chain)
      runs.push_back({i - 1, i});
    else
      runs.back().second = i;
  }
  Occupied names;
  for (std::size_t r = 0; r < runs.size(); ++r) {
    const double xa = X(walk[runs[r].first].distance), xb = X(walk[runs[r].second].distance);
    if (r % 2 == 1)
      bands += fmt::format("<rect x=\"{}\" y=\"{}\" width=\"{}\" height=\"{}\" fill=\"#f1f3f5\"/>\n", num(xa), num(plot_y0), num(xb - xa), num(plot_h));
    if (r > 0) {
      const bool chain_break = walk[runs[r].first].chain != walk[runs[r - 1].second].chain;
      bands += fmt::format("<path d=\"M{0} {1} L{0} {2}\" stroke=\"#777\" stroke-width=\"{3}\" {4}/>\n", num(xa), num(plot_y0), num(plot_y0 + plot_h),
                           chain_break ? "0.3" : "0.12", chain_break ? "stroke-dasharray=\"1 0.8\"" : "");
    }
    const std::string name = section.surfaces[walk[runs[r].second].surface].name;
    const double w = svg::text_width(name, small_font_size);
    for (int row = 0; row < 3; ++row) {
      const double y = plot_y0 - 1.2 - row * 2.6;
      const Box box{0.5 * (xa + xb) - w / 2, y - small_font_size, 0.5 * (xa + xb) + w / 2, y};
      if (names.is_free(box.grown(0.4)) || row == 2) {
        names.add(box);
        bands += fmt::format("<text x=\"{}\" y=\"{}\" font-size=\"{}\" text-anchor=\"middle\" fill=\"#333\">{}</text>\n", num(0.5 * (xa + xb)), num(y),
                             num(small_font_size), escape(name));
        include(extent, {box.x0, box.y0 - 1, box.x1, box.y1});
        break;
      }
    }
  }
  body += bands;

  // Grid and axes.
  std::string grid;
  for (double t = y_lo; t <= y_hi + 1e-9; t += y_step) {
    grid += fmt::format("<path d=\"M{} {} L{} {}\" stroke=\"#d5d9de\" stroke-width=\"0.12\"/>\n", num(plot_x0), num(Y(t)), num(plot_x0 + plot_w), num(Y(t)));
    grid += fmt::format("<text x=\"{}\" y=\"{}\" font-size=\"{}\" text-anchor=\"end\">{}</text>\n", num(plot_x0 - 1.2), num(Y(t) + 0.8), num(small_font_size),
                        svg::label_number(t, y_step < 1 ? 1 : 0));
  }
  for (double x = 0; x <= x_len + 1e-9; x += x_step) {
    grid += fmt::format("<path d=\"M{0} {1} L{0} {2}\" stroke=\"#222\" stroke-width=\"0.15\"/>\n", num(X(x)), num(plot_y0 + plot_h), num(plot_y0 + plot_h + 1.0));
    grid += fmt::format("<text x=\"{}\" y=\"{}\" font-size=\"{}\" text-anchor=\"middle\">{}</text>\n", num(X(x)), num(plot_y0 + plot_h + 3.6),
                        num(small_font_size), num(x));
  }
  body += grid;
  body += fmt::format("<rect x=\"{}\" y=\"{}\" width=\"{}\" height=\"{}\" fill=\"none\" stroke=\"#222\" stroke-width=\"0.2\"/>\n", num(plot_x0), num(plot_y0),
                      num(plot_w), num(plot_h));
  body += fmt::format("<text x=\"{}\" y=\"{}\" font-size=\"{}\" text-anchor=\"middle\">distance along the interior surface [m]</text>\n",
                      num(plot_x0 + plot_w / 2), num(plot_y0 + plot_h + 7.5), num(font_size));
  body += fmt::format("<text transform=\"translate({} {}) rotate(-90)\" font-size=\"{}\" text-anchor=\"middle\">θsi [°C]</text>\n", num(plot_x0 - 9.5),
                      num(plot_y0 + plot_h / 2), num(font_size));
  // fRsi on the right: the same line read as (θ − θe)/(θi − θe) in the verdict's climate.
  if (has_pair && theta_i != theta_e) {
    const double ci = mapped ? j.climate->interior_temperature : theta_i, ce = mapped ? j.climate->exterior_temperature : theta_e;
    const double f_lo = (y_lo - ce) / (ci - ce), f_hi = (y_hi - ce) / (ci - ce);
    const double f_step = svg::nice_step(std::abs(f_hi - f_lo), 6);
    for (double fr = std::ceil(std::min(f_lo, f_hi) / f_step) * f_step; fr <= std::max(f_lo, f_hi) + 1e-9; fr += f_step) {
      const double y = Y(ce + fr * (ci - ce));
      body += fmt::format("<path d=\"M{0} {1} L{2} {1}\" stroke=\"#222\" stroke-width=\"0.15\"/>\n", num(plot_x0 + plot_w), num(y), num(plot_x0 + plot_w + 1));
      body += fmt::format("<text x=\"{}\" y=\"{}\" font-size=\"{}\">{:.2f}</text>\n", num(plot_x0 + plot_w + 1.6), num(y + 0.8), num(small_font_size), fr);
    }
    body += fmt::format("<text transform=\"translate({} {}) rotate(90)\" font-size=\"{}\" text-anchor=\"middle\">fRsi</text>\n", num(plot_x0 + plot_w + 11),
                        num(plot_y0 + plot_h / 2), num(font_size));
  }

  // Limits.
  auto limit = [&](double t, const char* colour, const char* dash, const std::string& text, bool above) {
    body += fmt::format("<path d=\"M{0} {1} L{2} {1}\" stroke=\"{3}\" stroke-width=\"0.4\" stroke-dasharray=\"{4}\"/>\n", num(plot_x0), num(Y(t)),
                        num(plot_x0 + plot_w), colour, dash);
    body += halo_text({plot_x0 + 1.5, Y(t) + (above ? -1.0 : 2.6)}, text, small_font_size, "start", fmt::format("fill=\"{}\"", colour).c_str());
  };
  if (mould && any && std::abs(mould->mould_surface_temperature - any->dew_point) < 2.5 * (y_hi - y_lo) / plot_h * font_size) {
    limit(mould->mould_surface_temperature, "#D55E00", "2 1", fmt::format("mould limit (surface RH 80 %): {}", degrees(mould->mould_surface_temperature, 2)), true);
    limit(any->dew_point, "#0072B2", "0.6 0.8", fmt::format("dew point (surface RH 100 %): {}", degrees(any->dew_point, 2)), false);
  } else {
    if (mould) limit(mould->mould_surface_temperature, "#D55E00", "2 1", fmt::format("mould limit (surface RH 80 %): {}", degrees(mould->mould_surface_temperature, 2)), true);
    if (any) limit(any->dew_point, "#0072B2", "0.6 0.8", fmt::format("dew point (surface RH 100 %): {}", degrees(any->dew_point, 2)), true);
  }

  // The curve, one polyline per connected stretch.
  std::string d;
  for (std::size_t i = 0; i < walk.size(); ++i) {
    const bool start = i == 0 || walk[i].chain != walk[i - 1].chain;
    d += fmt::format("{}{} {}", start ? "M" : "L", num(X(walk[i].distance)), num(Y(theta[i])));
  }
  body += fmt::format("<path d=\"{}\" fill=\"none\" stroke=\"#1a1a1a\" stroke-width=\"0.45\" stroke-linejoin=\"round\"/>\n", d);
  const std::size_t i_min = std::min_element(theta.begin(), theta.end()) - theta.begin();
  const Point pm{X(walk[i_min].distance), Y(theta[i_min])};
  body += fmt::format("<circle cx=\"{}\" cy=\"{}\" r=\"0.9\" fill=\"#fff\" stroke=\"#000\" stroke-width=\"0.3\"/>\n", num(pm.x), num(pm.y));
  const std::string min_text = fmt::format("θsi,min {}", degrees(theta[i_min], 2));
  const double mw = svg::text_width(min_text, small_font_size);
  const double tx = std::clamp(pm.x, plot_x0 + mw / 2 + 1, plot_x0 + plot_w - mw / 2 - 1);
  body += halo_text({tx, pm.y + 3.6}, min_text, small_font_size, "middle", "font-weight=\"bold\"");

  out.caption = fmt::format(
      "θsi along the interior surfaces in the surface-temperature run, walked with the section on the left (shaded bands: one surface each; "
      "a dashed line marks a break between separate stretches of surface){}. The horizontal lines are the ISO 13788 limits for the stated "
      "climate: the lowest surface temperature that keeps the surface relative humidity at 80 % (mould) and the dew point (condensation).",
      mapped ? fmt::format("; temperatures converted to the climate of the verdict ({} inside, {} outside) through the temperature factor",
                           degrees(j.climate->interior_temperature, 1), degrees(j.climate->exterior_temperature, 1))
             : std::string());
  out.svg = finish(out.title, "Interior surface temperature, surface-temperature run", "", body, extent);
  return out;
}

}  // namespace edgeflux
