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

}  // namespace terzaghi

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
