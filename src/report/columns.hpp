#pragma once
// One column schema for the design rows: key (JSON and CSV, a contract), heading, unit, decimals and
// the row's value. The terminal table, CSV, Markdown, HTML and JSON writers all read it.
#include <functional>
#include <optional>
#include <string>
#include <vector>

#include "results/design_record.hpp"

namespace wickgrid::report {

struct Column {
    std::string key;             // JSON/CSV key
    std::string heading;         // short heading for tables
    std::string unit;            // unit as shown ("" for none)
    int decimals = 2;            // shown decimals
    double shown_scale = 1.0;    // shown value = value × shown_scale (fractions → %)
    std::function<std::optional<double>(const DesignRow&)> value;  // JSON/CSV units; nullopt: no value
    std::function<std::string(const DesignRow&)> mark;             // appended to the shown value ('+', '*')
    std::string missing = "-";   // shown where there is no value

    std::string shown(const DesignRow& row) const;       // formatted for a table
    std::string heading_with_unit(const char* open = " ", const char* close = "") const;
};

// Every column, in order (JSON and CSV carry all of them, null or empty where not computed).
std::vector<Column> all_design_columns(const Site& site);
// The columns worth showing for this record (tables, Markdown, HTML): cost only where costed,
// settlement only where computed, the extra geometry figures left out.
std::vector<Column> shown_design_columns(const results::DesignRecord& record);

}  // namespace wickgrid::report
