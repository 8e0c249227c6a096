#pragma once
// Data files in CSV (RFC 4180: a header row, commas, fields optionally in double quotes with ""
// for a quote inside), read with the line and column of every cell so that errors can point at
// them. Used by the layout's area and base-depth files (and any later table of readings).
#include <optional>
#include <string>
#include <vector>

#include "scenario.hpp"

namespace wickgrid::scenario {

struct CsvCell {
    std::string text;  // unquoted, surrounding spaces removed
    Mark mark;         // where the cell starts (1-based line and column)
};

struct CsvTable {
    std::string file;
    std::vector<CsvCell> header;
    std::vector<std::vector<CsvCell>> rows;  // every row has the header's number of cells

    // The index of a column, or nothing when the header does not have it.
    std::optional<std::size_t> column(const std::string& name) const;
    // The index of a column that must be there; ScenarioError at the header naming the columns.
    std::size_t required_column(const std::string& name) const;
};

// Parses CSV text. Throws ScenarioError (located) for an unterminated quote, a row with more or
// fewer cells than the header, a repeated or empty column name, or no header. Blank lines are
// skipped; a UTF-8 byte-order mark and CRLF line ends are accepted.
CsvTable parse_csv(const std::string& text, const std::string& file);

// Reads and parses a CSV file; ScenarioError when it cannot be opened or is a folder.
CsvTable read_csv_file(const std::string& path);

// A cell as a finite number; ScenarioError at the cell naming the column, the text and `allowed`.
double csv_number(const CsvTable& table, const CsvCell& cell, const std::string& column, const std::string& allowed);

// Reads a whole file as bytes; ScenarioError when it cannot be opened or is a folder. `what` names
// the file's role in the message ("area file", "base depth file").
std::string read_input_file(const std::string& path, const std::string& what);

}  // namespace wickgrid::scenario
