// The site model behind every command: the cell-model interface, the typed criterion, the defects
// the single model removes, and the error kinds (each with the exit code the README lists).
#include <gtest/gtest.h>

#include <boost/math/constants/constants.hpp>
#include <nlohmann/json.hpp>

#include "cli_helpers.hpp"
#include "report/svg_chart.hpp"
#include "results/design_record.hpp"
#include "scenario/scenario.hpp"
#include "wickgrid/errors.hpp"
#include "wickgrid/names.hpp"
#include "wickgrid/units.hpp"

using namespace wickgrid;
using namespace wickgrid::cli_testing;
using nlohmann::json;

namespace {
const auto edited = edited_copy;
}  // namespace

TEST(SiteModel, CarrilloHoldsAtEveryCurvePointAfterSurchargeRemoval) {
    // Staged loading with a surcharge removed on day 250: Uv, Ur and U stay consistent, by
    // construction of Ur, for the closed form and for the numerical cell alike.
    for (const char* method : {"", "\nmethod: numerical\nnumerical_mesh: {radial_cells: 12, vertical_cells: 24}\n"}) {
        const auto s = scenario::parse_scenario(slurp(source("configs/staged-surcharge.yaml")) + method, "case.yaml");
        const auto model = make_cell_model(s.site, s.site.products[0], Pattern::square, 1.5);
        std::vector<double> times;
        for (int d = 0; d <= 600; d += 10) times.push_back(units::days_to_seconds(d));
        for (const auto& p : degree_curve(*model, times)) {
            const Degrees& d = p.degrees;
            EXPECT_NEAR(1.0 - d.combined, (1.0 - d.vertical) * (1.0 - d.radial), 1e-12) << p.time_s;
            EXPECT_GE(d.combined + 1e-12, d.vertical) << p.time_s;
        }
    }
}

TEST(SiteModel, ShortServicePeriodIsNotAcceptedSilently) {
    // 30 days of service on a slow clay: most of the primary settlement comes after the period.
    const std::string text = edited("configs/residual-settlement.yaml", "  residual_settlement_mm: 50\n",
                                    "  residual_settlement_mm: 50\n  service_days: 30\n");
    const auto s = scenario::parse_scenario(text, "case.yaml");
    const auto record = results::design_record(s);
    for (const auto& row : record.result.rows) {
        ASSERT_TRUE(row.settlement_after_service_m.has_value());
        if (*row.settlement_after_service_m > 0.050) {
            ASSERT_EQ(row.warnings.size(), 1u);
            EXPECT_NE(row.warnings[0].find("after the 30-day service period"), std::string::npos) << row.warnings[0];
        }
    }
    ASSERT_FALSE(record.warnings.empty());
    const fs::path file = write_case(text);
    const CommandRun r = run("design " + file.string());
    EXPECT_NE(r.out.find("WARNING:"), std::string::npos) << r.out;
    EXPECT_NE(r.out.find("over 30 days of service"), std::string::npos);  // the note says over what period
    fs::remove_all(file.parent_path());
}

TEST(SiteModel, LayeredNumericalNeedsNoClayWideCoefficients) {
    // configs/layered-staged-numerical.yaml gives cv and ch per layer only, and no kh.
    const auto s = scenario::load_scenario(source("configs/layered-staged-numerical.yaml"));
    EXPECT_FALSE(s.site.ground.cv_m2_per_s.has_value());
    EXPECT_FALSE(s.site.ground.kh_m_per_s.has_value());
    const DrainProductSpec& product = s.site.products[0];
    const auto model = make_cell_model(s.site, product, Pattern::triangular, 1.2);
    // μ is the depth mean of Hansbo's (1981) μ(z) = μs + π z(2l − z) kh(z)/qw with each layer's
    // kh = ch·mv·γw: by hand, ∫ z(2l − z) dz = l z² − z³/3 over each layer, top outlet, l = L.
    const NumericalCellSpec spec = numerical_cell_spec(s.site, product, Pattern::triangular, 1.2);
    const double pi = boost::math::double_constants::pi, L = spec.drain_length_m, qw = spec.discharge_capacity_m3_per_s;
    const auto F = [&](double z) { return L * z * z - z * z * z / 3.0; };
    double top = 0.0, well = 0.0;
    for (const auto& layer : spec.layers) {
        const double kh = layer.ch_m2_per_s * layer.mv_m2_per_kN * units::gamma_w_kN_per_m3;
        well += pi * kh / qw * (F(top + layer.thickness_m) - F(top));
        top += layer.thickness_m;
    }
    const CellFigures& f = model->figures();
    EXPECT_NEAR(f.mu_depth_mean, f.mu_smear + well / L, 1e-6 * f.mu_depth_mean);
    // A closed form asked of the same ground is refused by name (not by blaming the spacing).
    Site closed = s.site;
    closed.method.method = CellMethod::closed_form;
    const auto why = method_refusal(closed);
    ASSERT_TRUE(why.has_value());
    EXPECT_EQ(why->part, MethodRefusal::Part::layer_coefficients);
}

TEST(SiteModel, LayerWithoutCoefficientsIsLocated) {
    const std::string text = edited("configs/layered-staged-numerical.yaml",
                                    "mv_m2_per_kN: 0.0001, cv_m2_per_year: 40.0, ch_m2_per_year: 60.0}",
                                    "mv_m2_per_kN: 0.0001}");
    try {
        scenario::parse_scenario(text, "case.yaml");
        FAIL();
    } catch (const scenario::ScenarioError& e) {
        EXPECT_EQ(e.key_path(), "clay.cv_m2_per_year") << e.what();  // needed by the layer without its own
        EXPECT_GT(e.mark().line, 0);
    }
}

TEST(SiteModel, DischargeCapacityWithSeveralProductsIsLocated) {
    const std::string text = edited("demo/scenario.yaml", "    discharge_capacity_factor: [0.25, 2.5]",
                                    "    discharge_capacity_m3_per_year: [40, 400]");
    try {
        scenario::parse_scenario(text, "case.yaml");
        FAIL();
    } catch (const scenario::ScenarioError& e) {
        EXPECT_EQ(e.key_path(), "studies.tornado.discharge_capacity_m3_per_year");
        EXPECT_NE(e.message().find("discharge_capacity_factor"), std::string::npos) << e.what();
        EXPECT_GT(e.mark().line, 0);
    }
}

TEST(SiteModel, SweepNamesTheResidualCriterion) {
    const CommandRun r = run("sweep " + source("configs/staged-surcharge.yaml") + " --only tornado");
    EXPECT_EQ(r.exit_code, 2);  // the file has no tornado block: a usage error, named
    EXPECT_NE(r.err.find("--only tornado"), std::string::npos) << r.err;
    EXPECT_EQ(r.err.find(":1:1"), std::string::npos) << r.err;
    const fs::path file = write_case(slurp(source("configs/staged-surcharge.yaml")) +
                                     "studies:\n  tornado:\n    smear_permeability_ratio: [2, 4]\n");
    const CommandRun t = run("sweep " + file.string() + " --only tornado");
    ASSERT_EQ(t.exit_code, 0) << t.err;
    EXPECT_NE(t.out.find("criterion: residual settlement at most 60 mm"), std::string::npos) << t.out;
    EXPECT_EQ(t.out.find("target U"), std::string::npos);
    EXPECT_EQ(t.out.find("(U "), std::string::npos) << "a settlement measure is never labelled U";
    EXPECT_NE(t.out.find("(residual "), std::string::npos);
    const json doc = json::parse(run("sweep " + file.string() + " --only tornado --json").out);
    EXPECT_EQ(doc["target"]["criterion"], "residual_settlement");
    EXPECT_TRUE(doc["tornado"][0].contains("residual_settlement_low_mm"));
    EXPECT_FALSE(doc["tornado"][0].contains("degree_low"));
    fs::remove_all(file.parent_path());
}

TEST(SiteModel, ErrorKindsHaveTheirOwnExitCodesAndNoInventedLocations) {
    struct Case {
        const char* what;
        std::string args;
        int exit_code;
        std::string present, absent;
    };
    const std::string demo = source("demo/scenario.yaml"), staged = source("configs/staged-surcharge.yaml");
    const fs::path no_surcharge = write_case(edited("configs/staged-surcharge.yaml",
                                                    "  surcharge: {height_m: 1.0, start_day: 110, end_day: 120, removal_day: 250, max_height_m: 2.0}\n",
                                                    ""));
    const std::vector<Case> cases{
        {"usage: a required option the file cannot stand in for",
         "surcharge " + no_surcharge.string() + " --drain band-100x4 --pattern square --spacing 1.5", 2,
         "--removal-day: is required", "= 0"},
        {"bad input without a line: a block the file does not have",
         "surcharge " + demo + " --drain band-100x4 --pattern square --spacing 1.5", 2, "loading: surcharge design needs",
         ":1:1"},
        {"criterion that cannot be reached",
         "surcharge " + staged + " --drain band-100x4 --pattern square --spacing 3.0 --removal-day 121", 5,
         "no surcharge below 5000 kPa", "unexpected"},
        {"Monte Carlo of a staged site", "sweep " + staged + " --only grid --json", 0, "", "error"},
    };
    for (const auto& c : cases) {
        const CommandRun r = run(c.args);
        EXPECT_EQ(r.exit_code, c.exit_code) << c.what << "\n" << r.err;
        EXPECT_NE(r.err.find(c.present), std::string::npos) << c.what << "\n" << r.err;
        EXPECT_EQ(r.err.find(c.absent), std::string::npos) << c.what << "\n" << r.err;
    }
    fs::remove_all(no_surcharge.parent_path());
}

TEST(SiteModel, EveryChoiceHasOneNameEachWay) {
    // Each table: names unique, each name reads back to its value (the YAML reader, the command line
    // and the writers all use these tables).
    auto check = [](const auto& table) {
        std::set<std::string_view> seen;
        for (const auto& row : table) {
            EXPECT_FALSE(row.name.empty());
            EXPECT_TRUE(seen.insert(row.name).second) << row.name;
            EXPECT_EQ(value_of(table, row.name), row.value);
            EXPECT_EQ(name_of(table, row.value), row.name);
        }
    };
    check(pattern_names);
    check(drainage_names);
    check(outlet_names);
    check(equivalent_diameter_names);
    check(smear_shape_names);
    check(radial_theory_names);
    check(cell_method_names);
    check(criterion_names);
    check(ranking_names);
    check(study_input_names);
    check(distribution_names);
    // The contract names the scenario schema and JSON use (extend, never rename).
    EXPECT_EQ(to_string(CellMethod::closed_form), "analytical");
    EXPECT_EQ(to_string(StudyInput::discharge_capacity), "discharge_capacity_m3_per_year");
    EXPECT_EQ(to_string(CriterionKind::residual_settlement), "residual_settlement");
}

TEST(SiteModel, RangeChartDrawsNoBarFromAMissingEnd) {
    report::RangeChart c;
    c.title = "t";
    c.x_label = "required spacing (m)";
    c.base = 1.2;
    c.bars = {{"ch_m2_per_year", std::nullopt, 1.5, "0.5", "8"}, {"smear_permeability_ratio", 1.0, 1.4, "2", "4"}};
    const std::string svg = report::render(c);
    std::size_t rects = 0;
    const std::string bar = "fill-opacity=\"0.75\"";  // how a range bar is drawn
    for (std::size_t at = svg.find(bar); at != std::string::npos; at = svg.find(bar, at + 1)) ++rects;
    EXPECT_EQ(rects, 1u) << "one bar only: the input with both ends feasible";
    EXPECT_NE(svg.find("low: no feasible spacing"), std::string::npos);
}

TEST(SiteModel, EveryCsvQuotesPerRfc4180) {
    // A drain name with a comma and quotes stays one field in the design and study CSVs.
    const std::string text = edited("demo/scenario.yaml", "  - name: band-100x4\n", "  - name: 'band, \"A\" 100x4'\n");
    const fs::path file = write_case(text);
    const std::string quoted = "\"band, \"\"A\"\" 100x4\",";
    const CommandRun design = run("design " + file.string() + " --csv");
    ASSERT_EQ(design.exit_code, 0) << design.err;
    EXPECT_NE(design.out.find("\n" + quoted + "triangular,"), std::string::npos) << design.out;
    const CommandRun tornado = run("sweep " + file.string() + " --only tornado --csv");
    ASSERT_EQ(tornado.exit_code, 0) << tornado.err;
    EXPECT_NE(tornado.out.find("\n" + quoted + "triangular,"), std::string::npos) << tornado.out;
    const CommandRun grid = run("sweep " + file.string() + " --only grid --csv");
    EXPECT_NE(grid.out.find("\n" + quoted + "triangular,"), std::string::npos);
    const CommandRun mc = run("sweep " + file.string() + " --only monte_carlo --csv --samples 100");
    EXPECT_NE(mc.out.find("\n" + quoted + "triangular,"), std::string::npos) << mc.err;
    fs::remove_all(file.parent_path());
}

TEST(SiteModel, MonteCarloSamplesTheNumericalCell) {
    // The layered numerical site through the generic path: inputs held at their scenario values
    // reproduce the design in every sample (probability 1, reliability spacing = the limit).
    const auto s = scenario::load_scenario(source("configs/layered-partial-numerical.yaml"));
    const DesignResult base = run_design(s.site);
    MonteCarloSpec mc;
    mc.samples = 3;
    mc.inputs = {{StudyInput::smear_permeability_ratio, {DistributionKind::uniform, 3.0, 3.0}}};
    const MonteCarloResult result = monte_carlo(s.site, base, mc);
    for (std::size_t k = 0; k < base.rows.size(); ++k) {
        EXPECT_EQ(result.rows[k].probability, 1.0);
        EXPECT_NEAR(*result.rows[k].reliability_spacing_m, base.rows[k].spacing_limit_m, 1e-9);
    }
    mc.samples = 1000;  // 2000 numerical searches: beyond the stated budget of 500
    EXPECT_THROW(monte_carlo(s.site, base, mc), InputError);
}
