// Equivalent conductivities of air cavities, so they can be meshed as solids (ISO 10077-2, ISO 6946).
#pragma once

namespace edgeflux {

/// Which way the heat crosses a frame cavity (in the section: horizontal is along x).
enum class CavityHeatFlow { horizontal, upward, downward };
/// Unventilated, or slightly ventilated (joined to the outside or inside air by a slit of 2–10 mm).
/// A well-ventilated cavity is part of the environment it opens to and is not a solid.
enum class CavityVentilation { unventilated, slightly_ventilated };

/// A frame cavity as the standard replaces it by a solid (ISO 10077-2, from memory).
struct FrameCavity {
  double depth = 0, width = 0;          ///< the equivalent rectangle: d along the heat flow, b across, m
  double convection = 0, radiation = 0; ///< ha and hr, W/(m²K)
  double conductivity = 0;              ///< λeq = d·(ha + hr), doubled when slightly ventilated, W/(m·K)
};

/// λeq of a cavity of any shape: the equivalent rectangle has the cavity's area and the aspect ratio
/// of its bounding rectangle (d' = √(A·d/b), b' = √(A·b/d)). ha = max(C1/d', C·ΔT^(1/3)) with
/// C = 0.73 W/(m²K^(4/3)) for horizontal and 1.14 for upward heat flow, ha = C1/d' for downward;
/// hr as for frame_cavity_conductivity; ΔT = 10 K. `bounding_depth` d and `bounding_width` b in m,
/// `area` A in m², all finite and > 0, A ≤ d·b. Throws std::invalid_argument otherwise.
FrameCavity frame_cavity(double bounding_depth, double bounding_width, double area, CavityHeatFlow flow,
                         CavityVentilation ventilation);

/// λeq, W/(m·K), of an unventilated rectangular frame cavity with heat flow horizontal across it
/// (ISO 10077-2, clause recalled from memory): λeq = d/Rs with Rs = 1/(ha + hr),
/// ha = max(C1/d, C2·ΔT^(1/3)), C1 = 0.025 W/(m·K), C2 = 0.73 W/(m²K^(4/3)), ΔT = 10 K,
/// hr = C4·(1 − d/b + √(1 + d²/b²)), C4 = 2.11 W/(m²K).
/// `depth` d: cavity size in the direction of heat flow, m; `width` b: size across it, m;
/// both finite and > 0. Throws std::invalid_argument otherwise.
double frame_cavity_conductivity(double depth, double width);

/// λeq, W/(m·K), of a slightly ventilated frame cavity (connected to outside air through a slit of
/// 2–10 mm): twice the unventilated value (ISO 10077-2, from memory). Arguments as above.
double slightly_ventilated_frame_cavity_conductivity(double depth, double width);

/// R, m²K/W, of an unventilated air layer with heat flow horizontal (within ±30°), surfaces of
/// emissivity 0.9 (ISO 6946:2017 Table 8): 0.11, 0.13, 0.15, 0.17, 0.18 for 5, 7, 10, 15 and
/// ≥ 25 mm, interpolated linearly between. `thickness` in m, finite and ≥ 0.005 (the table's
/// first row). Throws std::invalid_argument otherwise.
double air_layer_resistance(double thickness);

/// λeq = d/R, W/(m·K), of the same air layer, for modelling it as a solid of thickness d.
double air_layer_conductivity(double thickness);

}  // namespace edgeflux
