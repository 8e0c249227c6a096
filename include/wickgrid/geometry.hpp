#pragma once
// Drain, mandrel and pattern geometry.
#include <string_view>

namespace wickgrid {

enum class EquivalentDiameterMethod { hansbo_1979, rixner_1986, long_covo_1994 };

// Equivalent diameter of a band drain of width a and thickness b (metres).
double band_drain_equivalent_diameter_m(EquivalentDiameterMethod method, double width_m,
                                        double thickness_m);

// Equivalent diameter of a rectangular mandrel by equal cross-sectional area: √(4ab/π).
double mandrel_equivalent_diameter_m(double width_m, double depth_m);

enum class Pattern { triangular, square };

std::string_view to_string(Pattern pattern);
std::string_view to_string(EquivalentDiameterMethod method);

// De/s for a pattern: √(2√3/π) ≈ 1.050 triangular, √(4/π) ≈ 1.128 square (equal area, Barron 1948).
double influence_diameter_factor(Pattern pattern);
double influence_diameter_m(Pattern pattern, double spacing_m);
double spacing_from_influence_diameter_m(Pattern pattern, double influence_diameter_m);

// Plan area served by one drain, and drains per hectare.
double area_per_drain_m2(Pattern pattern, double spacing_m);
double drains_per_hectare(Pattern pattern, double spacing_m);

}  // namespace wickgrid
