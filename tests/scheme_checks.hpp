#pragma once
// Checks shared by the scheme-search tests (test_schedule_cli.cpp, test_matrix.cpp).
#include <gtest/gtest.h>

#include <nlohmann/json.hpp>

#include <algorithm>
#include <vector>

#include "cli_helpers.hpp"

namespace wickgrid::cli_testing {

// The chosen scheme's scenario through `design` and `stages`: the same spacing, criterion figures,
// start days and factors of safety as the search found.
inline void expect_reproduced(const fs::path& chosen, const nlohmann::json& scheme) {
    const CommandRun design = run("design " + chosen.string() + " --json");
    ASSERT_EQ(design.exit_code, 0) << design.err;
    const nlohmann::json d = nlohmann::json::parse(design.out);
    ASSERT_EQ(d["designs"].size(), 1u);
    const nlohmann::json& row = d["designs"][0];
    EXPECT_EQ(row["drain"], scheme["drain"]);
    EXPECT_EQ(row["pattern"], scheme["pattern"]);
    EXPECT_NEAR(row["spacing_m"].get<double>(), scheme["spacing_m"].get<double>(), 1e-12);
    EXPECT_NEAR(row["degree"].get<double>(), scheme["degree_at_deadline"].get<double>(), 1e-9);
    if (!scheme["residual_settlement_mm"].is_null()) {
        EXPECT_NEAR(row["residual_settlement_mm"].get<double>(), scheme["residual_settlement_mm"].get<double>(), 1e-6);
    }
    const CommandRun stages = run("stages " + chosen.string() + " --json --drain " + scheme["drain"].get<std::string>() +
                                  " --pattern " + scheme["pattern"].get<std::string>() + " --spacing " +
                                  std::to_string(scheme["spacing_m"].get<double>()));
    ASSERT_EQ(stages.exit_code, 0) << stages.err;
    const nlohmann::json st = nlohmann::json::parse(stages.out);
    EXPECT_TRUE(st["meets_target"].get<bool>());
    double least = 1e9;
    std::vector<double> lifts, surcharge;
    for (const auto& c : st["stages"]) {
        least = std::min(least, c["factor_of_safety"].get<double>());
        (c["surcharge"].get<bool>() ? surcharge : lifts).push_back(c["start_day"].get<double>());
    }
    EXPECT_NEAR(least, scheme["min_factor_of_safety"].get<double>(), 1e-9);
    lifts.insert(lifts.end(), surcharge.begin(), surcharge.end());
    const nlohmann::json& planned = scheme["stage_start_days"];
    ASSERT_EQ(lifts.size(), planned.size());
    for (std::size_t i = 0; i < lifts.size(); ++i) EXPECT_NEAR(lifts[i], planned[i].get<double>(), 1e-6) << "placement " << i;
}

}  // namespace wickgrid::cli_testing
