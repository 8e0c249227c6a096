// Monte Carlo of the largest spacing over uncertain inputs: Gaussian copula for the ch–cv
// correlation, Clopper–Pearson (1934) intervals for the probability of reaching the target.
#include <algorithm>
#include <atomic>
#include <boost/math/distributions/binomial.hpp>
#include <boost/math/distributions/normal.hpp>
#include <chrono>
#include <cmath>
#include <exception>
#include <mutex>
#include <random>
#include <thread>

#include "wickgrid/errors.hpp"
#include "wickgrid/permeability.hpp"
#include "wickgrid/studies.hpp"

namespace wickgrid {

namespace {
constexpr std::size_t chunk_size = 1024;

// Uniform in (0, 1) from 53 random bits, never exactly 0 or 1.
double open_uniform(std::mt19937_64& rng) { return (static_cast<double>(rng() >> 11) + 0.5) * 0x1.0p-53; }

struct Combination {
    CellSpec cell;
    double eval_spacing_m;
};

// Applies one sampled value to a unit-cell specification (the per-sample fast form of with_input;
// `product` is the cell's unsampled specification).
void apply(CellSpec& cell, const CellSpec& product, const Site& base, StudyInput input, double value) {
    switch (input) {
        case StudyInput::ch:
            cell.clay.ch_m2_per_s = value;
            if (base.ground.kh_source == KhSource::from_ch_and_mv)
                cell.clay.kh_m_per_s = permeability_from_consolidation_m_per_s(value, *base.ground.mv_m2_per_kN);
            break;
        case StudyInput::cv: cell.clay.cv_m2_per_s = value; break;
        case StudyInput::kh: cell.clay.kh_m_per_s = value; break;
        case StudyInput::smear_diameter_ratio: cell.drain.smear_diameter_m = value * base.installation.mandrel_diameter_m; break;
        case StudyInput::smear_permeability_ratio: cell.drain.smear_permeability_ratio = value; break;
        case StudyInput::discharge_capacity: cell.drain.discharge_capacity_m3_per_s = value; break;
        case StudyInput::discharge_capacity_factor:
            cell.drain.discharge_capacity_m3_per_s = value * product.drain.discharge_capacity_m3_per_s;
            break;
        case StudyInput::ch_factor:
            apply(cell, product, base, StudyInput::ch, value * product.clay.ch_m2_per_s);
            break;
        case StudyInput::cv_factor: cell.clay.cv_m2_per_s = value * product.clay.cv_m2_per_s; break;
    }
}
}  // namespace

namespace {
// Counts the sorted limits into equal bins over the feasible ones (limit > 0).
void histogram(const std::vector<double>& sorted, MonteCarloRow& row) {
    const auto first = std::upper_bound(sorted.begin(), sorted.end(), 0.0);
    row.infeasible_samples = static_cast<std::size_t>(first - sorted.begin());
    if (first == sorted.end()) return;
    row.histogram_low_m = *first;
    const double span = sorted.back() - *first;
    row.histogram_bin_m = span > 0.0 ? span / static_cast<double>(monte_carlo_histogram_bins) : 0.0;
    row.histogram_counts.assign(span > 0.0 ? monte_carlo_histogram_bins : 1, 0);
    for (auto it = first; it != sorted.end(); ++it) {
        const auto bin = span > 0.0 ? static_cast<std::size_t>((*it - row.histogram_low_m) / row.histogram_bin_m) : 0;
        ++row.histogram_counts[std::min(bin, row.histogram_counts.size() - 1)];
    }
}
}  // namespace

MonteCarloResult monte_carlo(const Site& base_input, const DesignResult& base_result,
                             const MonteCarloSpec& spec, const Progress& progress) {
    if (spec.samples < 1) throw InputError("Monte Carlo samples", 0.0, "at least 1");
    const double values = static_cast<double>(spec.samples) * static_cast<double>(base_result.rows.size());
    if (values > defaults::max_monte_carlo_values)
        throw InputError("Monte Carlo samples × design rows", values,
                         "at most " + format_value(defaults::max_monte_carlo_values) + " (" +
                             format_value(std::floor(defaults::max_monte_carlo_values /
                                                     static_cast<double>(std::max<std::size_t>(1, base_result.rows.size())))) +
                             " samples for " + std::to_string(base_result.rows.size()) + " rows)");
    // The closed form under one instantaneous load with a degree criterion samples through the exact
    // fast search; every other site through its own cell models, within the study's search budget.
    const bool fast = !base_input.loading && base_input.criterion.degree() &&
                      base_input.method.method == CellMethod::closed_form;
    if (!fast && values > max_spacing_searches(base_input))
        throw InputError("Monte Carlo samples × design rows", values,
                         "at most " + format_value(max_spacing_searches(base_input)) +
                             " spacing searches for this site's method and loading (staged loading, the residual "
                             "criterion and the numerical cell search on cell models): use fewer samples");
    for (const auto& in : spec.inputs)
        if (in.input == StudyInput::discharge_capacity && base_input.products.size() != 1)
            throw InputError(std::string(to_string(in.input)), 0.0,
                             "sampled on a site with one drain product; vary discharge_capacity_factor instead");
    const double target = fast ? base_input.criterion.degree()->degree : 0.0;
    const SpacingBounds bounds = base_input.range.bounds;
    require_open_unit("reliability", spec.reliability);
    require_open_unit("confidence", spec.confidence);
    if (!(spec.ch_cv_correlation > -1.0 && spec.ch_cv_correlation < 1.0))
        throw InputError("ch–cv correlation", spec.ch_cv_correlation, "between −1 and 1, both excluded");
    if (spec.spacing_m)
        if (!(*spec.spacing_m >= bounds.min_m && *spec.spacing_m <= bounds.max_m))
            throw InputError("Monte Carlo spacing (m)", *spec.spacing_m,
                             "within the spacing range " + format_value(bounds.min_m) + "–" + format_value(bounds.max_m) +
                                 " m");
    const auto position = [&](StudyInput which) {
        for (std::size_t i = 0; i < spec.inputs.size(); ++i)
            if (spec.inputs[i].input == which) return static_cast<long>(i);
        return -1L;
    };
    const long ch_at = position(StudyInput::ch), cv_at = position(StudyInput::cv);
    // A sampled kh is the permeability; it is no longer derived from ch.
    Site base = base_input;
    if (position(StudyInput::kh) >= 0) base.ground.kh_source = KhSource::given;
    std::vector<TruncatedDistribution> draws;
    for (const auto& in : spec.inputs)
        draws.emplace_back(in.distribution, physical_range(base, in.input), to_string(in.input));
    const bool correlated = ch_at >= 0 && cv_at >= 0 && spec.ch_cv_correlation != 0.0;
    const double rho = spec.ch_cv_correlation, rho_c = std::sqrt(1.0 - rho * rho);

    // Every sampled input must apply to this site (e.g. a layer-wise cv cannot be sampled as one
    // value): checked once at the median, so a refusal is named before any sample runs.
    for (std::size_t j = 0; j < spec.inputs.size(); ++j) with_input(base, spec.inputs[j].input, draws[j].quantile(0.5));
    std::vector<Combination> combos;
    for (const DesignRow& row : base_result.rows) {
        const DrainProductSpec& product = base.product(row.drain);
        combos.push_back({fast ? closed_form_cell(base_input, product, row.pattern, bounds.min_m) : CellSpec{},
                          spec.spacing_m.value_or(row.spacing_m)});
    }

    const std::size_t n = spec.samples;
    // Samples are seeded per chunk, so results do not depend on the thread count; a search on cell
    // models costs a millisecond or more, so those run in small chunks to keep both cores busy.
    const std::size_t chunk = fast ? chunk_size : 16;
    std::vector<std::vector<double>> limits(combos.size(), std::vector<double>(n, 0.0));
    // Samples the site's model could not evaluate (an input it refuses): counted, and taken as not
    // meeting the criterion.
    std::vector<std::vector<unsigned char>> unevaluated(combos.size(), std::vector<unsigned char>(fast ? 0 : n, 0));
    const std::size_t chunks = (n + chunk - 1) / chunk;
    const unsigned threads = std::max(1u, std::min<unsigned>(spec.threads ? spec.threads : std::thread::hardware_concurrency(),
                                                             static_cast<unsigned>(chunks)));
    std::atomic<std::size_t> next_chunk{0}, done{0};
    std::atomic<bool> failed{false};
    std::exception_ptr failure;
    std::mutex failure_mutex;

    auto worker = [&] {
        std::vector<double> u(spec.inputs.size());
        SpacingSolver solver;
        const boost::math::normal standard;
        try {
            for (std::size_t c = next_chunk++; c < chunks && !failed; c = next_chunk++) {
                std::seed_seq seq{static_cast<std::uint32_t>(spec.seed), static_cast<std::uint32_t>(spec.seed >> 32),
                                  static_cast<std::uint32_t>(c), static_cast<std::uint32_t>(c >> 32)};
                std::mt19937_64 rng(seq);
                const std::size_t end = std::min(n, (c + 1) * chunk);
                for (std::size_t i = c * chunk; i < end; ++i) {
                    for (auto& x : u) x = open_uniform(rng);
                    if (correlated) {
                        const double z1 = boost::math::quantile(standard, u[ch_at]);
                        const double z2 = rho * z1 + rho_c * boost::math::quantile(standard, u[cv_at]);
                        u[cv_at] = boost::math::cdf(standard, z2);
                        u[cv_at] = std::min(std::max(u[cv_at], 0x1.0p-60), 1.0 - 0x1.0p-53);
                    }
                    for (std::size_t j = 0; j < spec.inputs.size(); ++j) u[j] = draws[j].quantile(u[j]);
                    if (!fast) {
                        Site varied = base;
                        for (std::size_t j = 0; j < spec.inputs.size(); ++j)
                            varied = with_input(varied, spec.inputs[j].input, u[j]);
                        for (std::size_t k = 0; k < combos.size(); ++k) {
                            const DesignRow& row = base_result.rows[k];
                            try {
                                const SpacingLimit limit = spacing_limit(varied, varied.product(row.drain), row.pattern);
                                limits[k][i] = limit.feasible ? limit.spacing_m : 0.0;
                            } catch (const InputError&) {
                                unevaluated[k][i] = 1;
                            } catch (const EvaluationError&) {
                                unevaluated[k][i] = 1;
                            }
                        }
                        continue;
                    }
                    for (std::size_t k = 0; k < combos.size(); ++k) {
                        CellSpec cell = combos[k].cell;
                        for (std::size_t j = 0; j < spec.inputs.size(); ++j)
                            apply(cell, combos[k].cell, base, spec.inputs[j].input, u[j]);
                        solver.reset(cell, bounds);
                        const SpacingLimit limit = solver.solve(target, base.criterion.deadline_s);
                        limits[k][i] = limit.feasible ? limit.spacing_m : 0.0;
                    }
                }
                done += end - c * chunk;
            }
        } catch (...) {
            std::lock_guard<std::mutex> lock(failure_mutex);
            if (!failure) failure = std::current_exception();
            failed = true;
        }
    };
    std::vector<std::thread> pool;
    for (unsigned t = 0; t < threads; ++t) pool.emplace_back(worker);
    while (progress && done < n && !failed) {
        progress(done, n);
        std::this_thread::sleep_for(std::chrono::milliseconds(100));
    }
    for (auto& t : pool) t.join();
    if (failure) std::rethrow_exception(failure);
    if (progress) progress(n, n);

    MonteCarloResult result;
    result.samples = n;
    result.seed = spec.seed;
    result.threads = threads;
    const double alpha = 1.0 - spec.confidence;
    using boost::math::binomial_distribution;
    for (std::size_t k = 0; k < combos.size(); ++k) {
        std::vector<double>& s = limits[k];
        std::sort(s.begin(), s.end());
        MonteCarloRow row;
        row.drain = base_result.rows[k].drain;
        row.pattern = base_result.rows[k].pattern;
        row.spacing_m = combos[k].eval_spacing_m;
        row.unevaluated = static_cast<std::size_t>(std::count(unevaluated[k].begin(), unevaluated[k].end(), 1));
        // A sample meets the target at spacing x exactly when its own limit is at least x.
        const auto first_ok = std::lower_bound(s.begin(), s.end(), row.spacing_m - 1e-12);
        const auto successes = static_cast<double>(s.end() - first_ok);
        row.probability = successes / static_cast<double>(n);
        row.probability_low = binomial_distribution<>::find_lower_bound_on_p(
            static_cast<double>(n), successes, alpha / 2, binomial_distribution<>::clopper_pearson_exact_interval);
        row.probability_high = binomial_distribution<>::find_upper_bound_on_p(
            static_cast<double>(n), successes, alpha / 2, binomial_distribution<>::clopper_pearson_exact_interval);
        row.feasible_fraction = static_cast<double>(s.end() - std::upper_bound(s.begin(), s.end(), 0.0)) / static_cast<double>(n);
        // The largest x with P(limit >= x) >= reliability: the (1 − reliability) quantile.
        const auto index = static_cast<std::size_t>(std::floor((1.0 - spec.reliability) * static_cast<double>(n)));
        const double quantile = s[std::min(index, n - 1)];
        if (quantile > 0.0) {
            row.reliability_spacing_m = quantile;
            row.reliability_at_maximum = quantile >= bounds.max_m;
        }
        row.median_spacing_m = s[n / 2];
        histogram(s, row);
        result.rows.push_back(row);
    }
    return result;
}

}  // namespace wickgrid
