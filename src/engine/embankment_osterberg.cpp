// Vertical stress under an embankment: Osterberg's (1957) influence for the centre line and the
// Flamant line load integrated in closed form over a piecewise-linear strip load; see embankment.hpp.
#include <boost/math/constants/constants.hpp>
#include <algorithm>
#include <cmath>

#include "wickgrid/embankment.hpp"
#include "wickgrid/errors.hpp"

namespace wickgrid {

namespace {
constexpr double pi = boost::math::double_constants::pi;

// Antiderivatives in u = x' − x of Flamant's kernel (2/π)·z³/(u² + z²)² and of u times it.
double kernel_integral(double u, double z) { return (std::atan(u / z) + u * z / (u * u + z * z)) / pi; }
double kernel_moment(double u, double z) { return -z * z * z / (pi * (u * u + z * z)); }

// Stress at (x, z) from a load rising linearly from p1 at x1 to p2 at x2 (x2 > x1).
double linear_strip_kPa(double x1, double p1, double x2, double p2, double x, double z) {
    const double slope = (p2 - p1) / (x2 - x1);
    const double at_x = p1 + slope * (x - x1);  // the load's linear extension evaluated at x
    const double u1 = x1 - x, u2 = x2 - x;
    return at_x * (kernel_integral(u2, z) - kernel_integral(u1, z)) + slope * (kernel_moment(u2, z) - kernel_moment(u1, z));
}
}  // namespace

void validate_section(const EmbankmentSection& s) {
    require_non_negative("embankment.crest_width_m", s.crest_width_m);
    if (!(s.side_slope_h_per_v >= 0.0) || !std::isfinite(s.side_slope_h_per_v))
        throw InputError("embankment.side_slope_h_per_v", s.side_slope_h_per_v,
                         "at least 0 (0 is a vertical side; a negative slope is steeper than vertical)");
    if (s.crest_width_m == 0.0 && s.side_slope_h_per_v == 0.0)
        throw InputError("embankment.crest_width_m", s.crest_width_m,
                         "greater than 0 when the sides are vertical (otherwise the section does not close)");
    require_positive("embankment.fill_unit_weight_kN_per_m3", s.fill_unit_weight_kN_per_m3);
    if (!(s.fill_friction_angle_deg >= 0.0 && s.fill_friction_angle_deg < 90.0))
        throw InputError("embankment.fill_friction_angle_deg", s.fill_friction_angle_deg, "from 0 up to 90 degrees, 90 excluded");
    require_non_negative("embankment.fill_cohesion_kPa", s.fill_cohesion_kPa);
    if (!(s.target_factor_of_safety >= 1.0) || !std::isfinite(s.target_factor_of_safety))
        throw InputError("embankment.target_factor_of_safety", s.target_factor_of_safety, "at least 1");
}

double fill_surface_m(const EmbankmentSection& s, double height_m, double x_m) noexcept {
    const double off = std::fabs(x_m) - crest_half_width_m(s);
    if (off <= 0.0) return height_m;
    if (s.side_slope_h_per_v <= 0.0) return 0.0;
    return std::max(0.0, height_m - off / s.side_slope_h_per_v);
}

double osterberg_influence(double a_m, double b_m, double z_m) noexcept {
    if (z_m <= 0.0) return b_m > 0.0 ? 0.5 : 0.0;
    const double alpha2 = std::atan(b_m / z_m);
    const double alpha1 = std::atan((a_m + b_m) / z_m) - alpha2;
    // a → 0: (a + b)/a·α1 → b·z/(b² + z²), the strip's own term.
    const double first = a_m > 1e-12 * (b_m + z_m) ? (a_m + b_m) / a_m * alpha1 : b_m * z_m / (b_m * b_m + z_m * z_m);
    return (first + alpha2) / pi;
}

double embankment_stress_kPa(const EmbankmentSection& s, double height_m, double x_m, double z_m) noexcept {
    const double q = s.fill_unit_weight_kN_per_m3 * height_m;
    if (q <= 0.0) return 0.0;
    if (z_m <= 0.0) return s.fill_unit_weight_kN_per_m3 * fill_surface_m(s, height_m, x_m);
    const double b = crest_half_width_m(s), toe = toe_offset_m(s, height_m);
    double sigma = 0.0;
    if (b > 0.0) sigma += linear_strip_kPa(-b, q, b, q, x_m, z_m);
    if (toe > b) {
        sigma += linear_strip_kPa(-toe, 0.0, -b, q, x_m, z_m);
        sigma += linear_strip_kPa(b, q, toe, 0.0, x_m, z_m);
    }
    return sigma;
}

double centreline_influence(const EmbankmentSection& s, double height_m, double z_m) noexcept {
    return 2.0 * osterberg_influence(s.side_slope_h_per_v * height_m, crest_half_width_m(s), z_m);
}

}  // namespace wickgrid
