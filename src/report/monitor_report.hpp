#pragma once
// Writers of a monitoring back-analysis: terminal table, JSON (keys fixed by the contract) and CSV
// (one row per plate).
#include <nlohmann/json.hpp>
#include <string>

#include "results/monitor_record.hpp"

namespace wickgrid::report {

std::string monitor_table(const results::MonitorRecord& r);
nlohmann::json monitor_json(const results::MonitorRecord& r);
std::string monitor_csv(const results::MonitorRecord& r);
// A page with the title block, the table, and per plate: observed against predicted settlement
// (design and back-analysed) and the Asaoka plot with its fitted line and the 45° line.
std::string monitor_html(const results::MonitorRecord& r);

}  // namespace wickgrid::report
