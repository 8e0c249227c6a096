// Monitoring back-analysis: the observational methods on records whose answer is known in closed
// form, the direct fit on synthetic records made by the engine (known ch and final settlement,
// staged fill and a surcharge, with and without noise), and hostile readings files.
#include <gtest/gtest.h>
#include <nlohmann/json.hpp>

#include <algorithm>
#include <cmath>
#include <fstream>
#include <random>

#include "cli_helpers.hpp"
#include "scenario/readings_file.hpp"
#include "scenario/scenario.hpp"
#include "wickgrid/errors.hpp"
#include "wickgrid/monitoring.hpp"
#include "wickgrid/studies.hpp"
#include "wickgrid/units.hpp"

namespace wickgrid::monitoring {
namespace {
using namespace wickgrid::cli_testing;
constexpr double day = units::seconds_per_day;

// s = S(1 − e^(−λt)) gives β1 = e^(−λΔt) and β0 = S(1 − β1) exactly (Asaoka 1978, by hand).
TEST(Asaoka, ExactOnAnExponentialRecord) {
    const double S = 0.8, lambda = 0.02 / day;
    std::vector<Reading> r;
    for (int d = 0; d <= 200; d += 5) r.push_back({d * day, S * (1.0 - std::exp(-lambda * d * day))});
    const AsaokaFit fit = asaoka(r, 50 * day, 10 * day);
    EXPECT_NEAR(fit.beta1, std::exp(-lambda * 10 * day), 1e-9);  // interpolation is exact at the readings
    EXPECT_NEAR(fit.final_settlement_m, S, 1e-6);
    EXPECT_NEAR(fit.final_settlement_se_m, 0.0, 1e-6);
    EXPECT_EQ(fit.resampled_m.size(), 16u);
    // ch back from β1 with cv = 0: 8ch/(De²μ) = λ.
    const auto ch = asaoka_ch_m2_per_s(fit.beta1, fit.interval_s, 1.5, 4.0, 0.0, 5.0);
    ASSERT_TRUE(ch.has_value());
    EXPECT_NEAR(*ch, lambda * 1.5 * 1.5 * 4.0 / 8.0, 1e-6 * *ch);
    EXPECT_FALSE(asaoka_ch_m2_per_s(fit.beta1, fit.interval_s, 1.5, 4.0, 1.0, 1.0).has_value());  // vertical alone is faster
}

TEST(Asaoka, RefusesShortOrUnsettledRecords) {
    std::vector<Reading> r{{0, 0.0}, {10 * day, 0.05}, {20 * day, 0.09}};
    EXPECT_THROW(asaoka(r, 0.0, 10 * day), EvaluationError);  // 3 points
    std::vector<Reading> linear;
    for (int d = 0; d <= 100; d += 10) linear.push_back({d * day, 0.001 * d});
    EXPECT_THROW(asaoka(linear, 0.0, 10 * day), EvaluationError);  // β1 = 1: no limit yet
    EXPECT_THROW(asaoka(linear, 0.0, -1.0), InputError);
}

// s − s0 = (t − t0)/(α + β(t − t0)) gives α and β exactly (Tan, Inoue & Lee 1991, by hand).
TEST(Hyperbolic, ExactOnAHyperbola) {
    const double alpha = 50.0 * day, beta = 2.0, s0 = 0.1;
    std::vector<Reading> r{{0, 0.0}, {30 * day, s0}};
    for (int d = 40; d <= 400; d += 20) r.push_back({d * day, s0 + (d - 30) * day / (alpha + beta * (d - 30) * day)});
    const HyperbolicFit fit = hyperbolic(r, 30 * day);
    EXPECT_NEAR(fit.beta_per_m, beta, 1e-9);
    EXPECT_NEAR(fit.alpha_s_per_m, alpha, 1e-6 * alpha);
    EXPECT_NEAR(fit.final_settlement_m, s0 + 1.0 / beta, 1e-9);
    EXPECT_THROW(hyperbolic({{0, 0}, {day, 0.01}, {2 * day, 0.02}}, 0.0), EvaluationError);
}

// A synthetic record from the engine: the staged, surcharged scenario with ch = 5.0 m²/year (the
// design says 3.5) and a final settlement 15 % above the design's.
struct Synthetic {
    scenario::Scenario s;
    double ch_true = units::per_year_to_per_second(5.0);
    double final_true = 0.0;
    std::string csv;
};

Synthetic synthetic(double noise_mm, unsigned seed, int every_days, int last_day) {
    Synthetic x{scenario::load_scenario(source("configs/staged-surcharge.yaml")), units::per_year_to_per_second(5.0), 0.0, ""};
    const auto& product = x.s.site.products.front();
    const Site truth = with_input(x.s.site, StudyInput::ch, x.ch_true);
    const auto model = make_cell_model(truth, product, Pattern::triangular, 1.5);
    x.final_true = 1.15 * *model->final_settlement_m();
    std::mt19937 rng(seed);
    std::normal_distribution<double> noise(0.0, noise_mm);
    x.csv = "plate,day,settlement_mm\n";
    for (int d = every_days; d <= last_day; d += every_days) {
        const double mm = 1000.0 * x.final_true * model->degree(d * day) + (noise_mm > 0 ? noise(rng) : 0.0);
        x.csv += "SP1," + std::to_string(d) + "," + std::to_string(mm) + "\n";
    }
    return x;
}

nlohmann::json run_monitor(const Synthetic& x) {
    const fs::path dir = scratch();
    std::ofstream(dir / "readings.csv") << x.csv;
    const auto r = run("monitor " + source("configs/staged-surcharge.yaml") + " --readings " + (dir / "readings.csv").string() +
                       " --drain band-100x4 --pattern triangular --spacing 1.5 --json");
    EXPECT_EQ(r.exit_code, 0) << r.err;
    return nlohmann::json::parse(r.out);
}

TEST(DirectFit, RecoversChAndFinalSettlementFromAnExactRecord) {
    const Synthetic x = synthetic(0.0, 1, 7, 245);
    const auto j = run_monitor(x);
    const auto& p = j["plates"][0];
    EXPECT_NEAR(p["fit"]["ch_m2_per_year"].get<double>(), 5.0, 0.01 * 5.0);
    EXPECT_NEAR(p["fit"]["final_settlement_mm"].get<double>(), 1000.0 * x.final_true, 0.01 * 1000.0 * x.final_true);
    EXPECT_TRUE(p["fit"]["reliable"].get<bool>());
    ASSERT_FALSE(p["forecast"].is_null());
    EXPECT_FALSE(p["forecast"]["surcharge_removal_day"].is_null());
    for (const char* key : {"final_settlement_mm", "beta0_mm", "beta1", "interval_days", "ch_m2_per_year"})
        EXPECT_TRUE(p["asaoka"].contains(key)) << key;
    EXPECT_TRUE(p["hyperbolic"].contains("final_settlement_mm"));
    EXPECT_EQ(j["cautions"].size(), 4u);
}

TEST(DirectFit, DegradesGracefullyWithNoise) {
    for (const double noise : {2.0, 5.0, 10.0}) {
        const Synthetic x = synthetic(noise, 7, 7, 245);
        const auto j = run_monitor(x);
        const auto& fit = j["plates"][0]["fit"];
        const double ch = fit["ch_m2_per_year"].get<double>();
        const auto interval = fit["ch_interval_95"];
        ASSERT_FALSE(interval.is_null()) << noise;
        EXPECT_LE(interval[0].get<double>(), 5.0 * 1.02) << noise;  // the truth within (about) its interval
        EXPECT_GE(interval[1].get<double>(), 5.0 * 0.98) << noise;
        EXPECT_NEAR(ch, 5.0, 0.25 * 5.0) << noise;
        std::printf("noise %.0f mm: ch %.2f (95 %% %.2f–%.2f) m²/year, S %.0f mm (true %.0f)\n", noise, ch,
                    interval[0].get<double>(), interval[1].get<double>(), fit["final_settlement_mm"].get<double>(),
                    1000.0 * x.final_true);
    }
}

// On layered ground (layered series) and under fill with vacuum, readings made by the design's own
// cell model with every layer's ch × 1.3 and the final settlement × 1.08, with 3 mm of noise: the
// direct fit gives the factor back within 5 % and the final settlement within 3 % (the issue's
// targets), and Asaoka's s∞ under the vacuum is flagged.
TEST(DirectFit, RecoversAKnownChFactorOnLayeredAndVacuumGround) {
    struct Row {
        const char* scenario;
        int last_day;
        bool under_vacuum;
    };
    for (const Row& row : {Row{"configs/layered-five-staged.yaml", 255, false}, Row{"configs/vacuum-with-fill.yaml", 240, true}}) {
        const auto s = scenario::load_scenario(source(row.scenario));
        const auto& product = s.site.products.front();
        const Site truth = with_input(s.site, StudyInput::ch_factor, 1.3);
        const auto model = make_cell_model(truth, product, Pattern::triangular, 1.4);
        const double final_true = 1.08 * *model->final_settlement_m();
        std::mt19937 rng(11);
        std::normal_distribution<double> noise(0.0, 3.0);
        std::string csv = "plate,day,settlement_mm\n";
        for (int d = 5; d <= row.last_day; d += 5)
            csv += "SP1," + std::to_string(d) + "," + std::to_string(1000.0 * final_true * model->degree(d * day) + noise(rng)) + "\n";
        const fs::path dir = scratch();
        std::ofstream(dir / "readings.csv") << csv;
        const auto r = run("monitor " + source(row.scenario) + " --readings " + (dir / "readings.csv").string() + " --drain " +
                           product.name + " --pattern triangular --spacing 1.4 --json");
        ASSERT_EQ(r.exit_code, 0) << r.err;
        const auto j = nlohmann::json::parse(r.out);
        const auto& p = j["plates"][0];
        EXPECT_NEAR(p["fit"]["ch_factor"].get<double>(), 1.3, 0.05 * 1.3) << row.scenario;
        EXPECT_NEAR(p["fit"]["final_settlement_mm"].get<double>(), 1000.0 * final_true, 0.03 * 1000.0 * final_true)
            << row.scenario;
        EXPECT_LE(p["fit"]["ch_factor_interval"][0].get<double>(), 1.3 * 1.02) << row.scenario;
        EXPECT_GE(p["fit"]["ch_factor_interval"][1].get<double>(), 1.3 * 0.98) << row.scenario;
        ASSERT_TRUE(p["asaoka"].is_object()) << row.scenario;
        const auto& flags = p["asaoka"]["flags"];
        EXPECT_EQ(std::find(flags.begin(), flags.end(), "under_vacuum") != flags.end(), row.under_vacuum) << flags;
        std::printf("%s: ch factor %.3f (95 %% %.3f–%.3f), S %.0f mm (true %.0f)\n", row.scenario,
                    p["fit"]["ch_factor"].get<double>(), p["fit"]["ch_factor_interval"][0].get<double>(),
                    p["fit"]["ch_factor_interval"][1].get<double>(), p["fit"]["final_settlement_mm"].get<double>(),
                    1000.0 * final_true);
    }
}

// A record that stops before the plan's last lift: Asaoka's s∞ is the limit of the load so far, and says so.
TEST(DirectFit, AsaokaBeforeTheLastLiftIsFlagged) {
    const Synthetic x = synthetic(0.0, 1, 2, 88);  // the third lift goes on from day 90
    const auto j = run_monitor(x);
    const auto& p = j["plates"][0];
    ASSERT_TRUE(p["asaoka"].is_object()) << p;
    EXPECT_EQ(p["asaoka"]["flags"], nlohmann::json::array({"before_last_lift"}));
    bool noted = false;
    for (const auto& n : p["notes"]) noted = noted || n.get<std::string>().find("before the last lift") != std::string::npos;
    EXPECT_TRUE(noted) << p["notes"];
    const Synthetic full = synthetic(0.0, 1, 7, 245);
    EXPECT_TRUE(run_monitor(full)["plates"][0]["asaoka"]["flags"].empty());
}

TEST(DirectFit, ARecordTooShortGivesNoForecast) {
    const Synthetic x = synthetic(5.0, 3, 10, 30);  // three readings in the first month
    const auto j = run_monitor(x);
    const auto& p = j["plates"][0];
    EXPECT_TRUE(p["forecast"].is_null());
    EXPECT_FALSE(p["notes"].empty());
}

struct HostileRow {
    const char* name;
    const char* text;
    int line;
    const char* says;
};

TEST(ReadingsFile, EveryErrorNamesItsLine) {
    const std::vector<HostileRow> rows{
        {"no settlement column", "plate,day\nSP1,1\n", 1, "no column 'settlement_mm'"},
        {"settlement in metres", "plate,day,settlement_m\nSP1,1,0.2\n", 1, "give settlements in millimetres"},
        {"empty plate", "plate,day,settlement_mm\n,1,20\n", 2, "without a plate name"},
        {"not a number", "plate,day,settlement_mm\nSP1,1,20\nSP1,8,twelve\n", 3, "not a number"},
        {"negative day", "plate,day,settlement_mm\nSP1,-3,20\n", 2, "before the start of loading"},
        {"out of order", "plate,day,settlement_mm\nSP1,10,20\nSP2,5,3\nSP1,8,25\n", 4, "comes after day 10 (line 2)"},
        {"duplicated", "plate,day,settlement_mm\nSP1,10,20\nSP1,10,21\n", 3, "a second reading of plate SP1 on day 10"},
        {"settlement units that do not fit", "plate,day,settlement_mm\nSP1,10,250000\n", 2, "more than 20 m"},
        {"fill height units that do not fit", "plate,day,settlement_mm,fill_height_m\nSP1,10,20,1500\n", 2, "0–50 m"},
        {"no readings", "plate,day,settlement_mm\n", 1, "no readings"},
        {"short row", "plate,day,settlement_mm\nSP1,10\n", 2, "has 2 fields"},
        {"a day beyond the record", "plate,day,settlement_mm\nSP1,10,20\nSP1,1e305,30\n", 3, "more than 100 years"},
    };
    for (const auto& row : rows) {
        try {
            scenario::parse_readings(row.text, "r.csv");
            ADD_FAILURE() << row.name << ": accepted";
        } catch (const scenario::ScenarioError& e) {
            EXPECT_EQ(e.mark().line, row.line) << row.name << ": " << e.what();
            EXPECT_NE(std::string(e.what()).find(row.says), std::string::npos) << row.name << ": " << e.what();
        }
    }
}

// A record full of gaps (every third interval ten times the usual) says so in a few lines, not one per gap.
TEST(ReadingsFile, GapWarningsAreCapped) {
    std::string text = "plate,day,settlement_mm\n";
    double day = 0.0;
    for (int i = 0; i < 2000; ++i) {
        day += i % 3 == 2 ? 10.0 : 1.0;  // 666 gaps of 10 days among 1,999 intervals
        text += "SP1," + std::to_string(day) + "," + std::to_string(0.01 * i) + "\n";
    }
    const auto f = scenario::parse_readings(text, "r.csv");
    ASSERT_EQ(f.warnings.size(), 11u);
    EXPECT_NE(f.warnings.back().find("656 more gaps like these"), std::string::npos) << f.warnings.back();
}

TEST(PiezometerFile, EveryErrorNamesItsLine) {
    const std::vector<HostileRow> rows{
        {"no pressure column", "piezometer,day,depth_m\nPZ1,1,4\n", 1, "no column 'excess_pore_pressure_kPa'"},
        {"empty name", "piezometer,day,depth_m,excess_pore_pressure_kPa\n,1,4,10\n", 2, "without a piezometer name"},
        {"negative day", "piezometer,day,depth_m,excess_pore_pressure_kPa\nPZ1,-1,4,10\n", 2, "before the start"},
        {"depth moves", "piezometer,day,depth_m,excess_pore_pressure_kPa\nPZ1,1,4,10\nPZ1,2,5,10\n", 3, "one depth per piezometer"},
        {"depth units", "piezometer,day,depth_m,excess_pore_pressure_kPa\nPZ1,1,4000,10\n", 2, "0–200 m"},
        {"pressure in Pa", "piezometer,day,depth_m,excess_pore_pressure_kPa\nPZ1,1,4,25000\n", 2, "must be in kPa"},
        {"twice on a day", "piezometer,day,depth_m,excess_pore_pressure_kPa\nPZ1,1,4,10\nPZ1,1,4,11\n", 3, "(line 2 has one)"},
        {"out of order", "piezometer,day,depth_m,excess_pore_pressure_kPa\nPZ1,5,4,10\nPZ1,2,4,11\n", 3, "comes after day 5 (line 2)"},
    };
    for (const auto& row : rows) {
        try {
            scenario::parse_piezometers(row.text, "p.csv");
            ADD_FAILURE() << row.name << ": accepted";
        } catch (const scenario::ScenarioError& e) {
            EXPECT_EQ(e.mark().line, row.line) << row.name << ": " << e.what();
            EXPECT_NE(std::string(e.what()).find(row.says), std::string::npos) << row.name << ": " << e.what();
        }
    }
}

TEST(MonitorCommand, BundledRecordsWithPiezometers) {
    const fs::path out = scratch();
    const auto r = run("monitor " + source("configs/staged-surcharge.yaml") + " --readings " +
                       source("configs/staged-surcharge-readings.csv") + " --piezometers " +
                       source("configs/staged-surcharge-piezometers.csv") +
                       " --drain band-100x4 --pattern triangular --spacing 1.5 --json --out " + out.string());
    ASSERT_EQ(r.exit_code, 0) << r.err;
    const auto j = nlohmann::json::parse(r.out);
    ASSERT_EQ(j["plates"].size(), 2u);
    ASSERT_EQ(j["piezometers"].size(), 2u);
    EXPECT_EQ(j["piezometers"][1]["depth_m"], 9.0);
    EXPECT_EQ(j["plates"][0]["asaoka"]["residuals_mm"].size(), j["plates"][0]["asaoka"]["points"].get<std::size_t>() - 1);
    // The invented record was made with ch = 5.0 m²/year (2 and 4 mm of noise).
    for (const auto& p : j["plates"]) EXPECT_NEAR(p["fit"]["ch_m2_per_year"].get<double>(), 5.0, 0.25);
    const std::string html = slurp(out / "monitor.html");
    EXPECT_NE(html.find("Excess pore pressure against time"), std::string::npos);
    EXPECT_NE(html.find("Asaoka plot"), std::string::npos);
    EXPECT_EQ(nlohmann::json::parse(slurp(out / "monitor.json"))["plates"].size(), 2u);
    // The design's excess pore pressure at a piezometer's depth is the one `curve --depths` lists at
    // that depth and time (one computation, CellModel::over_depth).
    const auto& at = j["piezometers"][1]["design_at_depth"];
    ASSERT_GT(at.size(), 60u);
    const double day = at[60]["day"].get<double>();
    char days[64];
    std::snprintf(days, sizeof days, "%.17g", day);
    const auto c = run("curve " + source("configs/staged-surcharge.yaml") +
                       " --drain band-100x4 --pattern triangular --spacing 1.5 --json --depths 9 --at-days " + days);
    ASSERT_EQ(c.exit_code, 0) << c.err;
    const auto curve = nlohmann::json::parse(c.out);
    EXPECT_NEAR(curve["points"][0]["excess_pore_pressure_kPa"][0].get<double>(),
                at[60]["excess_pore_pressure_kPa"].get<double>(), 1e-9);
    EXPECT_GT(at[60]["excess_pore_pressure_kPa"].get<double>(), 1.0);
}

TEST(ReadingsFile, PlatesGapsAndFillChanges) {
    const auto f = scenario::parse_readings(
        "plate,day,settlement_mm,fill_height_m\nSP1,0,0,0\nSP2,0,0,0\nSP1,10,50,1\nSP1,20,80,2\nSP1,30,100,2\n"
        "SP1,40,110,2\nSP1,200,150,2\n",
        "r.csv");
    ASSERT_EQ(f.plates.size(), 2u);
    EXPECT_EQ(f.plates[0].readings.size(), 6u);
    EXPECT_DOUBLE_EQ(f.plates[0].readings[2].settlement_m, 0.08);
    EXPECT_DOUBLE_EQ(*f.plates[0].last_fill_change_s, 20 * day);
    ASSERT_EQ(f.warnings.size(), 1u);
    EXPECT_NE(f.warnings[0].find("between day 40 and day 200"), std::string::npos) << f.warnings[0];
}

}  // namespace
}  // namespace wickgrid::monitoring
