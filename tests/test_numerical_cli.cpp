// The numerical method through scenarios and the CLI: design with layers and partial drains, verify.
#include <gtest/gtest.h>

#include <nlohmann/json.hpp>

#include "cli_helpers.hpp"
#include "scenario/scenario.hpp"
#include "wickgrid/units.hpp"

using namespace wickgrid;
using namespace wickgrid::cli_testing;
using nlohmann::json;

TEST(NumericalMethod, LayeredPartialDesignMeetsTheTarget) {
    const std::string file = source("configs/layered-partial-numerical.yaml");
    const CommandRun r = run("design " + file + " --json");
    ASSERT_EQ(r.exit_code, 0) << r.err;
    const json doc = json::parse(r.out);
    EXPECT_EQ(doc["method"], "numerical");
    const auto s = scenario::load_scenario(file);
    const Site& input = s.site;
    const NumericalCellSpec spec = numerical_cell_spec(input, input.products[0], Pattern::square, 1.5);
    ASSERT_EQ(spec.layers.size(), 2u);
    EXPECT_NEAR(spec.layers[1].ch_m2_per_s * units::seconds_per_year, 4.0, 1e-12);
    for (const auto& row : doc["designs"]) {
        const Pattern p = row["pattern"] == "square" ? Pattern::square : Pattern::triangular;
        // The degree of the numerical cell itself (its own march, interpolated at the deadline).
        auto degree = [&](double spacing) {
            const NumericalCell cell(numerical_cell_spec(input, input.products[0], p, spacing), input.method.mesh);
            const auto states = cell.march(input.criterion.deadline_s);
            std::size_t k = 0;
            while (states[k + 1].time_s <= input.criterion.deadline_s) ++k;
            const double w = (input.criterion.deadline_s - states[k].time_s) / (states[k + 1].time_s - states[k].time_s);
            return states[k].degree_settlement + w * (states[k + 1].degree_settlement - states[k].degree_settlement);
        };
        EXPECT_NEAR(degree(row["spacing_m"].get<double>()), row["degree"].get<double>(), 1e-12);
        EXPECT_GE(row["degree"].get<double>(), 0.8);
        EXPECT_LT(degree(row["spacing_limit_m"].get<double>() + 1e-3), 0.8);
    }
}

TEST(NumericalMethod, FullDrainsUniformClayCloseToTheClosedForm) {
    const std::string text = slurp(source("demo/scenario.yaml"));
    const auto analytical = scenario::parse_scenario(text, "a.yaml");
    const auto numerical = scenario::parse_scenario(text + "\nmethod: numerical\n", "n.yaml");
    const auto a = run_design(analytical.site), n = run_design(numerical.site);
    for (std::size_t i = 0; i < a.rows.size(); ++i)
        EXPECT_NEAR(n.rows[i].spacing_limit_m / a.rows[i].spacing_limit_m, 1.0, 0.03) << i;  // equal vs free strain
}

TEST(NumericalMethod, VerifyReportsDifferencesAndWarns) {
    const CommandRun r = run("verify " + source("demo/scenario.yaml") + " --json --radial-cells 20 --vertical-cells 40");
    ASSERT_EQ(r.exit_code, 0) << r.err;
    const json doc = json::parse(r.out);
    ASSERT_EQ(doc["rows"].size(), 4u);
    for (const auto& row : doc["rows"]) {
        EXPECT_LT(row["max_difference"].get<double>(), 0.02);
        EXPECT_FALSE(row["warning"].get<bool>());
        EXPECT_GT(row["plane_strain_kh_m_per_s"].get<double>(), 0.0);
        EXPECT_EQ(row["points"].size(), 25u);
    }
    const CommandRun strict = run("verify " + source("demo/scenario.yaml") + " --threshold 0.0001 --radial-cells 10 --vertical-cells 20");
    EXPECT_EQ(strict.exit_code, 0);
    EXPECT_NE(strict.err.find("differ by"), std::string::npos) << strict.err;
    EXPECT_NE(strict.out.find("WARNING"), std::string::npos);
}

// On a surcharged job `verify` names the cause of each difference by when it happens: after the
// removal (the design holds settlement, the reference swells) or while loading; and gives the largest
// difference up to the removal, where the two models compare like with like.
TEST(NumericalMethod, VerifyNamesTheCauseByTheLoadHistory) {
    const CommandRun r = run("verify " + source("configs/staged-surcharge.yaml") + " --json --radial-cells 16 --vertical-cells 24");
    ASSERT_EQ(r.exit_code, 0) << r.err;
    const json doc = json::parse(r.out);
    for (const auto& row : doc["rows"]) {
        EXPECT_DOUBLE_EQ(row["unloading_day"].get<double>(), 250.0);  // the surcharge's removal_day
        EXPECT_LE(row["max_difference_while_loading"].get<double>(), row["max_difference"].get<double>());
        const bool after = row["at_day"].get<double>() > 250.0;
        EXPECT_EQ(row["cause"].get<std::string>().find(after ? "after the unloading on day 250" : "while loading"), 0u)
            << row["cause"] << " at day " << row["at_day"];
    }
    const CommandRun demo = run("verify " + source("demo/scenario.yaml") + " --json --radial-cells 10 --vertical-cells 20");
    ASSERT_EQ(demo.exit_code, 0) << demo.err;
    const json demo_doc = json::parse(demo.out);  // held: a range-for over a temporary's member dangles
    for (const auto& row : demo_doc["rows"]) {
        EXPECT_TRUE(row["unloading_day"].is_null());
        EXPECT_DOUBLE_EQ(row["max_difference_while_loading"].get<double>(), row["max_difference"].get<double>());
    }
}

TEST(NumericalMethod, ScenarioErrorsNameTheMethod) {
    const std::string demo = slurp(source("demo/scenario.yaml"));
    struct Row {
        std::string text, key, message;
    };
    std::string partial = demo;
    partial.replace(partial.find("drain_length_m: 14.0"), 20, "method: analytical\ndrain_length_m: 10.0");
    const std::string layered = slurp(source("configs/layered-partial-numerical.yaml"));
    std::string analytical_layers = layered;
    analytical_layers.replace(analytical_layers.find("method: numerical"), 17, "method: analytical");
    std::string bad_method = layered;
    bad_method.replace(bad_method.find("method: numerical"), 17, "method: numerics");
    const std::vector<Row> rows{
        {partial, "drain_length_m", "need 'method: layered_series' or 'method: numerical'"},
        {analytical_layers, "clay.layers[0]", "need 'method: layered_series' or 'method: numerical'"},
        {bad_method, "method", "did you mean 'numerical'"},
        {layered + "\nnumerical_mesh_extra: 1\n", "numerical_mesh_extra", "did you mean 'numerical_mesh'"},
    };
    for (const auto& row : rows) {
        try {
            scenario::parse_scenario(row.text, "case.yaml");
            ADD_FAILURE() << row.key << ": accepted";
        } catch (const scenario::ScenarioError& e) {
            EXPECT_EQ(e.key_path(), row.key) << e.what();
            EXPECT_NE(e.message().find(row.message), std::string::npos) << e.what();
        }
    }
}
