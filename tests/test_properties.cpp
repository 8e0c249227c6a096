// Properties over random inputs (fixed seed): bounds, monotonicity, symmetry, roundtrips.
#include <gtest/gtest.h>

#include <random>

#include "cell_fixture.hpp"
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
