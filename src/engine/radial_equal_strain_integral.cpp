// General equal-strain μ for a permeability profile k(r) around the drain, by quadrature of the
// unit-cell integral of Hansbo (1981) with k = k(r); linear and parabolic smear profiles
// (parabolic in the shape of Walker & Indraratna 2006).
#include <algorithm>
#include <boost/math/quadrature/gauss_kronrod.hpp>
#include <cmath>

#include "wickgrid/errors.hpp"
#include "wickgrid/radial.hpp"

namespace wickgrid {

void validate_smear_zone(const SmearZone& smear, double n) {
    require_at_least("smear diameter ratio s = ds/dw", smear.diameter_ratio, 1.0,
                     "at least 1 (1 means no smear; the smear zone cannot be smaller than the drain)");
    if (!(smear.diameter_ratio < n))
        throw InputError("smear diameter ratio s = ds/dw", smear.diameter_ratio,
                         "smaller than n = De/dw = " + format_value(n) +
                             " (the smear zone must lie inside the unit cell)");
    require_positive("smear permeability ratio kh/ks", smear.permeability_ratio);
}

double smear_permeability_fraction(const SmearZone& smear, double x) {
    const double s = smear.diameter_ratio;
    if (x >= s || s == 1.0) return 1.0;
    const double ks = 1.0 / smear.permeability_ratio;  // ks/kh at the drain wall
    const double t = (x - 1.0) / (s - 1.0);             // 0 at the drain, 1 at the smear boundary
    switch (smear.shape) {
        case SmearShape::constant: return ks;
        case SmearShape::linear: return ks + (1.0 - ks) * t;
        case SmearShape::parabolic: return 1.0 - (1.0 - ks) * (1.0 - t) * (1.0 - t);
    }
    return 1.0;
}

double equal_strain_mu(double n, const std::function<double(double)>& k_fraction,
                       const std::vector<double>& breaks) {
    require_greater("drain spacing ratio n = De/dw", n, 1.0, "a finite number greater than 1");
    const double n2 = n * n;
    // Substituting x = e^y removes the 1/x and keeps the integrand smooth over wide ranges of n.
    auto integrand = [&](double y) {
        const double x = std::exp(y);
        const double k = k_fraction(x);
        if (!(k > 0.0 && std::isfinite(k)))
            throw InputError("permeability fraction k(r)/kh", k, "finite and greater than 0");
        const double a = n2 - x * x;
        return a * a / k;
    };
    std::vector<double> cuts{0.0};
    for (const double b : breaks)
        if (b > 1.0 && b < n) cuts.push_back(std::log(b));
    cuts.push_back(std::log(n));
    std::sort(cuts.begin(), cuts.end());
    double integral = 0.0;
    for (std::size_t i = 0; i + 1 < cuts.size(); ++i) {
        if (cuts[i + 1] <= cuts[i]) continue;
        integral += boost::math::quadrature::gauss_kronrod<double, 31>::integrate(
            integrand, cuts[i], cuts[i + 1], 15, 1e-14);
    }
    return integral / (n2 * (n2 - 1.0));
}

double equal_strain_mu(double n, const SmearZone& smear) {
    require_greater("drain spacing ratio n = De/dw", n, 1.0, "a finite number greater than 1");
    validate_smear_zone(smear, n);
    return equal_strain_mu(
        n, [&smear](double x) { return smear_permeability_fraction(smear, x); },
        {smear.diameter_ratio});
}

}  // namespace wickgrid
