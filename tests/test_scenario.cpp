// Scenario validation: every error path names the key, the file position and what is allowed.
#include <gtest/gtest.h>

#include <fstream>
#include <sstream>

#include "scenario/scenario.hpp"
#include "scenario/suggest.hpp"
#include "wickgrid/design.hpp"
#include "wickgrid/units.hpp"

using namespace wickgrid;
using namespace wickgrid::scenario;

namespace {
std::string demo_text() {
    std::ifstream in(WICKGRID_SOURCE_DIR "/demo/scenario.yaml");
    std::ostringstream text;
    text << in.rdbuf();
    return text.str();
}

// Replaces the first occurrence of `from` (which must exist) in the demo text.
std::string demo_with(const std::string& from, const std::string& to) {
    std::string text = demo_text();
    const auto at = text.find(from);
    if (at == std::string::npos) throw std::logic_error("test row edits text that is not there: " + from);
    return text.replace(at, from.size(), to);
}

// Line (1-based) of the first line containing `needle` in text.
int line_of(const std::string& text, const std::string& needle) {
    const auto at = text.find(needle);
    return 1 + static_cast<int>(std::count(text.begin(), text.begin() + static_cast<long>(at), '\n'));
}

struct ErrorRow {
    const char* what;
    std::string from, to;  // edit of the demo file
    std::string key_path;
    std::string message_part;
    std::string line_with;  // the error must point at the line holding this text ("" = don't check)
};
}  // namespace

TEST(Scenario, DemoLoadsWithSIUnits) {
    const Scenario s = parse_scenario(demo_text(), "demo.yaml");
    EXPECT_EQ(s.drains.size(), 2u);
    EXPECT_NEAR(*s.site.ground.cv_m2_per_s * units::seconds_per_year, 1.2, 1e-12);
    EXPECT_NEAR(s.site.products[0].equivalent_diameter_m, 0.208 / 3.141592653589793, 1e-12);
    EXPECT_NEAR(units::seconds_to_days(s.site.criterion.deadline_s), 180.0, 1e-12);
    EXPECT_EQ(s.site.ground.kh_source, KhSource::from_ch_and_mv);
    EXPECT_NEAR(s.site.ground.uniform_clay().kh_m_per_s, *s.site.ground.ch_m2_per_s * 0.0008 * 9.81, 1e-20);
    EXPECT_EQ(s.site.range.patterns.size(), 2u);
    EXPECT_EQ(s.mark_of("clay.thickness_m")->line, line_of(demo_text(), "thickness_m: 14.0"));
}

TEST(Scenario, EveryErrorIsLocatedAndNamed) {
    const std::vector<ErrorRow> rows{
        {"unknown key with suggestion", "  thickness_m: 14.0", "  thicknes_m: 14.0", "clay.thicknes_m",
         "did you mean 'thickness_m'", "thicknes_m"},
        {"unknown top key", "patterns:", "paterns:", "paterns", "did you mean 'patterns'", "paterns:"},
        {"missing key", "  deadline_days: 180        # counted from the start of loading\n", "", "target.deadline_days",
         "missing key 'deadline_days'", ""},
        {"degree out of range", "degree: 0.90", "degree: 1.2", "target.degree", "between 0 and 1, both excluded",
         "degree: 1.2"},
        {"degree zero", "degree: 0.90", "degree: 0", "target.degree", "between 0 and 1", "degree: 0"},
        {"not a number", "cv_m2_per_year: 1.2", "cv_m2_per_year: fast", "clay.cv_m2_per_year", "'fast' is not a number",
         "cv_m2_per_year: fast"},
        {"nan is refused", "cv_m2_per_year: 1.2", "cv_m2_per_year: .nan", "clay.cv_m2_per_year", "greater than 0",
         "cv_m2_per_year: .nan"},
        {"negative ch", "ch_m2_per_year: 4.0", "ch_m2_per_year: -4.0", "clay.ch_m2_per_year", "greater than 0",
         "ch_m2_per_year: -4.0"},
        {"bad drainage name", "vertical_drainage: both_faces", "vertical_drainage: both", "clay.vertical_drainage",
         "one of both_faces, top_only, bottom_only", "vertical_drainage: both"},
        {"no mv or kh", "  mv_m2_per_kN: 0.0008      # kh = ch·mv·γw since kh_m_per_s is not given\n", "", "clay",
         "'mv_m2_per_kN' or 'kh_m_per_s'", ""},
        {"second drain width", "    width_mm: 100\n    thickness_mm: 6", "    width_mm: -100\n    thickness_mm: 6",
         "drains[1].width_mm", "greater than 0 mm", "width_mm: -100"},
        {"bad method with suggestion", "equivalent_diameter: hansbo_1979", "equivalent_diameter: hanbso_1979",
         "drains[0].equivalent_diameter", "did you mean 'hansbo_1979'", "hanbso_1979"},
        {"zero discharge", "discharge_capacity_m3_per_year: 150", "discharge_capacity_m3_per_year: 0",
         "drains[0].discharge_capacity_m3_per_year", "greater than 0", "discharge_capacity_m3_per_year: 0"},
        {"duplicate drain", "name: band-100x6-hiflow", "name: band-100x4", "drains[1].name", "used twice", ""},
        {"partial penetration with the closed form", "drain_length_m: 14.0", "method: analytical\ndrain_length_m: 10.0",
         "drain_length_m", "need 'method: layered_series' or 'method: numerical'", "drain_length_m: 10.0"},
        {"bad outlets", "drain_outlets: top", "drain_outlets: bottom", "drain_outlets", "top, top_and_bottom",
         "drain_outlets: bottom"},
        {"smear smaller than drain", "smear_diameter_ratio: 2.0", "smear_diameter_ratio: 0.5",
         "installation.smear_diameter_ratio", "smaller than the equivalent diameter", "smear_diameter_ratio: 0.5"},
        {"kh/ks below one", "smear_permeability_ratio: 3.0", "smear_permeability_ratio: 0.5",
         "installation.smear_permeability_ratio", "at least 1", "smear_permeability_ratio: 0.5"},
        {"closed form with parabolic smear",
         "  smear_permeability_ratio: 3.0   # kh / ks\n",
         "  smear_permeability_ratio: 3.0\n  smear_shape: parabolic\n  radial_theory: hansbo_1981\n",
         "installation.radial_theory", "use equal_strain_integral", "radial_theory: hansbo_1981"},
        {"unknown pattern", "patterns: [triangular, square]", "patterns: [triangular, hexagonal]", "patterns[1]",
         "one of triangular, square", "patterns: [triangular, hexagonal]"},
        {"repeated pattern", "patterns: [triangular, square]", "patterns: [square, square]", "patterns[1]",
         "listed twice", ""},
        {"min spacing inside smear", "min_m: 0.8", "min_m: 0.15", "spacing.min_m", "smear zone", "min_m: 0.15"},
        {"max below min", "max_m: 4.0", "max_m: 0.5", "spacing.max_m", "greater than 0.8", "max_m: 0.5"},
        {"increment too large", "increment_m: 0.05", "increment_m: 5", "spacing.increment_m", "at most max_m",
         "increment_m: 5"},
        {"wrong schema", "schema: 1", "schema: 2", "schema", "between 1 and 1", "schema: 2"},
        {"key twice", "  mv_m2_per_kN: 0.0008", "  ch_m2_per_year: 5\n  mv_m2_per_kN: 0.0008", "clay.ch_m2_per_year",
         "given twice", ""},
        {"target not a map",
         "target:\n  degree: 0.90              # average degree of consolidation, 0 < degree < 1\n"
         "  deadline_days: 180        # counted from the start of loading\n",
         "target: 0.9\n", "target", "mapping", "target: 0.9"},
        {"yaml syntax", "patterns: [triangular, square]", "patterns: [triangular, square", "", "YAML syntax", ""},
        {"tornado unknown input", "    ch_m2_per_year: [2.5, 6.0]", "    ch_m2_per_yr: [2.5, 6.0]", "studies.tornado.ch_m2_per_yr",
         "did you mean 'ch_m2_per_year'", "ch_m2_per_yr: [2.5"},
        {"tornado not a pair", "    ch_m2_per_year: [2.5, 6.0]", "    ch_m2_per_year: [2.5]", "studies.tornado.ch_m2_per_year",
         "[low, high]", "ch_m2_per_year: [2.5]"},
        {"tornado reversed", "    ch_m2_per_year: [2.5, 6.0]", "    ch_m2_per_year: [6.0, 2.5]",
         "studies.tornado.ch_m2_per_year[1]", "at least the low value", "ch_m2_per_year: [6.0, 2.5]"},
        {"tornado ratio below one", "smear_permeability_ratio: [2.0, 5.0]", "smear_permeability_ratio: [0.5, 5.0]",
         "studies.tornado.smear_permeability_ratio[0]", "at least 1", "smear_permeability_ratio: [0.5, 5.0]"},
        {"negative sd", "{distribution: lognormal, mean: 4.0, sd: 1.2}", "{distribution: lognormal, mean: 4.0, sd: -1.2}",
         "uncertain.ch_m2_per_year.sd", "at least 0", "mean: 4.0, sd: -1.2"},
        {"uniform reversed", "{distribution: uniform, low: 1.5, high: 3.0}", "{distribution: uniform, low: 3.0, high: 1.5}",
         "uncertain.smear_diameter_ratio.high", "at least 'low'", "low: 3.0, high: 1.5"},
        {"triangular mode outside", "low: 2.0, mode: 3.0, high: 5.0", "low: 2.0, mode: 6.0, high: 5.0",
         "uncertain.smear_permeability_ratio.high", "at least 'mode'", "mode: 6.0"},
        {"unknown distribution", "{distribution: lognormal, mean: 1.2, sd: 0.3}", "{distribution: weibull, mean: 1.2, sd: 0.3}",
         "uncertain.cv_m2_per_year.distribution", "normal, lognormal, uniform, triangular", "weibull"},
        {"distribution outside physical range", "{distribution: uniform, low: 1.5, high: 3.0}",
         "{distribution: uniform, low: 0.1, high: 0.2}", "uncertain.smear_diameter_ratio", "physical range", "low: 0.1"},
        {"bad correlation", "ch_cv_correlation: 0.6", "ch_cv_correlation: 1.5", "uncertain.ch_cv_correlation",
         "between -1 and 1", "ch_cv_correlation: 1.5"},
        {"fractional samples", "samples: 20000", "samples: 20.5", "uncertain.samples", "whole number", "samples: 20.5"},
    };
    for (const auto& row : rows) {
        const std::string text = demo_with(row.from, row.to);
        try {
            parse_scenario(text, "case.yaml");
            ADD_FAILURE() << row.what << ": accepted";
        } catch (const ScenarioError& e) {
            EXPECT_EQ(e.key_path(), row.key_path) << row.what << ": " << e.what();
            EXPECT_NE(e.message().find(row.message_part), std::string::npos) << row.what << ": " << e.what();
            EXPECT_EQ(e.file(), "case.yaml");
            EXPECT_GT(e.mark().line, 0) << row.what;
            EXPECT_GT(e.mark().column, 0) << row.what;
            if (!row.line_with.empty()) {
                EXPECT_EQ(e.mark().line, line_of(text, row.line_with)) << row.what << ": " << e.what();
            }
            const std::string where = "case.yaml:" + std::to_string(e.mark().line) + ":";
            EXPECT_EQ(std::string(e.what()).rfind(where, 0), 0u) << e.what();
        }
    }
}

TEST(Scenario, EmptyFileAndMissingFile) {
    EXPECT_THROW(parse_scenario("", "empty.yaml"), ScenarioError);
    try {
        load_scenario("/nonexistent/wickgrid.yaml");
        FAIL();
    } catch (const ScenarioError& e) {
        EXPECT_NE(e.message().find("cannot open"), std::string::npos);
    }
}

TEST(Scenario, DrainLookupSuggests) {
    const Scenario s = parse_scenario(demo_text(), "demo.yaml");
    try {
        s.drain("band-100x5");
        FAIL();
    } catch (const ScenarioError& e) {
        EXPECT_NE(e.message().find("did you mean 'band-100x4'"), std::string::npos) << e.what();
    }
}

TEST(Suggest, EditDistance) {
    // Levenshtein (1966): kitten → sitting needs 3 edits (the textbook example).
    EXPECT_EQ(edit_distance("kitten", "sitting"), 3u);
    EXPECT_EQ(edit_distance("", "abc"), 3u);
    EXPECT_EQ(closest("thicknes_m", {"thickness_m", "cv_m2_per_year"}).value(), "thickness_m");
    EXPECT_FALSE(closest("zzz", {"thickness_m"}).has_value());
}

namespace {
// A calibration block scales every ch (and cv) as if the file gave the scaled values: the demo with
// `calibration: {ch_factor: 1.3, cv_factor: 0.8}` designs as the demo with ch and cv so edited by hand.
TEST(Calibration, ActsAsTheScaledCoefficients) {
    const double ch = 4.0, cv = 1.2;  // the demo's clay (checked below)
    const std::string ch_line = "ch_m2_per_year: 4.0", cv_line = "cv_m2_per_year: 1.2";
    ASSERT_NE(demo_text().find(ch_line), std::string::npos);
    ASSERT_NE(demo_text().find(cv_line), std::string::npos);
    const auto calibrated = parse_scenario(demo_text() + "\ncalibration: {ch_factor: 1.3, cv_factor: 0.8, source: plates SP1-SP4}\n",
                                           "calibrated.yaml");
    std::string by_hand = demo_with(ch_line, "ch_m2_per_year: " + std::to_string(1.3 * ch));
    by_hand.replace(by_hand.find(cv_line), cv_line.size(), "cv_m2_per_year: " + std::to_string(0.8 * cv));
    const auto edited = parse_scenario(by_hand, "edited.yaml");
    ASSERT_TRUE(calibrated.calibration);
    EXPECT_EQ(calibrated.calibration->source, "plates SP1-SP4");
    const DesignResult a = run_design(calibrated.site), b = run_design(edited.site);
    ASSERT_EQ(a.rows.size(), b.rows.size());
    for (std::size_t i = 0; i < a.rows.size(); ++i) {
        EXPECT_NEAR(a.rows[i].spacing_limit_m, b.rows[i].spacing_limit_m, 1e-9);
        EXPECT_NEAR(a.rows[i].at_deadline.combined, b.rows[i].at_deadline.combined, 1e-12);
    }
    const DesignResult plain = run_design(parse_scenario(demo_text(), "demo.yaml").site);
    EXPECT_GT(a.rows[0].spacing_limit_m, plain.rows[0].spacing_limit_m + 0.01);  // a faster clay: wider drains
}

TEST(Calibration, BadBlocksAreNamed) {
    struct Row {
        std::string block, key, message;
    };
    for (const Row& row : {Row{"calibration: {}", "calibration", "give 'ch_factor'"},
                           Row{"calibration: {ch_factor: 0}", "calibration.ch_factor", "0.02 to 50"},
                           Row{"calibration: {ch_factor: 1.2, ch_factr: 1}", "calibration.ch_factr", "did you mean 'ch_factor'"},
                           Row{"calibration: 1.3", "calibration", "must be"}}) {
        try {
            parse_scenario(demo_text() + "\n" + row.block + "\n", "case.yaml");
            ADD_FAILURE() << row.block << " was accepted";
        } catch (const ScenarioError& e) {
            EXPECT_EQ(e.key_path(), row.key) << row.block;
            EXPECT_NE(e.message().find(row.message), std::string::npos) << e.message();
        }
    }
}
}  // namespace

namespace {
// rank_by: the demo ranks by cost (every product has one); asked, it ranks by drain metres, and a
// cost ranking where a product has no cost is refused at the key, naming the product.
TEST(RankBy, ChoosesTheRankingOrRefusesAtTheKey) {
    const auto by_cost = parse_scenario(demo_text(), "demo.yaml");
    EXPECT_EQ(run_design(by_cost.site).ranking, RankingBasis::cost_per_hectare);
    const auto by_length = parse_scenario(demo_text() + "\nrank_by: drain_length\n", "demo.yaml");
    const DesignResult r = run_design(by_length.site);
    EXPECT_EQ(r.ranking, RankingBasis::drain_length_per_hectare);
    const DesignRow* best = r.best();
    ASSERT_NE(best, nullptr);
    for (const auto& row : r.rows)
        if (row.feasible) {
            EXPECT_LE(best->drain_length_per_hectare_m, row.drain_length_per_hectare_m);
        }
    const std::string no_cost = demo_with("    cost_per_m: 1.45\n", "");
    try {
        parse_scenario(no_cost + "\nrank_by: cost\n", "demo.yaml");
        ADD_FAILURE() << "accepted";
    } catch (const ScenarioError& e) {
        EXPECT_EQ(e.key_path(), "rank_by");
        EXPECT_NE(e.message().find("band-100x6-hiflow"), std::string::npos) << e.message();
    }
    try {
        parse_scenario(demo_text() + "\nrank_by: price\n", "demo.yaml");
        ADD_FAILURE() << "accepted";
    } catch (const ScenarioError& e) {
        EXPECT_NE(e.message().find("must be one of cost, drain_length"), std::string::npos) << e.message();
    }
}
}  // namespace

namespace {
// studies.grid: an axis left out keeps its default, so `grid: {}` is the documented default grid.
TEST(GridStudy, AxesLeftOutKeepTheirDefaults) {
    const auto with_grid = [](const std::string& grid) {
        std::string text = demo_text();
        text.replace(text.find("studies:\n"), 9, "studies:\n  grid: " + grid + "\n");
        return parse_scenario(text, "demo.yaml");
    };
    const auto empty = with_grid("{}");
    EXPECT_TRUE(empty.studies.grid_given);
    EXPECT_EQ(empty.studies.grid_x.input, StudyInput::smear_permeability_ratio);
    EXPECT_DOUBLE_EQ(empty.studies.grid_x.from_si, 1.0);
    EXPECT_DOUBLE_EQ(empty.studies.grid_x.to_si, 6.0);
    EXPECT_EQ(empty.studies.grid_y.input, StudyInput::smear_diameter_ratio);
    EXPECT_EQ(empty.studies.grid_y.steps, 11);
    const auto x_only = with_grid("{x: {input: ch_m2_per_year, from: 2.0, to: 5.0, steps: 4}}");
    EXPECT_EQ(x_only.studies.grid_x.input, StudyInput::ch);
    EXPECT_EQ(x_only.studies.grid_x.steps, 4);
    EXPECT_EQ(x_only.studies.grid_y.input, StudyInput::smear_diameter_ratio);
    try {
        with_grid("{x: {input: smear_diameter_ratio, from: 1.5, to: 3.0}}");
        ADD_FAILURE() << "accepted";
    } catch (const ScenarioError& e) {
        EXPECT_EQ(e.key_path(), "studies.grid.x.input");
        EXPECT_NE(e.message().find("must differ from the other axis's input"), std::string::npos) << e.message();
    }
}
}  // namespace
