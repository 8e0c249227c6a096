#pragma once
// Text formatting shared by every writer: fixed-point numbers, one RFC 4180 CSV writer for every
// CSV, and the aligned terminal table.
#include <optional>
#include <string>
#include <vector>

namespace wickgrid::report {

// Fixed-point text with the given decimals.
std::string fixed(double value, int decimals);
// A number for CSV (10 significant digits), or an empty field.
std::string csv_number(std::optional<double> value);

// RFC 4180 quoting: a field with a comma, a double quote, CR or LF is quoted and its quotes doubled.
// Records end in LF (the README says so).
std::string csv_field(const std::string& text);
std::string csv_document(const std::vector<std::string>& header, const std::vector<std::vector<std::string>>& rows);

// Text for a Markdown table cell or line: the characters Markdown or HTML would read as markup
// (| < > & ` \ and line breaks) are escaped, so a name cannot break a table or inject a tag.
std::string markdown_text(const std::string& text);

// A table aligned in characters (UTF-8 aware); the first `left_columns` columns left-aligned.
std::string text_table(const std::vector<std::string>& header, const std::vector<std::vector<std::string>>& rows,
                       std::size_t left_columns = 2);

}  // namespace wickgrid::report
