// Asaoka's (1978) observational method, and the ch its β1 implies with radial and vertical drainage
// together (Magnan & Deroy 1980).
#include <algorithm>
#include <cmath>
#include <numbers>

#include "wickgrid/errors.hpp"
#include "wickgrid/monitoring.hpp"

namespace wickgrid::monitoring {

namespace {
constexpr std::size_t most_asaoka_steps = 12;

// Settlement at time t by linear interpolation; t within the readings' span.
double settlement_at(const std::vector<Reading>& r, double t) {
    const auto after = std::lower_bound(r.begin(), r.end(), t, [](const Reading& a, double x) { return a.time_s < x; });
    if (after == r.begin()) return after->settlement_m;
    if (after == r.end()) return r.back().settlement_m;
    const auto before = after - 1;
    const double w = (t - before->time_s) / (after->time_s - before->time_s);
    return before->settlement_m + w * (after->settlement_m - before->settlement_m);
}

double default_interval_s(const std::vector<Reading>& r, double start_s) {
    const auto first = std::lower_bound(r.begin(), r.end(), start_s, [](const Reading& a, double x) { return a.time_s < x; });
    const auto count = static_cast<std::size_t>(r.end() - first);
    const double span = r.back().time_s - start_s;
    if (count < 2 || span <= 0.0) return span;
    const double mean_gap = (r.back().time_s - first->time_s) / static_cast<double>(count - 1);
    const auto steps = std::clamp<std::size_t>(static_cast<std::size_t>(span / mean_gap), 1, most_asaoka_steps);
    return span / static_cast<double>(steps);
}
}  // namespace

AsaokaFit asaoka(const std::vector<Reading>& readings, double start_s, std::optional<double> interval_s) {
    if (readings.size() < 2) throw EvaluationError("Asaoka fit", "fewer than 2 readings");
    AsaokaFit fit;
    fit.start_s = std::max(start_s, readings.front().time_s);
    if (!(readings.back().time_s > fit.start_s))
        throw EvaluationError("Asaoka fit", "no reading after the last load change (day " +
                                                format_value(fit.start_s / 86400.0) + ")");
    fit.interval_s = interval_s ? *interval_s : default_interval_s(readings, fit.start_s);
    require_positive("Asaoka interval (s)", fit.interval_s);
    // Counted first, stepped by index: an interval far below the span can neither loop for ever (t + Δt
    // == t) nor grow memory without bound.
    const double steps = std::floor((readings.back().time_s * (1.0 + 1e-12) - fit.start_s) / fit.interval_s);
    if (!(steps < static_cast<double>(asaoka_max_points)))
        throw InputError("Asaoka interval (days)", fit.interval_s / 86400.0,
                         "at most " + std::to_string(asaoka_max_points) + " points over the record after the last load change");
    for (std::size_t i = 0; i <= static_cast<std::size_t>(steps); ++i)
        fit.resampled_m.push_back(settlement_at(readings, fit.start_s + static_cast<double>(i) * fit.interval_s));
    if (fit.resampled_m.size() < asaoka_min_points)
        throw EvaluationError("Asaoka fit", "only " + std::to_string(fit.resampled_m.size()) +
                                                " points at the interval after the last load change; at least " +
                                                std::to_string(asaoka_min_points) + " are needed");
    // Least squares of y = s_i on x = s_(i−1).
    const std::size_t n = fit.resampled_m.size() - 1;
    double mx = 0.0, my = 0.0;
    for (std::size_t i = 0; i < n; ++i) {
        mx += fit.resampled_m[i];
        my += fit.resampled_m[i + 1];
    }
    mx /= static_cast<double>(n);
    my /= static_cast<double>(n);
    double sxx = 0.0, sxy = 0.0;
    for (std::size_t i = 0; i < n; ++i) {
        sxx += (fit.resampled_m[i] - mx) * (fit.resampled_m[i] - mx);
        sxy += (fit.resampled_m[i] - mx) * (fit.resampled_m[i + 1] - my);
    }
    if (!(sxx > 0.0)) throw EvaluationError("Asaoka fit", "the settlement does not change after the last load change");
    fit.beta1 = sxy / sxx;
    fit.beta0_m = my - fit.beta1 * mx;
    if (!(fit.beta1 > 0.0 && fit.beta1 < 1.0))
        throw EvaluationError("Asaoka fit", "β1 = " + format_value(fit.beta1) +
                                                " is not within (0, 1): the record does not yet settle towards a limit");
    double sse = 0.0;
    for (std::size_t i = 0; i < n; ++i) {
        const double r = fit.resampled_m[i + 1] - (fit.beta0_m + fit.beta1 * fit.resampled_m[i]);
        fit.residuals_m.push_back(r);
        sse += r * r;
    }
    const double sigma2 = sse / static_cast<double>(n - 2);
    const double var1 = sigma2 / sxx;
    const double var0 = sigma2 * (1.0 / static_cast<double>(n) + mx * mx / sxx);
    const double cov01 = -mx * sigma2 / sxx;
    fit.beta0_se_m = std::sqrt(var0);
    fit.beta1_se = std::sqrt(var1);
    fit.final_settlement_m = fit.beta0_m / (1.0 - fit.beta1);
    const double g0 = 1.0 / (1.0 - fit.beta1);
    const double g1 = fit.beta0_m / ((1.0 - fit.beta1) * (1.0 - fit.beta1));
    fit.final_settlement_se_m = std::sqrt(std::max(0.0, g0 * g0 * var0 + g1 * g1 * var1 + 2.0 * g0 * g1 * cov01));
    return fit;
}

std::optional<double> asaoka_ch_m2_per_s(double beta1, double interval_s, double influence_diameter_m, double mu,
                                         double cv_m2_per_s, double drainage_path_m) {
    require_open_unit("β1", beta1);
    require_positive("Asaoka interval (s)", interval_s);
    require_positive("influence diameter (m)", influence_diameter_m);
    require_positive("μ", mu);
    require_non_negative("cv (m²/s)", cv_m2_per_s);
    require_positive("drainage path (m)", drainage_path_m);
    const double rate = -std::log(beta1) / interval_s;
    const double vertical = std::numbers::pi * std::numbers::pi * cv_m2_per_s / (4.0 * drainage_path_m * drainage_path_m);
    if (rate <= vertical) return std::nullopt;
    return (rate - vertical) * influence_diameter_m * influence_diameter_m * mu / 8.0;
}

}  // namespace wickgrid::monitoring
