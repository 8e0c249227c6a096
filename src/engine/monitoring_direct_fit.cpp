// Back-analysis by a direct fit of the site model to a settlement record, and the forecast of a
// model with a given final settlement. Least squares: Brent's minimiser (Boost.Math) over ln ch,
// the final settlement solved exactly for each ch; the interval of ch from the Jacobian with
// Student's t (Boost.Math).
#include <boost/math/distributions/students_t.hpp>
#include <boost/math/tools/minima.hpp>

#include <cmath>
#include <limits>

#include "wickgrid/defaults.hpp"
#include "wickgrid/errors.hpp"
#include "wickgrid/monitoring.hpp"
#include "wickgrid/studies.hpp"
#include "wickgrid/units.hpp"

namespace wickgrid::monitoring {

namespace {
constexpr double ch_search_factor = 100.0;  // the fit looks for ch within a factor 100 of the site's
constexpr int brent_bits = 24;              // ln ch to about 1e-7 relative
constexpr double jacobian_step = 1e-3;      // central difference in ln ch

struct Trial {
    std::vector<double> degrees;
    double final_m = 0.0;
    double sse = std::numeric_limits<double>::max();
};

Trial evaluate(const Site& site, const DrainProductSpec& product, Pattern pattern, double spacing_m,
               const std::vector<double>& times, const std::vector<double>& observed, double ln_factor) {
    Trial t;
    try {
        const Site trial_site = with_input(site, StudyInput::ch_factor, std::exp(ln_factor));
        t.degrees = make_cell_model(trial_site, product, pattern, spacing_m)->combined(times);
    } catch (const InputError&) {
        return t;  // a ch the site cannot take (a bound of the physics): the worst fit
    } catch (const EvaluationError&) {
        return t;
    }
    double num = 0.0, den = 0.0;
    for (std::size_t i = 0; i < times.size(); ++i) {
        num += t.degrees[i] * observed[i];
        den += t.degrees[i] * t.degrees[i];
    }
    if (!(den > 0.0)) return t;
    t.final_m = num / den;
    t.sse = 0.0;
    for (std::size_t i = 0; i < times.size(); ++i) t.sse += std::pow(t.final_m * t.degrees[i] - observed[i], 2);
    return t;
}

// The first time in [lo, hi] at which holds(t) becomes true, by a scan then bisection; nothing when
// it does not hold by hi.
template <typename Holds>
std::optional<double> first_time(double lo, double hi, int scan_points, Holds holds) {
    double previous = lo;
    if (holds(lo)) return lo;
    for (int i = 1; i <= scan_points; ++i) {
        // Logarithmic steps: early times matter at day scale, late ones at year scale.
        const double t = lo + (hi - lo) * (std::pow(10.0, 4.0 * i / scan_points) - 1.0) / (1e4 - 1.0);
        if (!holds(t)) {
            previous = t;
            continue;
        }
        double a = previous, b = t;
        while (b - a > defaults::time_tolerance_s) {
            const double m = 0.5 * (a + b);
            (holds(m) ? b : a) = m;
        }
        return b;
    }
    return std::nullopt;
}
}  // namespace

DirectFit fit_ch_and_settlement(const Site& site, const DrainProductSpec& product, Pattern pattern, double spacing_m,
                                const std::vector<Reading>& readings) {
    if (readings.size() < 4) throw EvaluationError("direct fit", "fewer than 4 readings");
    std::vector<double> times, observed;
    for (const auto& r : readings) {
        times.push_back(r.time_s);
        observed.push_back(r.settlement_m);
    }
    const double lo = -std::log(ch_search_factor), hi = std::log(ch_search_factor);
    auto sse = [&](double x) { return evaluate(site, product, pattern, spacing_m, times, observed, x).sse; };
    std::uintmax_t iterations = defaults::root_iterations;
    const auto [x, best] = boost::math::tools::brent_find_minima(sse, lo, hi, brent_bits, iterations);
    require_converged("direct fit of ch (Brent)", iterations, defaults::root_iterations);
    const Trial at = evaluate(site, product, pattern, spacing_m, times, observed, x);
    if (at.sse == std::numeric_limits<double>::max()) throw EvaluationError("direct fit", "no ch in the search range gives a model");
    DirectFit fit;
    fit.ch_factor = std::exp(x);
    if (site.ground.ch_m2_per_s) fit.ch_m2_per_s = fit.ch_factor * *site.ground.ch_m2_per_s;
    fit.final_settlement_m = at.final_m;
    fit.points = readings.size();
    fit.rms_m = std::sqrt(best / static_cast<double>(readings.size()));
    fit.at_search_bound = std::min(x - lo, hi - x) < 1e-3;
    // Covariance of (ln ch, S) from JᵀJ; r_i = S·U_i(ln ch) − s_i.
    const Trial up = evaluate(site, product, pattern, spacing_m, times, observed, x + jacobian_step);
    const Trial down = evaluate(site, product, pattern, spacing_m, times, observed, x - jacobian_step);
    if (up.degrees.empty() || down.degrees.empty() || readings.size() < 3) return fit;
    double a = 0.0, b = 0.0, c = 0.0;  // JᵀJ = [[a, b], [b, c]]
    for (std::size_t i = 0; i < times.size(); ++i) {
        const double jx = at.final_m * (up.degrees[i] - down.degrees[i]) / (2.0 * jacobian_step);
        const double js = at.degrees[i];
        a += jx * jx;
        b += jx * js;
        c += js * js;
    }
    const double det = a * c - b * b;
    const double dof = static_cast<double>(readings.size() - 2);
    if (!(det > 0.0) || fit.at_search_bound) return fit;
    const double var_x = best / dof * c / det;
    const double t = boost::math::quantile(boost::math::complement(boost::math::students_t(dof), 0.025));
    const double half = t * std::sqrt(var_x);
    if (std::isfinite(half)) {
        fit.ch_factor_interval_95 = std::array<double, 2>{std::exp(x - half), std::exp(x + half)};
        if (site.ground.ch_m2_per_s)
            fit.ch_interval_95 = std::array<double, 2>{(*fit.ch_factor_interval_95)[0] * *site.ground.ch_m2_per_s,
                                                       (*fit.ch_factor_interval_95)[1] * *site.ground.ch_m2_per_s};
    }
    return fit;
}

Forecast forecast(const CellModel& model, double final_settlement_m, const Site& site, double now_s) {
    require_non_negative("time of the last reading (s)", now_s);
    Forecast f;
    f.degree_now = model.degree(now_s);
    f.settlement_now_m = final_settlement_m * f.degree_now;
    const Criterion& c = site.criterion;
    const double horizon = units::days_to_seconds(defaults::search_horizon_years * units::days_per_year);
    // Primary with the fitted S; secondary compression over a service period, as `design` counts it
    // (without a period it does not end and is not added).
    auto residual = [&](double t) -> std::pair<double, double> {
        const auto* r = c.residual();
        const std::optional<double> period = r ? r->service_s : std::nullopt;
        // Creep without a period does not end: the primary part alone, with no secondary counted.
        if (!period && model.secondary_model())
            return {final_settlement_m * (model.eventual_degree() - model.degree(t)), 0.0};
        const auto parts = model.residual_parts(t, period, final_settlement_m);
        return {parts.primary_m, parts.secondary_m};
    };
    const auto [primary, secondary] = residual(c.deadline_s);
    f.residual_primary_at_deadline_m = primary;
    f.residual_secondary_at_deadline_m = secondary;
    f.residual_at_deadline_m = primary + secondary;
    if (const auto* d = c.degree()) f.criterion_met_s = model.time_to_degree_s(d->degree);
    else
        f.criterion_met_s = first_time(0.0, horizon, 400, [&](double t) {
            const auto [p, s] = residual(t);
            return p + s <= c.residual()->limit_m;
        });
    if (site.loading && site.loading->surcharge) {
        const auto& s = *site.loading->surcharge;
        // The preloading criterion (Johnson 1970): the settlement reaches the final settlement under the
        // permanent load, U = 1 relative to it, before the planned removal.
        f.surcharge_removal_s = first_time(s.end_s, s.removal_s, 200, [&](double t) { return model.degree(t) >= 1.0; });
    }
    return f;
}

}  // namespace wickgrid::monitoring
