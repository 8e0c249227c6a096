#pragma once
// Writers for sensitivity and uncertainty studies (format only: the record holds the results).
#include <nlohmann/json.hpp>
#include <string>

#include "results/design_record.hpp"

namespace wickgrid::report {

nlohmann::json sweep_json(const results::DesignRecord& record);
std::string tornado_csv(const Site& site, const std::vector<TornadoRow>& rows);
std::string grid_csv(const std::vector<GridCell>& cells, const GridAxis& x, const GridAxis& y);
std::string monte_carlo_csv(const MonteCarloResult& mc);
std::string sweep_table(const results::DesignRecord& record);

}  // namespace wickgrid::report
