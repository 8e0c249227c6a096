#pragma once
// Writers for the design record and degree–time curves: JSON, CSV, Markdown design note and the
// terminal table. They format a record; they never compute physics.
#include <nlohmann/json.hpp>
#include <string>

#include "report/format.hpp"
#include "results/design_record.hpp"

namespace wickgrid::report {

nlohmann::json design_json(const results::DesignRecord& record);
std::string design_csv(const results::DesignRecord& record);
// The design note. `extra_sections` (Markdown) goes before the method section: the report's charts
// and reliability table in report.md.
std::string design_markdown(const results::DesignRecord& record, const std::string& extra_sections = "");
std::string design_table(const results::DesignRecord& record);

// The criterion as JSON: {"criterion": "degree"|"residual_settlement", …, "deadline_days", "label"}.
nlohmann::json target_json(const Site& site);

nlohmann::json curve_json(const Site& site, const results::Curve& curve);
std::string curve_csv(const results::Curve& curve);
std::string curve_table(const Site& site, const results::Curve& curve);

// One scenario's recommended design for a batch summary (keys as the CSV header below), and the
// summary of several as CSV.
nlohmann::json design_summary_row(const results::DesignRecord& record);
std::string design_summary_csv(const std::vector<nlohmann::json>& rows);

// The title block in a JSON output: "project" (the fields the scenario gives) and
// "scenario_sha256" beside the "wickgrid_version" and "scenario" keys.
void add_title_block(nlohmann::json& out, const scenario::Scenario& s);
// The title block as a Markdown table.
std::string title_block_markdown(const scenario::Scenario& s);

// The sub-layer table (header and rows, units in the headings) shared by the note and the report.
std::vector<std::string> sublayer_header();
std::vector<std::vector<std::string>> sublayer_table_rows(const results::DesignRecord& record);

// The rows of the inputs table (quantity, value) shared by the Markdown note and the HTML report.
std::vector<std::pair<std::string, std::string>> input_rows(const results::DesignRecord& record);
// A layer's undrained strength as the file gives it, with the level its su_top refers to.
std::string strength_text(const UndrainedStrength& strength);

}  // namespace wickgrid::report
