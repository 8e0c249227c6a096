// Input distributions for Monte Carlo (Boost.Math quantiles), truncated to the physical range.
#include <boost/math/distributions/lognormal.hpp>
#include <boost/math/distributions/normal.hpp>
#include <boost/math/distributions/triangular.hpp>
#include <boost/math/distributions/uniform.hpp>
#include <cmath>

#include "wickgrid/errors.hpp"
#include "wickgrid/studies.hpp"

namespace wickgrid {

void validate_distribution(const Distribution& d, std::string_view what) {
    const std::string w(what);
    switch (d.kind) {
        case DistributionKind::normal:
            require_finite(w + " mean", d.a);
            require_non_negative(w + " sd", d.b);
            require_finite(w + " sd", d.b);
            break;
        case DistributionKind::lognormal:
            require_positive(w + " mean", d.a);
            require_non_negative(w + " sd", d.b);
            // σ² = ln(1 + (sd/mean)²) must be a number: a coefficient of variation up to 1e6 is far
            // beyond any soil parameter and still computable.
            if (d.b > 1e6 * d.a)
                throw InputError(w + " sd", d.b, "at most 1e6 × the mean " + format_value(d.a) + " for a lognormal");
            break;
        case DistributionKind::uniform:
            require_finite(w + " low", d.a);
            require_at_least(w + " high", d.b, d.a, "at least the low value " + format_value(d.a));
            break;
        case DistributionKind::triangular:
            require_finite(w + " low", d.a);
            require_at_least(w + " mode", d.b, d.a, "at least the low value " + format_value(d.a));
            require_at_least(w + " high", d.c, d.b, "at least the mode " + format_value(d.b));
            break;
    }
}

namespace {
bool zero_width(const Distribution& d) {
    switch (d.kind) {
        case DistributionKind::normal:
        case DistributionKind::lognormal: return d.b == 0.0;
        case DistributionKind::uniform: return d.a == d.b;
        case DistributionKind::triangular: return d.a == d.c;
    }
    return false;
}

double constant_value(const Distribution& d) {
    return d.kind == DistributionKind::triangular ? d.b : d.a;
}

// Double precision throughout: Boost's default promotes double to long double inside the inverse
// error function, several times slower per Monte Carlo draw for no gain at the precision kept.
using Fast = boost::math::policies::policy<boost::math::policies::promote_double<false>>;

// Lognormal from the mean m and sd s of the variable: σ² = ln(1 + s²/m²), μ = ln m − σ²/2.
boost::math::lognormal_distribution<double, Fast> lognormal_of(const Distribution& d) {
    const double sigma2 = std::log1p(d.b * d.b / (d.a * d.a));
    return boost::math::lognormal_distribution<double, Fast>(std::log(d.a) - 0.5 * sigma2, std::sqrt(sigma2));
}

template <class F>
auto with_boost(const Distribution& d, F&& f) {
    switch (d.kind) {
        case DistributionKind::normal: return f(boost::math::normal_distribution<double, Fast>(d.a, d.b));
        case DistributionKind::lognormal: return f(lognormal_of(d));
        case DistributionKind::uniform: return f(boost::math::uniform_distribution<double, Fast>(d.a, d.b));
        case DistributionKind::triangular: break;
    }
    return f(boost::math::triangular_distribution<double, Fast>(d.a, d.b, d.c));
}

double raw_cdf(const Distribution& d, double x) {
    return with_boost(d, [x](const auto& dist) {
        if (x <= boost::math::range(dist).first) return 0.0;
        if (x >= boost::math::range(dist).second) return 1.0;
        return static_cast<double>(boost::math::cdf(dist, x));
    });
}
}  // namespace

TruncatedDistribution::TruncatedDistribution(const Distribution& d, InputRange range, std::string_view what) : d_(d) {
    validate_distribution(d, what);
    if (zero_width(d)) {
        constant_ = true;
        const double v = constant_value(d);
        if (!(v >= range.low && v < range.high))
            throw InputError(std::string(what), v,
                             "inside the physical range [" + format_value(range.low) + ", " + format_value(range.high) + ")");
        return;
    }
    if (d.kind == DistributionKind::lognormal) {
        const auto log_space = lognormal_of(d);
        log_location_ = log_space.location();
        log_scale_ = log_space.scale();
    }
    p_low_ = raw_cdf(d, range.low);
    p_high_ = std::isfinite(range.high) ? raw_cdf(d, range.high) : 1.0;
    if (!(p_high_ - p_low_ > 1e-9))
        throw InputError(std::string(what) + " distribution", constant_value(d),
                         "a distribution with probability inside the physical range [" + format_value(range.low) +
                             ", " + format_value(range.high) + ")");
}

double TruncatedDistribution::quantile(double p) const {
    if (constant_) return constant_value(d_);
    const double q = p_low_ + p * (p_high_ - p_low_);
    // The lognormal's log-space parameters are kept from construction: exp of a normal quantile.
    if (d_.kind == DistributionKind::lognormal)
        return std::exp(boost::math::quantile(boost::math::normal_distribution<double, Fast>(log_location_, log_scale_), q));
    return with_boost(d_, [q](const auto& dist) { return static_cast<double>(boost::math::quantile(dist, q)); });
}

double TruncatedDistribution::cdf(double x) const {
    if (constant_) return x >= constant_value(d_) ? 1.0 : 0.0;
    const double p = raw_cdf(d_, x);
    return std::clamp((p - p_low_) / (p_high_ - p_low_), 0.0, 1.0);
}

}  // namespace wickgrid
