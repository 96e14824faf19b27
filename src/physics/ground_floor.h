// U-value of a slab-on-ground floor by ISO 13370: characteristic dimension B' = A / (½ P), total
// equivalent thickness dt = w + λ·(Rsi + Rf + Rse), and Ug from the formula of the regime dt < B'
// (uninsulated or moderately insulated) or dt ≥ B' (well insulated).
#pragma once

#include <string>

namespace edgeflux {

/// The floor as ISO 13370 describes it. Lengths in m, resistances in m²K/W, λ in W/(m·K).
struct SlabOnGround {
  double characteristic_dimension = 0;  ///< B' = A / (0.5·P), m, > 0
  double wall_thickness = 0;            ///< w, full thickness of the external walls, m, ≥ 0
  double floor_resistance = 0;          ///< Rf of the floor construction (slab, insulation, screed), ≥ 0
  double ground_conductivity = 2.0;     ///< λ of the unfrozen ground; 2.0 when the soil is unknown (ISO 13370)
  double interior_resistance = 0.17;    ///< Rsi for heat flowing downwards (ISO 6946)
  double exterior_resistance = 0.04;    ///< Rse (ISO 6946)
};

struct GroundFloorU {
  double equivalent_thickness = 0;  ///< dt, m
  bool well_insulated = false;      ///< dt ≥ B': the second formula applies
  double u_value = 0;               ///< Ug, W/(m²K)
};

/// B' = A / (0.5·P) for a floor of area A (m²) and exposed perimeter P (m). Throws
/// std::invalid_argument unless both are finite and above 0.
double characteristic_dimension(double area, double perimeter);

/// Ug by ISO 13370: dt < B': Ug = 2λ / (π·B' + dt) · ln(π·B'/dt + 1); dt ≥ B': Ug = λ / (0.457·B' + dt).
/// Throws std::invalid_argument for a non-finite or out-of-range input.
GroundFloorU slab_on_ground_u(const SlabOnGround& floor);

}  // namespace edgeflux
