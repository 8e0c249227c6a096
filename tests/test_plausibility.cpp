// Plausibility warnings: allowed values outside the usual ranges are named with their place in the
// file, the range and its source, and reach stderr, the JSON `warnings` and the note.
#include <gtest/gtest.h>
#include <nlohmann/json.hpp>

#include "cli_helpers.hpp"
#include "scenario/scenario.hpp"

namespace wickgrid::scenario {
namespace {
using namespace wickgrid::cli_testing;

struct PlausibilityRow {
    const char* source;  // where the usual range comes from
    const char* from;    // text of demo/scenario.yaml
    const char* to;
    const char* says;    // the located warning starts with this
};

const std::vector<PlausibilityRow> rows{
    {"common practice: 0.1–100 m²/year", "  ch_m2_per_year: 4.0", "  ch_m2_per_year: 0.00000012", "demo.yaml:11:19: clay.ch_m2_per_year = 1.2e-07 m²/year is outside the usual 0.1–100"},
    {"common practice: 0.1–100 m²/year", "  cv_m2_per_year: 1.2", "  cv_m2_per_year: 400", "demo.yaml:10:19: clay.cv_m2_per_year = 400 m²/year is outside"},
    {"Hansbo 1987; Holtz et al. 1991, widened: kh/ks 1–10", "smear_permeability_ratio: 3.0   #", "smear_permeability_ratio: 30   #", "installation.smear_permeability_ratio = 30 is outside the usual 1–10"},
    {"Hansbo 1987; Holtz et al. 1991, widened: ds/dm 1–6", "smear_diameter_ratio: 2.0       #", "smear_diameter_ratio: 8       #", "installation.smear_diameter_ratio = 8 is outside the usual 1–6"},
    {"common practice: qw at least 10 m³/year", "discharge_capacity_m3_per_year: 150", "discharge_capacity_m3_per_year: 0.5", "drains[0].discharge_capacity_m3_per_year = 0.5 m³/year is below the usual least of 10"},
    {"a drain fits its mandrel", "    width_mm: 100\n    thickness_mm: 4", "    width_mm: 130\n    thickness_mm: 4", "is wider than the mandrel (installation.mandrel_width_mm = 120 mm)"},
    {"common practice: spacings 0.5–5 m", "  max_m: 4.0", "  max_m: 12.0", "spacing.max_m = 12 m is outside the usual 0.5–5 m"},
};

TEST(Plausibility, UnusualValuesAreNamedWithTheirPlace) {
    for (const auto& row : rows) {
        const Scenario s = parse_scenario(edited_copy("demo/scenario.yaml", row.from, row.to), "demo.yaml");
        ASSERT_FALSE(s.input_warnings.empty()) << row.to;
        EXPECT_NE(s.input_warnings[0].find(row.says), std::string::npos) << row.source << "\n" << s.input_warnings[0];
        for (const auto& w : s.input_warnings) EXPECT_NE(w.find(row.says), std::string::npos) << w;
    }
    EXPECT_TRUE(parse_scenario(slurp(source("demo/scenario.yaml")), "demo.yaml").input_warnings.empty());
}

// A fill far above any embankment on soft clay (a height in feet?) is named, though it is allowed.
TEST(Plausibility, AFillHigherThanUsualIsNamed) {
    const Scenario usual = parse_scenario(slurp(source("configs/staged-embankment-stability.yaml")), "staged.yaml");
    EXPECT_TRUE(usual.input_warnings.empty());
    const Scenario tall = parse_scenario(edited_copy("configs/staged-embankment-stability.yaml", "  finished_height_m: 5.0",
                                                     "  height_m: 25.0\n  finished_height_m: 5.0"),
                                         "staged.yaml");
    bool named = false;
    for (const auto& w : tall.input_warnings)
        named = named || w.find("embankment.height_m = 25 m is outside the usual 0–20 m") != std::string::npos;
    EXPECT_TRUE(named) << (tall.input_warnings.empty() ? std::string("no warning") : tall.input_warnings[0]);
}

TEST(Plausibility, WarningsReachStderrJsonAndTheNote) {
    const fs::path file = scratch() / "unusual.yaml";
    std::ofstream(file) << edited_copy("demo/scenario.yaml", "  ch_m2_per_year: 4.0", "  ch_m2_per_year: 0.00000012");
    const CommandRun curve = run("curve " + file.string() + " --drain band-100x4 --pattern square --spacing 1.2");
    EXPECT_NE(curve.err.find("clay.ch_m2_per_year = 1.2e-07"), std::string::npos) << curve.err;
    const fs::path out = scratch();
    const CommandRun design = run("design " + file.string() + " --json --out " + out.string());
    const auto j = nlohmann::json::parse(design.out);
    ASSERT_FALSE(j["warnings"].empty());
    EXPECT_NE(j["warnings"][0].get<std::string>().find("a value in m²/s"), std::string::npos);
    // Shown once on stderr, though the design's record carries it too.
    EXPECT_EQ(design.err.find("clay.ch_m2_per_year"), design.err.rfind("clay.ch_m2_per_year")) << design.err;
    EXPECT_NE(design.err.find("clay.ch_m2_per_year"), std::string::npos) << design.err;
    EXPECT_NE(slurp(out / "design.md").find("clay.ch_m2_per_year = 1.2e-07"), std::string::npos);
}

}  // namespace
}  // namespace wickgrid::scenario
