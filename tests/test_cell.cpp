#include <gtest/gtest.h>

#include <boost/math/quadrature/gauss_kronrod.hpp>
#include <cmath>

#include "cell_fixture.hpp"
#include "wickgrid/combine.hpp"
#include "wickgrid/errors.hpp"
#include "wickgrid/search.hpp"

using namespace wickgrid;
using wickgrid::fixtures::typical_cell;

TEST(Carrillo, Combination) {
    // Carrillo (1942): 1 − U = (1 − Uv)(1 − Ur); Uv = 0.3, Ur = 0.8 → 0.86.
    EXPECT_NEAR(carrillo(0.3, 0.8), 0.86, 1e-15);
    EXPECT_EQ(carrillo(0.0, 0.0), 0.0);
    EXPECT_EQ(carrillo(1.0, 0.2), 1.0);
    EXPECT_EQ(carrillo(0.25, 0.65), carrillo(0.65, 0.25));
}

TEST(DepthAverage, MatchesAdaptiveQuadrature) {
    // Gauss–Legendre (20 nodes) against adaptive Gauss–Kronrod on the same mean of Ur(z).
    for (double th : {0.01, 0.1, 0.5, 1.0, 3.0})
        for (double mus : {1.5, 3.0, 6.0})
            for (double wl2 : {0.0, 0.1, 1.0, 5.0, 20.0}) {
                const double l = 10.0;
                const double w = wl2 / (l * l);
                auto f = [&](double z) { return -std::expm1(-8.0 * th / (mus + w * z * (2.0 * l - z))); };
                const double reference =
                    boost::math::quadrature::gauss_kronrod<double, 61>::integrate(f, 0.0, l, 20, 1e-15) / l;
                EXPECT_NEAR(degree_radial_depth_averaged(th, mus, w, l), reference, 1e-12)
                    << th << " " << mus << " " << wl2;
            }
}

TEST(DepthAverage, IsNotTheDegreeOfTheMeanMu) {
    // Averaging Ur(z) differs from Ur at the mean μ (Jensen): the former is larger.
    const double th = 0.5, mus = 3.0, w = 0.03, l = 10.0;
    const double averaged = degree_radial_depth_averaged(th, mus, w, l);
    const double of_mean = degree_radial_equal_strain(th, mu_depth_mean(mus, w, l));
    EXPECT_GT(averaged, of_mean + 1e-4);
}

TEST(UnitCell, ReducesToHandComposition) {
    // Ideal drain (no smear, no well resistance): Ur = 1 − exp(−8Th/(ln n − 0.75)), Uv Terzaghi,
    // combined by Carrillo — composed here by hand from the pieces.
    CellSpec spec = typical_cell(Pattern::square, 2.0);
    spec.drain.smear_diameter_m = spec.drain.equivalent_diameter_m;
    spec.drain.discharge_capacity_m3_per_s = INFINITY;
    const UnitCell cell(spec);
    const double t = units::days_to_seconds(120.0);
    const double de = 2.0 * std::sqrt(4.0 / 3.141592653589793);
    const double n = de / spec.drain.equivalent_diameter_m;
    const double th = spec.clay.ch_m2_per_s * t / (de * de);
    const double tv = spec.clay.cv_m2_per_s * t / (7.0 * 7.0);
    const double ur = 1.0 - std::exp(-8.0 * th / (std::log(n) - 0.75));
    const Degrees d = cell.at(t);
    EXPECT_NEAR(d.radial, ur, 1e-14);
    EXPECT_NEAR(d.vertical, degree_vertical(tv), 1e-15);
    EXPECT_NEAR(d.combined, carrillo(d.vertical, ur), 1e-14);
    EXPECT_NEAR(cell.n(), n, 1e-12);
}

TEST(UnitCell, EqualStrainIntegralTheoryCloseToHansbo) {
    CellSpec spec = typical_cell();
    const UnitCell hansbo(spec);
    spec.drain.theory = RadialTheory::equal_strain_integral;
    const UnitCell integral(spec);
    // Within Hansbo's simplification bound (κ·s² + ln n + 1)/n² (see test_radial).
    const double n = hansbo.n(), s = hansbo.s(), kappa = spec.drain.smear_permeability_ratio;
    EXPECT_NEAR(hansbo.mu_smear(), integral.mu_smear(), (kappa * s * s + std::log(n) + 1.0) / (n * n));
    const double t = units::days_to_seconds(100.0);
    EXPECT_NEAR(hansbo.at(t).combined, integral.at(t).combined, 0.01);
}

TEST(UnitCell, TwoOutletsHalveTheWellResistancePath) {
    CellSpec spec = typical_cell();
    const UnitCell one(spec);
    spec.drain.outlets = DrainOutlets::top_and_bottom;
    const UnitCell two(spec);
    EXPECT_DOUBLE_EQ(one.outlet_length_m(), 14.0);
    EXPECT_DOUBLE_EQ(two.outlet_length_m(), 7.0);
    const double t = units::days_to_seconds(90.0);
    EXPECT_GT(two.at(t).radial, one.at(t).radial);
    // Well term of the depth-mean μ: w·2l²/3 falls by four with l halved.
    const double well_one = one.mu_depth_mean() - one.mu_smear();
    const double well_two = two.mu_depth_mean() - two.mu_smear();
    EXPECT_NEAR(well_one / well_two, 4.0, 1e-12);
}

TEST(Search, TimeToDegreeRoundTrip) {
    for (double spacing : {1.0, 1.5, 2.5, 3.5}) {
        const UnitCell cell(typical_cell(Pattern::square, spacing));
        for (double target : {0.3, 0.6, 0.9, 0.95}) {
            const double t = time_to_degree_s(cell, target);
            EXPECT_NEAR(cell.at(t).combined, target, 1e-9);
            // Far below an hour: one second earlier the target is not yet reached.
            EXPECT_LT(cell.at(t - 1.0).combined, target);
        }
    }
}

TEST(Search, LargestSpacingRoundTrip) {
    const double deadline = units::days_to_seconds(180.0);
    for (Pattern p : {Pattern::triangular, Pattern::square})
        for (double target : {0.7, 0.8, 0.9}) {
            const CellSpec spec = typical_cell(p);
            const SpacingLimit limit = largest_spacing(spec, target, deadline, {0.5, 4.0});
            ASSERT_TRUE(limit.feasible);
            ASSERT_FALSE(limit.at_maximum);
            CellSpec at = spec;
            at.spacing_m = limit.spacing_m;
            EXPECT_NEAR(UnitCell(at).at(deadline).combined, target, 1e-9);
            // Far below a millimetre: 1 µm wider misses the target, 1 µm closer meets it.
            at.spacing_m = limit.spacing_m + 1e-6;
            EXPECT_LT(UnitCell(at).at(deadline).combined, target);
            at.spacing_m = limit.spacing_m - 1e-6;
            EXPECT_GT(UnitCell(at).at(deadline).combined, target);
            // Time to target at the limiting spacing is the deadline.
            at.spacing_m = limit.spacing_m;
            EXPECT_NEAR(time_to_degree_s(UnitCell(at), target), deadline, 60.0);
        }
}

TEST(Search, SquareSpacingIsTheTriangularTimesTheFactorRatio) {
    // Same influence diameter → same degree: s_square = s_tri·1.0501/1.1284 (geometry identity).
    const double deadline = units::days_to_seconds(180.0);
    const auto tri = largest_spacing(typical_cell(Pattern::triangular), 0.8, deadline, {0.5, 4.0});
    const auto sq = largest_spacing(typical_cell(Pattern::square), 0.8, deadline, {0.5, 4.0});
    ASSERT_TRUE(tri.feasible && sq.feasible && !tri.at_maximum && !sq.at_maximum);
    EXPECT_NEAR(sq.spacing_m,
                tri.spacing_m * influence_diameter_factor(Pattern::triangular) /
                    influence_diameter_factor(Pattern::square),
                1e-8);
}

TEST(Search, InfeasibleAndCappedCases) {
    const double short_deadline = units::days_to_seconds(5.0);
    const auto none = largest_spacing(typical_cell(), 0.9, short_deadline, {0.8, 4.0});
    EXPECT_FALSE(none.feasible);
    ASSERT_TRUE(none.degree_at_minimum);
    EXPECT_LT(*none.degree_at_minimum, 0.9);
    // The best the range reaches: the degree of the cell at the smallest spacing (the reference cell).
    EXPECT_NEAR(*none.degree_at_minimum,
                UnitCell(typical_cell(Pattern::triangular, 0.8), DepthAverageRule::Accuracy::reference).at(short_deadline).combined,
                1e-9);
    const auto capped = largest_spacing(typical_cell(), 0.5, units::days_to_seconds(3000.0), {0.8, 4.0});
    EXPECT_TRUE(capped.feasible);
    EXPECT_TRUE(capped.at_maximum);
    EXPECT_EQ(capped.spacing_m, 4.0);
}
