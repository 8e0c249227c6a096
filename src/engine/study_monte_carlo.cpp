// Monte Carlo of the largest spacing over uncertain inputs: Gaussian copula for the ch–cv
// correlation, Clopper–Pearson (1934) intervals for the probability of reaching the target.
#include <algorithm>
#include <atomic>
#include <boost/math/distributions/binomial.hpp>
#include <boost/math/distributions/normal.hpp>
#include <chrono>
#include <cmath>
#include <exception>
#include <limits>
#include <memory>
#include <span>
#include <mutex>
#include <random>
#include <thread>

#include "wickgrid/cell_model.hpp"
#include "wickgrid/errors.hpp"
#include "wickgrid/geometry.hpp"
#include "wickgrid/permeability.hpp"
#include "wickgrid/search.hpp"
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

// The closed form's degree depends on the spacing only through the influence diameter De, so one
// search in De serves every pattern of a product: it runs for the pattern with the smallest De/s
// factor over spacings that cover every pattern's De range, and each pattern reads its own limit
// off the root (monotone in De: below its De range infeasible, above it at the maximum).
struct SharedSearch {
    CellSpec cell;                   // the product's cell, in the pattern with the smallest factor
    SpacingBounds bounds;            // in that pattern's spacings, covering every member's De range
    std::vector<std::size_t> rows;   // the design rows it serves
};

std::vector<SharedSearch> shared_searches(const std::vector<Combination>& combos, const DesignResult& design,
                                          const SpacingBounds& bounds) {
    std::vector<SharedSearch> out;
    for (std::size_t k = 0; k < combos.size(); ++k) {
        auto same = std::find_if(out.begin(), out.end(), [&](const SharedSearch& g) {
            return design.rows[g.rows.front()].drain == design.rows[k].drain;
        });
        if (same == out.end()) same = out.insert(out.end(), SharedSearch{combos[k].cell, bounds, {}});
        same->rows.push_back(k);
        if (influence_diameter_factor(combos[k].cell.pattern) < influence_diameter_factor(same->cell.pattern))
            same->cell = combos[k].cell;
    }
    for (auto& g : out) {
        double largest = 0.0;
        for (const std::size_t k : g.rows) largest = std::max(largest, influence_diameter_factor(combos[k].cell.pattern));
        g.bounds.max_m = bounds.max_m * largest / influence_diameter_factor(g.cell.pattern);
    }
    return out;
}

// A pattern's limit (0: infeasible) from the shared search's result.
double member_limit(const SpacingLimit& shared, Pattern shared_pattern, Pattern pattern, const SpacingBounds& bounds) {
    if (!shared.feasible) return 0.0;
    const double s = pattern == shared_pattern
                         ? shared.spacing_m
                         : shared.spacing_m * influence_diameter_factor(shared_pattern) / influence_diameter_factor(pattern);
    if (s < bounds.min_m) return 0.0;
    return std::min(s, bounds.max_m);
}

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
// Counts the limits into equal bins over the feasible ones (limit > 0): linear passes, no sort.
void histogram(std::span<const double> limits, MonteCarloRow& row) {
    double low = std::numeric_limits<double>::infinity(), high = 0.0;
    std::size_t feasible = 0;
    for (const double x : limits)
        if (x > 0.0) {
            ++feasible;
            low = std::min(low, x);
            high = std::max(high, x);
        }
    row.infeasible_samples = limits.size() - feasible;
    if (feasible == 0) return;
    row.histogram_low_m = low;
    const double span = high - low;
    row.histogram_bin_m = span > 0.0 ? span / static_cast<double>(monte_carlo_histogram_bins) : 0.0;
    row.histogram_counts.assign(span > 0.0 ? monte_carlo_histogram_bins : 1, 0);
    for (const double x : limits) {
        if (!(x > 0.0)) continue;
        const auto bin = span > 0.0 ? static_cast<std::size_t>((x - low) / row.histogram_bin_m) : 0;
        ++row.histogram_counts[std::min(bin, row.histogram_counts.size() - 1)];
    }
}

// The k-th smallest limit (0-based): the value a full sort would put at index k, selected within
// [first, end), which must already hold exactly the values a sort would put there.
double order_statistic(std::span<double> limits, std::size_t first, std::size_t k) {
    const auto at = [&](std::size_t i) { return limits.begin() + static_cast<std::ptrdiff_t>(i); };
    std::nth_element(at(first), at(k), limits.end());
    return limits[k];
}
}  // namespace

MonteCarloResult monte_carlo(const Site& base_input, const DesignResult& base_result,
                             const MonteCarloSpec& spec, const Progress& progress) {
    if (spec.samples < 1) throw InputError("Monte Carlo samples", static_cast<double>(spec.samples), "at least 1");
    const double values = static_cast<double>(spec.samples) * static_cast<double>(base_result.rows.size());
    if (values > defaults::max_monte_carlo_values)
        throw InputError("Monte Carlo samples × design rows", values,
                         "at most " + format_value(defaults::max_monte_carlo_values) + " (" +
                             format_value(std::floor(defaults::max_monte_carlo_values /
                                                     static_cast<double>(std::max<std::size_t>(1, base_result.rows.size())))) +
                             " samples for " + std::to_string(base_result.rows.size()) + " rows)");
    // The closed form with a degree criterion samples through the fast searches (one instantaneous
    // load, or a load history with Hansbo's theory); every other site through its own cell models,
    // within the study's search budget.
    const bool fast = has_fast_search(base_input);
    // The superposed increments do not depend on the sampled inputs (compressibility is not sampled).
    const std::optional<LoadIncrements> loads =
        fast && base_input.loading
            ? std::optional<LoadIncrements>(load_increments(ultimate_settlement_function(base_input), base_input.load_history()))
            : std::nullopt;
    if (!fast && values > max_spacing_searches(base_input))
        throw InputError("Monte Carlo samples × design rows", values,
                         "at most " + format_value(max_spacing_searches(base_input)) +
                             " spacing searches for this site's method and loading (staged loading, the residual "
                             "criterion, the layered series (fewer the more series_terms) and the numerical cell "
                             "search on cell models): use fewer samples");
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
    const std::vector<SharedSearch> shared = fast ? shared_searches(combos, base_result, bounds) : std::vector<SharedSearch>{};
    // Every sample's limit for every row is written by the workers, so the buffers are left
    // uninitialised here: their pages are first touched by the workers in parallel rather than
    // zeroed serially (a million samples are 8 MB per row).
    std::vector<std::unique_ptr<double[]>> limit_rows;
    std::vector<std::span<double>> limits;
    for (std::size_t k = 0; k < combos.size(); ++k) {
        limit_rows.emplace_back(new double[n]);
        limits.emplace_back(limit_rows.back().get(), n);
    }
    // A sample the site's model could not evaluate (an input it refuses) is marked NaN: counted apart,
    // then taken as not meeting the criterion (limit 0).
    constexpr double unevaluated_mark = std::numeric_limits<double>::quiet_NaN();
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
        StagedSpacingSolver staged;
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
                                limits[k][i] = unevaluated_mark;
                            } catch (const EvaluationError&) {
                                limits[k][i] = unevaluated_mark;
                            }
                        }
                        continue;
                    }
                    for (const SharedSearch& g : shared) {
                        CellSpec cell = g.cell;
                        for (std::size_t j = 0; j < spec.inputs.size(); ++j)
                            apply(cell, g.cell, base, spec.inputs[j].input, u[j]);
                        SpacingLimit limit;
                        try {
                            if (loads) {
                                staged.reset(cell, g.bounds, *loads, base.criterion.deadline_s);
                                limit = staged.solve(target);
                            } else {
                                solver.reset(cell, g.bounds);
                                limit = solver.solve(target, base.criterion.deadline_s);
                            }
                        } catch (const InputError&) {
                            for (const std::size_t k : g.rows) limits[k][i] = unevaluated_mark;
                            continue;
                        } catch (const EvaluationError&) {
                            for (const std::size_t k : g.rows) limits[k][i] = unevaluated_mark;
                            continue;
                        }
                        for (const std::size_t k : g.rows)
                            limits[k][i] = member_limit(limit, g.cell.pattern, combos[k].cell.pattern, bounds);
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
    auto statistics = [&](std::size_t k) {
        const std::span<double> s = limits[k];
        MonteCarloRow row;
        row.drain = base_result.rows[k].drain;
        row.pattern = base_result.rows[k].pattern;
        row.spacing_m = combos[k].eval_spacing_m;
        for (double& x : s)
            if (std::isnan(x)) {
                ++row.unevaluated;
                x = 0.0;
            }
        // A sample meets the target at spacing x exactly when its own limit is at least x.
        const double threshold = row.spacing_m - 1e-12;
        const auto successes = static_cast<double>(std::count_if(s.begin(), s.end(), [&](double x) { return x >= threshold; }));
        row.probability = successes / static_cast<double>(n);
        row.probability_low = binomial_distribution<>::find_lower_bound_on_p(
            static_cast<double>(n), successes, alpha / 2, binomial_distribution<>::clopper_pearson_exact_interval);
        row.probability_high = binomial_distribution<>::find_upper_bound_on_p(
            static_cast<double>(n), successes, alpha / 2, binomial_distribution<>::clopper_pearson_exact_interval);
        histogram(s, row);
        row.feasible_fraction = static_cast<double>(n - row.infeasible_samples) / static_cast<double>(n);
        // The largest x with P(limit >= x) >= reliability: the (1 − reliability) quantile; the
        // median is then selected among the limits on its side of it.
        const auto index = std::min(static_cast<std::size_t>(std::floor((1.0 - spec.reliability) * static_cast<double>(n))), n - 1);
        const double quantile = order_statistic(s, 0, index);
        if (quantile > 0.0) {
            row.reliability_spacing_m = quantile;
            row.reliability_at_maximum = quantile >= bounds.max_m;
        }
        row.median_spacing_m = n / 2 == index ? quantile : n / 2 > index ? order_statistic(s, index + 1, n / 2)
                                                                          : order_statistic(s, 0, n / 2);
        return row;
    };
    // The rows' statistics are independent: one thread each, up to the thread count.
    result.rows.resize(combos.size());
    std::atomic<std::size_t> next_row{0};
    auto row_worker = [&] {
        for (std::size_t k = next_row++; k < combos.size(); k = next_row++) result.rows[k] = statistics(k);
    };
    pool.clear();
    for (unsigned t = 0; t < std::min<std::size_t>(threads, combos.size()); ++t) pool.emplace_back(row_worker);
    for (auto& t : pool) t.join();
    return result;
}

}  // namespace wickgrid
