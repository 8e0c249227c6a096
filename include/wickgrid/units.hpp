#pragma once
// Constants and the unit conversions done once at the edge; the engine works in SI
// (m, s, kPa = kN/m², m/s, m³/s).

namespace wickgrid::units {

inline constexpr double gamma_w_kN_per_m3 = 9.81;          // unit weight of water (common practice)
inline constexpr double seconds_per_day = 86400.0;
inline constexpr double days_per_year = 365.25;            // Julian year
inline constexpr double seconds_per_year = seconds_per_day * days_per_year;
inline constexpr double square_metres_per_hectare = 10000.0;

constexpr double days_to_seconds(double days) { return days * seconds_per_day; }
constexpr double seconds_to_days(double seconds) { return seconds / seconds_per_day; }
constexpr double per_year_to_per_second(double per_year) { return per_year / seconds_per_year; }
constexpr double per_second_to_per_year(double per_second) { return per_second * seconds_per_year; }
constexpr double mm_to_m(double mm) { return mm * 1.0e-3; }

}  // namespace wickgrid::units
