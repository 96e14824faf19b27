// Detail files the tests share: plane walls of layers and an external corner with isothermal faces.
#pragma once

#include <fmt/format.h>

#include <string>
#include <vector>

#include "../test_support.h"

namespace edgeflux::test {

/// The body of the two-layer wall many input tests break one thing in: 200 mm brick (λ 0.8),
/// 100 mm EPS (λ 0.035), 1 m high, inner face Rsi horizontal at 20 °C, outer face Rse at −5 °C.
/// Tests that check line numbers rely on its exact text.
inline std::string two_layer_wall_body() {
  return R"(
  <materials>
    <material id="brick" conductivity="0.8" source="test value"/>
    <material id="eps" conductivity="0.035" source="test value"/>
  </materials>
  <regions>
    <rectangle name="brick" material="brick" from="0,0" to="200,1000"/>
    <rectangle name="insulation" material="eps" from="200,0" to="300,1000"/>
  </regions>
  <environments>
    <environment id="in" temperature="20" side="interior"/>
    <environment id="out" temperature="-5" side="exterior"/>
  </environments>
  <boundaries>
    <surface name="inner face" environment="in" resistance="rsi-horizontal" path="0,1000 0,0"/>
    <surface name="outer face" environment="out" resistance="rse" path="300,0 300,1000"/>
  </boundaries>)";
}

struct WallLayer {
  std::string material;
  double conductivity;  ///< W/(m·K)
  double thickness_mm;
};

/// A plane wall of layers from x = 0 (inside face, Rsi horizontal, "in" at `inside_c`, interior)
/// to the outside face (Rse, "out" at `outside_c`, exterior), `height_mm` high; `extra` is added
/// after the boundaries (probes, flanking elements).
inline std::string layered_wall(const std::vector<WallLayer>& layers, double height_mm, double inside_c, double outside_c,
                                const std::string& extra = "") {
  std::string materials, regions;
  double x = 0.0;
  for (const WallLayer& l : layers) {
    materials += fmt::format("    <material id=\"{}\" conductivity=\"{}\" source=\"test value\"/>\n", l.material, l.conductivity);
    regions += fmt::format("    <rectangle material=\"{}\" from=\"{},0\" to=\"{},{}\"/>\n", l.material, x, x + l.thickness_mm, height_mm);
    x += l.thickness_mm;
  }
  return detail_xml(fmt::format(R"(
  <materials>
{}  </materials>
  <regions>
{}  </regions>
  <environments>
    <environment id="in" temperature="{}" side="interior"/>
    <environment id="out" temperature="{}" side="exterior"/>
  </environments>
  <boundaries>
    <surface name="inside" environment="in" resistance="rsi-horizontal" path="0,{} 0,0"/>
    <surface name="outside" environment="out" resistance="rse" path="{},0 {},{}"/>
  </boundaries>{})",
                                materials, regions, inside_c, outside_c, height_mm, x, x, height_mm, extra));
}

/// An L-shaped wall of one material (λ given), thickness 0.25 m, legs 1.5 m from the outer corner
/// (1.25 m from the inner one), inner faces fixed at 1 °C ("warm"), outer faces at 0 °C ("cold"),
/// leg ends adiabatic; in metres.
inline std::string isothermal_corner(double conductivity) {
  return fmt::format(R"(<edgeflux-detail format="1" units="m">
  <materials><material id="m" conductivity="{}" source="test value"/></materials>
  <regions><polygon material="m" points="0,0 1.5,0 1.5,0.25 0.25,0.25 0.25,1.5 0,1.5"/></regions>
  <environments><environment id="warm" temperature="1"/><environment id="cold" temperature="0"/></environments>
  <boundaries>
    <fixed-temperature environment="warm" path="1.5,0.25 0.25,0.25 0.25,1.5"/>
    <fixed-temperature environment="cold" path="0,1.5 0,0 1.5,0"/>
  </boundaries></edgeflux-detail>)", conductivity);
}

}  // namespace edgeflux::test
