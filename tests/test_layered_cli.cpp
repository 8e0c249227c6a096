// Layered ground and vacuum through the site model and the commands: the default method, located
// errors for bad input, and the figures the commands share.
#include <gtest/gtest.h>

#include <nlohmann/json.hpp>

#include "cli_helpers.hpp"
#include "scenario/scenario.hpp"
#include "wickgrid/cell_model.hpp"
#include "wickgrid/errors.hpp"

using namespace wickgrid;
using namespace wickgrid::cli_testing;

namespace {
const char* five = "configs/layered-five-staged.yaml";
const char* vacuum = "configs/vacuum-with-fill.yaml";
}  // namespace

TEST(LayeredSite, TheDefaultMethodFollowsTheGround) {
    // Layers with their own cv/ch, drains stopping short and a vacuum take the layered series; one
    // uniform clay with full drains keeps the closed form.
    EXPECT_EQ(scenario::load_scenario(source(five)).site.method.method, CellMethod::layered);
    EXPECT_EQ(scenario::load_scenario(source(vacuum)).site.method.method, CellMethod::layered);
    EXPECT_EQ(scenario::load_scenario(source("demo/scenario.yaml")).site.method.method, CellMethod::closed_form);
    const auto partial = scenario::parse_scenario(demo_with("drain_length_m: 14.0", "drain_length_m: 10.0"), "p.yaml");
    EXPECT_EQ(partial.site.method.method, CellMethod::layered);
    const auto chosen = scenario::parse_scenario(edited_copy(five, "schema: 1", "schema: 1\nmethod: numerical"), "n.yaml");
    EXPECT_EQ(chosen.site.method.method, CellMethod::numerical);
}

TEST(LayeredSite, BadInputIsNamedAndLocated) {
    struct Row {
        const char* file;
        std::string from, to, key, message;
    };
    const std::vector<Row> rows{
        {five, "  groundwater_depth_m: 1.0", "  thickness_m: 16.0\n  groundwater_depth_m: 1.0", "clay.thickness_m",
         "must equal the sum of the layer thicknesses, 15 m"},
        {five, "drain_outlets: top", "drain_length_m: 16.0\ndrain_outlets: top", "drain_length_m",
         "at most clay.thickness_m = 15 m"},
        {vacuum, "pressure_kPa: 70", "pressure_kPa: 120", "loading.vacuum.pressure_kPa", "one atmosphere at most"},
        {vacuum, "end_day: 250", "end_day: 40000", "loading.vacuum.end_day", "within the 100-year record"},
        {vacuum, "end_day: 250", "end_day: 5", "loading.vacuum.end_day", "after start_day"},
        {vacuum, "tip_ratio: 0.8", "tip_ratio: 1.5", "loading.vacuum.tip_ratio", "between 0 and 1"},
        {vacuum, "tip_ratio: 0.8", "tip_ratio: 0.8, pressure: 3", "loading.vacuum.pressure", "unknown key 'pressure'"},
        {"demo/scenario.yaml", "drain_length_m: 14.0",
         "drain_length_m: 14.0\nmethod: analytical\nloading:\n  vacuum: {pressure_kPa: 60, start_day: 0, end_day: 200}",
         "loading.vacuum", "'method: layered_series'"},
        {vacuum, "schema: 1", "schema: 1\nmethod: analytical", "clay.layers[0]", "'method: layered_series'"},
        {five, "schema: 1", "schema: 1\nseries_terms: 1", "series_terms", "between 2 and 400"},
        {five, "schema: 1", "schema: 1\nseries_terms: 12.5", "series_terms", "whole number"},
    };
    for (const auto& row : rows) {
        try {
            scenario::parse_scenario(edited_copy(row.file, row.from, row.to), "case.yaml");
            ADD_FAILURE() << row.key << ": accepted";
        } catch (const scenario::ScenarioError& e) {
            EXPECT_EQ(e.key_path(), row.key) << e.what();
            EXPECT_NE(e.message().find(row.message), std::string::npos) << e.what();
            EXPECT_GT(e.mark().line, 0) << e.what();
        }
    }
}

TEST(LayeredSite, VacuumAloneNeedsNoStages) {
    // Vacuum alone: no fill stages; the degree is relative to the steady state under the vacuum and
    // the settlement model gives the final settlement of its mean suction.
    std::string text = slurp(source(vacuum));
    const auto from = text.find("  stages:");
    const auto to = text.find("  vacuum:");
    text.erase(from, to - from);
    const auto s = scenario::parse_scenario(text, "v.yaml");
    const auto& product = s.site.products.front();
    const auto model = make_cell_model(s.site, product, Pattern::triangular, 1.5);
    EXPECT_GT(*model->final_settlement_m(), 0.1);
    EXPECT_NEAR(model->degree(0.0), 0.0, 1e-12);
    EXPECT_GT(model->degree(200 * 86400.0), 0.5);
    EXPECT_NEAR(model->degrees({200 * 86400.0}).front().vertical, 0.0, 1e-12);  // vacuum acts through the drains only
}

TEST(LayeredSite, VerifyGivesPlaneStrainParametersPerLayer) {
    const CommandRun r = run(std::string("verify ") + source(five) + " --json --radial-cells 12 --vertical-cells 30");
    ASSERT_EQ(r.exit_code, 0) << r.err;
    const auto j = nlohmann::json::parse(r.out);
    EXPECT_EQ(j["design_method"], "layered_series");
    for (const auto& row : j["rows"]) {
        ASSERT_EQ(row["plane_strain_layers"].size(), 5u);
        for (const auto& layer : row["plane_strain_layers"]) {
            EXPECT_GT(layer["khp_m_per_s"].get<double>(), 0.0);
            EXPECT_LT(layer["smear_khp_m_per_s"].get<double>(), layer["khp_m_per_s"].get<double>());
        }
    }
}

TEST(LayeredSite, DegreeOverDepthAgreesBetweenClosedFormAndSeriesInUniformGround) {
    // Uniform clay, staged loading, drains without well resistance: the closed form's local degree
    // (Terzaghi's isochrone × Hansbo's radial degree by Carrillo, superposed) and the layered series
    // (96 terms) solve the same equation; they agree within 2e-3 at every depth and time listed, and
    // the closed form's mean over depth is its average degree.
    std::string base = slurp(source("demo/scenario.yaml"));
    for (const char* qw : {"discharge_capacity_m3_per_year: 150", "discharge_capacity_m3_per_year: 400"})
        base.replace(base.find(qw), std::string(qw).size(), "discharge_capacity_m3_per_year: 1.0e9");
    base.replace(base.find("drain_length_m: 14.0"), 20,
                 "drain_length_m: 14.0\nloading:\n  stages:\n    - {start_day: 0, end_day: 30, pressure_kPa: 40}\n"
                 "    - {start_day: 60, pressure_kPa: 30}\n");
    const auto closed = scenario::parse_scenario(base, "c.yaml");
    const auto series = scenario::parse_scenario(base + "\nmethod: layered_series\nseries_terms: 96\n", "s.yaml");
    ASSERT_EQ(closed.site.method.method, CellMethod::closed_form);
    const auto& product = closed.site.products.front();
    const auto a = make_cell_model(closed.site, product, Pattern::triangular, 1.6);
    const auto b = make_cell_model(series.site, product, Pattern::triangular, 1.6);
    std::vector<double> depths;
    for (int i = 0; i <= 14; ++i) depths.push_back(i * 1.0);
    for (const double day : {20.0, 45.0, 90.0, 200.0}) {
        const auto pa = *a->over_depth(depths, day * 86400.0), pb = *b->over_depth(depths, day * 86400.0);
        for (std::size_t i = 0; i < depths.size(); ++i) {
            EXPECT_NEAR(pa[i].local_degree, pb[i].local_degree, 2e-3) << "day " << day << " z " << depths[i];
            EXPECT_NEAR(pa[i].excess_pore_pressure_kPa, pb[i].excess_pore_pressure_kPa, 0.15) << "day " << day;
        }
        // Mean of the local degree over depth (Simpson on 1 m slices of the 14 m clay) = U.
        std::vector<double> fine;
        for (int i = 0; i <= 280; ++i) fine.push_back(i * 0.05);
        const auto pf = *a->over_depth(fine, day * 86400.0);
        double mean = 0.0;
        for (std::size_t i = 0; i < fine.size(); ++i)
            mean += pf[i].local_degree * (i == 0 || i + 1 == fine.size() ? 1.0 : (i % 2 ? 4.0 : 2.0)) / 3.0 * 0.05 / 14.0;
        EXPECT_NEAR(mean, a->degree(day * 86400.0), 1e-4) << "day " << day;
    }
    EXPECT_THROW(a->over_depth({15.0}, 1e6), InputError);
}

TEST(LayeredSite, FastSearchAgreesWithCellModelsBuiltPerSpacing) {
    // The search's inner function prepares what does not depend on spacing once; the reference is a
    // cell model built from the site at each spacing (make_cell_model). At the limit found the
    // criterion holds and just beyond it fails, by the reference path.
    for (const char* file : {five, vacuum}) {
        const auto s = scenario::load_scenario(source(file));
        for (const auto& product : s.site.products)
            for (const Pattern pattern : {Pattern::triangular, Pattern::square}) {
                const SpacingLimit limit = spacing_limit(s.site, product, pattern);
                ASSERT_TRUE(limit.feasible && !limit.at_maximum) << file;
                EXPECT_GE(make_cell_model(s.site, product, pattern, limit.spacing_m)->margin(s.site.criterion), 0.0) << file;
                EXPECT_LT(make_cell_model(s.site, product, pattern, limit.spacing_m + 1e-6)->margin(s.site.criterion), 0.0)
                    << file;
            }
    }
}

// The layered series' study budget follows its cost, the cube of its terms: the generic 2 × 10⁴
// searches at the default 48 terms, 34 at 400 (2 × 10⁴ × (48/400)³ = 34.56, rounded down).
TEST(LayeredSeries, StudyBudgetFollowsTheTerms) {
    auto s = scenario::load_scenario(source("configs/layered-five-staged.yaml"));
    ASSERT_EQ(s.site.method.method, CellMethod::layered);
    s.site.method.series_terms = 48;
    EXPECT_DOUBLE_EQ(max_spacing_searches(s.site), 2e4);
    s.site.method.series_terms = 24;
    EXPECT_DOUBLE_EQ(max_spacing_searches(s.site), 2e4);
    s.site.method.series_terms = 400;
    EXPECT_DOUBLE_EQ(max_spacing_searches(s.site), 34.0);
}
