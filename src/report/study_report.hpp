#pragma once
// Writers for sensitivity and uncertainty studies.
#include <nlohmann/json.hpp>
#include <optional>
#include <string>

#include "scenario/scenario.hpp"
#include "wickgrid/studies.hpp"

namespace wickgrid::report {

struct SweepResults {
    std::optional<std::vector<TornadoRow>> tornado;
    std::optional<std::vector<GridCell>> grid;
    GridAxis grid_x, grid_y;
    std::optional<MonteCarloResult> monte_carlo;
};

nlohmann::json sweep_json(const scenario::Scenario& s, const SweepResults& r);
std::string tornado_csv(const std::vector<TornadoRow>& rows);
std::string grid_csv(const std::vector<GridCell>& cells, const GridAxis& x, const GridAxis& y);
std::string monte_carlo_csv(const MonteCarloResult& mc);
std::string sweep_table(const scenario::Scenario& s, const SweepResults& r);

}  // namespace wickgrid::report
