#pragma once
// Average degree of consolidation U against time factor Tv for a uniform initial excess pore
// pressure, as printed (three decimals) in Das, B.M., Principles of Geotechnical Engineering,
// table "Variation of Tv with U" (from memory; the same values appear in Craig's Soil Mechanics).
// Texts differ by one unit in the last decimal at U = 60 % (0.286 or 0.287), hence 0.001.
#include <array>

#include "checks/check_row.hpp"

namespace wickgrid::checks {

inline constexpr std::string_view das_table = "Das, Principles of Geotech. Eng., U-Tv table (from memory)";

// input: U, expected: Tv, tolerance in Tv.
inline constexpr std::array<Row, 9> terzaghi_u_tv{{
    {das_table, 0.10, 0.008, 0.001},
    {das_table, 0.20, 0.031, 0.001},
    {das_table, 0.30, 0.071, 0.001},
    {das_table, 0.40, 0.126, 0.001},
    {das_table, 0.50, 0.197, 0.001},
    {das_table, 0.60, 0.287, 0.001},
    {das_table, 0.70, 0.403, 0.001},
    {das_table, 0.80, 0.567, 0.001},
    {das_table, 0.90, 0.848, 0.001},
}};

// The usual closed-form approximations (commonly attributed to Terzaghi and Casagrande; in Das):
// Tv = (π/4)U² for U <= 60 %, Tv = 1.781 − 0.933·log10(100 − U%) for U > 60 %. Tolerances are
// the approximations' own largest error in each range (0.0037 at 60 % for the first; below 0.00035
// from 60 % to 99 % for the second), measured against the exact curve.
inline constexpr std::string_view approx_small = "Tv = (pi/4)U^2, U <= 0.6 (Das)";
inline constexpr std::string_view approx_large = "Tv = 1.781 - 0.933 log10(100 - U%), U > 0.6 (Das)";

}  // namespace wickgrid::checks
