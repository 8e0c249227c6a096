#include <gtest/gtest.h>

#include <boost/math/constants/constants.hpp>
#include <cmath>

#include "checks/terzaghi_table.hpp"
#include "wickgrid/errors.hpp"
#include "wickgrid/vertical.hpp"

using namespace wickgrid;
using checks::terzaghi_u_tv;

namespace {
constexpr double pi = boost::math::double_constants::pi;
}

TEST(TerzaghiTable, InverseGivesPrintedTimeFactor) {
    for (const auto& row : terzaghi_u_tv)
        EXPECT_NEAR(time_factor_vertical(row.input), row.expected, row.tolerance)
            << row.source << " at U = " << row.input;
}

TEST(TerzaghiTable, ForwardGivesPrintedDegree) {
    // The printed Tv is rounded to 0.001; dU/dTv <= 1.8 on this range, so U within 0.002.
    for (const auto& row : terzaghi_u_tv)
        EXPECT_NEAR(degree_vertical(row.expected), row.input, 0.002)
            << row.source << " at Tv = " << row.expected;
}

TEST(TerzaghiTable, RoundTripThroughTable) {
    for (const auto& row : terzaghi_u_tv)
        EXPECT_NEAR(degree_vertical(time_factor_vertical(row.input)), row.input, 1e-12) << row.source;
}

TEST(TerzaghiApproximations, SmallDegreeParabola) {
    for (double u = 0.05; u <= 0.6 + 1e-12; u += 0.05)
        EXPECT_NEAR(time_factor_vertical(u), pi / 4.0 * u * u, 0.0037) << checks::approx_small << " U=" << u;
}

TEST(TerzaghiApproximations, LargeDegreeLogarithm) {
    for (double u = 0.6; u <= 0.99 + 1e-12; u += 0.01)
        EXPECT_NEAR(time_factor_vertical(u), 1.781 - 0.933 * std::log10(100.0 - 100.0 * u), 3.5e-4)
            << checks::approx_large << " U=" << u;
}

TEST(TerzaghiSeries, ShortTimeAndFourierAgreeWhereBothConverge) {
    // Two independent representations of the same solution (images vs eigenfunctions).
    for (double tv = 0.01; tv < 3.0; tv *= 1.13)
        EXPECT_NEAR(terzaghi::degree_short_time(tv), terzaghi::degree_fourier(tv), 1e-14) << tv;
}

TEST(TerzaghiSeries, AsymptotesAreExact) {
    // Small Tv: U = 2√(Tv/π) up to terms in exp(−1/Tv) (mathematical identity of the image series).
    for (double tv = 1e-12; tv < 0.02; tv *= 3.0)
        EXPECT_NEAR(degree_vertical(tv), 2.0 * std::sqrt(tv / pi), 1e-15) << tv;
    // Large Tv: the first Fourier term alone, 1 − (8/π²)exp(−π²Tv/4).
    for (double tv = 2.0; tv < 20.0; tv += 0.7)
        EXPECT_NEAR(degree_vertical(tv), 1.0 - 8.0 / (pi * pi) * std::exp(-pi * pi * tv / 4.0), 1e-16);
}

TEST(TerzaghiSeries, ContinuousAcrossTheSwitch) {
    const double below = degree_vertical(std::nextafter(0.2, 0.0));
    const double above = degree_vertical(0.2);
    EXPECT_NEAR(below, above, 1e-15);
    EXPECT_EQ(degree_vertical(0.0), 0.0);
}

TEST(TerzaghiInverse, RoundTripInTimeFactor) {
    for (double tv = 1e-8; tv < 2.5; tv *= 1.37) {
        const double u = degree_vertical(tv);
        EXPECT_NEAR(time_factor_vertical(u), tv, 1e-10 * std::max(1.0, tv)) << tv;
    }
}

TEST(TerzaghiInverse, RoundTripInDegree) {
    for (double u = 1e-6; u < 1.0; u = u < 0.99 ? u + 0.0137 : u + (1.0 - u) * 0.5) {
        EXPECT_NEAR(degree_vertical(time_factor_vertical(u)), u, 1e-12) << u;
        if (1.0 - u < 1e-12) break;
    }
}

TEST(DrainagePath, RuleOfFaces) {
    // Common practice: one drained face → d = H; two → d = H/2.
    EXPECT_DOUBLE_EQ(drainage_path_m(14.0, VerticalDrainage::both_faces), 7.0);
    EXPECT_DOUBLE_EQ(drainage_path_m(14.0, VerticalDrainage::top_only), 14.0);
    EXPECT_DOUBLE_EQ(drainage_path_m(14.0, VerticalDrainage::bottom_only), 14.0);
}

TEST(DrainagePath, TimeFactorDefinition) {
    // Tv = cv·t/d²: 1 m²/yr for one year over d = 2 m → 0.25.
    EXPECT_NEAR(time_factor(1.0 / 31557600.0, 31557600.0, 2.0), 0.25, 1e-15);
}

// Terzaghi's isochrone: its two forms agree where both converge, it is 0 at the drained face, and
// its depth mean is 1 − Uv (the average degree checked against Terzaghi's table above).
TEST(Isochrone, ImagesAndFourierAgreeAndAverageToTheDegree) {
    for (const double tv : {0.01, 0.03, 0.08, 0.2, 0.5})
        for (const double z : {0.0, 0.1, 0.37, 0.8, 1.0, 1.5, 2.0})
            EXPECT_NEAR(wickgrid::terzaghi::excess_images(z, tv), wickgrid::terzaghi::excess_fourier(z, tv), 1e-12)
                << tv << " " << z;
    for (const double tv : {0.002, 0.05, 0.3, 1.0}) {
        EXPECT_NEAR(wickgrid::excess_fraction_vertical(0.0, tv), 0.0, 1e-14);
        // Mean over 0 ≤ Z ≤ 1 by the midpoint rule on 4000 slices (error ~1e-8 for these Tv).
        double mean = 0.0;
        for (int i = 0; i < 4000; ++i) mean += wickgrid::excess_fraction_vertical((i + 0.5) / 4000.0, tv) / 4000.0;
        EXPECT_NEAR(mean, 1.0 - wickgrid::degree_vertical(tv), 1e-6) << tv;
    }
    EXPECT_THROW(wickgrid::excess_fraction_vertical(2.5, 0.1), wickgrid::InputError);
}
