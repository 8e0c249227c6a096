// Properties over random inputs (fixed seed): bounds, monotonicity, symmetry, roundtrips.
#include <gtest/gtest.h>

#include <random>

#include "cell_fixture.hpp"
#include "wickgrid/cell_model.hpp"
#include "wickgrid/combine.hpp"
#include "wickgrid/search.hpp"

using namespace wickgrid;

namespace {
struct RandomCells {
    std::mt19937_64 engine{20261201};
    double uniform(double a, double b) { return std::uniform_real_distribution<double>(a, b)(engine); }
    double log_uniform(double a, double b) { return std::exp(uniform(std::log(a), std::log(b))); }

    CellSpec next() {
        CellSpec spec = fixtures::typical_cell(uniform(0, 1) < 0.5 ? Pattern::triangular : Pattern::square,
                                              uniform(0.9, 3.5));
        spec.clay.thickness_m = uniform(4.0, 40.0);
        spec.drain.length_m = spec.clay.thickness_m;
        spec.clay.cv_m2_per_s = units::per_year_to_per_second(log_uniform(0.3, 10.0));
        spec.clay.ch_m2_per_s = units::per_year_to_per_second(log_uniform(0.3, 20.0));
        spec.clay.kh_m_per_s = log_uniform(1e-10, 1e-8);
        spec.clay.drainage = uniform(0, 1) < 0.5 ? VerticalDrainage::both_faces : VerticalDrainage::top_only;
        spec.drain.smear_diameter_m = spec.drain.equivalent_diameter_m * uniform(1.0, 5.0);
        spec.drain.smear_permeability_ratio = uniform(1.0, 8.0);
        spec.drain.discharge_capacity_m3_per_s = units::per_year_to_per_second(log_uniform(20.0, 2000.0));
        spec.drain.outlets = uniform(0, 1) < 0.5 ? DrainOutlets::top : DrainOutlets::top_and_bottom;
        return spec;
    }
};
}  // namespace

TEST(Properties, DegreeBoundedAndIncreasingInTime) {
    RandomCells random;
    for (int i = 0; i < 300; ++i) {
        const UnitCell cell(random.next());
        double previous = -1.0;
        for (double days = 0.0; days < 2000.0; days = days * 1.6 + 1.0) {
            const Degrees d = cell.at(units::days_to_seconds(days));
            ASSERT_GE(d.combined, 0.0);
            ASSERT_LE(d.combined, 1.0);
            ASSERT_GE(d.combined, std::max(d.vertical, d.radial));
            if (1.0 - d.combined < 1e-12) break;  // rounding, not physics, past this point
            ASSERT_LT(d.combined, 1.0);
            ASSERT_GT(d.combined, previous) << i << " " << days;
            previous = d.combined;
        }
    }
}

TEST(Properties, DegreeDecreasingInSpacing) {
    RandomCells random;
    for (int i = 0; i < 300; ++i) {
        CellSpec spec = random.next();
        const double t = units::days_to_seconds(random.uniform(10.0, 500.0));
        double previous = 2.0;
        for (double s = 1.0; s < 4.0; s += 0.25) {
            spec.spacing_m = s;
            const double u = UnitCell(spec).at(t).combined;
            ASSERT_LT(u, previous) << i << " " << s;
            previous = u;
        }
    }
}

TEST(Properties, CarrilloSymmetricAndBounded) {
    RandomCells random;
    for (int i = 0; i < 1000; ++i) {
        const double a = random.uniform(0, 1), b = random.uniform(0, 1);
        ASSERT_DOUBLE_EQ(carrillo(a, b), carrillo(b, a));
        ASSERT_GE(carrillo(a, b), std::max(a, b));
        ASSERT_LE(carrillo(a, b), 1.0);
    }
}

TEST(Properties, InverseProblemsRoundTrip) {
    RandomCells random;
    for (int i = 0; i < 100; ++i) {
        const CellSpec spec = random.next();
        const UnitCell cell(spec);
        const double target = random.uniform(0.5, 0.97);
        const double t = time_to_degree_s(cell, target);
        ASSERT_NEAR(cell.at(t).combined, target, 1e-9);
        const auto limit = largest_spacing(spec, target, t, {1.0, 4.0});
        if (spec.spacing_m > 1.0 && spec.spacing_m < 4.0) {
            ASSERT_TRUE(limit.feasible);
            ASSERT_NEAR(limit.spacing_m, spec.spacing_m, 1e-6) << i;
        }
    }
}

TEST(FastPaths, AgreeWithReferencePaths) {
    // The fast paths (adaptive depth rule, SpacingSolver) against the reference paths (20-node
    // panels, a UnitCell per trial): within 1e-9 in degree, as the performance work promises;
    // measured agreement is about 1e-14.
    RandomCells random;
    double worst_degree = 0.0;
    for (int i = 0; i < 200; ++i) {
        CellSpec spec = random.next();
        if (i % 4 == 0) spec.drain.discharge_capacity_m3_per_s = units::per_year_to_per_second(random.log_uniform(1.0, 10.0));
        const UnitCell fast(spec);
        const UnitCell reference(spec, DepthAverageRule::Accuracy::reference);
        const SpacingSolver solver(spec, {0.9, 4.0});
        for (double days : {1.0, 10.0, 60.0, 200.0, 900.0}) {
            const double t = units::days_to_seconds(days);
            worst_degree = std::max(worst_degree, std::fabs(fast.at(t).combined - reference.at(t).combined));
            worst_degree = std::max(worst_degree, std::fabs(solver.degree(spec.spacing_m, t) - reference.at(t).combined));
        }
        const double target = random.uniform(0.6, 0.95), deadline = units::days_to_seconds(random.uniform(60, 400));
        const auto a = largest_spacing(spec, target, deadline, {0.9, 4.0});
        const auto b = largest_spacing_reference(spec, target, deadline, {0.9, 4.0});
        ASSERT_EQ(a.feasible, b.feasible);
        ASSERT_EQ(a.at_maximum, b.at_maximum);
        if (a.feasible && !a.at_maximum) {
            EXPECT_NEAR(a.spacing_m, b.spacing_m, 1e-9) << i;
            CellSpec at = spec;
            at.spacing_m = a.spacing_m;
            EXPECT_NEAR(UnitCell(at, DepthAverageRule::Accuracy::reference).at(deadline).combined, target, 1e-9);
        }
    }
    EXPECT_LT(worst_degree, 1e-9);
}

TEST(FastPaths, DepthRuleAgainstReferenceAtExtremes) {
    // From no well resistance to well resistance a thousand times the smear term.
    for (double ratio : {1e-3, 1e-2, 0.1, 0.5, 1.0, 2.0, 5.0, 10.0, 100.0, 1e4})
        for (double th : {1e-4, 0.01, 0.1, 0.5, 1.0, 3.0, 6.0}) {
            const double mus = 3.0, l = 10.0, w = mus / (ratio * l * l);
            const DepthAverageRule fast(mus, w, l), reference(mus, w, l, DepthAverageRule::Accuracy::reference);
            EXPECT_NEAR(fast.degree(th), reference.degree(th), 1e-13) << ratio << " " << th;
            EXPECT_LE(fast.nodes(), reference.nodes());
        }
}

TEST(FastPaths, StagedSearchAgreesWithTheCellModels) {
    // StagedSpacingSolver (fixed Gauss–Legendre nodes per ramp, Newton in ln De) against the cell
    // models' search (adaptive Gauss–Kronrod ramps, TOMS 748 to 1e-7 m): random clays, three lifts
    // with and without a surcharge removed before or after the deadline.
    RandomCells random;
    double worst_degree = 0.0;
    int interior = 0;
    for (int i = 0; i < 60; ++i) {
        const CellSpec cell = random.next();
        Site site = fixtures::typical_design(random.uniform(120.0, 500.0));
        site.ground.thickness_m = site.installation.drain_length_m = cell.clay.thickness_m;
        site.ground.cv_m2_per_s = cell.clay.cv_m2_per_s;
        site.ground.ch_m2_per_s = cell.clay.ch_m2_per_s;
        site.ground.drainage = cell.clay.drainage;
        site.installation.outlets = cell.drain.outlets;
        site.installation.smear_permeability_ratio = cell.drain.smear_permeability_ratio;
        site.products[0].discharge_capacity_m3_per_s = cell.drain.discharge_capacity_m3_per_s;
        site.criterion = {DegreeTarget{i % 10 == 0 ? 0.999 : random.uniform(0.6, 0.97)}, site.criterion.deadline_s};
        LoadHistory loads;
        double t = 0.0;
        for (int k = 0; k < 3; ++k) {
            const double start = t + units::days_to_seconds(random.uniform(0.0, 30.0));
            // A step, short ramps, and now and then a ramp over most of the time to the deadline.
            const double ramp_days = k == 1 ? 0.0 : i % 5 == 0 && k == 2 ? random.uniform(80.0, 110.0) : random.uniform(1.0, 40.0);
            const double end = start + units::days_to_seconds(ramp_days);
            loads.stages.push_back({start, end, random.uniform(10.0, 40.0)});
            t = end;
        }
        if (i % 3 != 0) {
            const double start = t + units::days_to_seconds(random.uniform(0.0, 20.0));
            const double end = start + units::days_to_seconds(random.uniform(5.0, 30.0));
            loads.surcharge = Surcharge{start, end, end + units::days_to_seconds(random.uniform(20.0, 300.0)),
                                        random.uniform(10.0, 40.0)};
        }
        site.loading = loads;
        for (const Pattern pattern : site.range.patterns) {
            SCOPED_TRACE("site " + std::to_string(i) + " " + std::string(to_string(pattern)));
            const auto fast = spacing_limit(site, site.products[0], pattern);
            const auto reference = spacing_limit_reference(site, site.products[0], pattern);
            ASSERT_EQ(fast.feasible, reference.feasible);
            ASSERT_EQ(fast.at_maximum, reference.at_maximum);
            if (!fast.feasible || fast.at_maximum) continue;
            ++interior;
            EXPECT_NEAR(fast.spacing_m, reference.spacing_m, 2 * defaults::spacing_tolerance_m);
            // At the fast root the reference model meets the target to 1e-9 in degree, and the
            // solver's own degree equals the model's near the root.
            StagedSpacingSolver solver;
            solver.reset(closed_form_cell(site, site.products[0], pattern, site.range.bounds.min_m), site.range.bounds,
                         load_increments(ultimate_settlement_function(site), site.load_history()),
                         site.criterion.deadline_s);
            for (const double s : {fast.spacing_m, 0.97 * fast.spacing_m, 1.03 * fast.spacing_m}) {
                if (s < site.range.bounds.min_m || s > site.range.bounds.max_m) continue;
                const double model = make_cell_model(site, site.products[0], pattern, s)->degree(site.criterion.deadline_s);
                worst_degree = std::max(worst_degree, std::fabs(solver.degree(s) - model));
                if (s == fast.spacing_m) {
                    EXPECT_NEAR(model, site.criterion.degree()->degree, 1e-9);
                }
            }
        }
    }
    EXPECT_LT(worst_degree, 1e-9);
    EXPECT_GT(interior, 40);  // most searches end inside the range, so the comparison has teeth
}
