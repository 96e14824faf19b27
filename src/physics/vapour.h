// Water-vapour pressures for condensation and mould checks (ISO 13788).
#pragma once

namespace edgeflux {

/// Lowest and highest temperature, °C, accepted by the vapour functions. The ISO 13788 fits are
/// meant for building climates; this wide band only rejects values that cannot be temperatures
/// of air in or around a building (and keeps away from the fits' poles).
inline constexpr double vapour_temperature_min = -100.0;
inline constexpr double vapour_temperature_max = 100.0;

/// psat(θ), Pa, over water for θ ≥ 0 °C and over ice for θ < 0 °C (ISO 13788):
/// 610.5·exp(17.269·θ/(237.3 + θ)) and 610.5·exp(21.875·θ/(265.5 + θ)).
/// `temperature` θ in °C, within [vapour_temperature_min, vapour_temperature_max].
/// Throws std::invalid_argument outside that range or when not finite.
double saturation_vapour_pressure(double temperature);

/// The temperature θ, °C, at which psat(θ) equals `vapour_pressure` p (Pa): the inverse of
/// saturation_vapour_pressure, with x = ln(p/610.5), θ = 237.3·x/(17.269 − x) for p ≥ 610.5 Pa and
/// θ = 265.5·x/(21.875 − x) below. p must lie within psat of the accepted temperature range.
/// Throws std::invalid_argument otherwise (including p ≤ 0).
double saturation_temperature(double vapour_pressure);

/// Dew point of air with partial vapour pressure `vapour_pressure` p, °C: the temperature at which
/// that air is saturated (surface condensation starts on a surface this cold). Same domain as
/// saturation_temperature.
double dew_point(double vapour_pressure);

/// p = φ·psat(θ), Pa, for air at `temperature` θ (°C) with `relative_humidity` φ as a fraction 0–1.
/// Throws std::invalid_argument for φ outside [0, 1] or a bad temperature.
double vapour_pressure(double temperature, double relative_humidity);

/// Δp, Pa: the indoor vapour pressure excess of humidity class 1–5 (ISO 13788 humidity classes):
/// 270, 540, 810, 1080, 1350 Pa for θe ≤ 0 °C, falling linearly to 0 at θe = 20 °C and 0 above.
/// (Class values recalled from memory.) `exterior_temperature` θe in °C, finite.
/// Throws std::invalid_argument for a class outside 1–5 or a non-finite θe.
double vapour_pressure_excess(int humidity_class, double exterior_temperature);

/// pi = pe + 1.10·Δp, Pa (ISO 13788): interior vapour pressure for humidity class 1–5. The factor
/// 1.10 is the standard's safety margin on Δp. `exterior_temperature` θe in °C;
/// `exterior_vapour_pressure` pe in Pa, 0 ≤ pe ≤ psat(θe).
/// Throws std::invalid_argument for a bad class, temperature or pe.
double interior_vapour_pressure_from_class(int humidity_class, double exterior_temperature,
                                           double exterior_vapour_pressure);

}  // namespace edgeflux
