#pragma once
// Sensitivity and uncertainty studies on a design: one-at-a-time (tornado), two-input grids and
// Monte Carlo with reliability-based spacing. Pure computation; progress is reported through a
// callback so the caller decides how to show it.
#include <cstdint>
#include <functional>
#include <optional>
#include <string>
#include <string_view>
#include <vector>

#include "wickgrid/design.hpp"

namespace wickgrid {

// Inputs a study may vary. Values are SI (m²/s, m³/s, m/s, ratios).
enum class StudyInput {
    ch,                        // horizontal coefficient of consolidation; kh follows when derived from mv
    cv,                        // vertical coefficient of consolidation
    kh,                        // horizontal permeability (replaces the derived value)
    smear_diameter_ratio,      // ds/dm
    smear_permeability_ratio,  // kh/ks
    discharge_capacity,        // qw of the drain product (a site with one product only)
    discharge_capacity_factor, // a factor on each product's own qw (keeps the products apart)
    ch_factor,                 // a factor on the ch of every layer and of the clay (keeps the layers apart)
    cv_factor,                 // a factor on the cv of every layer and of the clay
};

std::string_view to_string(StudyInput input);  // the scenario key, e.g. "ch_m2_per_year"

// The scenario value of an input in the scenario's units (m²/year, m³/year ...) from SI and back.
double study_value_from_si(StudyInput input, double si);
double study_value_to_si(StudyInput input, double scenario_value);

// A copy of the site with one input set (SI value). Throws InputError for discharge_capacity on a
// site with several products (one value would override them all: vary the factor instead).
Site with_input(const Site& base, StudyInput input, double value_si);

// Physical range an input may take in this design (SI): used to check study values and to
// truncate distributions. Lower bound inclusive, upper exclusive.
struct InputRange {
    double low;
    double high;
};
InputRange physical_range(const Site& base, StudyInput input);

struct TornadoInput {
    StudyInput input;
    double low_si;
    double high_si;
};

struct TornadoRow {
    std::string drain;
    Pattern pattern = Pattern::triangular;
    StudyInput input = StudyInput::ch;
    double low_si = 0.0, high_si = 0.0;
    SpacingLimit at_low, at_high;          // required spacing with the input low / high
    // The criterion's own measure at the base chosen spacing and the deadline: the degree (degree
    // criterion) or the residual settlement in m (residual-settlement criterion).
    CriterionKind measure = CriterionKind::degree;
    double measure_low = 0.0, measure_high = 0.0;
    // |spacing at high − spacing at low|; none when either end has no feasible spacing.
    std::optional<double> swing_m;
};

// Rows for every product × pattern × input, within each product × pattern the inputs with an
// infeasible end first, then by swing (largest first); products and patterns in design order.
std::vector<TornadoRow> tornado_study(const Site& base, const DesignResult& base_result,
                                      const std::vector<TornadoInput>& inputs);

struct GridAxis {
    StudyInput input = StudyInput::smear_permeability_ratio;
    double from_si = 1.0;
    double to_si = 6.0;
    int steps = defaults::grid_steps;  // >= 2 values from..to inclusive
    std::vector<double> values() const;
};

struct GridCell {
    std::string drain;
    Pattern pattern = Pattern::triangular;
    double x_si = 0.0, y_si = 0.0;
    SpacingLimit limit;
};

std::vector<GridCell> grid_study(const Site& base, const GridAxis& x, const GridAxis& y);

enum class DistributionKind { normal, lognormal, uniform, triangular };
std::string_view to_string(DistributionKind kind);

// normal: a = mean, b = sd; lognormal: a = mean, b = sd (of the variable itself);
// uniform: a = low, b = high; triangular: a = low, b = mode, c = high. SI values.
// Zero width (sd = 0, low = high) is a constant.
struct Distribution {
    DistributionKind kind = DistributionKind::normal;
    double a = 0.0, b = 0.0, c = 0.0;
};

// Checks the parameters (named errors for negative sd, low > high, mode outside ...).
void validate_distribution(const Distribution& d, std::string_view what);

// Quantile of the distribution truncated to [range.low, range.high) at probability p in (0, 1).
// Throws InputError when the distribution has (almost) no mass in that range.
class TruncatedDistribution {
public:
    TruncatedDistribution(const Distribution& d, InputRange range, std::string_view what);
    double quantile(double p) const;
    double cdf(double x) const;  // of the truncated distribution
    bool constant() const noexcept { return constant_; }

private:
    Distribution d_;
    bool constant_ = false;
    double p_low_ = 0.0, p_high_ = 1.0;
    double log_location_ = 0.0, log_scale_ = 0.0;  // lognormal: mean and sd of ln x
};

struct UncertainInput {
    StudyInput input;
    Distribution distribution;
};

struct MonteCarloSpec {
    std::vector<UncertainInput> inputs;
    double ch_cv_correlation = 0.0;  // Gaussian copula correlation between ch and cv
    std::size_t samples = 10000;
    std::uint64_t seed = 1;
    unsigned threads = 0;  // 0: all hardware threads
    double reliability = defaults::monte_carlo_reliability;
    double confidence = defaults::monte_carlo_confidence;
    std::optional<double> spacing_m;  // evaluate here; default: each design's chosen spacing
};

struct MonteCarloRow {
    std::string drain;
    Pattern pattern = Pattern::triangular;
    double spacing_m = 0.0;  // where the probability was evaluated
    double probability = 0.0;
    double probability_low = 0.0, probability_high = 0.0;  // Clopper–Pearson interval
    std::optional<double> reliability_spacing_m;  // none when fewer than `reliability` samples are feasible
    bool reliability_at_maximum = false;          // the quantile sits at the largest spacing allowed
    double feasible_fraction = 0.0;               // samples that meet the target at the minimum spacing
    double median_spacing_m = 0.0;
    std::size_t unevaluated = 0;  // samples the site's model refused (counted as not meeting the criterion)
    // Histogram of the samples' limiting spacings: equal bins from the smallest to the largest
    // feasible limit; samples with no feasible spacing are counted apart.
    double histogram_low_m = 0.0;
    double histogram_bin_m = 0.0;
    std::vector<std::size_t> histogram_counts;
    std::size_t infeasible_samples = 0;
};

inline constexpr std::size_t monte_carlo_histogram_bins = 24;

struct MonteCarloResult {
    std::size_t samples = 0;
    std::uint64_t seed = 0;
    unsigned threads = 1;
    std::vector<MonteCarloRow> rows;
};

using Progress = std::function<void(std::size_t done, std::size_t total)>;

// Draws the uncertain inputs per sample and runs a full largest-spacing search for every product
// and pattern: the closed form's exact fast search for a degree criterion under one instantaneous
// load, otherwise the site's own cell models (staged loading, the residual criterion, the numerical
// cell) within max_spacing_searches(site) searches in all (InputError beyond). A sample the model
// refuses is counted in `unevaluated` and taken as not meeting the criterion. Samples are drawn in fixed chunks seeded from (seed, chunk), so results do not
// depend on the number of threads.
MonteCarloResult monte_carlo(const Site& base, const DesignResult& base_result, const MonteCarloSpec& spec,
                             const Progress& progress = {});

}  // namespace wickgrid
