// Studies: tornado and grid equal direct design runs; Monte Carlo exact in degenerate cases,
// consistent with quadrature of the same probability, reproducible, thread-count independent.
#include <gtest/gtest.h>

#include <boost/math/distributions/lognormal.hpp>
#include <boost/math/quadrature/gauss_kronrod.hpp>
#include <boost/math/tools/toms748_solve.hpp>

#include "cell_fixture.hpp"
#include "wickgrid/errors.hpp"
#include "wickgrid/studies.hpp"

using namespace wickgrid;

namespace {
Site typical_design() { return fixtures::typical_design(); }

const DesignRow& row_of(const DesignResult& r, Pattern p) {
    for (const auto& row : r.rows)
        if (row.pattern == p) return row;
    throw std::logic_error("no row");
}
}  // namespace

TEST(Studies, TornadoEqualsDirectDesignRuns) {
    const Site base = typical_design();
    const DesignResult result = run_design(base);
    const std::vector<TornadoInput> inputs{
        {StudyInput::ch, units::per_year_to_per_second(1.5), units::per_year_to_per_second(4.0)},
        {StudyInput::smear_permeability_ratio, 1.5, 5.0},
        {StudyInput::discharge_capacity, units::per_year_to_per_second(30.0), units::per_year_to_per_second(500.0)},
    };
    const auto rows = tornado_study(base, result, inputs);
    ASSERT_EQ(rows.size(), 6u);
    for (const auto& t : rows) {
        const DesignResult low = run_design(with_input(base, t.input, t.low_si));
        const DesignResult high = run_design(with_input(base, t.input, t.high_si));
        EXPECT_EQ(row_of(low, t.pattern).spacing_limit_m, t.at_low.spacing_m);
        EXPECT_EQ(row_of(high, t.pattern).spacing_limit_m, t.at_high.spacing_m);
    }
    // Sorted by swing within each pattern; ch moves kh too (kh derived from mv).
    EXPECT_GE(*rows[0].swing_m, *rows[1].swing_m);
    EXPECT_GE(*rows[1].swing_m, *rows[2].swing_m);
    const Site fast = with_input(base, StudyInput::ch, units::per_year_to_per_second(4.0));
    EXPECT_NEAR(fast.ground.uniform_clay().kh_m_per_s, units::per_year_to_per_second(4.0) * 0.0008 * 9.81, 1e-20);
}

TEST(Studies, GridEqualsDirectDesignRuns) {
    const Site base = typical_design();
    const GridAxis x{StudyInput::smear_permeability_ratio, 1.0, 6.0, 4};
    const GridAxis y{StudyInput::smear_diameter_ratio, 1.5, 4.0, 3};
    const auto cells = grid_study(base, x, y);
    ASSERT_EQ(cells.size(), 2u * 4u * 3u);
    for (const auto& c : cells) {
        const DesignResult direct = run_design(with_input(with_input(base, x.input, c.x_si), y.input, c.y_si));
        EXPECT_EQ(row_of(direct, c.pattern).spacing_limit_m, c.limit.spacing_m);
    }
    EXPECT_THROW(grid_study(base, x, x), InputError);
}

TEST(MonteCarlo, DegenerateDistributionsGiveExactlyZeroOrOne) {
    const Site base = typical_design();
    const DesignResult result = run_design(base);
    MonteCarloSpec spec;
    spec.samples = 3000;
    spec.inputs = {{StudyInput::ch, {DistributionKind::normal, *base.ground.ch_m2_per_s, 0.0}},
                   {StudyInput::smear_permeability_ratio, {DistributionKind::uniform, 3.0, 3.0}},
                   {StudyInput::smear_diameter_ratio, {DistributionKind::triangular, 2.0, 2.0, 2.0}}};
    const double limit = row_of(result, Pattern::triangular).spacing_limit_m;
    spec.spacing_m = limit - 0.01;
    const auto below = monte_carlo(base, result, spec);
    spec.spacing_m = limit + 0.01;
    const auto above = monte_carlo(base, result, spec);
    EXPECT_EQ(below.rows[0].probability, 1.0);
    EXPECT_EQ(above.rows[0].probability, 0.0);
    EXPECT_EQ(above.rows[0].probability_low, 0.0);
    EXPECT_GT(above.rows[0].probability_high, 0.0);  // Clopper–Pearson: 1 − (α/2)^{1/n}
    EXPECT_NEAR(above.rows[0].probability_high, 1.0 - std::pow(0.025, 1.0 / 3000.0), 1e-12);
    EXPECT_NEAR(*below.rows[0].reliability_spacing_m, limit, 1e-12);
}

TEST(MonteCarlo, OneSearchPerProductGivesEachPatternItsOwnLimit) {
    // The closed form samples one search in the influence diameter per product and reads each
    // pattern's limit off it. With constant inputs every sample's limit is the design's own
    // (a separate search per pattern): interior, capped at the maximum, and infeasible.
    Site base = typical_design();
    base.products.push_back({"wide-qw", base.products[0].equivalent_diameter_m,
                             4.0 * base.products[0].discharge_capacity_m3_per_s, 1.3});
    const DesignResult free = run_design(base);
    const double tri = row_of(free, Pattern::triangular).spacing_limit_m, sq = row_of(free, Pattern::square).spacing_limit_m;
    ASSERT_LT(sq, tri);
    MonteCarloSpec spec;
    spec.samples = 64;
    spec.inputs = {{StudyInput::ch, {DistributionKind::normal, *base.ground.ch_m2_per_s, 0.0}}};
    for (const SpacingBounds bounds : {base.range.bounds, SpacingBounds{base.range.bounds.min_m, 0.5 * (sq + tri)},
                                       SpacingBounds{0.5 * (sq + tri), base.range.bounds.max_m}}) {
        Site site = base;
        site.range.bounds = bounds;
        const DesignResult design = run_design(site);
        const MonteCarloResult mc = monte_carlo(site, design, spec);
        ASSERT_EQ(mc.rows.size(), design.rows.size());
        for (std::size_t k = 0; k < design.rows.size(); ++k) {
            const DesignRow& row = design.rows[k];
            SCOPED_TRACE(row.drain + " " + std::string(to_string(row.pattern)) + " max " + std::to_string(bounds.max_m));
            if (!row.feasible) {
                EXPECT_FALSE(mc.rows[k].reliability_spacing_m);
                EXPECT_EQ(mc.rows[k].feasible_fraction, 0.0);
                continue;
            }
            ASSERT_TRUE(mc.rows[k].reliability_spacing_m);
            EXPECT_NEAR(*mc.rows[k].reliability_spacing_m, row.spacing_limit_m, 1e-9);
            EXPECT_NEAR(mc.rows[k].median_spacing_m, row.spacing_limit_m, 1e-9);
            EXPECT_EQ(mc.rows[k].reliability_at_maximum, row.limited_by_maximum);
        }
    }
}

TEST(MonteCarlo, MatchesQuadratureOfTheSameProbability) {
    // Only ch is uncertain (lognormal): P(target at spacing s) = P(ch >= ch*), ch* the value at
    // which spacing s just reaches the target. Evaluated by Gauss–Kronrod quadrature of the pdf.
    const Site base = typical_design();
    const DesignResult result = run_design(base);
    const double mean = *base.ground.ch_m2_per_s, sd = 0.3 * mean;
    MonteCarloSpec spec;
    spec.samples = 40000;
    spec.seed = 11;
    spec.inputs = {{StudyInput::ch, {DistributionKind::lognormal, mean, sd}}};
    spec.spacing_m = row_of(result, Pattern::square).spacing_m;
    const auto mc = monte_carlo(base, result, spec);
    const auto& row = mc.rows[1];
    ASSERT_EQ(row.pattern, Pattern::square);
    const auto degree_at_ch = [&](double ch) {
        const Site varied = with_input(base, StudyInput::ch, ch);
        return UnitCell(closed_form_cell(varied, varied.products[0], Pattern::square, *spec.spacing_m))
                   .at(base.criterion.deadline_s)
                   .combined -
               base.criterion.degree()->degree;
    };
    std::uintmax_t iterations = 200;
    const auto root = boost::math::tools::toms748_solve(degree_at_ch, 0.2 * mean, 5.0 * mean,
                                                        boost::math::tools::eps_tolerance<double>(50), iterations);
    const double ch_star = 0.5 * (root.first + root.second);
    const double sigma2 = std::log1p(sd * sd / (mean * mean));
    const boost::math::lognormal dist(std::log(mean) - 0.5 * sigma2, std::sqrt(sigma2));
    const double exact = boost::math::quadrature::gauss_kronrod<double, 61>::integrate(
        [&](double ch) { return boost::math::pdf(dist, ch); }, ch_star, 20.0 * mean, 15, 1e-12);
    EXPECT_NEAR(exact, 1.0 - boost::math::cdf(dist, ch_star), 1e-9);
    EXPECT_GE(exact, row.probability_low);
    EXPECT_LE(exact, row.probability_high);
    EXPECT_LT(row.probability_high - row.probability_low, 0.02);
    // The histogram holds every sample, and the bins wholly above the design spacing hold no more
    // than the probability, those from its bin up no less.
    std::size_t counted = row.infeasible_samples, above = 0, from_bin = 0;
    for (std::size_t b = 0; b < row.histogram_counts.size(); ++b) {
        counted += row.histogram_counts[b];
        const double lo = row.histogram_low_m + static_cast<double>(b) * row.histogram_bin_m;
        if (lo >= *spec.spacing_m) above += row.histogram_counts[b];
        if (lo + row.histogram_bin_m >= *spec.spacing_m) from_bin += row.histogram_counts[b];
    }
    EXPECT_EQ(counted, spec.samples);
    EXPECT_EQ(row.histogram_counts.size(), monte_carlo_histogram_bins);
    EXPECT_LE(static_cast<double>(above) / spec.samples, row.probability);
    EXPECT_GE(static_cast<double>(from_bin) / spec.samples, row.probability);
}

TEST(MonteCarlo, ReproducibleAndIndependentOfThreads) {
    const Site base = typical_design();
    const DesignResult result = run_design(base);
    MonteCarloSpec spec;
    spec.samples = 5000;
    spec.seed = 42;
    spec.ch_cv_correlation = 0.7;
    spec.inputs = {{StudyInput::ch, {DistributionKind::lognormal, *base.ground.ch_m2_per_s, 0.3 * *base.ground.ch_m2_per_s}},
                   {StudyInput::cv, {DistributionKind::lognormal, *base.ground.cv_m2_per_s, 0.3 * *base.ground.cv_m2_per_s}},
                   {StudyInput::discharge_capacity,
                    {DistributionKind::uniform, units::per_year_to_per_second(50), units::per_year_to_per_second(300)}}};
    spec.threads = 1;
    const auto one = monte_carlo(base, result, spec);
    spec.threads = 2;
    const auto two = monte_carlo(base, result, spec);
    spec.seed = 43;
    const auto other = monte_carlo(base, result, spec);
    for (std::size_t k = 0; k < one.rows.size(); ++k) {
        EXPECT_EQ(one.rows[k].probability, two.rows[k].probability);
        EXPECT_EQ(one.rows[k].reliability_spacing_m, two.rows[k].reliability_spacing_m);
        EXPECT_NE(one.rows[k].median_spacing_m, other.rows[k].median_spacing_m);
    }
    // Progress: the total is the sample count, done never goes back, and the last report is complete.
    std::vector<std::pair<std::size_t, std::size_t>> calls;
    monte_carlo(base, result, spec, [&](std::size_t done, std::size_t total) { calls.emplace_back(done, total); });
    ASSERT_FALSE(calls.empty());
    for (std::size_t i = 0; i < calls.size(); ++i) {
        EXPECT_EQ(calls[i].second, spec.samples);
        if (i) {
            EXPECT_GE(calls[i].first, calls[i - 1].first);
        }
    }
    EXPECT_EQ(calls.back().first, spec.samples);
}

TEST(Studies, DischargeCapacityFactorKeepsProductsApart) {
    Site base = typical_design();
    DrainProductSpec wide = base.products[0];
    wide.name = "band-100x6";
    wide.discharge_capacity_m3_per_s *= 4.0;
    base.products.push_back(wide);
    const Site varied = with_input(base, StudyInput::discharge_capacity_factor, 0.5);
    EXPECT_DOUBLE_EQ(varied.products[0].discharge_capacity_m3_per_s, 0.5 * base.products[0].discharge_capacity_m3_per_s);
    EXPECT_DOUBLE_EQ(varied.products[1].discharge_capacity_m3_per_s, 0.5 * base.products[1].discharge_capacity_m3_per_s);
    // One absolute qw for several products would erase their difference: refused by name.
    try {
        with_input(base, StudyInput::discharge_capacity, units::per_year_to_per_second(100.0));
        FAIL();
    } catch (const InputError& e) {
        EXPECT_NE(std::string(e.what()).find("discharge_capacity_factor"), std::string::npos) << e.what();
    }
}

TEST(Studies, TornadoEndWithoutFeasibleSpacingHasNoSwing) {
    // A deadline so short that the low ch leaves no feasible spacing (invented values).
    const Site base = fixtures::typical_design(60.0);
    const DesignResult result = run_design(base);
    const auto rows = tornado_study(base, result,
                                    {{StudyInput::ch, units::per_year_to_per_second(0.5), units::per_year_to_per_second(8.0)},
                                     {StudyInput::smear_permeability_ratio, 2.0, 4.0}});
    bool seen = false;
    for (const auto& t : rows)
        if (t.input == StudyInput::ch) {
            ASSERT_FALSE(t.at_low.feasible);
            ASSERT_TRUE(t.at_high.feasible);
            EXPECT_FALSE(t.swing_m.has_value());
            seen = true;
        }
    EXPECT_TRUE(seen);
    EXPECT_EQ(rows.front().input, StudyInput::ch);  // an infeasible end comes first
}

TEST(MonteCarlo, BadDistributionsAreNamed) {
    EXPECT_THROW(validate_distribution({DistributionKind::normal, 1.0, -0.1}, "ch"), InputError);
    EXPECT_THROW(validate_distribution({DistributionKind::uniform, 2.0, 1.0}, "ch"), InputError);
    EXPECT_THROW(validate_distribution({DistributionKind::triangular, 1.0, 3.0, 2.0}, "ch"), InputError);
    EXPECT_THROW(validate_distribution({DistributionKind::lognormal, -1.0, 0.1}, "ch"), InputError);
    try {
        TruncatedDistribution({DistributionKind::uniform, -3.0, -1.0}, {1e-300, INFINITY}, "ch_m2_per_year");
        FAIL();
    } catch (const InputError& e) {
        EXPECT_EQ(std::string(e.quantity()).rfind("ch_m2_per_year", 0), 0u);
    }
    // Truncation to the physical range is exact: a normal N(1, 1) cut at 1 is a half-normal, whose
    // median is 1 + 0.6745 (the normal quartile, Φ⁻¹(0.75)).
    const TruncatedDistribution t({DistributionKind::normal, 1.0, 1.0}, {1.0, INFINITY}, "kh/ks");
    EXPECT_NEAR(t.quantile(0.5), 1.0 + 0.6744897501960817, 1e-12);
    EXPECT_GE(t.quantile(1e-9), 1.0);
}

TEST(MonteCarlo, SamplesTheFastSearchRefusesAreCounted) {
    // A discharge capacity so small that the well resistance is out of all proportion to the smear
    // term is refused by the depth rule: such samples are counted as unevaluated and taken as not
    // meeting the target, the others still searched; the same with one thread or two.
    const Site base = typical_design();
    const DesignResult result = run_design(base);
    MonteCarloSpec spec;
    spec.samples = 2000;
    spec.inputs = {{StudyInput::discharge_capacity, {DistributionKind::uniform, 1e-13, 1.5e-11}}};
    spec.threads = 1;
    const auto one = monte_carlo(base, result, spec);
    spec.threads = 2;
    const auto two = monte_carlo(base, result, spec);
    for (std::size_t k = 0; k < one.rows.size(); ++k) {
        EXPECT_GT(one.rows[k].unevaluated, spec.samples / 4);
        EXPECT_LT(one.rows[k].unevaluated, 3 * spec.samples / 4);
        EXPECT_EQ(one.rows[k].unevaluated, two.rows[k].unevaluated);
        EXPECT_LE(one.rows[k].probability, 1.0 - static_cast<double>(one.rows[k].unevaluated) / spec.samples);
        EXPECT_EQ(one.rows[k].infeasible_samples, two.rows[k].infeasible_samples);
        EXPECT_GE(one.rows[k].infeasible_samples, one.rows[k].unevaluated);
    }
}
