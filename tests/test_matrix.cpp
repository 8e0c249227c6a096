// Every command on every bundled scenario (demo/ and configs/): each exits 0 or 1 and writes whole
// outputs, and the same quantity agrees wherever two commands show it — the design row, `curve` at
// the chosen spacing and the deadline, and the report's chart data.
#include <gtest/gtest.h>

#include <nlohmann/json.hpp>

#include <cmath>
#include <fstream>

#include "cli_helpers.hpp"
#include "scheme_checks.hpp"
#include "results/design_record.hpp"
#include "results/stage_record.hpp"
#include "scenario/scheme_scenario.hpp"
#include "scenario/scenario.hpp"
#include "wickgrid/names.hpp"
#include "wickgrid/units.hpp"

using namespace wickgrid;
using namespace wickgrid::cli_testing;
using nlohmann::json;

namespace {
std::vector<std::string> bundled_scenarios() {
    std::vector<std::string> files{"demo/scenario.yaml"};
    for (const auto& entry : fs::directory_iterator(source("configs")))
        if (entry.path().extension() == ".yaml") files.push_back("configs/" + entry.path().filename().string());
    std::sort(files.begin(), files.end());
    return files;
}

class EveryScenario : public ::testing::TestWithParam<std::string> {};

std::string label(const ::testing::TestParamInfo<std::string>& info) {
    std::string name = info.param;
    for (char& c : name)
        if (!std::isalnum(static_cast<unsigned char>(c))) c = '_';
    return name;
}
}  // namespace

TEST_P(EveryScenario, EveryCommandRunsAndWritesWholeOutputs) {
    const std::string file = source(GetParam());
    EXPECT_EQ(run("check " + file).exit_code, 0);
    const fs::path dir = scratch();
    const CommandRun design = run("design " + file + " --json --out " + (dir / "design").string());
    ASSERT_TRUE(design.exit_code == 0 || design.exit_code == 1) << design.err;
    const json doc = json::parse(design.out);
    EXPECT_EQ(json::parse(slurp(dir / "design" / "design.json")), doc);
    EXPECT_NE(slurp(dir / "design" / "design.md").find("## Cautions"), std::string::npos);
    const std::string csv = csv_body(slurp(dir / "design" / "design.csv"));
    EXPECT_EQ(std::count(csv.begin(), csv.end(), '\n'), static_cast<long>(doc["designs"].size()) + 1);
    const CommandRun report = run("report " + file + " --out " + (dir / "report").string());
    EXPECT_EQ(report.exit_code, design.exit_code) << report.err;
    const std::string html = slurp(dir / "report" / "report.html");
    EXPECT_NE(html.find("</html>"), std::string::npos);
    EXPECT_NE(html.find("site investigation"), std::string::npos);
    const CommandRun verify = run("verify " + file + " --json --radial-cells 12 --vertical-cells 24 --points 6");
    EXPECT_EQ(verify.exit_code, 0) << verify.err;
    EXPECT_EQ(json::parse(verify.out)["rows"].size(), doc["designs"].size());
    // Few samples: the numerical scenarios search a cell model per sample (about 0.1 s each).
    const CommandRun sweep = run("sweep " + file + " --json --samples 20");
    EXPECT_TRUE(sweep.exit_code == 0 || sweep.exit_code == 5) << sweep.err;  // 5: a study the site cannot sample
    if (sweep.exit_code == 0) {
        EXPECT_EQ(json::parse(sweep.out)["target"], doc["target"]);
    } else {
        EXPECT_NE(sweep.err.find("Monte Carlo"), std::string::npos) << sweep.err;
    }
    const auto s = scenario::load_scenario(file);
    if (!results::stage_check_refusal(s)) {
        // The stage checks of the recommended design: `stages` and the report show the same figures.
        const CommandRun stages = run("stages " + file + " --json");
        ASSERT_TRUE(stages.exit_code == 0 || stages.exit_code == 1) << stages.err;
        const std::string note = slurp(dir / "report" / "report.md");
        const json stages_doc = json::parse(stages.out);  // held: a range-for over a temporary's member dangles
        for (const auto& st : stages_doc["stages"]) {
            char fs[32];
            std::snprintf(fs, sizeof fs, "| %.2f", st["factor_of_safety"].get<double>());
            EXPECT_NE(note.find(fs), std::string::npos) << fs;
        }
    }
    if (s.schedule) {
        // The scheme search of a scenario that asks for one: every scheme on the front, written as a
        // scenario and read back, gives `design` and `stages` the search's numbers.
        const CommandRun schedule = run("schedule " + file + " --json");
        ASSERT_TRUE(schedule.exit_code == 0 || schedule.exit_code == 1) << schedule.err;
        const json sch = json::parse(schedule.out);
        const ScheduleResult result = search_schedules(s.site, *s.schedule);
        ASSERT_EQ(result.schemes.size(), sch["schemes"].size());
        for (std::size_t i = 0; i < result.schemes.size(); ++i) {
            const json& cost = sch["schemes"][i]["cost_per_hectare"];
            EXPECT_EQ(result.schemes[i].cost_per_hectare.has_value(), !cost.is_null());
            if (!cost.is_null()) {
                EXPECT_EQ(*result.schemes[i].cost_per_hectare, cost.get<double>());
            }
            if (!result.schemes[i].on_front) continue;
            const fs::path chosen = dir / ("scheme-" + std::to_string(i) + ".yaml");
            std::ofstream(chosen) << scenario::scheme_scenario_yaml(s, result.schemes[i]);
            expect_reproduced(chosen, sch["schemes"][i]);
        }
    }
    if (s.site.has_settlement()) {
        const auto& row = doc["designs"][0];
        const CommandRun surcharge =
            run("surcharge " + file + " --drain " + row["drain"].get<std::string>() + " --pattern " +
                row["pattern"].get<std::string>() + " --spacing " + std::to_string(row["evaluated_spacing_m"].get<double>()) +
                " --removal-day " + std::to_string(units::seconds_to_days(s.site.criterion.deadline_s)) + " --json");
        EXPECT_EQ(surcharge.exit_code, 0) << surcharge.err;
    }
    fs::remove_all(dir);
}

TEST_P(EveryScenario, CurveAtTheDeadlineEqualsTheDesignRow) {
    const std::string file = source(GetParam());
    const CommandRun design = run("design " + file + " --json");
    const json doc = json::parse(design.out);
    const auto s = scenario::load_scenario(file);
    const double deadline_days = units::seconds_to_days(s.site.criterion.deadline_s);
    for (const auto& row : doc["designs"]) {
        char spacing[64];
        std::snprintf(spacing, sizeof spacing, "%.17g", row["evaluated_spacing_m"].get<double>());
        char day[64];
        std::snprintf(day, sizeof day, "%.17g", deadline_days);
        const CommandRun curve = run("curve " + file + " --drain " + row["drain"].get<std::string>() + " --pattern " +
                                     row["pattern"].get<std::string>() + " --spacing " + spacing + " --at-days 0," +
                                     std::to_string(0.5 * deadline_days) + "," + day + " --json");
        ASSERT_EQ(curve.exit_code, 0) << curve.err;
        const json point = json::parse(curve.out)["points"][2];
        EXPECT_NEAR(point["degree"].get<double>(), row["degree"].get<double>(), 1e-12) << row["drain"] << row["pattern"];
        EXPECT_NEAR(point["degree_vertical"].get<double>(), row["degree_vertical"].get<double>(), 1e-12);
        EXPECT_NEAR(point["degree_radial"].get<double>(), row["degree_radial"].get<double>(), 1e-12);
        if (row["settlement_at_deadline_mm"].is_null()) {
            EXPECT_TRUE(point["settlement_mm"].is_null());
        } else {
            EXPECT_NEAR(point["settlement_mm"].get<double>(), row["settlement_at_deadline_mm"].get<double>(), 1e-9);
        }
    }
}

TEST_P(EveryScenario, ReportChartDataEqualTheTable) {
    const auto s = scenario::load_scenario(source(GetParam()));
    const auto record = results::design_record(s, {true, false});
    ASSERT_FALSE(record.chart_curves.empty());
    for (const auto& curve : record.chart_curves) {
        const DesignRow* row = nullptr;
        for (const auto& r : record.result.rows)
            if (r.drain == curve.drain && r.pattern == curve.pattern) row = &r;
        ASSERT_NE(row, nullptr);
        EXPECT_EQ(curve.spacing_m, row->spacing_m);
        const auto at = std::find_if(curve.points.begin(), curve.points.end(),
                                     [&](const CurvePoint& p) { return p.time_s == s.site.criterion.deadline_s; });
        ASSERT_NE(at, curve.points.end()) << "the chart passes through the deadline";
        EXPECT_NEAR(at->degrees.combined, row->at_deadline.combined, 1e-12);
        EXPECT_NEAR(at->degrees.vertical, row->at_deadline.vertical, 1e-12);
        if (row->settlement_at_deadline_m) {
            EXPECT_NEAR(*at->settlement_m, *row->settlement_at_deadline_m, 1e-12);
        }
    }
    // The design chart at the design's own deadline gives the table's limit (linear charts run to 2 × deadline).
    for (const auto& series : record.spacing_vs_time)
        for (std::size_t i = 0; i < series.deadline_s.size(); ++i)
            if (std::fabs(series.deadline_s[i] - s.site.criterion.deadline_s) < 1e-6 * s.site.criterion.deadline_s)
                for (const auto& r : record.result.rows)
                    if (r.pattern == series.pattern && r.drain == record.chart_curves.front().drain && r.feasible) {
                        EXPECT_NEAR(series.spacing_limit_m[i], r.spacing_limit_m, 1e-6);
                    }
}

// One plan of the works: the final settlement, the residual (primary and secondary) and U at the
// deadline of a design are the same in `design`, `surcharge`, `stages` and `monitor` (on readings
// made from the design by `curve`); the fill `stages` places is the fill `design` loads, stage by
// stage. (`curve` at the deadline: CurveAtTheDeadlineEqualsTheDesignRow; the report's table:
// tests/report/check_report.py.)
TEST_P(EveryScenario, EveryCommandEvaluatesTheSamePlan) {
    const std::string file = source(GetParam());
    const auto s = scenario::load_scenario(file);
    if (!s.site.has_settlement()) GTEST_SKIP() << "no settlement model";
    const json doc = json::parse(run("design " + file + " --json").out);
    json row = doc["designs"][0];
    for (const auto& r : doc["designs"])
        if (r["rank"] == 1) row = r;
    char spacing[64];
    std::snprintf(spacing, sizeof spacing, "%.17g", row["evaluated_spacing_m"].get<double>());
    const std::string cell = " --drain " + row["drain"].get<std::string>() + " --pattern " + row["pattern"].get<std::string>() +
                             " --spacing " + spacing;
    const double ultimate = row["ultimate_settlement_mm"].get<double>();
    auto near = [](double a, double b) { return std::fabs(a - b) <= 1e-9 * std::max(1.0, std::fabs(b)); };

    const CommandRun surcharge = run("surcharge " + file + cell + " --json");
    if (surcharge.exit_code == 0) {
        EXPECT_PRED2(near, json::parse(surcharge.out)["final_settlement_mm"].get<double>(), ultimate);
    }
    if (!results::stage_check_refusal(s)) {
        const CommandRun stages = run("stages " + file + cell + " --json");
        ASSERT_TRUE(stages.exit_code == 0 || stages.exit_code == 1) << stages.err;
        const json st = json::parse(stages.out);
        if (!st["fill_to_finish"].is_null()) {
            EXPECT_PRED2(near, 1000.0 * st["fill_to_finish"]["final_settlement_m"].get<double>(), ultimate);
        }
        std::size_t compared = 0;
        for (const auto& placed : st["stages"]) {
            if (placed["surcharge"].get<bool>()) continue;
            for (const auto& loaded : doc["load_plan"])
                if (loaded["stage"] == placed["stage"]) {
                    EXPECT_PRED2(near, placed["height_m"].get<double>(), loaded["height_m"].get<double>()) << placed;
                    EXPECT_PRED2(near, placed["start_day"].get<double>(), loaded["start_day"].get<double>());
                    ++compared;
                }
        }
        EXPECT_EQ(compared, s.site.loading->stages.size());
    }
    // Readings made from the design (curve's settlement every tenth of the deadline).
    const double deadline_days = units::seconds_to_days(s.site.criterion.deadline_s);
    std::string days;
    for (int i = 1; i <= 10; ++i) days += (i > 1 ? "," : "") + std::to_string(0.09 * i * deadline_days);
    const CommandRun curve = run("curve " + file + cell + " --at-days " + days + " --json");
    ASSERT_EQ(curve.exit_code, 0) << curve.err;
    std::string readings = "plate,day,settlement_mm\n";
    const json points = json::parse(curve.out)["points"];
    for (const auto& p : points)
        readings += "SP1," + std::to_string(p["time_days"].get<double>()) + "," + std::to_string(p["settlement_mm"].get<double>()) + "\n";
    const fs::path dir = scratch();
    std::ofstream(dir / "readings.csv") << readings;
    const CommandRun monitor = run("monitor " + file + cell + " --readings " + (dir / "readings.csv").string() + " --json");
    ASSERT_EQ(monitor.exit_code, 0) << monitor.err;
    const json forecast = json::parse(monitor.out)["plates"][0]["design_forecast"];
    EXPECT_PRED2(near, forecast["final_settlement_mm"].get<double>(), ultimate);
    if (!row["residual_settlement_mm"].is_null()) {
        EXPECT_PRED2(near, forecast["residual_primary_mm"].get<double>(), row["residual_primary_mm"].get<double>());
        EXPECT_PRED2(near, forecast["residual_secondary_mm"].get<double>(), row["residual_secondary_mm"].get<double>());
        EXPECT_PRED2(near, forecast["residual_at_deadline_mm"].get<double>(), row["residual_settlement_mm"].get<double>());
    }
    fs::remove_all(dir);
}

INSTANTIATE_TEST_SUITE_P(Bundled, EveryScenario, ::testing::ValuesIn(bundled_scenarios()), label);
