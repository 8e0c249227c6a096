// The cell-model interface: what every method shares (settlement, residual, criterion margin and
// time, the generic spacing search), and the method table with the factory.
#include "wickgrid/cell_model.hpp"

#include <algorithm>
#include <boost/math/tools/toms748_solve.hpp>
#include <cmath>
#include <cstdint>

#include "cell_model_methods.hpp"
#include "wickgrid/errors.hpp"
#include "wickgrid/units.hpp"

namespace wickgrid {

std::vector<double> CellModel::combined(const std::vector<double>& times_s) const {
    std::vector<double> out;
    out.reserve(times_s.size());
    for (const Degrees& d : degrees(times_s)) out.push_back(d.combined);
    return out;
}

namespace {
constexpr int scan_points = 400;
double horizon_s() { return defaults::search_horizon_years * units::seconds_per_year; }

// Log-spaced times from one day to the horizon.
std::vector<double> scan_times() {
    std::vector<double> t;
    const double first = units::seconds_per_day, last = horizon_s();
    for (int i = 0; i <= scan_points; ++i) t.push_back(first * std::pow(last / first, static_cast<double>(i) / scan_points));
    return t;
}

// The first time at which met(t) holds, given that it fails at `before` and holds at `after`.
template <class Met>
double bisect_time(Met&& met, double before, double after) {
    while (after - before > defaults::time_tolerance_s) {
        const double mid = 0.5 * (before + after);
        (met(mid) ? after : before) = mid;
    }
    return after;
}
}  // namespace

std::optional<double> CellModel::time_to_degree_s(double target) const {
    require_open_unit("target degree of consolidation", target);
    const auto times = scan_times();
    const auto u = combined(times);
    for (std::size_t i = 0; i < times.size(); ++i)
        if (u[i] >= target)
            return bisect_time([&](double t) { return degree(t) >= target; }, i ? times[i - 1] : 0.0, times[i]);
    return std::nullopt;
}

std::optional<std::vector<DepthPoint>> CellModel::over_depth(const std::vector<double>&, double) const {
    return std::nullopt;
}

std::optional<double> CellModel::settlement_m(double time_s) const {
    if (!final_m_) return std::nullopt;
    return *final_m_ * degree(time_s);
}

CellModel::Residual CellModel::residual_parts(double time_s, std::optional<double> period_s) const {
    if (!final_m_) throw InputError("residual settlement", time_s, "asked of a site with a settlement model");
    return residual_parts(time_s, period_s, *final_m_);
}

CellModel::Residual CellModel::residual_parts(double time_s, std::optional<double> period_s, double final_settlement_m) const {
    if (period_s) {
        const auto u = combined({time_s, time_s + *period_s});
        return {final_settlement_m * (u[1] - u[0]), secondary_between_m(time_s, time_s + *period_s)};
    }
    if (secondary_)
        throw InputError("service period (days)", time_s, "given with secondary compression (it does not end)");
    return {final_settlement_m * (eventual_degree() - degree(time_s)), 0.0};
}

double CellModel::degree_at_removal() const {
    return secondary_ && secondary_->removal_s ? degree(*secondary_->removal_s) : 1.0;
}

double CellModel::secondary_between(double from_s, double to_s, std::optional<double> tp, double u_removal) const {
    if (!secondary_ || !tp) return 0.0;
    return wickgrid::secondary_between_m(*secondary_, from_s, to_s, tp, u_removal);
}

double CellModel::secondary_between_m(double from_s, double to_s) const {
    if (!secondary_) return 0.0;
    return secondary_between(from_s, to_s, end_of_primary_s(), degree_at_removal());
}

double CellModel::secondary_m(double time_s) const { return secondary_between_m(0.0, time_s); }

double CellModel::margin(const Criterion& criterion) const {
    if (const auto* d = criterion.degree()) return degree(criterion.deadline_s) - d->degree;
    const auto* r = criterion.residual();
    return r->limit_m - residual_m(criterion.deadline_s, r->service_s);
}

std::optional<double> CellModel::time_criterion_met_s(const Criterion& criterion) const {
    if (const auto* d = criterion.degree()) return time_to_degree_s(d->degree);
    const auto* r = criterion.residual();
    auto met = [&](double t) { return residual_m(t, r->service_s) <= r->limit_m; };
    // One batch for the scan (a numerical cell marches once), then bisection of the first crossing.
    const auto times = scan_times();
    std::vector<double> all = times;
    if (r->service_s)
        for (const double t : times) all.push_back(t + *r->service_s);
    std::sort(all.begin(), all.end());
    all.erase(std::unique(all.begin(), all.end()), all.end());
    const auto u = combined(all);
    auto at = [&](double t) { return u[static_cast<std::size_t>(std::lower_bound(all.begin(), all.end(), t) - all.begin())]; };
    const double final_m = *final_settlement_m();
    const std::optional<double> tp = secondary_ ? end_of_primary_s() : std::nullopt;
    const double u_removal = degree_at_removal();
    for (std::size_t i = 0; i < times.size(); ++i) {
        const double end = r->service_s ? at(times[i] + *r->service_s) : eventual_degree();
        const double secondary = r->service_s ? secondary_between(times[i], times[i] + *r->service_s, tp, u_removal) : 0.0;
        if (final_m * (end - at(times[i])) + secondary <= r->limit_m)
            return bisect_time(met, i ? times[i - 1] : 0.0, times[i]);
    }
    return std::nullopt;
}

namespace {
// The method table: one row per method, used by the factory and the spacing search.
struct MethodRow {
    CellMethod method;
    std::unique_ptr<CellModel> (*build)(const Site&, const DrainProductSpec&, Pattern, double);
    std::optional<MethodRefusal> (*refusal)(const Site&);
    std::optional<SpacingLimit> (*fast_limit)(const Site&, const DrainProductSpec&, Pattern);
    // The margin against spacing, prepared once per search (nullptr: a cell model per spacing).
    std::function<double(double)> (*margin_function)(const Site&, const DrainProductSpec&, Pattern);
};

constexpr MethodRow methods[] = {
    {CellMethod::closed_form, detail::make_closed_form_model, detail::closed_form_refusal, detail::closed_form_fast_limit,
     nullptr},
    {CellMethod::numerical, detail::make_numerical_model, detail::numerical_refusal, nullptr, nullptr},
    {CellMethod::layered, detail::make_layered_model, detail::layered_refusal, nullptr, detail::layered_margin_function},
};

const MethodRow& row_of(CellMethod method) {
    for (const auto& row : methods)
        if (row.method == method) return row;
    throw InputError("cell method", static_cast<double>(method), "one of the implemented methods");
}
}  // namespace

std::unique_ptr<CellModel> make_cell_model(const Site& site, const DrainProductSpec& product, Pattern pattern,
                                           double spacing_m) {
    const MethodRow& row = row_of(site.method.method);
    if (auto why = row.refusal(site)) throw why->error();
    return row.build(site, product, pattern, spacing_m);
}

std::optional<MethodRefusal> method_refusal(const Site& site) { return row_of(site.method.method).refusal(site); }

bool has_fast_search(const Site& site) {
    return site.method.method == CellMethod::closed_form && site.criterion.degree() &&
           (!site.loading || site.installation.theory == RadialTheory::hansbo_1981);
}

double max_spacing_searches(const Site& site) {
    if (site.method.method == CellMethod::numerical) return defaults::max_searches_numerical;
    if (site.method.method == CellMethod::layered) {
        // The series' cost grows as the cube of its terms (a dense generalised eigenproblem): the
        // budget is the generic one at the default number of terms, scaled down for more.
        const double ratio = static_cast<double>(defaults::layered_terms) / site.method.series_terms;
        return std::floor(defaults::max_searches_generic * std::min(1.0, ratio * ratio * ratio));
    }
    return has_fast_search(site) ? defaults::max_searches_fast : defaults::max_searches_generic;
}

SpacingLimit spacing_limit(const Site& site, const DrainProductSpec& product, Pattern pattern) {
    const MethodRow& row = row_of(site.method.method);
    if (row.fast_limit)
        if (auto fast = row.fast_limit(site, product, pattern)) return *fast;
    return spacing_limit_reference(site, product, pattern);
}

SpacingLimit spacing_limit_reference(const Site& site, const DrainProductSpec& product, Pattern pattern) {
    const MethodRow& row = row_of(site.method.method);
    const Criterion& criterion = site.criterion;
    const std::function<double(double)> margin_at =
        row.margin_function ? row.margin_function(site, product, pattern)
                            : std::function<double(double)>([&](double s) {
                                  return make_cell_model(site, product, pattern, s)->margin(criterion);
                              });
    const double lo = site.range.bounds.min_m, hi = site.range.bounds.max_m;
    SpacingLimit limit;
    const auto at_min = make_cell_model(site, product, pattern, lo);
    limit.degree_at_minimum = at_min->degree(criterion.deadline_s);
    const double f_lo = at_min->margin(criterion);
    if (f_lo < 0.0) return limit;
    limit.feasible = true;
    if (criterion.degree()) {
        // The degree at the deadline falls as the spacing widens: one monotone root.
        const double f_hi = margin_at(hi);
        if (f_hi >= 0.0) {
            limit.at_maximum = true;
            limit.spacing_m = hi;
            return limit;
        }
        std::uintmax_t iterations = defaults::root_iterations;
        const auto r = boost::math::tools::toms748_solve(
            margin_at, lo, hi, f_lo, f_hi, [](double a, double b) { return b - a < defaults::spacing_tolerance_m; },
            iterations);
        require_converged("largest spacing", iterations, defaults::root_iterations);
        limit.spacing_m = r.first;  // the side that still meets the criterion
        return limit;
    }
    // The residual over a service period need not be monotone in spacing: scan the increment grid
    // from the minimum, then bisect the first failing step.
    double ok = lo;
    for (int k = 1;; ++k) {
        const double s = std::min(hi, lo + k * site.range.increment_m);
        if (margin_at(s) < 0.0) {
            double bad = s;
            while (bad - ok > defaults::spacing_tolerance_m) {
                const double mid = 0.5 * (ok + bad);
                (margin_at(mid) >= 0.0 ? ok : bad) = mid;
            }
            limit.spacing_m = ok;
            return limit;
        }
        ok = s;
        if (s >= hi) break;
    }
    limit.at_maximum = true;
    limit.spacing_m = hi;
    return limit;
}

}  // namespace wickgrid
