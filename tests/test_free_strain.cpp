#include <gtest/gtest.h>

#include <algorithm>
#include <cmath>

#include "wickgrid/radial.hpp"

using namespace wickgrid;

TEST(BarronFreeStrain, ShortTimeExpansionMeetsSeries) {
    // Two independent solutions (Laplace short-time expansion, eigen-expansion) at the switch.
    for (double n : {4.0, 7.0, 10.0, 30.0, 100.0}) {
        const BarronFreeStrain cell(n);
        const double th = cell.short_time_limit();
        for (double f : {0.5, 1.0, 2.0}) {
            EXPECT_NEAR(cell.degree_series(th * f), cell.degree_short_time(th * f), 1e-9)
                << "n=" << n << " Th=" << th * f;
        }
    }
}

TEST(BarronFreeStrain, WeightsSumToOne) {
    // At Th = 0 the series is 1 − Σ C_k: the weights must represent the uniform initial pore pressure,
    // Σ C_k = 1, short only by the modes beyond the cached roots (a tail that shrinks as n grows).
    for (const double n : {4.0, 20.0, 60.0}) {
        const double sum = 1.0 - BarronFreeStrain(n).degree_series(0.0);
        EXPECT_NEAR(sum, 1.0, 1e-3) << n;
        EXPECT_LE(sum, 1.0) << n;  // every weight is positive: a truncated sum falls short, never over
    }
}

TEST(BarronFreeStrain, SeriesMeetsShortTimeExpansionAtTheSwitch) {
    const BarronFreeStrain cell(20.0);
    const double th = cell.short_time_limit();
    EXPECT_NEAR(cell.degree_series(th), cell.degree_short_time(th), 1e-9);
    EXPECT_GT(cell.degree(th), 0.0);
    EXPECT_LT(cell.degree(th), 1e-3);
}

TEST(BarronFreeStrain, MonotoneAndBounded) {
    for (double n : {4.0, 15.0, 60.0}) {
        const BarronFreeStrain cell(n);
        double previous = 0.0;
        EXPECT_EQ(cell.degree(0.0), 0.0);
        for (double th = 1e-9; th < 10.0; th *= 1.5) {
            const double u = cell.degree(th);
            EXPECT_GE(u, previous) << n << " " << th;
            EXPECT_LE(u, 1.0);  // rounds to 1 once 1 − Ur < 1e-16
            previous = u;
        }
    }
}

TEST(BarronFreeStrain, CloseToEqualStrainOnceHalfConsolidated) {
    // Barron (1948) found free and equal strain average degrees nearly equal. Measured here: for
    // n from 10 to 100 and Ur >= 0.6 the largest difference is below 0.01 (about 0.0083 at n = 10);
    // this bound is what the test holds.
    double worst = 0.0;
    for (double n : {10.0, 15.0, 20.0, 40.0, 70.0, 100.0}) {
        const BarronFreeStrain cell(n);
        const double mu = barron_F(n);
        for (double th = 1e-4; th < 5.0; th *= 1.05) {
            const double equal = degree_radial_equal_strain(th, mu);
            const double free = cell.degree(th);
            if (std::min(equal, free) < 0.6) continue;
            worst = std::max(worst, std::fabs(equal - free));
        }
    }
    EXPECT_LT(worst, 0.01);
    EXPECT_GT(worst, 0.0);
}

TEST(BarronFreeStrain, FirstEigenvalueMatchesEqualStrainRate) {
    // Late in consolidation both decay as one exponential; their rates agree to a few percent:
    // 4β₁² ≈ 8/F(n).
    for (double n : {10.0, 30.0, 100.0}) {
        const BarronFreeStrain cell(n);
        const double beta1 = cell.eigenvalues().front();
        EXPECT_NEAR(4.0 * beta1 * beta1 / (8.0 / barron_F(n)), 1.0, 0.05) << n;
    }
}
