// Terzaghi (1925) one-dimensional consolidation, average degree for a uniform initial excess
// pore pressure; the Fourier series and the equivalent error-function (image) series.
#include <boost/math/constants/constants.hpp>
#include <boost/math/tools/toms748_solve.hpp>
#include <cmath>
#include <cstdint>

#include "wickgrid/errors.hpp"
#include "wickgrid/vertical.hpp"

namespace wickgrid {

namespace {
constexpr double pi = boost::math::double_constants::pi;

// Below this Tv the image series needs only a handful of terms; above it the Fourier series does.
constexpr double switch_tv = 0.2;

// Integrated complementary error function, i·erfc(x) = exp(−x²)/√π − x·erfc(x).
double ierfc(double x) {
    return std::exp(-x * x) / boost::math::double_constants::root_pi - x * std::erfc(x);
}
}  // namespace

namespace terzaghi {

double degree_short_time(double tv) {
    require_non_negative("time factor Tv", tv);
    if (tv == 0.0) return 0.0;
    // U = 2√(Tv/π) + 4√Tv Σ_{m≥1} (−1)^m ierfc(m/√Tv)
    const double root = std::sqrt(tv);
    double sum = 0.0;
    double sign = -1.0;
    for (int m = 1; m < 100000; ++m) {
        const double x = m / root;
        if (x * x > 745.0) break;  // exp(−x²) underflows: remaining terms are exactly negligible
        const double term = ierfc(x);
        sum += sign * term;
        if (term < 1e-18 * (1.0 + std::fabs(sum))) break;
        sign = -sign;
    }
    return 2.0 * std::sqrt(tv / pi) + 4.0 * root * sum;
}

double degree_fourier(double tv) {
    require_non_negative("time factor Tv", tv);
    if (tv == 0.0) return 0.0;
    // U = 1 − Σ_{m≥0} 2/M² exp(−M² Tv),  M = π(2m + 1)/2. With q = exp(−π²Tv/4) the exponentials
    // are q^{(2m+1)²}; successive ratios q^{8(m+1)} need one exp() in all.
    const double q = std::exp(-pi * pi * tv / 4.0);
    const double q8 = std::pow(q, 8.0);
    double power = q;     // q^{(2m+1)²}
    double ratio = q8;    // q^{8(m+1)}
    double sum = 0.0;
    for (std::int64_t m = 0; m < 100000000; ++m) {
        const double big_m = 0.5 * pi * static_cast<double>(2 * m + 1);
        const double term = 2.0 / (big_m * big_m) * power;
        sum += term;
        if (term < 1e-18 || power == 0.0) break;
        power *= ratio;
        ratio *= q8;
    }
    return 1.0 - sum;
}

double excess_images(double z, double tv) {
    // A slab of thickness 2 (in units of d) drained on both faces; the plane Z = 1 is the no-flow
    // face of the one-sided case. u = 1 − Σ_{n≥0} (−1)^n [erfc((2n + Z)/2√Tv) + erfc((2n + 2 − Z)/2√Tv)].
    if (tv == 0.0) return z > 0.0 && z < 2.0 ? 1.0 : 0.0;
    const double root = 2.0 * std::sqrt(tv);
    double sum = 0.0, sign = 1.0;
    for (int n = 0; n < 100000; ++n) {
        const double term = std::erfc((2.0 * n + z) / root) + std::erfc((2.0 * n + 2.0 - z) / root);
        sum += sign * term;
        if (term < 1e-18) break;
        sign = -sign;
    }
    return 1.0 - sum;
}

double excess_fourier(double z, double tv) {
    // u = Σ_{m≥0} (2/M) sin(M·Z) exp(−M²·Tv), M = π(2m + 1)/2.
    double sum = 0.0;
    for (std::int64_t m = 0; m < 10000000; ++m) {
        const double big_m = 0.5 * pi * static_cast<double>(2 * m + 1);
        const double envelope = 2.0 / big_m * std::exp(-big_m * big_m * tv);
        sum += envelope * std::sin(big_m * z);
        if (envelope < 1e-17) break;
    }
    return sum;
}

}  // namespace terzaghi

double excess_fraction_vertical(double z_over_d, double tv) {
    require_non_negative("time factor Tv", tv);
    if (!(z_over_d >= 0.0 && z_over_d <= 2.0))
        throw InputError("depth ratio z/d", z_over_d, "from 0 to 2 (0 at a drained face)");
    // Images converge in a few terms for small Tv, Fourier for large; they agree to 1e-14 at 0.05.
    return tv < 0.05 ? terzaghi::excess_images(z_over_d, tv) : terzaghi::excess_fourier(z_over_d, tv);
}

double degree_vertical(double tv) {
    require_non_negative("time factor Tv", tv);
    // Below Tv = 0.02 the image-series correction is under exp(−1/Tv) < 1e-21: one term is exact.
    if (tv < 0.02) return 2.0 * std::sqrt(tv / pi);
    return tv < switch_tv ? terzaghi::degree_short_time(tv) : terzaghi::degree_fourier(tv);
}

double time_factor_vertical(double uv) {
    require_open_unit("degree of vertical consolidation Uv", uv);
    // Small Tv: U = 2√(Tv/π) to machine precision while exp(−1/Tv) < 1e-21 (Tv < 0.02).
    const double small_u = 2.0 * std::sqrt(0.02 / pi);
    if (uv <= small_u) return pi * uv * uv / 4.0;
    // Large Tv: one Fourier term is exact to machine precision once exp(−2π²Tv) < 1e-17 (Tv > 2).
    const double large_u = 1.0 - 8.0 / (pi * pi) * std::exp(-pi * pi * 2.0 / 4.0);
    if (uv >= large_u) return -4.0 / (pi * pi) * std::log(pi * pi * (1.0 - uv) / 8.0);
    auto f = [uv](double tv) { return degree_vertical(tv) - uv; };
    std::uintmax_t iterations = 200;
    const auto root = boost::math::tools::toms748_solve(
        f, 0.02, 2.0, boost::math::tools::eps_tolerance<double>(50), iterations);
    require_converged("time factor Tv for a degree", iterations, 200);
    return 0.5 * (root.first + root.second);
}

}  // namespace wickgrid
