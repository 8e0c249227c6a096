// Staged loading, settlement criteria and surcharge through the scenario layer and the CLI.
#include <gtest/gtest.h>

#include <nlohmann/json.hpp>

#include "cli_helpers.hpp"
#include "scenario/scenario.hpp"
#include "wickgrid/errors.hpp"
#include "wickgrid/studies.hpp"
#include "wickgrid/surcharge.hpp"
#include "wickgrid/units.hpp"

using namespace wickgrid;
using namespace wickgrid::cli_testing;
using nlohmann::json;

namespace {
const std::string staged = "configs/staged-surcharge.yaml";

std::string staged_with(const std::string& from, const std::string& to) { return edited_copy(staged, from, to); }
}  // namespace

TEST(Staged, DesignRowsAgreeWithEngineAndMeetTheResidualLimit) {
    const CommandRun r = run("design " + source(staged) + " --json");
    ASSERT_EQ(r.exit_code, 0) << r.err;
    const json doc = json::parse(r.out);
    EXPECT_EQ(doc["target"]["criterion"], "residual_settlement");
    EXPECT_EQ(doc["loading"], "staged");
    const auto s = scenario::load_scenario(source(staged));
    const Site& input = s.site;
    // Permanent load: 4 m of fill at 20 kN/m³ = 80 kPa.
    EXPECT_NEAR(input.loading->permanent_kPa(), 80.0, 1e-12);
    const double ultimate = ultimate_settlement_m(*input.ground.profile, 80.0);
    for (const auto& row : doc["designs"]) {
        ASSERT_TRUE(row["feasible"].get<bool>());
        EXPECT_NEAR(row["ultimate_settlement_mm"].get<double>(), ultimate * 1000.0, 1e-9);
        EXPECT_LE(row["residual_settlement_mm"].get<double>(), 60.0 + 1e-9);
        const Pattern p = row["pattern"] == "square" ? Pattern::square : Pattern::triangular;
        // Just beyond the limit the residual exceeds 60 mm; just inside it does not.
        for (double delta : {-1e-4, 1e-4}) {
            // By hand from the engine's pieces: the cell's step response superposed over the load history.
            const UnitCell cell(closed_form_cell(input, input.products[0], p, row["spacing_limit_m"].get<double>() + delta));
            const SettlementHistory history(ultimate_settlement_function(input), *input.loading,
                                            [&cell](double t) { return cell.at(t).combined; });
            const double residual = history.residual_m(input.criterion.deadline_s, input.criterion.residual()->service_s);
            if (delta < 0) EXPECT_LE(residual, 0.060);
            else EXPECT_GT(residual, 0.060);
        }
    }
}

TEST(Staged, OneInstantStageEqualsTheStepDesign) {
    // A single instantaneous stage at day 0 is the step loading of the plain design.
    const std::string text = slurp(source("demo/scenario.yaml"));
    const auto plain = scenario::parse_scenario(text, "plain.yaml");
    const auto loaded = scenario::parse_scenario(text + "\nloading:\n  stages:\n    - {start_day: 0, pressure_kPa: 50}\n", "loaded.yaml");
    const auto a = run_design(plain.site), b = run_design(loaded.site);
    for (std::size_t i = 0; i < a.rows.size(); ++i) {
        EXPECT_NEAR(a.rows[i].spacing_limit_m, b.rows[i].spacing_limit_m, 2e-7);
        EXPECT_EQ(a.rows[i].spacing_m, b.rows[i].spacing_m);
        EXPECT_NEAR(a.rows[i].at_deadline.combined, b.rows[i].at_deadline.combined, 1e-12);
        // mv·q·H for the single-layer clay: 0.0008 × 50 × 14 = 0.56 m.
        EXPECT_NEAR(*b.rows[i].ultimate_settlement_m, 0.56, 1e-12);
    }
}

TEST(Staged, SurchargePressureAndRemovalDayAreInverse) {
    const auto s = scenario::load_scenario(source(staged));
    const SurchargeCell cell{s.site, s.site.products[0], Pattern::square, 1.5};
    Surcharge timing = *s.site.loading->surcharge;
    const SurchargeResult sized = surcharge_for_removal(cell, timing);
    ASSERT_TRUE(sized.needed);
    EXPECT_NEAR(sized.settlement_at_removal_m, sized.final_m, 1e-9);
    timing.pressure_kPa = sized.pressure_kPa;
    const SurchargeResult back = removal_for_surcharge(cell, timing);
    EXPECT_NEAR(units::seconds_to_days(back.removal_s), units::seconds_to_days(s.site.loading->surcharge->removal_s), 1e-3);
    // More surcharge, earlier removal.
    timing.pressure_kPa = 2.0 * sized.pressure_kPa;
    EXPECT_LT(removal_for_surcharge(cell, timing).removal_s, back.removal_s);
}

TEST(Staged, SurchargeCommandWarnsAboveTheLimit) {
    const CommandRun r = run("surcharge " + source(staged) +
                             " --drain band-100x4 --pattern triangular --spacing 1.6 --max-height 1.0 --json");
    ASSERT_EQ(r.exit_code, 0) << r.err;
    const json doc = json::parse(r.out);
    EXPECT_TRUE(doc["exceeds_limit"].get<bool>());
    EXPECT_NE(r.err.find("exceeds the limit"), std::string::npos);
    EXPECT_NEAR(doc["surcharge_height_m"].get<double>() * 20.0, doc["surcharge_kPa"].get<double>(), 1e-9);
    EXPECT_EQ(doc["ignores"].size(), 3u);
    const CommandRun none = run("surcharge " + source("demo/scenario.yaml") + " --drain band-100x4 --pattern square --spacing 1");
    EXPECT_EQ(none.exit_code, 2);
    EXPECT_NE(none.err.find("loading"), std::string::npos);
}

TEST(Staged, CurveHasSettlement) {
    const CommandRun r = run("curve " + source(staged) + " --drain band-100x4 --pattern square --spacing 1.5 --at-days 0,100,300 --json");
    ASSERT_EQ(r.exit_code, 0) << r.err;
    const json points = json::parse(r.out)["points"];
    EXPECT_EQ(points[0]["settlement_mm"].get<double>(), 0.0);
    EXPECT_GT(points[2]["settlement_mm"].get<double>(), points[1]["settlement_mm"].get<double>());
    const CommandRun csv = run("curve " + source(staged) + " --drain band-100x4 --pattern square --spacing 1.5 --points 3 --csv");
    EXPECT_EQ(csv.out.rfind("time_days,degree_vertical,degree_radial,degree,settlement_mm\n", 0), 0u);
}

TEST(Staged, LoadingAndLayerErrorsAreLocated) {
    struct Row {
        const char* what;
        std::string from, to, key_path, message;
    };
    const std::vector<Row> rows{
        {"stage without load", "{start_day: 45, end_day: 60, height_m: 1.5}", "{start_day: 45, end_day: 60}",
         "loading.stages[1]", "'height_m' or 'pressure_kPa'"},
        {"height without fill weight", "fill_unit_weight_kN_per_m3: 20.0\n", "", "loading.stages[0].height_m",
         "fill_unit_weight_kN_per_m3"},
        {"end before start", "{start_day: 90, end_day: 100, height_m: 1.0}", "{start_day: 90, end_day: 80, height_m: 1.0}",
         "loading.stages[2].end_day", "not before start_day"},
        {"removal before end", "removal_day: 250", "removal_day: 115", "loading.surcharge.removal_day", "after end_day"},
        {"both criteria", "  residual_settlement_mm: 60", "  degree: 0.9\n  residual_settlement_mm: 60",
         "target.residual_settlement_mm", "not both"},
        {"surcharge without removal", ", removal_day: 250", "", "loading.surcharge.removal_day", "missing key 'removal_day'"},
        {"misspelt loading key", "  surcharge: {", "  surcharges: {", "loading.surcharges", "did you mean 'surcharge'"},
        {"cr above cc", "cc: 0.45, cr: 0.06", "cc: 0.45, cr: 0.6", "clay.layers[0].cr", "must not exceed cc"},
        {"ocr below one", "cr: 0.11, ocr: 1.2}", "cr: 0.11, ocr: 0.8}", "clay.layers[1].ocr", "at least 1"},
        {"missing preconsolidation", "cr: 0.11, ocr: 1.2}", "cr: 0.11}", "clay.layers[1]", "'preconsolidation_kPa', 'ocr' or 'pop_kPa'"},
        {"OCR and POP", "cr: 0.11, ocr: 1.2}", "cr: 0.11, ocr: 1.2, pop_kPa: 10}", "clay.layers[1].pop_kPa", "not both 'ocr' and 'pop_kPa'"},
        {"negative POP", "cr: 0.11, ocr: 1.2}", "cr: 0.11, pop_kPa: -5}", "clay.layers[1].pop_kPa", "0 to 1000"},
        {"thickness mismatch", "  groundwater_depth_m: 0.8", "  groundwater_depth_m: 0.8\n  thickness_m: 15", "clay.thickness_m",
         "sum of the layer thicknesses"},
        {"under-consolidated", "cr: 0.09, ocr: 1.1}", "cr: 0.09, preconsolidation_kPa: 40}",
         "clay.layers[2].preconsolidation_kPa", "below the in-situ effective stress"},
    };
    for (const auto& row : rows) {
        try {
            scenario::parse_scenario(staged_with(row.from, row.to), "case.yaml");
            ADD_FAILURE() << row.what << ": accepted";
        } catch (const scenario::ScenarioError& e) {
            EXPECT_EQ(e.key_path(), row.key_path) << row.what << ": " << e.what();
            EXPECT_NE(e.message().find(row.message), std::string::npos) << row.what << ": " << e.what();
            EXPECT_GT(e.mark().line, 0) << row.what;
        }
    }
    // A residual criterion with no loading at all is refused at the criterion.
    const std::string no_loading = slurp(source("demo/scenario.yaml"));
    std::string text = no_loading;
    text.replace(text.find("  degree: 0.90"), std::string("  degree: 0.90").size(), "  residual_settlement_mm: 50");
    try {
        scenario::parse_scenario(text, "case.yaml");
        FAIL();
    } catch (const scenario::ScenarioError& e) {
        EXPECT_EQ(e.key_path(), "target.residual_settlement_mm");
        EXPECT_NE(e.message().find("needs a 'loading' block"), std::string::npos) << e.what();
    }
}

TEST(Staged, StudiesHonourTheCriterionAndLoading) {
    const auto s = scenario::load_scenario(source(staged));
    const Site& input = s.site;
    const DesignResult base = run_design(input);
    const auto rows = tornado_study(input, base, {{StudyInput::smear_permeability_ratio, 2.0, 4.0}});
    for (const auto& t : rows) {
        const DesignResult direct = run_design(with_input(input, t.input, t.high_si));
        for (const auto& r : direct.rows) {
            if (r.pattern == t.pattern) {
                EXPECT_EQ(r.spacing_limit_m, t.at_high.spacing_m);
            }
        }
    }
    // Monte Carlo on the staged, residual-criterion site: with the input held at its scenario value
    // (a zero-width distribution) every sample is the design itself, so each meets the criterion at
    // the chosen spacing and the reliability spacing is the design's limit.
    MonteCarloSpec mc;
    mc.samples = 12;
    mc.threads = 2;
    mc.inputs = {{StudyInput::smear_permeability_ratio, {DistributionKind::uniform, 3.0, 3.0}}};
    const MonteCarloResult result = monte_carlo(input, base, mc);
    ASSERT_EQ(result.rows.size(), base.rows.size());
    for (std::size_t k = 0; k < base.rows.size(); ++k) {
        EXPECT_EQ(result.rows[k].probability, 1.0);
        EXPECT_EQ(result.rows[k].unevaluated, 0u);
        ASSERT_TRUE(result.rows[k].reliability_spacing_m.has_value());
        EXPECT_NEAR(*result.rows[k].reliability_spacing_m, base.rows[k].spacing_limit_m, 1e-9);
    }
    mc.samples = 20000;  // beyond the search budget of a staged site: refused by name
    EXPECT_THROW(monte_carlo(input, base, mc), InputError);
}

// POP: σ'p = σ'v0 + POP at each slice. One slice of a 2 m layer under water: σ'v0 = (18 − 9.81)·1 =
// 8.19 kPa at mid-layer, σ'p = 28.19 kPa; under 50 kPa the e–log settlement by hand is
// H/(1 + e0)·[Cr·log10(σ'p/σ'v0) + Cc·log10((σ'v0 + Δσ)/σ'p)] (the one-dimensional e–log settlement of
// an over-consolidated layer loaded past σ'p; common practice, in every soil mechanics text).
TEST(Staged, PopRaisesThePreconsolidationAboveTheInSituStress) {
    auto text = [](const std::string& preconsolidation) {
        return "schema: 1\ntarget: {degree: 0.9, deadline_days: 180}\n"
               "clay:\n  groundwater_depth_m: 0.0\n  slices_per_layer: 1\n  cv_m2_per_year: 1.0\n  ch_m2_per_year: 3.0\n"
               "  kh_m_per_s: 1.0e-9\n  vertical_drainage: both_faces\n  layers:\n"
               "    - {thickness_m: 2.0, unit_weight_kN_per_m3: 18.0, e0: 1.5, cc: 0.5, cr: 0.05, " +
               preconsolidation + "}\n"
               "loading:\n  stages:\n    - {start_day: 0, end_day: 0, pressure_kPa: 50}\n"
               "drains: [{name: d, equivalent_diameter_mm: 66, discharge_capacity_m3_per_year: 100}]\n"
               "installation: {mandrel_diameter_mm: 90, smear_diameter_ratio: 2.0, smear_permeability_ratio: 3.0}\n"
               "spacing: {min_m: 0.8, max_m: 3.0}\n";
    };
    const double s0 = (18.0 - units::gamma_w_kN_per_m3) * 1.0, sp = s0 + 20.0;
    const double hand = 2.0 / 2.5 * (0.05 * std::log10(sp / s0) + 0.5 * std::log10((s0 + 50.0) / sp));
    const auto pop = scenario::parse_scenario(text("pop_kPa: 20"), "pop.yaml");
    EXPECT_NEAR(ultimate_settlement_function(pop.site)(50.0), hand, 1e-12);
    char given[64];
    std::snprintf(given, sizeof given, "preconsolidation_kPa: %.17g", sp);
    const auto direct = scenario::parse_scenario(text(given), "sp.yaml");
    EXPECT_NEAR(ultimate_settlement_function(direct.site)(50.0), hand, 1e-12);
    EXPECT_NEAR(hand, 0.14737, 5e-5);  // the same by calculator
}
