// The layered series method (Walker & Indraratna 2009) against closed forms and against the
// independent numerical cell; vacuum against Indraratna et al. (2005); convergence with the terms.
#include <gtest/gtest.h>

#include <boost/math/constants/constants.hpp>
#include <cmath>
#include <cstdio>
#include <limits>

#include "wickgrid/errors.hpp"
#include "wickgrid/layered.hpp"
#include "wickgrid/numerical.hpp"
#include "wickgrid/plane_strain.hpp"
#include "wickgrid/radial.hpp"
#include "wickgrid/units.hpp"
#include "wickgrid/vertical.hpp"

using namespace wickgrid;

namespace {
constexpr double pi = boost::math::double_constants::pi;
constexpr double day = 86400.0;

NumericalCellSpec column(double height, double cv, double ch, double mv = 1e-3) {
    NumericalCellSpec s;
    s.layers = {{height, cv, ch, mv}};
    s.drain_diameter_m = 0.05;
    s.smear_diameter_m = 0.05;
    s.influence_diameter_m = 1.5;
    s.drain_length_m = height;
    return s;
}

// Terzaghi's (1925) isochrone for a uniform initial excess: u/u0 at depth Z = z/d (d the drainage
// path, Z = 0 at the drained face) and time factor Tv, summed to 1e-15.
double terzaghi_local_u(double z_over_d, double tv) {
    double sum = 0.0;
    for (int m = 0; m < 100000; ++m) {
        const double M = pi * (2 * m + 1) / 2;
        const double term = 2.0 / M * std::sin(M * z_over_d) * std::exp(-M * M * tv);
        sum += term;
        if (std::fabs(2.0 / M * std::exp(-M * M * tv)) < 1e-16 && m > 10) break;
    }
    return sum;
}
}  // namespace

TEST(Layered, NoDrainIsTerzaghiForEachDrainageCase) {
    // Source: Terzaghi (1925) average degree (degree_vertical, itself checked against Terzaghi's table).
    for (const auto drainage : {VerticalDrainage::both_faces, VerticalDrainage::top_only, VerticalDrainage::bottom_only}) {
        NumericalCellSpec spec = column(10.0, 2e-8, 4e-8);
        spec.has_drain = false;
        spec.drainage = drainage;
        const LayeredCell cell(spec, RadialTheory::hansbo_1981);
        const double d = drainage_path_m(10.0, drainage);
        for (const double tv : {0.01, 0.05, 0.2, 0.5, 1.0}) {
            const double t = tv * d * d / 2e-8;
            EXPECT_NEAR(cell.degree(t), degree_vertical(tv), 2e-4) << "Tv " << tv;
        }
        EXPECT_NEAR(cell.degree(0.0), 0.0, 1e-12);
    }
}

TEST(Layered, UniformWithIdealDrainIsCarrilloAtEveryDepth) {
    // Uniform clay, constant η (no well resistance): the equation separates, so the local degree is
    // exactly 1 − (1 − Uv(z, t))(1 − Ur(t)) with Terzaghi's isochrone (1925) and Hansbo's (1981) Ur,
    // Carrillo (1942), and the average degree is Carrillo's rule on the averages. The table shows the
    // largest differences over depths 0.5–11.5 m and days 5–400 (Tv from 4.5e-5 to 3.6e-3) against
    // the number of terms; the series converges at every depth, slowest at the earliest time near
    // the drained face (the isochrone's boundary layer).
    NumericalCellSpec spec = column(12.0, 1.5e-8, 3e-8);
    spec.drainage = VerticalDrainage::top_only;
    spec.smear_diameter_m = 0.15;
    spec.smear_permeability_ratio = 3.0;
    const double mu = hansbo_mu_smear(1.5 / 0.05, 3.0, 3.0);
    std::printf("  terms | max |U(z,t) - Carrillo|, t >= 5 d | t >= 30 d | max |U(t) - Carrillo|\n");
    std::vector<double> local_early, local_late, mean;
    for (const int terms : {12, 24, 48, 96, 192}) {
        const LayeredCell cell(spec, RadialTheory::hansbo_1981, terms);
        EXPECT_NEAR(cell.mu_smear(), mu, 1e-12);
        double worst_early = 0.0, worst_late = 0.0, worst_mean = 0.0;
        for (const double t_days : {5.0, 30.0, 120.0, 400.0}) {
            const double t = t_days * day;
            const double ur = 1.0 - std::exp(-8.0 * 3e-8 * t / (1.5 * 1.5 * mu));
            const double tv = 1.5e-8 * t / (12.0 * 12.0);
            for (const double z : {0.5, 3.0, 6.0, 9.0, 11.5}) {
                const double uv = 1.0 - terzaghi_local_u(z / 12.0, tv);
                const double e = std::fabs(cell.local_degree(z, t) - (1.0 - (1.0 - uv) * (1.0 - ur)));
                worst_early = std::max(worst_early, e);
                if (t_days >= 30.0) worst_late = std::max(worst_late, e);
            }
            worst_mean = std::max(worst_mean, std::fabs(cell.degree(t) - (1.0 - (1.0 - degree_vertical(tv)) * (1.0 - ur))));
        }
        std::printf("  %5d | %.2e | %.2e | %.2e\n", terms, worst_early, worst_late, worst_mean);
        local_early.push_back(worst_early);
        local_late.push_back(worst_late);
        mean.push_back(worst_mean);
    }
    // Tolerances (degree): the average within 5e-6 at the default 24 terms (measured 7.5e-7); the
    // local degree within 1e-10 from day 30 at 96 terms and 1e-8 at 192 at every time listed.
    EXPECT_LT(mean[1], 5e-6);
    EXPECT_LT(local_late[3], 1e-10);
    EXPECT_LT(local_early[4], 1e-8);
    for (std::size_t i = 1; i < local_early.size(); ++i) EXPECT_LT(local_early[i], local_early[i - 1]);
}

TEST(Layered, IdenticalLayersAreOneLayer) {
    NumericalCellSpec one = column(9.0, 1e-8, 3e-8, 8e-4);
    one.discharge_capacity_m3_per_s = 3e-6;
    NumericalCellSpec three = one;
    three.layers = {{2.0, 1e-8, 3e-8, 8e-4}, {4.5, 1e-8, 3e-8, 8e-4}, {2.5, 1e-8, 3e-8, 8e-4}};
    const LayeredCell a(one, RadialTheory::hansbo_1981), b(three, RadialTheory::hansbo_1981);
    for (const double t_days : {1.0, 20.0, 100.0, 300.0}) EXPECT_NEAR(a.degree(t_days * day), b.degree(t_days * day), 1e-9);
}

TEST(Layered, VacuumAloneRadialFlowIsIndraratna2005) {
    // Vacuum alone, radial flow only (cv = 0), uniform clay, full drains: the average excess pore
    // pressure is −p(1 + k1)/2·(1 − exp(−8Th/μ)) (Indraratna, Sathananthan, Rujikiatkamjorn &
    // Balasubramaniam 2005, equal strain with the linear vacuum loss along the drain; form re-derived
    // from the equal-strain equation). So U = 1 − exp(−8Th/μ) and the steady suction is p(1 + k1)/2.
    NumericalCellSpec spec = column(10.0, 0.0, 2e-8);
    spec.drainage = VerticalDrainage::top_only;
    LoadHistory h;
    h.vacuum = VacuumLoad{0.0, 5000 * day, 70.0, 0.6};
    spec.loading = h;
    const LayeredCell cell(spec, RadialTheory::hansbo_1981, 200);
    const double mu = hansbo_mu_smear(1.5 / 0.05, 1.0, 1.0);
    for (const double t_days : {10.0, 60.0, 200.0}) {
        const double th = 2e-8 * t_days * day / (1.5 * 1.5);
        EXPECT_NEAR(cell.degree(t_days * day), 1.0 - std::exp(-8.0 * th / mu), 1e-9);
    }
    EXPECT_NEAR(cell.reference_load_kPa(), 70.0 * (1.0 + 0.6) / 2.0, 0.3);  // kPa, truncated series
}

namespace {
struct Profile {
    const char* name;
    NumericalCellSpec spec;
};

LoadHistory staged(double day0_kPa, double ramp_kPa) {
    LoadHistory h;
    h.stages = {{0.0, 0.0, day0_kPa}, {60 * day, 120 * day, ramp_kPa}};
    return h;
}

std::vector<Profile> layered_profiles() {
    std::vector<Profile> out;
    NumericalCellSpec base;
    base.drain_diameter_m = 0.066;
    base.smear_diameter_m = 0.2;
    base.smear_permeability_ratio = 3.0;
    base.influence_diameter_m = 1.6;
    {  // a thin permeable (silty) lens in soft clay, both faces drained, well resistance
        NumericalCellSpec s = base;
        s.layers = {{4.0, 1e-8, 2e-8, 1.2e-3}, {0.5, 2e-7, 4e-7, 2e-4}, {5.5, 1e-8, 2e-8, 1.2e-3}};
        s.drain_length_m = 10.0;
        s.discharge_capacity_m3_per_s = 100.0 / units::seconds_per_year;
        s.loading = staged(30.0, 30.0);
        out.push_back({"thin permeable lens", s});
    }
    {  // drains stopping in a stiff layer: 7 m soft over 5 m stiff, drains 9 m, top drained only
        NumericalCellSpec s = base;
        s.layers = {{7.0, 1.5e-8, 3e-8, 1.5e-3}, {5.0, 6e-8, 1e-7, 2e-4}};
        s.drainage = VerticalDrainage::top_only;
        s.drain_length_m = 9.0;
        s.loading = staged(30.0, 30.0);
        out.push_back({"drains stop in a stiff layer", s});
    }
    {  // soft over stiff, full drains, both faces
        NumericalCellSpec s = base;
        s.layers = {{8.0, 1e-8, 2.5e-8, 1.4e-3}, {6.0, 8e-8, 1.5e-7, 1.5e-4}};
        s.drain_length_m = 14.0;
        s.loading = staged(40.0, 20.0);
        out.push_back({"soft over stiff", s});
    }
    {  // vacuum with fill: 60 kPa at the head, 0.8 at the tip, fill in two lifts
        NumericalCellSpec s = base;
        s.layers = {{3.0, 2e-8, 4e-8, 1.0e-3}, {9.0, 1e-8, 2e-8, 1.6e-3}};
        s.drainage = VerticalDrainage::top_only;
        s.drain_length_m = 12.0;
        LoadHistory h = staged(20.0, 30.0);
        h.vacuum = VacuumLoad{10 * day, 1500 * day, 60.0, 0.8};
        s.loading = h;
        out.push_back({"vacuum with fill", s});
    }
    {  // five layers, well resistance, staged fill and a surcharge
        NumericalCellSpec s = base;
        s.layers = {{1.5, 5e-8, 8e-8, 4e-4},
                    {4.0, 1e-8, 2e-8, 1.5e-3},
                    {1.0, 1e-7, 2e-7, 3e-4},
                    {5.0, 8e-9, 1.6e-8, 1.3e-3},
                    {3.5, 3e-8, 5e-8, 5e-4}};
        s.drain_length_m = 15.0;
        s.discharge_capacity_m3_per_s = 80.0 / units::seconds_per_year;
        LoadHistory h = staged(25.0, 35.0);
        h.surcharge = Surcharge{150 * day, 180 * day, 500 * day, 30.0};
        s.loading = h;
        out.push_back({"five layers with surcharge", s});
    }
    return out;
}
}  // namespace

TEST(Layered, AgreesWithTheNumericalCellOnLayeredProfiles) {
    // The independent check: the axisymmetric finite-volume cell (numerical.hpp) solves the same
    // ground with coupled radial and vertical flow (no equal-strain assumption). Times 5–1000 days,
    // before any removal of a temporary load (the numerical cell lets the clay swell back after it;
    // the layered method holds the settlement). Largest differences printed; tolerances 0.02 in U and
    // 15 mm in settlement (measured: 0.006–0.014 and under 10 mm).
    NumericalMesh mesh;
    mesh.radial_cells = 40;
    mesh.vertical_cells = 120;
    mesh.max_degree_step = 0.002;
    std::vector<double> times;
    for (const double d : {5.0, 20.0, 50.0, 90.0, 140.0, 200.0, 300.0, 450.0, 700.0, 1000.0}) times.push_back(d * day);
    std::printf("  profile                       | max |U_layered - U_numerical| | settlement mm\n");
    for (const auto& [name, spec] : layered_profiles()) {
        const LayeredCell layered(spec, RadialTheory::hansbo_1981);
        const NumericalCell numerical(spec, mesh);
        const auto points = numerical.solve(times);
        double worst = 0.0;
        for (std::size_t i = 0; i < times.size(); ++i) {
            if (spec.loading && spec.loading->surcharge && times[i] > spec.loading->surcharge->removal_s) continue;
            if (spec.loading && spec.loading->vacuum && times[i] > spec.loading->vacuum->end_s) continue;
            worst = std::max(worst, std::fabs(layered.degree(times[i]) - points[i].degree_settlement));
        }
        // Settlement is U × the same final settlement in both, so its largest difference is ΔU × final.
        const double mm = worst * layered.reference_strain_integral_m() * 1000.0;
        std::printf("  %-29s | %.4f                        | %.1f\n", name, worst, mm);
        EXPECT_LT(worst, 0.02) << name;
        EXPECT_LT(mm, 15.0) << name;
    }
}

TEST(PlaneStrain, IndraratnaRedanaMatchesTheAxisymmetricCellAtEveryDepth) {
    // The defining property of the match (Indraratna & Redana 2000): at cell half-width B = re the
    // plane-strain μp(z) equals (khp/kh)·μ(z) of Hansbo (1981) at every depth, so both cells reach
    // the same average degree at every time. Checked for three smear zones and two capacities.
    const double re = 0.8, rw = 0.033, l = 12.0, kh = 2e-9;
    for (const double rs : {0.066, 0.1, 0.2})
        for (const double qw : {100.0 / units::seconds_per_year, 500.0 / units::seconds_per_year}) {
            const double n = re / rw, s = rs / rw;
            const double mu_s = hansbo_mu_smear(n, s, 3.0);
            const PlaneStrainMatch m = indraratna_redana_match(re, rw, rs, mu_s, qw);
            ASSERT_TRUE(m.smear_ratio.has_value()) << rs;
            ASSERT_TRUE(m.discharge_m2_per_s.has_value());
            EXPECT_GT(*m.smear_ratio, 0.0);
            EXPECT_LT(*m.smear_ratio, 1.0);  // the smear zone is less permeable in plane strain too
            for (const double z : {0.0, 2.0, 6.0, 12.0}) {
                const double mu_axi = mu_s + pi * z * (2 * l - z) * kh / qw;
                EXPECT_NEAR(plane_strain_mu(m, re, rw, m.kh_ratio * kh, z, l), m.kh_ratio * mu_axi, 1e-12 * mu_axi)
                    << "rs " << rs << " z " << z;
            }
        }
}

TEST(PlaneStrain, WithoutSmearTheUndisturbedRatioIsHirdEtAl1992) {
    // Ideal drain without smear: khp/kh = (2/3)/(ln n − 0.75) (Indraratna & Redana) is Hird, Pyrah &
    // Russell's (1992) khp = 2kh/(3μ) with Hansbo's μ = ln n − 0.75 for s = 1, kh/ks = 1.
    for (const double n : {10.0, 25.0, 60.0}) {
        const double mu = hansbo_mu_smear(n, 1.0, 1.0);
        const PlaneStrainMatch m = indraratna_redana_match(0.5 * n * 0.05, 0.025, 0.025, mu, std::numeric_limits<double>::infinity());
        EXPECT_NEAR(m.kh_ratio, plane_strain_permeability_m_per_s(1.0, mu), 1e-12);
        EXPECT_FALSE(m.smear_ratio.has_value());
        EXPECT_FALSE(m.discharge_m2_per_s.has_value());
    }
    EXPECT_THROW(indraratna_redana_match(0.05, 0.025, 0.025, 1.0, 1.0), InputError);  // n = 2: ln n < 0.75
}

TEST(PlaneStrain, LayersBelowTheDrainTipHaveNoDrain) {
    NumericalCellSpec s = column(12.0, 1e-8, 3e-8);
    s.layers = {{5.0, 1e-8, 3e-8, 1e-3}, {4.0, 1e-8, 3e-8, 1e-3}, {3.0, 1e-8, 3e-8, 1e-3}};
    s.drain_length_m = 8.0;
    s.smear_diameter_m = 0.15;
    s.smear_permeability_ratio = 3.0;
    const auto layers = plane_strain_layers(s, hansbo_mu_smear(30.0, 3.0, 3.0));
    ASSERT_EQ(layers.size(), 3u);
    EXPECT_TRUE(layers[0].has_drain);
    EXPECT_TRUE(layers[1].has_drain);
    EXPECT_FALSE(layers[2].has_drain);
    EXPECT_NEAR(layers[0].kh_m_per_s, 3e-8 * 1e-3 * units::gamma_w_kN_per_m3, 1e-20);
}

TEST(Layered, ConvergesWithTheNumberOfTerms) {
    // The README's convergence table: the largest difference in U (days 5–1000) from the same cell at
    // 256 terms, for each profile of the comparison above. Printed; the default (48 terms) must be
    // within 1e-3 of it on every profile (measured 8e-5 to 4.5e-4: about 1/terms, the interfaces'
    // kinks in ū converge slowly in a smooth basis) and 96 terms closer than 24.
    std::vector<double> times;
    for (const double d : {5.0, 20.0, 50.0, 90.0, 140.0, 200.0, 300.0, 450.0, 700.0, 1000.0}) times.push_back(d * day);
    const std::vector<int> counts{8, 12, 16, 24, 48, 96};
    std::printf("  profile                       |");
    for (const int n : counts) std::printf(" %8d", n);
    std::printf("  terms\n");
    for (const auto& [name, spec] : layered_profiles()) {
        const LayeredCell reference(spec, RadialTheory::hansbo_1981, 256);
        std::printf("  %-29s |", name);
        std::vector<double> worst;
        for (const int n : counts) {
            const LayeredCell cell(spec, RadialTheory::hansbo_1981, n);
            double w = 0.0;
            for (const double t : times) w = std::max(w, std::fabs(cell.degree(t) - reference.degree(t)));
            worst.push_back(w);
            std::printf(" %8.1e", w);
        }
        std::printf("\n");
        EXPECT_LT(worst[4], 1e-3) << name;  // 48 terms, the default
        EXPECT_LT(worst[5], worst[3]) << name;
    }
}
