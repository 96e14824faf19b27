// How every output writes its numbers: the digits the trade reports each quantity to, plain
// decimals with the ASCII minus (tables paste into spreadsheets as numbers), points rounded to the
// drawing's millimetre, and the discretisation error stated once in words.
#pragma once

#include <optional>
#include <string>

#include "core/point.h"
#include "results/convergence.h"

namespace edgeflux {

/// Decimals per quantity, the same in the terminal, the reports, the pages and the CSV.
namespace digits {
inline constexpr int psi = 3;                  ///< ψ, W/(m·K)
inline constexpr int coupling = 4;             ///< L2D and Lij, W/(m·K)
inline constexpr int u_value = 3;              ///< U, W/(m²K)
inline constexpr int length = 3;               ///< flanking lengths, m
inline constexpr int surface_temperature = 2;  ///< θsi, °C
inline constexpr int temperature_factor = 3;   ///< fRsi
inline constexpr int heat_flow = 3;            ///< Φ, W/m
}  // namespace digits

/// A number with fixed decimals; a value that rounds to zero prints without a sign.
std::string fixed(double v, int decimals);
/// The same with a sign always shown (margins, changes).
std::string signed_fixed(double v, int decimals);
/// An estimated error in plain decimals, one significant digit rounded up, at most two digits finer
/// than the value it belongs to (shown with `decimals`); smaller errors show as one unit of that
/// finest digit, an upper bound.
std::string error_text(double error, int decimals);
/// A point in the user's unit rounded to whole millimetres: "(340, 2680) mm", "(34.0, 268.0) cm",
/// "(0.340, 2.680) m".
std::string point_text(Point p, double metres_per_unit, const std::string& unit);

/// The discretisation error of the reported values stated once, e.g. "estimated discretisation
/// error below half a unit of the last digit shown for L2D, ψ and θsi,min" or, where one is not,
/// which and by how much. Empty without estimates (a fixed mesh).
std::string accuracy_statement(const Convergence& convergence);

/// Σ U·l as a checker recomputes it from the printed U and lengths.
double printed_product(double u_value, double length);

}  // namespace edgeflux
