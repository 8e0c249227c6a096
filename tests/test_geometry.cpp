#include <gtest/gtest.h>

#include <array>

#include "checks/check_row.hpp"
#include "wickgrid/geometry.hpp"
#include "wickgrid/permeability.hpp"
#include "wickgrid/units.hpp"

using namespace wickgrid;
using checks::Row;

TEST(InfluenceDiameter, FamiliarFactors) {
    // Barron (1948) equal-area unit cells: De = 1.05 s triangular, 1.128 s square (factors as
    // quoted in Hansbo 1981 and Rixner et al. 1986, three decimals).
    EXPECT_NEAR(influence_diameter_factor(Pattern::triangular), 1.050, 0.0005);
    EXPECT_NEAR(influence_diameter_factor(Pattern::square), 1.128, 0.0005);
    EXPECT_NEAR(influence_diameter_m(Pattern::triangular, 2.0), 2.100, 0.001);
    EXPECT_NEAR(spacing_from_influence_diameter_m(Pattern::square, influence_diameter_m(Pattern::square, 1.7)),
                1.7, 1e-14);
}

TEST(EquivalentDiameter, BandDrain100x4) {
    // Rows: {source, width a (mm), expected dw (mm), tolerance (mm)} for a 100 × 4 mm drain.
    struct DiameterRow {
        std::string_view source;
        EquivalentDiameterMethod method;
        double expected_mm;
    };
    const std::array<DiameterRow, 3> rows{{
        {"Hansbo (1979) 2(a+b)/pi = 208/pi", EquivalentDiameterMethod::hansbo_1979, 66.21},
        {"Rixner et al. (1986) (a+b)/2", EquivalentDiameterMethod::rixner_1986, 52.00},
        {"Long & Covo (1994) 0.5a + 0.7b", EquivalentDiameterMethod::long_covo_1994, 52.80},
    }};
    for (const auto& row : rows)
        EXPECT_NEAR(band_drain_equivalent_diameter_m(row.method, 0.100, 0.004) * 1000.0, row.expected_mm, 0.01)
            << row.source;
}

TEST(EquivalentDiameter, MandrelByEqualArea) {
    // 120 × 60 mm rectangle: √(4·7200/π) = 95.75 mm (hand calculation).
    EXPECT_NEAR(mandrel_equivalent_diameter_m(0.120, 0.060) * 1000.0, 95.75, 0.01);
}

TEST(Pattern, DrainsPerHectare) {
    // Square 2 m: 2500 per hectare; triangular 2 m: 10000/(√3/2·4) = 2886.75 (hand calculation).
    const std::array<Row, 2> rows{{
        {"square grid, s = 2 m", 2.0, 2500.0, 1e-9},
        {"triangular grid, s = 2 m", 2.0, 2886.751, 1e-3},
    }};
    EXPECT_NEAR(drains_per_hectare(Pattern::square, rows[0].input), rows[0].expected, rows[0].tolerance);
    EXPECT_NEAR(drains_per_hectare(Pattern::triangular, rows[1].input), rows[1].expected, rows[1].tolerance);
    // Equal area: the influence circle covers exactly the drain's share of plan.
    for (Pattern p : {Pattern::triangular, Pattern::square}) {
        const double de = influence_diameter_m(p, 1.6);
        EXPECT_NEAR(3.141592653589793 * de * de / 4.0, area_per_drain_m2(p, 1.6), 1e-12);
    }
}

TEST(Permeability, FromCoefficientOfConsolidation) {
    // k = c·mv·γw: 2.4 m²/yr × 0.0008 m²/kN × 9.81 kN/m³ = 5.9685e-10 m/s (hand calculation).
    const double ch = units::per_year_to_per_second(2.4);
    EXPECT_NEAR(permeability_from_consolidation_m_per_s(ch, 0.0008), 5.9685e-10, 1e-14);
}
