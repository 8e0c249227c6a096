// Hansbo (1981) equal-strain radial consolidation with smear and well resistance.
#include <boost/math/constants/constants.hpp>
#include <cmath>

#include "wickgrid/errors.hpp"
#include "wickgrid/radial.hpp"

namespace wickgrid {

double hansbo_mu_smear(double n, double s, double kh_over_ks) {
    require_greater("drain spacing ratio n = De/dw", n, 1.0, "a finite number greater than 1");
    validate_smear_zone(SmearZone{SmearShape::constant, s, kh_over_ks}, n);
    return std::log(n / s) + kh_over_ks * std::log(s) - 0.75;
}

double hansbo_mu_well(double z_m, double l_m, double kh_m_per_s, double qw_m3_per_s) {
    require_positive("drain length from the outlet l (m)", l_m);
    if (!(z_m >= 0.0 && z_m <= l_m))
        throw InputError("depth below the outlet z (m)", z_m,
                         "between 0 and the drain length from the outlet, " + format_value(l_m) + " m");
    require_positive("horizontal permeability kh (m/s)", kh_m_per_s);
    if (!(qw_m3_per_s > 0.0))  // +inf is allowed: an ideal drain without well resistance
        throw InputError("discharge capacity qw (m³/s)", qw_m3_per_s, "greater than 0");
    return boost::math::double_constants::pi * z_m * (2.0 * l_m - z_m) * kh_m_per_s / qw_m3_per_s;
}

double hansbo_mu(double n, double s, double kh_over_ks, double z_m, double l_m, double kh_m_per_s,
                 double qw_m3_per_s) {
    return hansbo_mu_smear(n, s, kh_over_ks) + hansbo_mu_well(z_m, l_m, kh_m_per_s, qw_m3_per_s);
}

double degree_radial_equal_strain(double th, double mu) {
    require_non_negative("radial time factor Th", th);
    require_positive("radial flow factor mu", mu);
    return -std::expm1(-8.0 * th / mu);
}

double time_factor_radial_equal_strain(double ur, double mu) {
    require_open_unit("degree of radial consolidation Ur", ur);
    require_positive("radial flow factor mu", mu);
    return -mu * std::log1p(-ur) / 8.0;
}

}  // namespace wickgrid
