// Time-dependent loading and settlement: closed forms of ramp loading, superposition identities,
// hand calculations of e–log settlement.
#include <gtest/gtest.h>

#include <boost/math/constants/constants.hpp>
#include <cmath>

#include "cell_fixture.hpp"
#include "wickgrid/errors.hpp"
#include "wickgrid/settlement.hpp"
#include "wickgrid/vertical.hpp"

using namespace wickgrid;

namespace {
constexpr double pi = boost::math::double_constants::pi;

// Olson (1977) ramp loading of Terzaghi's layer, construction ending at Tc (degree relative to the
// final load): T <= Tc: (T/Tc)[1 − (2/T)Σ(1 − e^{−M²T})/M⁴]; T >= Tc: 1 − (2/Tc)Σ(e^{M²Tc} − 1)e^{−M²T}/M⁴.
double olson_ramp(double t, double tc) {
    double sum = 0.0;
    for (int m = 0; m < 2000; ++m) {
        const double big = pi * (2 * m + 1) / 2.0, m2 = big * big;
        sum += t <= tc ? -std::expm1(-m2 * t) / (m2 * m2) : (std::exp(-m2 * (t - tc)) - std::exp(-m2 * t)) / (m2 * m2);
    }
    return t <= tc ? (t / tc) * (1.0 - 2.0 / t * sum) : 1.0 - 2.0 / tc * sum;
}
}  // namespace

TEST(RampLoading, TerzaghiMatchesOlson1977) {
    const StepResponse terzaghi = [](double t) { return degree_vertical(t); };  // time in units of d²/cv
    for (double tc : {0.05, 0.3, 1.0})
        for (double t : {0.01, 0.04, 0.1, 0.3, 0.6, 1.0, 1.5, 3.0}) {
            EXPECT_NEAR(ramp_response(terzaghi, 0.0, tc, t), olson_ramp(t, tc), 1e-9) << tc << " " << t;
        }
}

TEST(RampLoading, ExponentialResponseClosedForm) {
    // Ur = 1 − e^{−λt} (Barron/Hansbo equal strain) ramped over [0, tc]:
    // t <= tc: (t − (1 − e^{−λt})/λ)/tc;  t >= tc: 1 − (e^{λtc} − 1)e^{−λt}/(λ tc).
    const double lambda = 0.8;
    const StepResponse radial = [lambda](double t) { return -std::expm1(-lambda * t); };
    const double tc = 2.0;
    for (double t : {0.1, 0.5, 1.0, 2.0, 3.0, 6.0}) {
        const double expected = t <= tc ? (t + std::expm1(-lambda * t) / lambda) / tc
                                        : 1.0 - std::expm1(lambda * tc) * std::exp(-lambda * t) / (lambda * tc);
        EXPECT_NEAR(ramp_response(radial, 0.0, tc, t), expected, 1e-12) << t;
    }
}

TEST(RampLoading, InstantStageIsTheStepAndSplitRampsChangeNothing) {
    const UnitCell cell(fixtures::typical_cell());
    const StepResponse u = [&cell](double t) { return cell.at(t).combined; };
    const double day = units::seconds_per_day;
    for (double t : {5.0, 30.0, 90.0, 200.0}) {
        EXPECT_EQ(superpose(u, {{0.0, 0.0, 1.0}}, t * day), cell.at(t * day).combined);
        const double one = superpose(u, {{10 * day, 50 * day, 1.0}}, t * day);
        const double two = superpose(u, {{10 * day, 30 * day, 0.5}, {30 * day, 50 * day, 0.5}}, t * day);
        EXPECT_NEAR(one, two, 1e-11) << t;
    }
    EXPECT_EQ(ramp_response(u, 10 * day, 20 * day, 5 * day), 0.0);
}

TEST(Settlement, HandCalculations) {
    // One slice, 4 m, γ = 16 kN/m³, groundwater at the top: σ'0 = (16 − 9.81)·2 = 12.38 kPa.
    SoilLayer layer;
    layer.thickness_m = 4.0;
    layer.unit_weight_kN_per_m3 = 16.0;
    layer.e0 = 1.5;
    layer.cc = 0.5;
    layer.cr = 0.05;
    SoilProfile profile{{layer}, 0.0, 1};
    const double s0 = (16.0 - 9.81) * 2.0;
    // Normally consolidated (OCR 1), 50 kPa: 0.5·log(62.38/12.38)/2.5·4.
    profile.layers[0].ocr = 1.0;
    EXPECT_NEAR(ultimate_settlement_m(profile, 50.0), 0.5 * std::log10((s0 + 50) / s0) / 2.5 * 4.0, 1e-12);
    // Over-consolidated staying below σ'p (OCR 6 → 74.28 kPa > 62.38): recompression only.
    profile.layers[0].ocr = 6.0;
    EXPECT_NEAR(ultimate_settlement_m(profile, 50.0), 0.05 * std::log10((s0 + 50) / s0) / 2.5 * 4.0, 1e-12);
    // Crossing σ'p (OCR 2 → 24.76 kPa): Cr to σ'p, Cc beyond.
    profile.layers[0].ocr = 2.0;
    const double sp = 2.0 * s0;
    EXPECT_NEAR(ultimate_settlement_m(profile, 50.0),
                (0.05 * std::log10(sp / s0) + 0.5 * std::log10((s0 + 50) / sp)) / 2.5 * 4.0, 1e-12);
    // A constant mv: mv·Δσ·H whatever the slicing.
    SoilLayer mv_layer;
    mv_layer.thickness_m = 6.0;
    mv_layer.unit_weight_kN_per_m3 = 17.0;
    mv_layer.mv_m2_per_kN = 5e-4;
    EXPECT_NEAR(ultimate_settlement_m({{mv_layer}, 1.0, 7}, 40.0), 5e-4 * 40.0 * 6.0, 1e-15);
}

TEST(Settlement, SlicingConvergesAndLayersAdd) {
    SoilLayer a;
    a.thickness_m = 5.0;
    a.unit_weight_kN_per_m3 = 15.5;
    a.e0 = 2.0;
    a.cc = 0.8;
    a.cr = 0.1;
    a.preconsolidation_kPa = 30.0;
    SoilLayer b = a;
    b.thickness_m = 7.0;
    b.unit_weight_kN_per_m3 = 16.5;
    b.ocr = 1.2;
    b.preconsolidation_kPa.reset();
    const double coarse = ultimate_settlement_m({{a, b}, 1.0, 20}, 60.0);
    const double fine = ultimate_settlement_m({{a, b}, 1.0, 400}, 60.0);
    EXPECT_NEAR(coarse, fine, 2e-3 * fine);  // midpoint slices converge as 1/N²
    EXPECT_GT(ultimate_settlement_m({{a, b}, 1.0, 20}, 80.0), coarse);
}

TEST(SettlementHistory, SurchargeAndResidual) {
    const UnitCell cell(fixtures::typical_cell());
    const StepResponse u = [&cell](double t) { return cell.at(t).combined; };
    const double day = units::seconds_per_day;
    LoadHistory loads;
    loads.stages = {{0.0, 20 * day, 30.0}, {40 * day, 50 * day, 20.0}};
    const auto linear = [](double q) { return 0.01 * q; };  // 10 mm per kPa... scaled: 0.5 m at 50 kPa
    const SettlementHistory plain(linear, loads, u);
    EXPECT_NEAR(plain.final_m(), 0.5, 1e-15);
    // Linear: the settlement is the load-weighted superposition.
    const double t = 100 * day;
    EXPECT_NEAR(plain.settlement_m(t), 0.3 * ramp_response(u, 0, 20 * day, t) + 0.2 * ramp_response(u, 40 * day, 50 * day, t),
                1e-12);
    EXPECT_NEAR(plain.residual_m(t, std::nullopt), 0.5 - plain.settlement_m(t), 1e-15);
    // A surcharge makes settlement faster until removal, then holds it.
    loads.surcharge = Surcharge{60 * day, 70 * day, 150 * day, 25.0};
    const SettlementHistory with(linear, loads, u);
    EXPECT_GT(with.settlement_m(140 * day), plain.settlement_m(140 * day));
    EXPECT_GE(with.settlement_m(200 * day), with.settlement_m(150 * day));
    EXPECT_NEAR(with.settlement_m(151 * day), std::max(with.settlement_m(150 * day), plain.settlement_m(151 * day)), 1e-15);
    EXPECT_THROW(SettlementHistory(linear, LoadHistory{}, u), InputError);
}

// The applied load the report charts: lifts pro rata over their ramps, the surcharge while it is on
// (values by hand).
TEST(LoadHistoryApplied, LiftsRampAndTheSurchargeComesOff) {
    const double day = wickgrid::units::seconds_per_day;
    wickgrid::LoadHistory h{{{0.0, 20 * day, 30.0}}, wickgrid::Surcharge{25 * day, 30 * day, 50 * day, 10.0}, std::nullopt};
    EXPECT_DOUBLE_EQ(h.applied_at_kPa(10 * day), 15.0);
    EXPECT_DOUBLE_EQ(h.applied_at_kPa(27.5 * day), 35.0);
    EXPECT_DOUBLE_EQ(h.applied_at_kPa(40 * day), 40.0);
    EXPECT_DOUBLE_EQ(h.applied_at_kPa(60 * day), 30.0);
    EXPECT_DOUBLE_EQ(h.applied_at_kPa(60 * day), h.permanent_at_kPa(60 * day));
}
