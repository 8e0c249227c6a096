#pragma once
// Writers of the stage-stability record: JSON, the terminal table, the section with each stage's
// critical circle, the charts against time, and the report's section. Formatting only.
#include <nlohmann/json.hpp>
#include <string>
#include <vector>

#include "report/html_report.hpp"
#include "results/stage_record.hpp"

namespace wickgrid::report {

nlohmann::json stages_json(const scenario::Scenario& s, const results::StageRecord& record);
std::string stages_table(const scenario::Scenario& s, const results::StageRecord& record);

// The section to scale (right half; the section is symmetric): clay layers, each stage's fill and
// its critical circle.
std::string stage_section_svg(const results::StageRecord& record);
// The charts: the section, the factor of safety against time (with the target), and the fill height
// and settlement against time.
std::vector<Chart> stage_charts(const results::StageRecord& record);

// One paragraph: the design checked, the target, whether every stage meets it, and the fill to a
// finished level when the scenario asks for it.
std::string stage_summary(const results::StageRecord& record);

// The stage table (header and rows) shared by the Markdown note and the HTML report.
std::vector<std::string> stage_header(const results::StageRecord& record);
std::vector<std::vector<std::string>> stage_rows(const results::StageRecord& record);

}  // namespace wickgrid::report
