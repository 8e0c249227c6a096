#pragma once
// Writers of the scheme search (schedule.hpp): JSON, the terminal table and the cost–finish chart.
// Formatting only.
#include <nlohmann/json.hpp>
#include <string>

#include "report/html_report.hpp"
#include "scenario/scenario.hpp"
#include "wickgrid/schedule.hpp"

namespace wickgrid::report {

// `schedule --json`: {"schemes": [...], "cheapest", "soonest", "cautions", ...} (README: schedule).
nlohmann::json schedule_json(const scenario::Scenario& s, const ScheduleResult& result);
// The front, the cheapest and the soonest scheme, and how many schemes each condition left out.
std::string schedule_table(const scenario::Scenario& s, const ScheduleResult& result);
// Cost per hectare against finish day: every feasible scheme, the front joined.
Chart schedule_chart(const ScheduleResult& result);
// The front as a table (header and rows; the terminal, the note and the HTML report share it) and
// one paragraph: how many schemes, the cheapest and the soonest, and how many each condition left out.
std::vector<std::string> schedule_front_header(const Criterion& criterion);
std::vector<std::vector<std::string>> schedule_front_rows(const ScheduleResult& result);
std::string schedule_summary(const ScheduleResult& result);
// What the search assumes, in words (JSON `assumptions`, the table's list).
const std::vector<std::string>& schedule_assumptions();

}  // namespace wickgrid::report
