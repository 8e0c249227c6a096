// `schedule`: the scheme search. The JSON contract; every scheme on the front or left out for a
// named reason that its own figures bear out; the chosen scheme's scenario reproduces the search's
// numbers through `design` and `stages`; the same results on one thread and two; bad input named
// and located. A small search (one drain, three spacings, two surcharge heights) of the bundled
// configs/embankment-scheme-search.yaml, so the test stays quick under the sanitizers.
#include <gtest/gtest.h>

#include <nlohmann/json.hpp>

#include <cmath>

#include "cli_helpers.hpp"
#include "scheme_checks.hpp"
#include "scenario/scenario.hpp"
#include "wickgrid/errors.hpp"
#include "wickgrid/schedule.hpp"
#include "wickgrid/units.hpp"

using namespace wickgrid;
using namespace wickgrid::cli_testing;
using nlohmann::json;

namespace {
const char* bundled = "configs/embankment-scheme-search.yaml";

std::string small_search() {
    std::string text = edited_copy(bundled, "  max_m: 1.8", "  max_m: 1.4");
    for (const auto& [from, to] : std::vector<std::pair<std::string, std::string>>{
             {"surcharge_heights_m: [0.0, 1.5, 3.0]", "surcharge_heights_m: [0.0, 1.5]"},
             {"  - name: band-100x6\n    width_mm: 100\n    thickness_mm: 6\n    discharge_capacity_m3_per_year: 250\n"
              "    cost_per_m: 1.35\n",
              ""}}) {
        const auto at = text.find(from);
        if (at == std::string::npos) throw std::logic_error("edit not found: " + from);
        text.replace(at, from.size(), to);
    }
    return text;
}

}  // namespace

TEST(ScheduleCommand, EverySchemeIsOnTheFrontOrLeftOutForANamedReason) {
    const fs::path file = write_case(small_search());
    const CommandRun r = run("schedule " + file.string() + " --json --threads 2");
    ASSERT_EQ(r.exit_code, 0) << r.err;
    const json doc = json::parse(r.out);
    const json& schemes = doc["schemes"];
    ASSERT_EQ(schemes.size(), 6u);  // one drain × one pattern × two heights × three spacings
    for (const char* key : {"drain", "pattern", "spacing_m", "surcharge_height_m", "stage_start_days", "finish_day",
                            "cost_per_hectare", "meets_criterion", "min_factor_of_safety", "on_front", "excluded_because"})
        EXPECT_TRUE(schemes[0].contains(key)) << key;
    EXPECT_FALSE(doc["cautions"].empty());
    const double target = doc["target_factor_of_safety"].get<double>();
    const double deadline = doc["deadline_day"].get<double>();
    std::size_t on_front = 0;
    for (const auto& s : schemes) {
        const bool stands = s["every_stage_stands"].get<bool>();
        const bool meets = s["meets_criterion"].get<bool>();
        if (s["on_front"].get<bool>()) {
            ++on_front;
            EXPECT_TRUE(s["excluded_because"].is_null());
        }
        if (stands || s["on_front"].get<bool>()) { EXPECT_GE(s["min_factor_of_safety"].get<double>(), target - 1e-12); }
        if (meets) { EXPECT_LE(s["finish_day"].get<double>(), deadline + 1e-6); }
        const std::string why = s["excluded_because"].is_null() ? "" : s["excluded_because"].get<std::string>();
        if (why == "stage_below_target") { EXPECT_FALSE(stands); }
        if (why == "criterion_missed") { EXPECT_TRUE(stands && !meets); }
        if (why == "beaten") {
            // Some scheme on the front is no dearer and no later.
            bool beaten = false;
            for (const auto& o : schemes)
                beaten |= o["on_front"].get<bool>() && o["cost_per_hectare"].get<double>() <= s["cost_per_hectare"].get<double>() &&
                          o["finish_day"].get<double>() <= s["finish_day"].get<double>();
            EXPECT_TRUE(beaten);
        }
        // The cost is the sum of its parts; the surcharge part is its height's volume at the given rates.
        // Without a finish day the programme (costed per day here) has no cost, and nor has the scheme.
        const json& parts = s["cost_parts_per_hectare"];
        EXPECT_EQ(s["finish_day"].is_null(), parts["programme"].is_null());
        EXPECT_EQ(s["finish_day"].is_null(), s["cost_per_hectare"].is_null());
        if (!s["cost_per_hectare"].is_null()) {
            EXPECT_NEAR(s["cost_per_hectare"].get<double>(),
                        parts["drains"].get<double>() + parts["fill"].get<double>() + parts["surcharge"].get<double>() +
                            parts["programme"].get<double>(),
                        1e-6);
        }
        EXPECT_NEAR(parts["surcharge"].get<double>(), s["surcharge_height_m"].get<double>() * 1e4 * (7.0 + 4.0), 1e-6);
    }
    EXPECT_GE(on_front, 1u);
    ASSERT_FALSE(doc["cheapest"].is_null());
    for (const auto& s : schemes)
        if (s["on_front"].get<bool>()) {
            EXPECT_GE(s["cost_per_hectare"].get<double>(), doc["cheapest"]["cost_per_hectare"].get<double>());
            EXPECT_GE(s["finish_day"].get<double>(), doc["soonest"]["finish_day"].get<double>());
        }
    // Results do not depend on the thread count.
    const CommandRun one = run("schedule " + file.string() + " --json --threads 1");
    ASSERT_EQ(one.exit_code, 0) << one.err;
    EXPECT_EQ(json::parse(one.out)["schemes"], schemes);
}

// chosen.yaml holds the scheme: `design` and `stages` of it give the search's numbers, for the
// cheapest (no surcharge here) and the soonest (with one).
TEST(ScheduleCommand, TheChosenSchemeReproducesItsNumbers) {
    const fs::path file = write_case(small_search());
    const std::string before = slurp(file);
    for (const char* choice : {"cheapest", "soonest"}) {
        const fs::path out = file.parent_path() / choice;
        const CommandRun r = run("schedule " + file.string() + " --json --choose " + choice + " --out " + out.string());
        ASSERT_EQ(r.exit_code, 0) << r.err;
        const json doc = json::parse(r.out);
        EXPECT_EQ(json::parse(slurp(out / "schedule.json")), doc);
        EXPECT_NE(slurp(out / "schedule-front.svg").find("<svg"), std::string::npos);
        expect_reproduced(out / "chosen.yaml", doc[choice]);
    }
    EXPECT_EQ(slurp(file), before);
    // A scenario named chosen.yaml in the output folder is an input: never overwritten (exit 3).
    const fs::path dir = file.parent_path() / "own";
    fs::create_directories(dir);
    fs::copy_file(file, dir / "chosen.yaml");
    const CommandRun own = run("schedule " + (dir / "chosen.yaml").string() + " --out " + dir.string());
    EXPECT_EQ(own.exit_code, 3) << own.err;
    EXPECT_NE(own.err.find("refusing to overwrite the input file"), std::string::npos) << own.err;
    EXPECT_EQ(slurp(dir / "chosen.yaml"), before);
}

TEST(ScheduleCommand, SurchargeHeightsAndSpacings) {
    const auto s = scenario::parse_scenario(small_search(), "small.yaml");
    // The scenario's own surcharge keeps its days and takes the height's load; 0 removes it.
    const Site one = with_surcharge_height(s.site, 1.0);
    ASSERT_TRUE(one.loading->surcharge);
    EXPECT_EQ(one.loading->surcharge->start_s, s.site.loading->surcharge->start_s);
    EXPECT_EQ(one.loading->surcharge->removal_s, s.site.loading->surcharge->removal_s);
    EXPECT_DOUBLE_EQ(one.loading->surcharge->pressure_kPa, 1.0 * 19.0);
    EXPECT_FALSE(with_surcharge_height(s.site, 0.0).loading->surcharge);
    EXPECT_THROW(with_surcharge_height(s.site, -1.0), InputError);
    // A surcharge the scenario does not place follows the last lift at its rate, held to the deadline.
    Site none = s.site;
    none.loading->surcharge.reset();
    const Site added = with_surcharge_height(none, 2.0);
    double last_end = 0.0, rate = 0.0;
    for (const auto& st : none.loading->stages)
        if (st.end_s >= last_end) {
            last_end = st.end_s;
            rate = (st.end_s - st.start_s) / st.pressure_kPa;
        }
    EXPECT_EQ(added.loading->surcharge->start_s, last_end);
    EXPECT_NEAR(added.loading->surcharge->end_s, last_end + rate * 38.0, 1e-6);
    EXPECT_EQ(added.loading->surcharge->removal_s, none.criterion.deadline_s);
    // The spacings tried are the increment's multiples within the range (the design's rounding).
    const auto spacings = schedule_spacings(s.site.range);
    ASSERT_EQ(spacings.size(), 3u);
    EXPECT_DOUBLE_EQ(spacings[0], 5 * 0.2);
    EXPECT_DOUBLE_EQ(spacings[2], 7 * 0.2);
}

TEST(ScheduleCommand, BadInputIsNamedAndLocated) {
    struct Case {
        std::string from, to, key, message;
    };
    const std::vector<Case> cases{
        {"surcharge_heights_m: [0.0, 1.5, 3.0]", "surcharge_heights_m: [0.0, -1.5]", "schedule.surcharge_heights_m[1]",
         "-1.5 is not allowed"},
        {"surcharge_heights_m: [0.0, 1.5, 3.0]", "surcharge_heights_m: [1.5, 1.5]", "schedule.surcharge_heights_m[1]",
         "listed twice"},
        {"surcharge_heights_m: [0.0, 1.5, 3.0]", "surcharge_heights_m: [0.0, 25.0]", "schedule.surcharge_heights_m[1]",
         "25 is not allowed"},
        {"surcharge_heights_m: [0.0, 1.5, 3.0]", "surcharge_heights_m: []", "schedule.surcharge_heights_m", "at least one"},
        {"  fill_cost_per_m3: 9.0", "  fill_cost_per_m3: -9.0", "schedule.fill_cost_per_m3", "-9 is not allowed"},
        {"  cost_per_hectare_per_day: 60.0", "  cost_per_day: 60.0", "schedule.cost_per_day", "unknown key"},
        {"    cost_per_m: 1.35\n", "", "drains[1]", "give 'cost_per_m' for drain 'band-100x6'"},
        {"  increment_m: 0.2", "  increment_m: 0.001", "spacing.increment_m", "at most 1000"},
        {"  top_up: after_surcharge_removal", "  top_up: after_surcharge_removal\n  top_up_start_day: 100",
         "embankment.top_up_start_day", "cannot start before day"},
        {"  finished_height_m: 4.0", "  top_up_start_day: 200", "embankment.top_up_start_day", "needs 'finished_height_m'"},
    };
    for (const auto& c : cases) {
        const fs::path file = write_case(edited_copy(bundled, c.from, c.to));
        const CommandRun r = run("schedule " + file.string());
        EXPECT_EQ(r.exit_code, 2) << c.key << ": " << r.err;
        EXPECT_NE(r.err.find(c.key), std::string::npos) << r.err;
        EXPECT_NE(r.err.find(c.message), std::string::npos) << r.err;
        EXPECT_NE(r.err.find(file.string() + ":"), std::string::npos) << r.err;
    }
    // Options: a choice outside the table and a thread count of 0 name the option (exit 2).
    for (const char* bad : {" --choose fastest", " --threads 0"}) {
        const CommandRun r = run("schedule " + source(bundled) + bad);
        EXPECT_EQ(r.exit_code, 2) << bad << ": " << r.err;
        EXPECT_NE(r.err.find(std::string(bad).substr(1, std::string(bad).find(' ', 1) - 1)), std::string::npos) << r.err;
    }
    // Without an embankment there is nothing to plan: located at the file.
    const CommandRun plain = run("schedule " + source("demo/scenario.yaml"));
    EXPECT_EQ(plain.exit_code, 2);
    EXPECT_NE(plain.err.find("embankment"), std::string::npos) << plain.err;
}

// The report of a scenario with a `schedule:` block carries the same search: its summary names the
// cheapest and the soonest scheme as `schedule` does, and the front is tabled.
TEST(ScheduleCommand, TheReportShowsTheSameSearch) {
    const fs::path file = write_case(small_search());
    const CommandRun sch = run("schedule " + file.string() + " --json");
    ASSERT_EQ(sch.exit_code, 0) << sch.err;
    const json doc = json::parse(sch.out);
    const fs::path out = file.parent_path() / "report";
    const CommandRun r = run("report " + file.string() + " --out " + out.string());
    ASSERT_EQ(r.exit_code, 0) << r.err;
    const std::string md = slurp(out / "report.md");
    EXPECT_NE(md.find("## Scheme search"), std::string::npos);
    char cheapest[128];
    std::snprintf(cheapest, sizeof cheapest, "Cheapest: %s, %s at %.2f m, surcharge %.2f m",
                  doc["cheapest"]["drain"].get<std::string>().c_str(), doc["cheapest"]["pattern"].get<std::string>().c_str(),
                  doc["cheapest"]["spacing_m"].get<double>(), doc["cheapest"]["surcharge_height_m"].get<double>());
    EXPECT_NE(md.find(cheapest), std::string::npos) << cheapest;
    EXPECT_NE(slurp(out / "report.html").find("id=\"schedule\""), std::string::npos);
    EXPECT_TRUE(fs::exists(out / "schedule-front.svg"));
}
