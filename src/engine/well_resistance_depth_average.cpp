// Depth average of the equal-strain radial degree along a drain with well resistance
// (local μ(z) of Hansbo 1981), by composite Gauss–Legendre quadrature in z.
#include <algorithm>
#include <boost/math/quadrature/gauss.hpp>
#include <cmath>

#include "wickgrid/combine.hpp"
#include "wickgrid/errors.hpp"

namespace wickgrid {

namespace {
// Appends the Gauss–Legendre nodes of [a, b] (in ζ = z/l) with weights scaled to the unit interval.
template <int N, class Sink>
void panel(double a, double b, Sink&& sink) {
    using Rule = boost::math::quadrature::gauss<double, N>;
    const double half = 0.5 * (b - a), mid = 0.5 * (a + b);
    const auto& x = Rule::abscissa();
    const auto& w = Rule::weights();
    for (std::size_t i = 0; i < x.size(); ++i) {
        if (x[i] == 0.0) {
            sink(mid, w[i] * half);
        } else {
            sink(mid - half * x[i], w[i] * half);
            sink(mid + half * x[i], w[i] * half);
        }
    }
}
}  // namespace

void depth_average_nodes(double mu_smear, double well_per_m2, double l_m, DepthAverageRule::Accuracy accuracy,
                         std::vector<double>& weights, std::vector<double>& well_terms) {
    require_positive("smear term of mu", mu_smear);
    require_non_negative("well resistance coefficient pi*kh/qw (1/m²)", well_per_m2);
    require_positive("drain length from the outlet l (m)", l_m);
    weights.clear();
    well_terms.clear();
    if (well_per_m2 == 0.0) {  // uniform μ: one node is exact
        weights.push_back(1.0);
        well_terms.push_back(0.0);
        return;
    }
    // μ = a + b·ζ(2 − ζ), a = μs, b = w·l²: poles at ζ = 1 ± √(1 + a/b); the nearer lies a distance
    // d = √(1 + a/b) − 1 before ζ = 0. Panels [x, 3x + 2d] keep it one half-length away from each
    // panel, so every panel converges alike. Node counts were chosen from measured errors against
    // adaptive quadrature (below 1e-15 over 8Th up to 40): 7 nodes for a/b >= 10, 10 for a/b >= 2,
    // else 15 per panel; the reference rule uses 20 per panel throughout.
    const double a = mu_smear, b = well_per_m2 * l_m * l_m;
    // Well resistance so large that it swamps the smear term by orders of magnitude means a wrong
    // input (kh with the exponent's sign flipped, a qw in the wrong unit), not a design: refuse it
    // before the panels below would shrink to nothing.
    if (b > max_well_resistance_ratio * a)
        throw InputError("well resistance π·kh·l²/qw over the smear term μs", b / a,
                         "at most " + format_value(max_well_resistance_ratio) +
                             " (check kh, e.g. the sign of its exponent, and the discharge capacity qw and its unit)");
    const double d = std::sqrt(1.0 + a / b) - 1.0;
    auto sink = [&](double zeta, double weight) {
        well_terms.push_back(b * zeta * (2.0 - zeta));
        weights.push_back(weight);
    };
    const bool reference = accuracy == DepthAverageRule::Accuracy::reference;
    double x = 0.0;
    // Panels widen geometrically (x → 3x + 2d), so their number is about log3(1/d) < 20 here.
    for (int panels = 0; x < 1.0; ++panels) {
        if (panels > 64) throw EvaluationError("depth quadrature of well resistance", "more than 64 panels");
        const double next = std::min(1.0, 3.0 * x + 2.0 * d);
        if (reference) panel<20>(x, next, sink);
        else if (x == 0.0 && next == 1.0 && a >= 10.0 * b) panel<7>(x, next, sink);
        else if (x == 0.0 && next == 1.0 && a >= 2.0 * b) panel<10>(x, next, sink);
        else panel<15>(x, next, sink);
        x = next;
    }
}

DepthAverageRule::DepthAverageRule(double mu_smear, double well_per_m2, double l_m, Accuracy accuracy) {
    depth_average_nodes(mu_smear, well_per_m2, l_m, accuracy, weight_, well_term_);
    for (const double g : well_term_) eight_over_mu_.push_back(8.0 / (mu_smear + g));
}

double DepthAverageRule::degree(double th) const {
    // Σw = 1, so the mean of 1 − e^{−x} is 1 − Σ w·e^{−x}: exp is cheaper than expm1 and the
    // absolute error stays at rounding level.
    double remaining = 0.0;
    for (std::size_t i = 0; i < weight_.size(); ++i) remaining += weight_[i] * std::exp(-eight_over_mu_[i] * th);
    // Σw differs from 1 by rounding (~1e-16); do not let that show as a negative degree at Th ≈ 0.
    return remaining < 1.0 ? 1.0 - remaining : 0.0;
}

double degree_radial_depth_averaged(double th, double mu_smear, double well_per_m2, double l_m) {
    require_non_negative("radial time factor Th", th);
    return DepthAverageRule(mu_smear, well_per_m2, l_m).degree(th);
}

double mu_depth_mean(double mu_smear, double well_per_m2, double l_m) {
    require_positive("smear term of mu", mu_smear);
    require_non_negative("well resistance coefficient pi*kh/qw (1/m²)", well_per_m2);
    require_positive("drain length from the outlet l (m)", l_m);
    return mu_smear + well_per_m2 * 2.0 * l_m * l_m / 3.0;
}

}  // namespace wickgrid
