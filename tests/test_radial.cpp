#include <gtest/gtest.h>

#include <cmath>
#include <vector>

#include "wickgrid/errors.hpp"
#include "wickgrid/radial.hpp"

using namespace wickgrid;

namespace {
// The two-zone equal-strain integral done by hand (test-side derivation, not engine code):
// μ = [κ·G(1, s) + G(s, n)] / (n²(n² − 1)),  G(a, b) = n⁴ ln(b/a) − n²(b² − a²) + (b⁴ − a⁴)/4.
double two_zone_exact(double n, double s, double kappa) {
    const double n2 = n * n;
    auto g = [n2](double a, double b) {
        return n2 * n2 * std::log(b / a) - n2 * (b * b - a * a) + (b * b * b * b - a * a * a * a) / 4.0;
    };
    return (kappa * g(1.0, s) + g(s, n)) / (n2 * (n2 - 1.0));
}
}  // namespace

TEST(BarronF, HandCalculation) {
    // F(20) = 400/399·ln 20 − 1199/1600 = 2.253865 (hand calculation of Barron 1948).
    EXPECT_NEAR(barron_F(20.0), 2.253865, 1e-6);
    // F(5) = 25/24·ln 5 − 74/100 = 0.936498.
    EXPECT_NEAR(barron_F(5.0), 0.936498, 1e-6);
}

TEST(BarronF, LargeNApproachesLogForm) {
    // Hansbo (1981) simplification F(n) ≈ ln n − 0.75 for large n; the difference is
    // ln n/(n² − 1) + 1/(4n²) (expand the exact form).
    for (double n : {10.0, 20.0, 50.0, 100.0}) {
        const double bound = std::log(n) / (n * n - 1.0) + 0.25 / (n * n) + 1e-12;
        EXPECT_NEAR(barron_F(n), std::log(n) - 0.75, bound) << n;
    }
}

TEST(HansboMu, HandCalculation) {
    // n = 20, s = 2, kh/ks = 3: ln 10 + 3 ln 2 − 0.75 = 3.632027 (Hansbo 1981 formula by hand).
    EXPECT_NEAR(hansbo_mu_smear(20.0, 2.0, 3.0), 3.632027, 1e-6);
    // No smear (s = 1) leaves ln n − 0.75 whatever kh/ks.
    EXPECT_NEAR(hansbo_mu_smear(20.0, 1.0, 5.0), std::log(20.0) - 0.75, 1e-15);
    // Well resistance term: z = l = 10 m, kh = 1e-9 m/s, qw = 1e-6 m³/s → π·100·1e-3 = 0.314159.
    EXPECT_NEAR(hansbo_mu_well(10.0, 10.0, 1e-9, 1e-6), 0.3141593, 1e-7);
    EXPECT_EQ(hansbo_mu_well(0.0, 10.0, 1e-9, 1e-6), 0.0);
    EXPECT_EQ(hansbo_mu_well(5.0, 10.0, 1e-9, INFINITY), 0.0);
    EXPECT_NEAR(hansbo_mu(20.0, 2.0, 3.0, 10.0, 10.0, 1e-9, 1e-6), 3.632027 + 0.3141593, 1e-6);
}

TEST(EqualStrainIntegral, IdealDrainEqualsBarron) {
    for (double n : {1.5, 2.0, 4.0, 10.0, 25.0, 60.0, 100.0, 400.0}) {
        const SmearZone none{SmearShape::constant, 1.0, 1.0};
        EXPECT_NEAR(equal_strain_mu(n, none), barron_F(n), 1e-12 * std::log(n) + 1e-14) << n;
        // Any shape with kh/ks = 1 is no smear at all.
        const SmearZone flat{SmearShape::parabolic, 3.0, 1.0};
        EXPECT_NEAR(equal_strain_mu(n * 3.0, flat), barron_F(n * 3.0), 1e-12) << n;
    }
}

TEST(EqualStrainIntegral, TwoZoneEqualsExactIntegral) {
    for (double n : {5.0, 10.0, 20.0, 40.0, 80.0})
        for (double s : {1.5, 2.0, 3.0, 4.0})
            for (double kappa : {0.5, 2.0, 5.0, 10.0}) {
                if (s >= n) continue;
                const SmearZone smear{SmearShape::constant, s, kappa};
                EXPECT_NEAR(equal_strain_mu(n, smear), two_zone_exact(n, s, kappa), 1e-11)
                    << n << " " << s << " " << kappa;
            }
}

TEST(EqualStrainIntegral, TwoZoneWithinHansboSimplification) {
    // Hansbo's closed form drops terms of order (κ·s² + ln n)/n². Measured: the difference stays
    // below (κ·s² + ln n + 1)/n² for n from 10 to 100, s up to 4, κ up to 10.
    for (double n : {10.0, 15.0, 20.0, 40.0, 100.0})
        for (double s : {1.0, 1.5, 2.0, 3.0, 4.0})
            for (double kappa : {1.0, 2.0, 5.0, 10.0}) {
                if (s >= 0.5 * n) continue;
                const SmearZone smear{SmearShape::constant, s, kappa};
                const double bound = (kappa * s * s + std::log(n) + 1.0) / (n * n);
                EXPECT_NEAR(equal_strain_mu(n, smear), hansbo_mu_smear(n, s, kappa), bound)
                    << n << " " << s << " " << kappa;
            }
}

TEST(EqualStrainIntegral, SmearShapesAreOrdered) {
    // k_parabolic >= k_linear >= ks pointwise, so μ falls in the same order, all above the ideal.
    for (double n : {10.0, 20.0, 50.0})
        for (double kappa : {2.0, 5.0}) {
            const double ideal = barron_F(n);
            const double para = equal_strain_mu(n, {SmearShape::parabolic, 3.0, kappa});
            const double lin = equal_strain_mu(n, {SmearShape::linear, 3.0, kappa});
            const double cons = equal_strain_mu(n, {SmearShape::constant, 3.0, kappa});
            EXPECT_LT(ideal, para);
            EXPECT_LT(para, lin);
            EXPECT_LT(lin, cons);
        }
}

TEST(EqualStrainIntegral, LinearProfileByHand) {
    // Linear k from ks to kh over [1, s]: check one value against a 2000-panel Simpson rule done
    // here in the test on the original (untransformed) integral.
    const double n = 20.0, s = 3.0, kappa = 4.0;
    const SmearZone smear{SmearShape::linear, s, kappa};
    auto k = [&](double x) { return smear_permeability_fraction(smear, x); };
    auto f = [&](double x) { return (n * n - x * x) * (n * n - x * x) / (x * k(x)); };
    auto simpson = [&](double a, double b, int panels) {
        const double h = (b - a) / panels;
        double sum = f(a) + f(b);
        for (int i = 1; i < panels; ++i) sum += f(a + i * h) * (i % 2 ? 4.0 : 2.0);
        return sum * h / 3.0;
    };
    const double expected = (simpson(1.0, s, 2000) + simpson(s, n, 2000)) / (n * n * (n * n - 1.0));
    EXPECT_NEAR(equal_strain_mu(n, smear), expected, 1e-9);
}

TEST(EqualStrainDegree, ForwardInverseRoundTrip) {
    for (double mu : {0.5, 2.0, 4.0, 9.0})
        for (double ur : {0.01, 0.3, 0.6, 0.9, 0.999}) {
            const double th = time_factor_radial_equal_strain(ur, mu);
            EXPECT_NEAR(degree_radial_equal_strain(th, mu), ur, 1e-14);
        }
    // Hansbo (1981): Th = (μ/8)·ln(1/(1 − U)); U = 0.9, μ = 4 → Th = 1.151293.
    EXPECT_NEAR(time_factor_radial_equal_strain(0.9, 4.0), 1.151293, 1e-6);
}
