// Drain patterns: influence (unit-cell) diameter by equal plan area (Barron 1948) and density.
#include <boost/math/constants/constants.hpp>
#include <cmath>

#include "wickgrid/errors.hpp"
#include "wickgrid/geometry.hpp"
#include "wickgrid/units.hpp"

namespace wickgrid {

namespace {
constexpr double pi = boost::math::double_constants::pi;
}

double area_per_drain_m2(Pattern pattern, double spacing_m) {
    require_positive("drain spacing (m)", spacing_m);
    // A triangular grid of side s gives each drain a hexagon of area (√3/2)s²; a square grid s².
    const double factor = pattern == Pattern::triangular ? 0.5 * std::sqrt(3.0) : 1.0;
    return factor * spacing_m * spacing_m;
}

double influence_diameter_factor(Pattern pattern) {
    // Circle of the same area as the drain's share: De = s·√(4·factor/π).
    const double factor = pattern == Pattern::triangular ? 0.5 * std::sqrt(3.0) : 1.0;
    return std::sqrt(4.0 * factor / pi);
}

double influence_diameter_m(Pattern pattern, double spacing_m) {
    require_positive("drain spacing (m)", spacing_m);
    return influence_diameter_factor(pattern) * spacing_m;
}

double spacing_from_influence_diameter_m(Pattern pattern, double influence_diameter_m) {
    require_positive("influence diameter De (m)", influence_diameter_m);
    return influence_diameter_m / influence_diameter_factor(pattern);
}

double drains_per_hectare(Pattern pattern, double spacing_m) {
    return units::square_metres_per_hectare / area_per_drain_m2(pattern, spacing_m);
}

}  // namespace wickgrid
