// Vertical stress under an embankment: Osterberg's (1957) influence superposed on the centre line,
// and the Flamant line load integrated in closed form over a piecewise-linear strip load elsewhere;
// the fill profile of a section with berms at any height. See embankment.hpp.
#include <algorithm>
#include <boost/math/constants/constants.hpp>
#include <cmath>
#include <limits>
#include <string>

#include "wickgrid/embankment.hpp"
#include "wickgrid/errors.hpp"

namespace wickgrid {

namespace {
constexpr double pi = boost::math::double_constants::pi;

// Antiderivatives in u = x' − x of Flamant's kernel (2/π)·z³/(u² + z²)² and of u times it.
double kernel_integral(double u, double z) { return (std::atan(u / z) + u * z / (u * u + z * z)) / pi; }
double kernel_moment(double u, double z) { return -z * z * z / (pi * (u * u + z * z)); }

// Stress at (x, z) from a load varying linearly from p1 at x1 to p2 at x2 (x2 > x1).
double linear_strip_kPa(double x1, double p1, double x2, double p2, double x, double z) {
    const double slope = (p2 - p1) / (x2 - x1);
    const double at_x = p1 + slope * (x - x1);  // the load's linear extension evaluated at x
    const double u1 = x1 - x, u2 = x2 - x;
    return at_x * (kernel_integral(u2, z) - kernel_integral(u1, z)) + slope * (kernel_moment(u2, z) - kernel_moment(u1, z));
}

// The final section's right half, crest at H.
FillProfile final_profile(const EmbankmentSection& s, double h) {
    FillProfile p;
    double x = 0.5 * s.crest_width_m, y = h;
    p.x_m = {0.0};
    p.y_m = {h};
    if (x > 0.0) p.x_m.push_back(x), p.y_m.push_back(y);
    for (std::size_t i = 0; i < s.berms.size(); ++i) {
        const Berm& b = s.berms[i];
        if (!(b.height_m < h))
            throw InputError("embankment.berms[" + std::to_string(i) + "].height_m", b.height_m,
                             "below the embankment's final fill height " + format_value(h) + " m");
        x += s.side_slope_h_per_v * (y - b.height_m);
        y = b.height_m;
        p.x_m.push_back(x), p.y_m.push_back(y);
        x += b.width_m;
        p.x_m.push_back(x), p.y_m.push_back(y);
    }
    x += s.side_slope_h_per_v * y;
    p.x_m.push_back(x), p.y_m.push_back(0.0);
    return p;
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
    if (s.reinforcement) require_positive("embankment.reinforcement.tensile_force_kN_per_m", s.reinforcement->tensile_force_kN_per_m);
    if (s.tension_crack) require_positive("embankment.tension_crack.depth_m", s.tension_crack->depth_m);
    for (std::size_t i = 0; i < s.berms.size(); ++i) {
        const std::string at = "embankment.berms[" + std::to_string(i) + "]";
        require_positive(at + ".width_m", s.berms[i].width_m);
        const double above = i == 0 ? std::numeric_limits<double>::infinity() : s.berms[i - 1].height_m;
        if (!(s.berms[i].height_m > 0.0 && s.berms[i].height_m < above))
            throw InputError(at + ".height_m", s.berms[i].height_m,
                             i == 0 ? "greater than 0" : "greater than 0 and below the berm before it");
    }
}

FillProfile fill_profile(const EmbankmentSection& s, double final_height_m, double height_m) {
    if (!(height_m > 0.0 && height_m <= final_height_m * (1.0 + 1e-12)))
        throw InputError("fill height (m)", height_m, "greater than 0 and at most the final height " + format_value(final_height_m) + " m");
    const FillProfile full = final_profile(s, final_height_m);
    FillProfile p;
    p.x_m = {0.0};
    p.y_m = {height_m};
    // Where level h meets the final profile, then the vertices below it.
    std::size_t i = 0;
    while (i + 1 < full.x_m.size() && full.y_m[i + 1] >= height_m) ++i;
    double cut = full.x_m[i];
    if (i + 1 < full.x_m.size() && full.y_m[i] > height_m) {
        const double t = (full.y_m[i] - height_m) / (full.y_m[i] - full.y_m[i + 1]);
        cut = full.x_m[i] + t * (full.x_m[i + 1] - full.x_m[i]);
    }
    if (cut > 0.0) p.x_m.push_back(cut), p.y_m.push_back(height_m);
    for (std::size_t k = i + 1; k < full.x_m.size(); ++k) p.x_m.push_back(full.x_m[k]), p.y_m.push_back(full.y_m[k]);
    return p;
}

double fill_surface_m(const FillProfile& p, double x_m) noexcept {
    const double x = std::fabs(x_m);
    for (std::size_t i = 0; i + 1 < p.x_m.size(); ++i)
        if (x <= p.x_m[i + 1] && p.x_m[i + 1] > p.x_m[i]) {
            if (x < p.x_m[i]) continue;
            const double t = (x - p.x_m[i]) / (p.x_m[i + 1] - p.x_m[i]);
            return p.y_m[i] + t * (p.y_m[i + 1] - p.y_m[i]);
        }
    return x <= p.x_m.front() ? p.y_m.front() : 0.0;
}

double osterberg_influence(double a_m, double b_m, double z_m) noexcept {
    if (z_m <= 0.0) return b_m > 0.0 ? 0.5 : 0.0;
    const double alpha2 = std::atan(b_m / z_m);
    const double alpha1 = std::atan((a_m + b_m) / z_m) - alpha2;
    // a → 0: (a + b)/a·α1 → b·z/(b² + z²), the strip's own term.
    const double first = a_m > 1e-12 * (b_m + z_m) ? (a_m + b_m) / a_m * alpha1 : b_m * z_m / (b_m * b_m + z_m * z_m);
    return (first + alpha2) / pi;
}

double centreline_stress_kPa(const FillProfile& p, double gamma, double z_m) noexcept {
    if (z_m <= 0.0) return gamma * p.height_m();
    double sigma = 0.0;
    for (std::size_t k = 0; k + 1 < p.x_m.size(); ++k) {
        const double drop = p.y_m[k] - p.y_m[k + 1];
        if (drop > 0.0) sigma += gamma * drop * 2.0 * osterberg_influence(p.x_m[k + 1] - p.x_m[k], p.x_m[k], z_m);
    }
    return sigma;
}

double embankment_stress_kPa(const FillProfile& p, double gamma, double x_m, double z_m) noexcept {
    if (z_m <= 0.0) return gamma * fill_surface_m(p, x_m);
    double sigma = 0.0;
    for (std::size_t k = 0; k + 1 < p.x_m.size(); ++k) {
        const double x1 = p.x_m[k], x2 = p.x_m[k + 1];
        if (!(x2 > x1)) continue;  // a vertical side carries no strip
        const double p1 = gamma * p.y_m[k], p2 = gamma * p.y_m[k + 1];
        sigma += linear_strip_kPa(x1, p1, x2, p2, x_m, z_m) + linear_strip_kPa(-x2, p2, -x1, p1, x_m, z_m);
    }
    return sigma;
}

}  // namespace wickgrid
