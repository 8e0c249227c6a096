// Embankment stress, undrained strength and circular-slip stability: checks against published
// values and hand calculations (each row names its source).
#include <gtest/gtest.h>

#include <boost/math/constants/constants.hpp>
#include <cmath>
#include <limits>
#include <optional>

#include "wickgrid/embankment.hpp"
#include "wickgrid/errors.hpp"
#include "wickgrid/stability.hpp"
#include "wickgrid/strength.hpp"

namespace wickgrid {
namespace {

constexpr double pi = boost::math::double_constants::pi;

EmbankmentSection section_of(double crest, double slope, double gamma, double phi, double cohesion, double target,
                             std::vector<Berm> berms = {}) {
    EmbankmentSection s;
    s.crest_width_m = crest;
    s.side_slope_h_per_v = slope;
    s.fill_unit_weight_kN_per_m3 = gamma;
    s.fill_friction_angle_deg = phi;
    s.fill_cohesion_kPa = cohesion;
    s.target_factor_of_safety = target;
    s.berms = std::move(berms);
    return s;
}

// A uniform φ = 0 clay of strength su and unit weight γ, thickness H, under a section.
SlopeModel uniform_clay(const EmbankmentSection& section, double height, double thickness, double su, double gamma) {
    SlopeModel m;
    m.section = section;
    m.profile = fill_profile(section, height, height);
    m.clay_thickness_m = thickness;
    m.bands = {{0.0, thickness, gamma}};
    m.su_kPa = [su](double, double) { return su; };
    return m;
}

// --- Stress under the section --------------------------------------------------------------------

struct InfluenceRow {
    const char* source;
    double a_m, b_m, z_m;
    double expected;
    double tolerance;
};

// Osterberg's influence: limits the formula must meet, and the strip load's closed form
// (the elastic strip, σ = (q/π)(α + sin α) on the centre line, as in standard texts; common
// practice), computed here from that formula.
TEST(Embankment, OsterbergInfluenceRows) {
    const auto strip_half = [](double b, double z) {
        const double alpha = 2.0 * std::atan(b / z);
        return 0.5 * (alpha + std::sin(alpha)) / pi;
    };
    const InfluenceRow rows[] = {
        {"surface under the crest: half the load", 5.0, 10.0, 0.0, 0.5, 1e-12},
        {"a → 0 is half a strip of half-width b (strip closed form)", 1e-9, 3.0, 2.0, strip_half(3.0, 2.0), 1e-8},
        {"a → 0, deep point (strip closed form)", 1e-9, 3.0, 30.0, strip_half(3.0, 30.0), 1e-8},
        // b = 0, the triangle's apex: α2 = 0 and I = α1/π with α1 = atan(a/z); 0.25 for a = z.
        {"b = 0, a = z: I = atan(1)/π = 0.25 (by hand)", 4.0, 0.0, 4.0, 0.25, 1e-12},
        // a = b = z: α2 = π/4, α1 = atan 2 − π/4; I = (2·atan 2 − π/4)/π (by hand) = 0.45483.
        {"a = b = z (by hand)", 3.0, 3.0, 3.0, (2.0 * std::atan(2.0) - pi / 4.0) / pi, 1e-12},
    };
    for (const auto& r : rows) EXPECT_NEAR(osterberg_influence(r.a_m, r.b_m, r.z_m), r.expected, r.tolerance) << r.source;
}

// The Flamant integral over the whole section equals Osterberg's half embankments superposed on the
// centre line (two independent formulas for the same integral), with and without berms, at the
// final height and part-way up; and a plain trapezoid gives twice Osterberg's influence.
TEST(Embankment, FlamantIntegralMatchesOsterbergOnCentreLine) {
    EmbankmentSection s = section_of(30.0, 2.0, 19.0, 32.0, 0.0, 1.3);
    EmbankmentSection bermed = s;
    bermed.berms = {{8.0, 3.0}, {5.0, 1.5}};
    for (const double h : {1.0, 3.0, 6.0})
        for (const double z : {0.5, 2.0, 8.0, 20.0, 60.0}) {
            const double q = 19.0 * h;
            const FillProfile plain = fill_profile(s, h, h);
            EXPECT_NEAR(centreline_stress_kPa(plain, 19.0, z), q * 2.0 * osterberg_influence(2.0 * h, 15.0, z), 1e-9 * q);
            EXPECT_NEAR(embankment_stress_kPa(plain, 19.0, 0.0, z), centreline_stress_kPa(plain, 19.0, z), 1e-9 * q);
            const FillProfile stepped = fill_profile(bermed, 6.5, h);
            EXPECT_NEAR(embankment_stress_kPa(stepped, 19.0, 0.0, z), centreline_stress_kPa(stepped, 19.0, z), 1e-9 * q)
                << h << " " << z;
        }
}

// A section with berms, cut at heights by hand: crest half-width 10, slopes 2:1, a berm 6 m wide at
// 2 m, final height 5 m. Full: (0,5) (10,5) (16,2) (22,2) (26,0). At 3 m: (0,3) (14,3) (16,2) (22,2)
// (26,0). At 2 m: the berm's top is the crest: (0,2) (22,2) (26,0). At 1 m: (0,1) (24,1) (26,0).
TEST(Embankment, FillProfileWithABermByHand) {
    EmbankmentSection s = section_of(20.0, 2.0, 19.0, 32.0, 0.0, 1.3, {{6.0, 2.0}});
    struct Row {
        double h;
        std::vector<double> x, y;
    };
    const Row rows[] = {{5.0, {0, 10, 16, 22, 26}, {5, 5, 2, 2, 0}},
                        {3.0, {0, 14, 16, 22, 26}, {3, 3, 2, 2, 0}},
                        {2.0, {0, 22, 26}, {2, 2, 0}},
                        {1.0, {0, 24, 26}, {1, 1, 0}}};
    for (const auto& row : rows) {
        const FillProfile p = fill_profile(s, 5.0, row.h);
        ASSERT_EQ(p.x_m.size(), row.x.size()) << row.h;
        for (std::size_t i = 0; i < row.x.size(); ++i) {
            EXPECT_NEAR(p.x_m[i], row.x[i], 1e-12) << row.h;
            EXPECT_NEAR(p.y_m[i], row.y[i], 1e-12) << row.h;
        }
        EXPECT_NEAR(fill_surface_m(p, -15.0), row.h >= 3.0 ? 2.5 : row.h, 1e-12) << row.h;  // on the slope, or the flat top
    }
    EXPECT_THROW(fill_profile(s, 1.5, 1.5), InputError);  // the berm stands above the fill
}

// Equilibrium: the vertical stress integrated across any horizontal plane carries the whole load
// (statics), here by the trapezoid rule over a wide span.
TEST(Embankment, StressCarriesTheWholeLoad) {
    const EmbankmentSection s = section_of(20.0, 2.0, 20.0, 30.0, 0.0, 1.3);
    const double h = 4.0, load = 20.0 * h * (20.0 + 2.0 * h);  // kN/m: γ·h·(crest + n·h)
    const double z = 6.0;
    const FillProfile p = fill_profile(s, h, h);
    double total = 0.0;
    const double dx = 0.01;
    for (double x = -3000.0; x < 3000.0; x += dx) total += embankment_stress_kPa(p, 20.0, x + 0.5 * dx, z) * dx;
    EXPECT_NEAR(total, load, 0.005 * load);  // the tails beyond ±3 km carry about 0.1 %
}

TEST(Embankment, SectionErrorsNameTheField) {
    const auto expect_field = [](EmbankmentSection s, const std::string& field) {
        try {
            validate_section(s);
            ADD_FAILURE() << field;
        } catch (const InputError& e) {
            EXPECT_EQ(e.quantity(), field);
        }
    };
    const EmbankmentSection ok = section_of(30.0, 2.0, 19.0, 32.0, 0.0, 1.3);
    EXPECT_NO_THROW(validate_section(ok));
    auto s = ok;
    s.side_slope_h_per_v = -0.5;  // steeper than vertical
    expect_field(s, "embankment.side_slope_h_per_v");
    s = ok;
    s.crest_width_m = 0.0;
    s.side_slope_h_per_v = 0.0;  // does not close
    expect_field(s, "embankment.crest_width_m");
    s = ok;
    s.target_factor_of_safety = 0.9;
    expect_field(s, "embankment.target_factor_of_safety");
    s = ok;
    s.fill_friction_angle_deg = 90.0;
    expect_field(s, "embankment.fill_friction_angle_deg");
}

// --- Strength ------------------------------------------------------------------------------------

TEST(Strength, HandCalculations) {
    UndrainedStrength profile;
    profile.su_top_kPa = 12.0;
    profile.su_gradient_kPa_per_m = 1.5;
    profile.gain_ratio = 0.25;
    // 12 + 1.5·4 + 0.25·40 = 28 kPa (by hand).
    EXPECT_NEAR(undrained_strength_kPa(profile, 4.0, 30.0, 30.0, 40.0), 28.0, 1e-12);
    UndrainedStrength ratio;
    ratio.su_ratio = 0.22;
    ratio.strength_exponent = 0.8;
    // OCR 2 at σ'v0 = 50: 0.22·50·2^0.8 = 19.150 kPa (by hand: 2^0.8 = 1.74110).
    EXPECT_NEAR(undrained_strength_kPa(ratio, 0.0, 50.0, 100.0, 0.0), 0.22 * 50.0 * 1.7411011, 1e-6);
    // Loaded past σ'p: normally consolidated, 0.22·(50 + 80) = 28.6 kPa.
    EXPECT_NEAR(undrained_strength_kPa(ratio, 0.0, 50.0, 100.0, 80.0), 28.6, 1e-12);
    // Within the over-consolidated range: 0.22·70·(100/70)^0.8 (by hand 21.44 kPa).
    EXPECT_NEAR(undrained_strength_kPa(ratio, 0.0, 50.0, 100.0, 20.0), 0.22 * 70.0 * std::pow(100.0 / 70.0, 0.8), 1e-12);
    UndrainedStrength both = profile;
    both.su_ratio = 0.2;
    EXPECT_THROW(validate_strength(both), InputError);
    UndrainedStrength zero = profile;
    zero.su_top_kPa = 0.0;
    EXPECT_THROW(validate_strength(zero), InputError);
}

// --- Circular slips ------------------------------------------------------------------------------

// φ = 0 clay under a strip load of width B on its surface: the critical circle carries about
// 5.5·su, the stability number for deep failure of Taylor (1937) (1/0.181 = 5.52, from memory),
// above Prandtl's (1920) exact 5.14·su (circles are upper bounds in limit analysis).
TEST(Stability, StripLoadOnClayCollapsesNearFellenius552) {
    const double su = 20.0, B = 10.0;
    // A thin, very heavy block of no strength is the strip load.
    EmbankmentSection strip = section_of(B, 0.0, 1.0e4, 0.0, 0.0, 1.0);
    const double h = 0.01;  // q = 100 kPa = 5 su
    const auto m = uniform_clay(strip, h, 30.0, su, 16.0);
    const CircleResult r = critical_circle(m);
    // F = q_collapse/q for a load-independent mechanism with weightless-in-moment clay.
    const double q_collapse = r.factor_of_safety * 1.0e4 * h;
    EXPECT_NEAR(q_collapse / su, 5.52, 0.03);
    EXPECT_GT(q_collapse / su, 5.14);
    // The critical centre stands above the load's edge (Fellenius' circle).
    EXPECT_NEAR(r.circle.centre_x_m, 0.5 * B, 0.05 * B);
}

// One circle by hand: a semicircle centred on the edge of a uniform strip load q on φ = 0 clay,
// radius R inside the load's width. Driving moment q·R²/2 (the loaded half), resisting su·πR·R (the
// clay's own weight is symmetric about the centre): F = 2π·su/q (the classic semicircle bound).
TEST(Stability, SemicircleOnStripEdgeByHand) {
    const double su = 15.0, q = 60.0, h = 0.001;
    EmbankmentSection strip = section_of(20.0, 0.0, q / h, 0.0, 0.0, 1.0);
    const auto m = uniform_clay(strip, h, 30.0, su, 17.0);
    const auto r = bishop_factor_of_safety(m, {10.0, h, 6.0}, 400);
    ASSERT_TRUE(r.has_value());
    EXPECT_NEAR(r->factor_of_safety, 2.0 * pi * su / q, 0.001 * 2.0 * pi * su / q);
    EXPECT_NEAR(r->entry_x_m, 4.0, 1e-6);
    EXPECT_NEAR(r->exit_x_m, 16.0, 1e-6);
}

// Basal reinforcement by hand (Jewell 1996: the design force T, horizontal at the base of the fill
// where the slip cuts it, restores T·yc about the centre). A thin strip load q on φ = 0 clay and a
// circle centred above the strip's edge at height yc: the clay's weight is symmetric about the centre,
// so M_D = q·a²/2 with a = √(R² − yc²) (the loaded part), M_R = su·R·2R·acos(yc/R) (the arc in the
// clay) + T·yc; F = M_R/M_D. T → 0 gives the unreinforced value.
TEST(Stability, BasalReinforcementByHand) {
    const double su = 15.0, q = 60.0, h = 0.001, R = 6.0, yc = 2.0;
    EmbankmentSection strip = section_of(20.0, 0.0, q / h, 0.0, 0.0, 1.0);
    const double a = std::sqrt(R * R - yc * yc);
    const double m_d = q * a * a / 2.0, m_r = su * R * 2.0 * R * std::acos(yc / R);
    const auto plain = bishop_factor_of_safety(uniform_clay(strip, h, 30.0, su, 17.0), {10.0, yc, R}, 400);
    ASSERT_TRUE(plain.has_value());
    EXPECT_NEAR(plain->factor_of_safety, m_r / m_d, 0.002 * m_r / m_d);
    for (const double t : {1e-9, 50.0, 100.0, 400.0}) {
        strip.reinforcement = BasalReinforcement{t};
        const auto r = bishop_factor_of_safety(uniform_clay(strip, h, 30.0, su, 17.0), {10.0, yc, R}, 400);
        ASSERT_TRUE(r.has_value());
        EXPECT_NEAR(r->factor_of_safety, (m_r + t * yc) / m_d, 0.002 * (m_r + t * yc) / m_d) << "T = " << t;
        // Against the code's own unreinforced value: exactly the added moment over the same M_D.
        EXPECT_NEAR(r->factor_of_safety - plain->factor_of_safety, t * yc / m_d, 1e-3 * t * yc / m_d + 1e-9) << "T = " << t;
    }
}

// A tension crack by hand (the crack carrying no shear and its water thrust γw·zc²/2 at a third of
// its depth: common practice in limit-equilibrium slope analysis; the thrust is hydrostatics): a 2 m block of cohesive fill (c = 10 kPa, φ = 0, γ = 20) with vertical
// sides on φ = 0 clay, a circle centred above the block's edge at yc = 3 m. Angles from the vertical
// below the centre: φh = acos((yc − h)/R) where the arc meets the fill surface, φc = acos((yc − h +
// zc)/R) at the crack's bottom, φ0 = acos(yc/R) at the original ground. M_R = R·[su·2R·φ0 + c·R·(φh
// − φ0)], less c·R·(φh − φc)·R for a crack of depth zc (no shear above its bottom). M_D is the fill's
// weight moment about the centre (the clay's weight is symmetric), integrated here over the block; a
// water-filled crack adds γw·zc²/2 × (yc − (h − zc) − zc/3). The slices resolve the crack's bottom to
// about one slice, hence 1 %.
TEST(Stability, TensionCrackByHand) {
    const double su = 15.0, c = 10.0, gamma = 20.0, h = 2.0, R = 6.0, yc = 3.0, xc = 10.0, zc = 1.0;
    EmbankmentSection block = section_of(20.0, 0.0, gamma, 0.0, c, 1.0);
    const double phi_h = std::acos((yc - h) / R), phi_c = std::acos((yc - h + zc) / R), phi_0 = std::acos(yc / R);
    const double m_r = R * (su * 2.0 * R * phi_0 + c * R * (phi_h - phi_0));
    const double lost = R * c * R * (phi_h - phi_c);
    // The fill's weight moment: x from where the arc meets the fill surface to the block's edge.
    const double x_e = xc - R * std::sin(phi_h);
    double m_d = 0.0;
    const int n = 200000;
    for (int i = 0; i < n; ++i) {
        const double x = x_e + (xc - x_e) * (i + 0.5) / n;
        const double arc = yc - std::sqrt(R * R - (x - xc) * (x - xc));
        m_d += gamma * (h - std::max(arc, 0.0)) * (xc - x) * (xc - x_e) / n;
    }
    const auto model = [&](std::optional<TensionCrack> crack) {
        block.tension_crack = crack;
        return uniform_clay(block, h, 30.0, su, 17.0);
    };
    const auto plain = bishop_factor_of_safety(model(std::nullopt), {xc, yc, R}, 400);
    const auto dry = bishop_factor_of_safety(model(TensionCrack{zc, false}), {xc, yc, R}, 400);
    const auto wet = bishop_factor_of_safety(model(TensionCrack{zc, true}), {xc, yc, R}, 400);
    ASSERT_TRUE(plain && dry && wet);
    EXPECT_NEAR(plain->factor_of_safety, m_r / m_d, 0.01 * m_r / m_d);
    EXPECT_NEAR(dry->factor_of_safety, (m_r - lost) / m_d, 0.01 * (m_r - lost) / m_d);
    const double thrust = 0.5 * 9.81 * zc * zc * (yc - (h - zc) - zc / 3.0);
    EXPECT_NEAR(wet->factor_of_safety, (m_r - lost) / (m_d + thrust), 0.01 * (m_r - lost) / (m_d + thrust));
    EXPECT_LT(dry->factor_of_safety, plain->factor_of_safety);
    EXPECT_LT(wet->factor_of_safety, dry->factor_of_safety);
    // A crack deeper than the fill stops at the fill's base.
    const auto deep = bishop_factor_of_safety(model(TensionCrack{5.0, false}), {xc, yc, R}, 400);
    const auto full = bishop_factor_of_safety(model(TensionCrack{h, false}), {xc, yc, R}, 400);
    ASSERT_TRUE(deep && full);
    EXPECT_DOUBLE_EQ(deep->factor_of_safety, full->factor_of_safety);
}

// The effective-stress form reduces to the total-stress one: with u = 0, φ′ = 0 and c′ = su every
// slice resists c′·l as the φ = 0 clay does (Bishop 1955's terms), so the factor of safety of any
// circle, and the critical one, are the same.
TEST(Stability, EffectiveStressWithNoPorePressureAndCEqualSuIsTheTotalStressAnswer) {
    EmbankmentSection fill = section_of(20.0, 2.0, 19.0, 30.0, 0.0, 1.3);
    const SlopeModel total = uniform_clay(fill, 4.0, 12.0, 18.0, 16.0);
    SlopeModel effective = total;
    effective.effective = [](double, double) { return SlopeModel::ClayEffective{18.0, 0.0, 0.0}; };
    const SlipCircle critical = critical_circle(total).circle;
    const SlipCircle wider{critical.centre_x_m + 1.0, critical.centre_y_m + 1.0, critical.radius_m + 1.5};
    for (const SlipCircle c : {critical, wider}) {
        const auto a = bishop_factor_of_safety(total, c), b = bishop_factor_of_safety(effective, c);
        ASSERT_TRUE(a && b);
        EXPECT_DOUBLE_EQ(a->factor_of_safety, b->factor_of_safety);
    }
    EXPECT_DOUBLE_EQ(critical_circle(total).factor_of_safety, critical_circle(effective).factor_of_safety);
    // Pore pressure only takes strength away: with φ′ > 0, more u, a lower factor of safety.
    double last = std::numeric_limits<double>::infinity();
    for (const double u : {0.0, 10.0, 30.0}) {
        effective.effective = [u](double, double) { return SlopeModel::ClayEffective{2.0, std::tan(25.0 * pi / 180.0), u}; };
        const auto r = bishop_factor_of_safety(effective, wider);
        ASSERT_TRUE(r);
        EXPECT_LT(r->factor_of_safety, last) << "u = " << u;
        last = r->factor_of_safety;
    }
}

// A dry cohesionless fill slope on a rigid base: the factor of safety tends to the infinite-slope
// value tanφ/tanβ for shallow slips (statics of a block on a plane).
TEST(Stability, DryCohesionlessSlopeTendsToInfiniteSlope) {
    const double phi = 32.0, n = 2.0;
    EmbankmentSection fill = section_of(20.0, n, 19.0, phi, 0.0, 1.0);
    const auto m = uniform_clay(fill, 5.0, 2.0, 1.0e6, 18.0);  // a clay too strong to fail
    CircleSearch search;
    search.through_clay = false;
    const CircleResult r = critical_circle(m, search);
    const double infinite = std::tan(phi * pi / 180.0) * n;
    EXPECT_GE(r.factor_of_safety, infinite - 1e-6);
    EXPECT_NEAR(r.factor_of_safety, infinite, 0.005 * infinite);
}

// The search against a brute-force scan of centres and radii on a clay with a weak layer at depth
// (where a coarse search could stop at a shallow local minimum): the search must find a factor of
// safety no higher than the scan's best (within 0.5 %). A consistency check of the search, not an
// outside reference.
TEST(Stability, SearchFindsWhatADenseScanFinds) {
    EmbankmentSection fill = section_of(20.0, 2.0, 19.0, 30.0, 0.0, 1.3);
    SlopeModel m;
    m.section = fill;
    m.profile = fill_profile(fill, 4.0, 4.0);
    m.clay_thickness_m = 12.0;
    m.bands = {{0.0, 3.0, 17.0}, {3.0, 5.0, 15.0}, {5.0, 12.0, 16.5}};
    m.su_kPa = [](double, double z) { return z > 3.0 && z <= 5.0 ? 9.0 : 25.0 + 1.0 * z; };
    double scan = std::numeric_limits<double>::infinity();
    for (double xc = -5.0; xc <= 40.0; xc += 1.0)
        for (double yc = 0.5; yc <= 30.0; yc += 1.0)
            for (double r = 1.0; r <= yc + 12.0; r += 0.5)
                if (const auto res = bishop_factor_of_safety(m, {xc, yc, r}); res && res->exit_x_m > 0.0) {
                    // Only slips that reach the clay, as the stage search does.
                    const double lowest = xc > res->entry_x_m && xc < res->exit_x_m ? yc - r : -1.0;
                    if (lowest <= -0.1) scan = std::min(scan, res->factor_of_safety);
                }
    const CircleResult found = critical_circle(m);
    EXPECT_LE(found.factor_of_safety, scan * 1.005);
}

// Named failures of a slope model.
TEST(Stability, BadSlopeModelsAreNamed) {
    EmbankmentSection fill = section_of(20.0, 2.0, 19.0, 30.0, 0.0, 1.3);
    auto m = uniform_clay(fill, 3.0, 10.0, 20.0, 16.0);
    m.bands = {{0.0, 6.0, 16.0}};  // does not reach the clay's base
    EXPECT_THROW(critical_circle(m), InputError);
    m = uniform_clay(fill, 3.0, 10.0, 20.0, 16.0);
    m.profile.y_m.back() = 0.5;  // a toe above the ground: the profile does not close
    EXPECT_THROW(critical_circle(m), InputError);
    EXPECT_THROW(fill_profile(fill, 3.0, -1.0), InputError);
}

}  // namespace
}  // namespace wickgrid
