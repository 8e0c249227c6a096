// Barron (1948) free-strain radial consolidation of an ideal drain: eigen-expansion in the
// cylinder functions U0, U1 (Boost.Math Bessel J and Y), plus the short-time expansion of flow into
// a cylinder where the series would need too many terms. That expansion is derived here from the
// Laplace transform with the large-argument K1/K0 series (the problem is the one of Carslaw & Jaeger
// 1959, Conduction of Heat in Solids, ch. 13, from memory); the tests check it against the series.
#include <boost/math/constants/constants.hpp>
#include <boost/math/special_functions/bessel.hpp>
#include <boost/math/tools/toms748_solve.hpp>
#include <cmath>
#include <cstdint>

#include "wickgrid/errors.hpp"
#include "wickgrid/radial.hpp"

namespace wickgrid {

namespace {
constexpr double pi = boost::math::double_constants::pi;

// τ = ch·t/rw² below which the short-time expansion is used; its first neglected term, about
// 0.12·τ³/(n² − 1), stays below 1e-10 there (checked against the series in the tests).
constexpr double short_time_tau = 2.0e-3;

// Exponent 4β²Th reached by the last cached root at the switch: terms beyond are below e^{-34}.
constexpr double series_exponent_at_switch = 34.0;

double j0(double x) { return boost::math::cyl_bessel_j(0, x); }
double j1(double x) { return boost::math::cyl_bessel_j(1, x); }
double y0(double x) { return boost::math::cyl_neumann(0, x); }
double y1(double x) { return boost::math::cyl_neumann(1, x); }

// Eigen-condition dU/dr = 0 at the influence radius: U1(β) = J1(β)Y0(β/n) − Y1(β)J0(β/n) = 0.
double eigen_condition(double beta, double n) {
    const double w = beta / n;
    return j1(beta) * y0(w) - y1(beta) * j0(w);
}

// Weight of each mode in the average pore pressure, from the orthogonality integrals:
// C = 16 / ((1 − 1/n²) β² (π² β² U0(β)² − 4)), U0(β) = J0(β)Y0(β/n) − Y0(β)J0(β/n).
double mode_weight(double beta, double n) {
    const double w = beta / n;
    const double u0 = j0(beta) * y0(w) - y0(beta) * j0(w);
    return 16.0 / ((1.0 - 1.0 / (n * n)) * beta * beta * (pi * pi * beta * beta * u0 * u0 - 4.0));
}
}  // namespace

BarronFreeStrain::BarronFreeStrain(double n) : n_(n) {
    require_greater("drain spacing ratio n = De/dw", n, 1.0, "a finite number greater than 1");
    th_switch_ = short_time_tau / (4.0 * n * n);
    const double beta_max = std::sqrt(series_exponent_at_switch / (4.0 * th_switch_));
    // Roots are about π/(1 − 1/n) apart; a step of π/8 never steps over two of them.
    const double step = pi / 8.0;
    double a = 1.0e-4;
    double fa = eigen_condition(a, n);
    while (a < beta_max) {
        const double b = a + step;
        const double fb = eigen_condition(b, n);
        if ((fa < 0.0) != (fb < 0.0)) {
            std::uintmax_t iterations = 100;
            const auto root = boost::math::tools::toms748_solve(
                [n](double beta) { return eigen_condition(beta, n); }, a, b, fa, fb,
                boost::math::tools::eps_tolerance<double>(52), iterations);
            require_converged("Barron free-strain eigenvalue", iterations, 100);
            const double beta = 0.5 * (root.first + root.second);
            beta_.push_back(beta);
            weight_.push_back(mode_weight(beta, n));
        }
        a = b;
        fa = fb;
    }
}

double BarronFreeStrain::degree_series(double th) const {
    require_non_negative("radial time factor Th", th);
    double remaining = 0.0;
    for (std::size_t k = 0; k < beta_.size(); ++k) {
        const double exponent = 4.0 * beta_[k] * beta_[k] * th;
        if (exponent > 745.0) break;
        const double term = weight_[k] * std::exp(-exponent);
        remaining += term;
        if (term < 1e-18 && exponent > series_exponent_at_switch) break;
    }
    return 1.0 - remaining;
}

double BarronFreeStrain::degree_short_time(double th) const {
    require_non_negative("radial time factor Th", th);
    // Drained volume into a cylinder from an unbounded region, per unit πrw²:
    // 4√(τ/π) + τ − τ^{3/2}/(3√π) + τ²/8 − 5τ^{5/2}/(24√π) + O(τ³), τ = ch·t/rw² = 4n²Th.
    const double tau = 4.0 * n_ * n_ * th;
    const double root_tau = std::sqrt(tau);
    const double root_pi = boost::math::double_constants::root_pi;
    const double drained = 4.0 * root_tau / root_pi + tau - tau * root_tau / (3.0 * root_pi) +
                           tau * tau / 8.0 - 5.0 * tau * tau * root_tau / (24.0 * root_pi);
    return drained / (n_ * n_ - 1.0);
}

double BarronFreeStrain::degree(double th) const {
    require_non_negative("radial time factor Th", th);
    return th < th_switch_ ? degree_short_time(th) : degree_series(th);
}

}  // namespace wickgrid
