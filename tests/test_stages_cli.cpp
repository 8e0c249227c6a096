// Staged construction through the site model and the `stages` command: strength gain and stress
// under the section by hand, the JSON contract, the plan, and located errors for bad input.
#include <gtest/gtest.h>

#include <boost/math/constants/constants.hpp>
#include <cmath>
#include <nlohmann/json.hpp>

#include "cli_helpers.hpp"
#include "scenario/scenario.hpp"
#include "wickgrid/cell_model.hpp"
#include "wickgrid/design.hpp"
#include "wickgrid/errors.hpp"
#include "wickgrid/stability.hpp"
#include "wickgrid/stages.hpp"
#include "wickgrid/units.hpp"

using namespace wickgrid;
using namespace wickgrid::cli_testing;

namespace {
const char* staged = "configs/staged-embankment-stability.yaml";
constexpr double pi = boost::math::double_constants::pi;

// One NC clay layer (mv) under a 3 m trial fill placed at once. Invented test case.
std::string trial(const std::string& strength) {
    return "schema: 1\ntitle: Invented trial fill on one soft layer (test case)\n"
           "target: {degree: 0.9, deadline_days: 200}\n"
           "clay:\n  groundwater_depth_m: 0.0\n  layers:\n"
           "    - {thickness_m: 10.0, unit_weight_kN_per_m3: 16.0, mv_m2_per_kN: 0.001, " + strength + "}\n"
           "  cv_m2_per_year: 2.0\n  ch_m2_per_year: 4.0\n  kh_m_per_s: 1.0e-9\n  vertical_drainage: both_faces\n"
           "embankment: {crest_width_m: 20.0, side_slope_h_per_v: 2.0, fill_unit_weight_kN_per_m3: 20.0, "
           "fill_friction_angle_deg: 30.0}\n"
           "loading:\n  stages:\n    - {start_day: 0, height_m: 3.0}\n"
           "drains: [{name: d, width_mm: 100, thickness_mm: 4, discharge_capacity_m3_per_year: 100}]\n"
           "installation: {mandrel_width_mm: 120, mandrel_depth_mm: 60, smear_diameter_ratio: 2.0, "
           "smear_permeability_ratio: 3.0}\npatterns: [triangular]\nspacing: {min_m: 0.8, max_m: 3.0}\n";
}

// Osterberg's (1957) half-embankment influence written out here from the formula (a: slope length,
// b: half crest, z: depth), to check the engine's Flamant integral by hand.
double osterberg_by_hand(double a, double b, double z) {
    const double a2 = std::atan(b / z), a1 = std::atan((a + b) / z) - a2;
    return ((a + b) / a * (a1 + a2) - b / a * a2) / pi;
}
}  // namespace

// su at the centre line, 5 m down, by hand: σ'v0 = (16 − 9.81)·5 = 30.95 kPa; the fill adds
// Δσ = 60·2·I(6, 10, 5) = 58.67 kPa (Osterberg); at once the load is carried by pore pressure
// (no gain), after 100 years it is all effective stress.
TEST(StagesSite, StrengthGainByHand) {
    const double sigma0 = (16.0 - units::gamma_w_kN_per_m3) * 5.0;
    const double added = 60.0 * 2.0 * osterberg_by_hand(6.0, 10.0, 5.0);
    EXPECT_NEAR(added, 58.665, 0.01);  // the hand value of the comment
    struct Row {
        std::string strength;
        double at_once, at_end;
    };
    const Row rows[] = {
        {"su_ratio: 0.25", 0.25 * sigma0, 0.25 * (sigma0 + added)},
        {"su_top_kPa: 10.0, su_gradient_kPa_per_m: 1.5, su_gain_ratio: 0.3", 10.0 + 7.5, 10.0 + 7.5 + 0.3 * added},
    };
    for (const auto& row : rows) {
        const auto s = scenario::parse_scenario(trial(row.strength), "trial.yaml");
        const auto model = make_cell_model(s.site, s.site.products.front(), Pattern::triangular, 1.5);
        const SlopeModel early = stage_slope_model(s.site, *model, units::days_to_seconds(1e-4));
        const SlopeModel late = stage_slope_model(s.site, *model, units::days_to_seconds(36500.0));
        EXPECT_NEAR(early.su_kPa(0.0, 5.0), row.at_once, 0.02 * (row.at_end - row.at_once)) << row.strength;
        EXPECT_NEAR(late.su_kPa(0.0, 5.0), row.at_end, 0.01) << row.strength;
        // Beyond the toe (16 m out) the clay gains nothing.
        EXPECT_NEAR(late.su_kPa(17.0, 5.0), row.at_once, 1e-9) << row.strength;
    }
}

// The tabulated strength (the fast path) against the exact one at points spread over the section,
// for the staged scenario's last stage with its berm.
TEST(StagesSite, TabulatedStrengthAgreesWithExact) {
    const auto s = scenario::load_scenario(source(staged));
    const auto model = make_cell_model(s.site, s.site.products.front(), Pattern::triangular, 1.4);
    const double t = s.site.loading->end_of_construction_s();
    const SlopeModel fast = stage_slope_model(s.site, *model, t), exact = stage_slope_model(s.site, *model, t, StrengthField::exact);
    double worst = 0.0;
    for (double x = -50.0; x <= 50.0; x += 0.37)
        for (double z = 0.0; z <= 14.0; z += 0.23) worst = std::max(worst, std::fabs(fast.su_kPa(x, z) - exact.su_kPa(x, z)));
    EXPECT_LT(worst, 0.5);
}

// The settlement slices take the section's stress at their depth (Osterberg), not the fill pressure.
TEST(StagesSite, SettlementUsesTheStressUnderTheSection) {
    const auto s = scenario::parse_scenario(trial("su_ratio: 0.25"), "trial.yaml");
    for (const auto& slice : settlement_slices(s.site, 60.0)) {
        EXPECT_NEAR(slice.load_kPa, 60.0 * 2.0 * osterberg_by_hand(6.0, 10.0, slice.depth_m), 1e-9);
        EXPECT_NEAR(slice.final_m, 0.001 * slice.load_kPa * slice.thickness_m, 1e-12);
    }
}

// Fill to a finished level by hand on the uniform mv clay (no section spreading: a wide fill):
// S = mv·H_clay·q with q = γ(f + S) − γw·S (groundwater at the surface), so
// S = mv·H·γ·f / (1 − mv·H·(γ − γw)).
TEST(StagesSite, FillToFinishByHand) {
    auto s = scenario::parse_scenario(trial("su_ratio: 0.25"), "trial.yaml");
    s.site.embankment.reset();
    const double mvh = 0.001 * 10.0, f = 2.0;
    const double expected = mvh * 20.0 * f / (1.0 - mvh * (20.0 - units::gamma_w_kN_per_m3));
    const FillToFinish r = fill_to_finish(s.site, 20.0, f);
    EXPECT_NEAR(r.final_settlement_m, expected, 1e-5);
    EXPECT_NEAR(r.placed_height_m, f + expected, 1e-5);
    EXPECT_NEAR(r.submerged_m, expected, 1e-5);
}

// Secondary compression by hand: one e–log layer, Cα = 0.03, e0 = 1.5, 10 m thick, so
// 0.03/2.5·10 = 0.12 m per log cycle of time from the end of primary tp (U = 95 %).
namespace {
std::string creeping(const std::string& secondary, const std::string& service) {
    return "schema: 1\ntitle: Invented creeping clay (test case)\n"
           "target: {residual_settlement_mm: 100, " + service + "deadline_days: 200}\n"
           "clay:\n  groundwater_depth_m: 0.0\n  layers:\n"
           "    - {thickness_m: 10.0, unit_weight_kN_per_m3: 16.0, e0: 1.5, cc: 0.6, cr: 0.06, ocr: 1.0" + secondary + "}\n"
           "  cv_m2_per_year: 2.0\n  ch_m2_per_year: 4.0\n  kh_m_per_s: 1.0e-9\n  vertical_drainage: both_faces\n"
           "loading:\n  stages:\n    - {start_day: 0, pressure_kPa: 60}\n"
           "drains: [{name: d, width_mm: 100, thickness_mm: 4, discharge_capacity_m3_per_year: 100}]\n"
           "installation: {mandrel_width_mm: 120, mandrel_depth_mm: 60, smear_diameter_ratio: 2.0, "
           "smear_permeability_ratio: 3.0}\npatterns: [triangular]\nspacing: {min_m: 0.8, max_m: 3.0}\n";
}
}  // namespace

TEST(StagesSite, SecondaryCompressionByHand) {
    const auto plain = scenario::parse_scenario(creeping("", "service_days: 7300, "), "c.yaml");
    for (const std::string key : {", c_alpha: 0.03", ", c_alpha_over_cc: 0.05"}) {
        const auto s = scenario::parse_scenario(creeping(key, "service_days: 7300, "), "c.yaml");
        const auto model = make_cell_model(s.site, s.site.products.front(), Pattern::triangular, 1.5);
        const auto base = make_cell_model(plain.site, plain.site.products.front(), Pattern::triangular, 1.5);
        const auto tp = model->end_of_primary_s();
        ASSERT_TRUE(tp.has_value());
        EXPECT_NEAR(model->degree(*tp), 0.95, 1e-6);
        const double t = units::days_to_seconds(200.0), period = units::days_to_seconds(7300.0);
        EXPECT_NEAR(model->secondary_m(*tp * 10.0), 0.12, 1e-12) << key;  // one log cycle
        EXPECT_EQ(model->secondary_m(0.5 * *tp), 0.0);
        const double by_hand = 0.12 * (std::log10((t + period) / *tp) - std::log10(std::max(t, *tp) / *tp));
        EXPECT_NEAR(model->residual_m(t, period) - base->residual_m(t, period), by_hand, 1e-9) << key;
    }
    // Negative Cα, Cα on an mv layer and a residual criterion without a service period are refused.
    const std::pair<std::string, std::string> bad[] = {
        {creeping(", c_alpha: -0.01", "service_days: 7300, "), "clay.layers[0].c_alpha"},
        {creeping(", c_alpha: 0.03", ""), "target.residual_settlement_mm"},
        {creeping(", c_alpha: 0.03, c_alpha_over_cc: 0.05", "service_days: 7300, "), "clay.layers[0].c_alpha_over_cc"},
    };
    for (const auto& [text, key] : bad) {
        try {
            scenario::parse_scenario(text, "c.yaml");
            ADD_FAILURE() << key;
        } catch (const scenario::ScenarioError& e) {
            EXPECT_EQ(e.key_path(), key) << e.what();
            EXPECT_GT(e.mark().line, 0) << e.what();
        }
    }
}

// Secondary compression after a surcharge, by hand from Bjerrum's (1967) time lines (secondary.hpp):
// one layer 10 m thick, γ = 16 kN/m³, water at the top, so σ′v0 = (16 − 9.81)·5 = 30.95 kPa at
// mid-layer; 60 kPa permanent; Cc = 0.6, Cr = 0.06, Cα = 0.03, so the ageing exponent is
// (0.6 − 0.06)/0.03 = 18 and 0.12 m of creep per log cycle. With U the cell's degree at removal
// (relative to the permanent load), OCR = (30.95 + 60·U)/90.95 and te = tr·OCR^18; creep from t1 to
// t2 after removal is 0.12·log10((te + t2 − tr)/(te + t1 − tr)).
namespace {
const std::string permanent_stage = "    - {start_day: 0, pressure_kPa: 60}\n";
}  // namespace

TEST(StagesSite, SecondaryCompressionAfterASurchargeByHand) {
    std::string text = creeping(", c_alpha: 0.03", "service_days: 7300, ");
    text.replace(text.find(permanent_stage), permanent_stage.size(),
                 "    - {start_day: 0, pressure_kPa: 60}\n  surcharge: {start_day: 0, pressure_kPa: 80, removal_day: 150}\n");
    const auto s = scenario::parse_scenario(text, "c.yaml");
    const auto model = make_cell_model(s.site, s.site.products.front(), Pattern::triangular, 1.2);
    const double tr = units::days_to_seconds(150.0), t = units::days_to_seconds(200.0), period = units::days_to_seconds(7300.0);
    const double u = model->degree(tr);
    ASSERT_GT(u, 1.0) << "the surcharge must over-compress for the check to mean anything";
    const double sigma0 = (16.0 - units::gamma_w_kN_per_m3) * 5.0;
    const double ocr = (sigma0 + 60.0 * u) / (sigma0 + 60.0);
    const double te = tr * std::pow(ocr, 18.0);
    const double by_hand = 0.12 * std::log10((te + t + period - tr) / (te + t - tr));
    const auto parts = model->residual_parts(t, period);
    EXPECT_NEAR(parts.secondary_m, by_hand, 1e-9);
    EXPECT_NEAR(parts.total_m(), model->residual_m(t, period), 1e-12);
    // Less creep than without the surcharge's over-consolidation (the plain law from tp).
    const auto tp = model->end_of_primary_s();
    ASSERT_TRUE(tp.has_value());
    EXPECT_LT(parts.secondary_m, 0.12 * std::log10((t + period) / t));
    // The design row shows the same split, and the parts add up to the residual.
    const auto row = design_row(s.site, s.site.products.front(), Pattern::triangular);
    ASSERT_TRUE(row.residual_primary_m && row.residual_secondary_m && row.residual_settlement_m);
    EXPECT_NEAR(*row.residual_primary_m + *row.residual_secondary_m, *row.residual_settlement_m, 1e-12);
}

// A surcharge sized by --offset-secondary meets the residual limit in the design's own model.
TEST(StagesCommand, SurchargeSizedForCreepMeetsTheResidualLimit) {
    const auto file = write_case(creeping(", c_alpha: 0.03", "service_days: 7300, "));
    const std::string args = "surcharge " + file.string() + " --drain d --pattern triangular --spacing 2.0 --removal-day 150 --json";
    const auto primary_only = run(args), offset = run(args + " --offset-secondary");
    ASSERT_EQ(primary_only.exit_code, 0) << primary_only.err;
    ASSERT_EQ(offset.exit_code, 0) << offset.err;
    const auto a = nlohmann::json::parse(primary_only.out), b = nlohmann::json::parse(offset.out);
    EXPECT_GT(b["secondary_offset_mm"].get<double>(), 0.0);
    EXPECT_GT(b["surcharge_kPa"].get<double>(), a["surcharge_kPa"].get<double>());
    EXPECT_NEAR(b["residual_settlement_mm"].get<double>(), 100.0, 1.0);
    EXPECT_NEAR(b["residual_primary_mm"].get<double>() + b["residual_secondary_mm"].get<double>(),
                b["residual_settlement_mm"].get<double>(), 1e-6);
    // The sized surcharge in the scenario: the design's cell at that spacing meets the limit within 1 mm.
    std::string text = creeping(", c_alpha: 0.03", "service_days: 7300, ");
    text.replace(text.find(permanent_stage), permanent_stage.size(),
                 "    - {start_day: 0, pressure_kPa: 60}\n  surcharge: {start_day: 0, removal_day: 150, pressure_kPa: " +
                     std::to_string(b["surcharge_kPa"].get<double>()) + "}\n");
    const auto s = scenario::parse_scenario(text, "c.yaml");
    const auto model = make_cell_model(s.site, s.site.products.front(), Pattern::triangular, 2.0);
    const double residual_mm = 1000.0 * model->residual_m(units::days_to_seconds(200.0), units::days_to_seconds(7300.0));
    EXPECT_NEAR(residual_mm, 100.0, 1.0);
    // Without a residual criterion there is no limit to size for: a named usage error.
    std::string degree = creeping(", c_alpha: 0.03", "");
    degree.replace(degree.find("residual_settlement_mm: 100, "), 29, "degree: 0.9, ");
    const auto refused = run("surcharge " + write_case(degree).string() +
                             " --drain d --pattern triangular --spacing 2.0 --removal-day 150 --offset-secondary");
    EXPECT_EQ(refused.exit_code, 2) << refused.err;
    EXPECT_NE(refused.err.find("--offset-secondary"), std::string::npos) << refused.err;
    EXPECT_NE(refused.err.find("target.residual_settlement_mm"), std::string::npos) << refused.err;
}

TEST(StagesCommand, JsonKeepsTheContractAndTheChartAgreesWithTheTable) {
    const auto r = run("stages " + source(staged) + " --json");
    ASSERT_LE(r.exit_code, 1) << r.err;
    const auto doc = nlohmann::json::parse(r.out);
    EXPECT_DOUBLE_EQ(doc.at("target_factor_of_safety").get<double>(), 1.3);
    EXPECT_TRUE(doc.at("plan_check").is_null());  // the scenario's own days: the design checked them
    // Four lifts and the finished-level top-up, checked as a stage of its own.
    ASSERT_EQ(doc.at("stages").size(), 5u);
    EXPECT_EQ(doc.at("fill_to_finish").at("top_up_stage").get<int>(), 5);
    for (const auto& st : doc.at("stages")) {
        for (const char* key : {"stage", "start_day", "height_m", "factor_of_safety", "earliest_next_start_day"})
            EXPECT_TRUE(st.contains(key)) << key;
        // The chart's point at the end of each stage is the table's check (one computation).
        bool found = false;
        for (const auto& p : doc.at("history"))
            if (std::fabs(p.at("day").get<double>() - st.at("end_day").get<double>()) < 1e-9) {
                EXPECT_DOUBLE_EQ(p.at("factor_of_safety").get<double>(), st.at("factor_of_safety").get<double>());
                found = true;
            }
        EXPECT_TRUE(found);
    }
    EXPECT_EQ(doc.at("meets_target").get<bool>(), r.exit_code == 0);
    EXPECT_TRUE(doc.at("stages").back().at("earliest_next_start_day").is_null());
}

// `stages --plan` closes its own loop: the planned schedule is asked the design criterion again at the
// spacing checked, and gives the largest spacing that meets it under that schedule. Planning the
// surcharged creep scenario earlier takes the surcharge off earlier, so more creep is left: the
// residual limit is then missed at the design's spacing (exit 1), and a smaller spacing is named.
TEST(StagesCommand, PlanSaysWhetherTheCriterionStillHolds) {
    const auto creep = run("stages " + source("configs/embankment-surcharge-creep.yaml") + " --plan --json");
    ASSERT_EQ(creep.exit_code, 1) << creep.err;
    const auto c = nlohmann::json::parse(creep.out);
    ASSERT_TRUE(c.at("plan_check").is_object());
    EXPECT_FALSE(c["plan_check"]["meets_criterion"].get<bool>());
    EXPECT_GT(c["plan_check"]["residual_settlement_mm"].get<double>(), 100.0);
    EXPECT_LT(c["plan_check"]["spacing_limit_m"].get<double>(), c["spacing_m"].get<double>());
    EXPECT_TRUE(c["meets_target"].get<bool>());  // every stage stands; the criterion is what fails
    bool surcharge_kept = false;
    for (const auto& st : c["stages"]) surcharge_kept = surcharge_kept || st["surcharge"].get<bool>();
    EXPECT_TRUE(surcharge_kept);

    const auto staged_plan = run("stages " + source(staged) + " --plan --json");
    ASSERT_LE(staged_plan.exit_code, 1) << staged_plan.err;
    const auto p = nlohmann::json::parse(staged_plan.out);
    ASSERT_TRUE(p.at("plan_check").is_object());
    EXPECT_EQ(p["plan_check"]["meets_criterion"].get<bool>(), p["plan_check"]["degree_at_deadline"].get<double>() >= 0.9);
    if (p["plan_check"]["meets_criterion"].get<bool>()) {
        EXPECT_GE(p["plan_check"]["spacing_limit_m"].get<double>(), p["spacing_m"].get<double>());
    }
}

// The section figure can be checked against the inputs: groundwater, the section's dimensions and
// each layer's strength as the scenario gives them (configs/staged-embankment-stability.yaml).
TEST(StagesCommand, SectionFigureShowsGroundwaterDimensionsAndStrength) {
    const fs::path out = scratch();
    const auto r = run("stages " + source(staged) + " --out " + out.string());
    ASSERT_LE(r.exit_code, 1) << r.err;
    const std::string svg = slurp(out / "stages-section.svg");
    for (const char* expected : {"groundwater 1.00 m below the original ground", "crest width 30.00 m", "side slopes 2.00 H : 1 V",
                                 "berm 12.00 m wide × 2.50 m high", "layer 1, 2.00 m: su = 25.0 kPa at the top of the layer",
                                 "layer 2, 6.00 m: su = S·σ′v·OCR^m with S = 0.250", "<desc>"})
        EXPECT_NE(svg.find(expected), std::string::npos) << expected;
    fs::remove_all(out);
}

// The plan starts each stage at the day its predecessor's check allows, and every planned stage
// then meets the target.
TEST(StagesCommand, PlanStartsEachStageAtTheEarliestDayAndMeetsTheTarget) {
    const auto r = run("stages " + source(staged) + " --plan --json");
    ASSERT_EQ(r.exit_code, 0) << r.err << r.out;
    const auto doc = nlohmann::json::parse(r.out);
    const auto& st = doc.at("stages");
    ASSERT_EQ(st.size(), 5u);
    EXPECT_TRUE(doc.at("planned").get<bool>());
    for (std::size_t i = 0; i < st.size(); ++i) {
        EXPECT_GE(st[i].at("factor_of_safety").get<double>(), 1.3);
        if (i > 0) {
            EXPECT_DOUBLE_EQ(st[i].at("start_day").get<double>(), st[i - 1].at("earliest_next_start_day").get<double>());
        }
    }
}

// The plan of the works: the top-up that `stages` places is the load `design` consolidates and
// settles under (one plan, resolved with the scenario).
TEST(StagesCommand, TheTopUpIsWhatDesignConsolidates) {
    const auto st = run("stages " + source(staged) + " --json"), de = run("design " + source(staged) + " --json");
    ASSERT_LE(st.exit_code, 1) << st.err;
    ASSERT_EQ(de.exit_code, 0) << de.err;
    const auto s = nlohmann::json::parse(st.out), d = nlohmann::json::parse(de.out);
    const auto& finish = s.at("fill_to_finish");
    const double gamma = 19.0;  // the config's fill unit weight
    // The fill standing after the top-up is the whole load of the plan, as a height (load / γ) ...
    EXPECT_NEAR(s.at("stages").back().at("height_m").get<double>() * gamma, finish.at("load_kPa").get<double>(), 1e-9);
    // ... the thickness placed is finished level plus settlement ...
    EXPECT_NEAR(finish.at("scheduled_height_m").get<double>() + finish.at("top_up_height_m").get<double>(),
                finish.at("placed_height_m").get<double>(), 1e-9);
    EXPECT_GT(finish.at("top_up_height_m").get<double>(), 0.0);
    // ... and design's final settlement under the plan's permanent load is the settlement the fill
    // to finish was solved for (its root tolerance, 1e-6 m).
    for (const auto& row : d.at("designs"))
        EXPECT_NEAR(row.at("ultimate_settlement_mm").get<double>(), 1000.0 * finish.at("final_settlement_m").get<double>(),
                    1e-3);
}

// A top-up after the surcharge is removed goes on at the removal day, after the surcharge's check.
TEST(StagesCommand, TopUpAfterSurchargeRemovalFollowsTheRemoval) {
    std::string text = edited_copy(staged, "    - {start_day: 150, end_day: 160, height_m: 1.0}\n",
                                   "    - {start_day: 150, end_day: 160, height_m: 1.0}\n"
                                   "  surcharge: {start_day: 170, end_day: 175, height_m: 1.0, removal_day: 300}\n");
    text = text.replace(text.find("finished_height_m: 5.0"), 22, "finished_height_m: 5.0\n  top_up: after_surcharge_removal");
    const auto s = scenario::parse_scenario(text, "case.yaml");
    ASSERT_TRUE(s.top_up && s.top_up->stage);
    const LoadStage& top = s.site.loading->stages[*s.top_up->stage];
    EXPECT_DOUBLE_EQ(units::seconds_to_days(top.start_s), 300.0);
    const auto file = write_case(text);
    const auto r = run("stages " + file.string() + " --json");
    ASSERT_LE(r.exit_code, 1) << r.err;
    const auto doc = nlohmann::json::parse(r.out);
    const auto& st = doc.at("stages");
    ASSERT_EQ(st.size(), 6u);
    EXPECT_TRUE(st[4].at("surcharge").get<bool>());
    EXPECT_FALSE(st[5].at("surcharge").get<bool>());
    EXPECT_DOUBLE_EQ(st[5].at("start_day").get<double>(), 300.0);
    EXPECT_EQ(st[5].at("stage").get<int>(), 5);  // numbered as the plan's load stage (the surcharge apart)
    EXPECT_EQ(st[4].at("stage").get<int>(), 5);  // the surcharge: the number after the stages before it
    // The surcharge is off when the top-up is checked: the fill standing is the permanent load.
    EXPECT_NEAR(st[5].at("height_m").get<double>() * 19.0, doc.at("fill_to_finish").at("load_kPa").get<double>(), 1e-9);
    // Without a surcharge the rule is refused at its key.
    std::string bad = edited_copy(staged, "finished_height_m: 5.0", "finished_height_m: 5.0\n  top_up: after_surcharge_removal");
    try {
        scenario::parse_scenario(bad, "case.yaml");
        ADD_FAILURE() << "accepted";
    } catch (const scenario::ScenarioError& e) {
        EXPECT_EQ(e.key_path(), "embankment.top_up") << e.what();
        EXPECT_GT(e.mark().line, 0);
    }
}

// The effective-stress check beside the total-stress one: every stage reports both; with the cell
// model's excess pore pressure the effective factor of safety rises as the clay consolidates under
// the full fill; c′ and φ′ go together, in every layer or none.
TEST(StagesCommand, EffectiveStressCheckRisesAsTheClayConsolidates) {
    std::string text = slurp(source(staged));
    for (const char* layer_end : {"su_gradient_kPa_per_m: -4.0}", "cr: 0.11, ocr: 1.5, su_ratio: 0.25}",
                                  "cr: 0.09, ocr: 1.3, su_ratio: 0.25}"}) {
        const auto at = text.find(layer_end);
        ASSERT_NE(at, std::string::npos) << layer_end;
        text.insert(at + std::string(layer_end).size() - 1, ", c_prime_kPa: 2.0, phi_prime_deg: 26.0");
    }
    const fs::path file = write_case(text);
    const auto r = run("stages " + file.string() + " --json --drain band-100x4 --pattern triangular --spacing 1.2");
    ASSERT_LE(r.exit_code, 1) << r.err;
    const auto doc = nlohmann::json::parse(r.out);
    for (const auto& st : doc["stages"]) {
        EXPECT_TRUE(st["effective_factor_of_safety"].is_number()) << st.dump();
        EXPECT_GT(st["effective_factor_of_safety"].get<double>(), 0.0);
    }
    const auto table = run("stages " + file.string() + " --drain band-100x4 --pattern triangular --spacing 1.2");
    EXPECT_NE(table.out.find("effective-stress FS"), std::string::npos);
    // Under the full schedule, later: less excess pore pressure, a higher effective factor of safety.
    const auto s = scenario::parse_scenario(text, "e.yaml");
    Site site = s.site;
    site.embankment->height_m = final_fill_height_m(site);
    const auto model = make_cell_model(site, site.product("band-100x4"), Pattern::triangular, 1.2);
    double last = 0.0;
    for (const double day : {165.0, 250.0, 400.0, 1000.0}) {
        const SlopeModel m = stage_slope_model(site, *model, units::days_to_seconds(day), StrengthField::tabulated,
                                               StressBasis::effective);
        const double fs = critical_circle(m).factor_of_safety;
        EXPECT_GT(fs, last) << "day " << day;
        last = fs;
    }
    // Without c′ and φ′ the check is not made; in some layers only, refused at the layer without.
    const auto plain = run("stages " + source(staged) + " --json --drain band-100x4 --pattern triangular --spacing 1.2");
    EXPECT_TRUE(nlohmann::json::parse(plain.out)["stages"][0]["effective_factor_of_safety"].is_null());
    const std::string partial = edited_copy(staged, "su_gradient_kPa_per_m: -4.0}",
                                            "su_gradient_kPa_per_m: -4.0, c_prime_kPa: 2.0, phi_prime_deg: 26.0}");
    try {
        scenario::parse_scenario(partial, "p.yaml");
        ADD_FAILURE() << "partial c′, φ′ accepted";
    } catch (const scenario::ScenarioError& e) {
        EXPECT_EQ(e.key_path(), "clay.layers[1]") << e.what();
        EXPECT_NE(e.message().find("every layer"), std::string::npos) << e.what();
    }
}

TEST(StagesCommand, BadInputIsNamedAndLocated) {
    struct Row {
        std::string from, to, key, message;
    };
    const std::vector<Row> rows{
        {"crest_width_m: 30.0", "crest_width_m: 0.0", "embankment.crest_width_m", ""},
        {"side_slope_h_per_v: 2.0", "side_slope_h_per_v: -1.0", "embankment.side_slope_h_per_v", "steeper than vertical"},
        {"height_m: 2.5}]", "height_m: 7.0}]", "embankment.berms[0].height_m", "below the embankment's full height"},
        {"height_m: 2.5}]", "height_m: 2.5}, {width_m: 5.0, height_m: 3.0}]", "embankment.berms[1].height_m",
         "below the berm before it"},
        {"height_m: 2.5}]", "height_m: 2.5, slope: 3}]", "embankment.berms[0].slope", "unknown key"},
        {"target_factor_of_safety: 1.3", "target_factor_of_safety: 0.9", "embankment.target_factor_of_safety", "at least 1"},
        {"su_top_kPa: 25.0", "su_top_kPa: 0.0", "clay.layers[0].su_top_kPa", "greater than 0"},
        {"su_gradient_kPa_per_m: -4.0", "su_gradient_kPa_per_m: -14.0", "clay.layers[0].su_gradient_kPa_per_m",
         "su must stay greater than 0"},
        {"su_ratio: 0.25}", "su_ratio: 0.25, su_top_kPa: 5}", "clay.layers[1].su_ratio", "not both"},
        {"fill_friction_angle_deg: 32.0", "fill_friction_angle_deg: 95.0", "embankment.fill_friction_angle_deg", "degrees"},
        {"fill_unit_weight_kN_per_m3: 19.0", "fill_unit_weight_kN_per_m3: 19.0\n  berm: 2", "embankment.berm",
         "unknown key"},
        {"target_factor_of_safety: 1.3", "target_factor_of_safety: 1.3\n  reinforcement: {tensile_force_kN_per_m: -50}",
         "embankment.reinforcement.tensile_force_kN_per_m", "-50 is not allowed"},
        {"target_factor_of_safety: 1.3", "target_factor_of_safety: 1.3\n  reinforcement: {tensile_force_kN_per_m: 20000}",
         "embankment.reinforcement.tensile_force_kN_per_m", "20000 is not allowed"},
        {"target_factor_of_safety: 1.3", "target_factor_of_safety: 1.3\n  reinforcement: {strength: 200}",
         "embankment.reinforcement.strength", "unknown key"},
        {"target_factor_of_safety: 1.3", "target_factor_of_safety: 1.3\n  tension_crack: {depth_m: 7.5}",
         "embankment.tension_crack.depth_m", "no deeper than the fill, 6 m"},
        {"target_factor_of_safety: 1.3", "target_factor_of_safety: 1.3\n  tension_crack: {depth_m: 0}",
         "embankment.tension_crack.depth_m", "0 is not allowed"},
        {"target_factor_of_safety: 1.3", "target_factor_of_safety: 1.3\n  tension_crack: {depth_m: 1, water_filled: yes}",
         "embankment.tension_crack.water_filled", "true or false"},
        {"su_gradient_kPa_per_m: -4.0}", "su_gradient_kPa_per_m: -4.0, c_prime_kPa: 2.0}", "clay.layers[0].c_prime_kPa",
         "give both"},
        {"su_gradient_kPa_per_m: -4.0}", "su_gradient_kPa_per_m: -4.0, c_prime_kPa: 2.0, phi_prime_deg: 75}",
         "clay.layers[0].phi_prime_deg", "75 is not allowed"},
    };
    for (const auto& row : rows) {
        std::string text = edited_copy(staged, row.from, row.to);
        if (row.key == "embankment.crest_width_m") {  // vertical sides with no crest: no section
            const auto at = text.find("side_slope_h_per_v: 2.0");
            text.replace(at, 23, "side_slope_h_per_v: 0.0");
        }
        try {
            scenario::parse_scenario(text, "case.yaml");
            ADD_FAILURE() << row.key << ": accepted";
        } catch (const scenario::ScenarioError& e) {
            EXPECT_EQ(e.key_path(), row.key) << e.what();
            EXPECT_NE(e.message().find(row.message), std::string::npos) << e.what();
            EXPECT_GT(e.mark().line, 0) << e.what();
        }
    }
    // A scenario without a section, or a layer without a strength, is refused at the key at fault.
    const auto none = run("stages " + source("demo/scenario.yaml"));
    EXPECT_EQ(none.exit_code, 2);
    EXPECT_NE(none.err.find("embankment"), std::string::npos) << none.err;
    const auto weak = write_case(edited_copy(staged, ", su_ratio: 0.25}", "}"));
    const auto missing = run("stages " + weak.string());
    EXPECT_EQ(missing.exit_code, 2);
    EXPECT_NE(missing.err.find("clay.layers[1]"), std::string::npos) << missing.err;
    EXPECT_NE(missing.err.find(":12:"), std::string::npos) << missing.err;  // the layer's line
}

// `monitor` counts creep as `design` does: readings made from the design's own cell give back the
// design's residual, primary and secondary, at the deadline.
TEST(StagesCommand, MonitorForecastCountsCreepAsDesignDoes) {
    const std::string text = creeping(", c_alpha: 0.03", "service_days: 7300, ");
    const auto s = scenario::parse_scenario(text, "c.yaml");
    const auto model = make_cell_model(s.site, s.site.products.front(), Pattern::triangular, 2.0);
    const double day = units::days_to_seconds(1.0);
    std::string csv = "plate,day,settlement_mm\n";
    for (int d = 5; d <= 150; d += 5) csv += "SP1," + std::to_string(d) + "," + std::to_string(1000.0 * *model->settlement_m(d * day)) + "\n";
    const fs::path file = write_case(text);
    std::ofstream(file.parent_path() / "plates.csv") << csv;
    const auto r = run("monitor " + file.string() + " --readings " + (file.parent_path() / "plates.csv").string() +
                       " --drain d --pattern triangular --spacing 2.0 --json");
    ASSERT_EQ(r.exit_code, 0) << r.err;
    const auto doc = nlohmann::json::parse(r.out);
    const auto& f = doc.at("plates").at(0).at("forecast");
    const auto parts = model->residual_parts(s.site.criterion.deadline_s, units::days_to_seconds(7300.0));
    EXPECT_GT(parts.secondary_m, 0.01);
    EXPECT_NEAR(f.at("residual_secondary_mm").get<double>(), 1000.0 * parts.secondary_m, 0.5);
    EXPECT_NEAR(f.at("residual_primary_mm").get<double>(), 1000.0 * parts.primary_m, 1.0);
    EXPECT_NEAR(f.at("residual_at_deadline_mm").get<double>(), 1000.0 * parts.total_m(), 1.5);
}
