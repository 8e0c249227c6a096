// RFC 4180 CSV with cell locations.
#include "csv_table.hpp"

#include <charconv>
#include <cmath>
#include <filesystem>
#include <fstream>
#include <set>
#include <sstream>

#include "text_encoding.hpp"

namespace wickgrid::scenario {

namespace {
std::string trimmed(const std::string& s) {
    const auto first = s.find_first_not_of(" \t");
    if (first == std::string::npos) return "";
    const auto last = s.find_last_not_of(" \t");
    return s.substr(first, last - first + 1);
}

struct Reader {
    const std::string& text;
    const std::string& file;
    std::size_t pos = 0;
    int line = 1;
    int column = 1;

    bool at_end() const { return pos >= text.size(); }
    char peek() const { return text[pos]; }
    void advance() {
        if (text[pos] == '\n') {
            ++line;
            column = 1;
        } else {
            ++column;
        }
        ++pos;
    }

    CsvCell cell() {
        CsvCell out{"", {line, column}};
        while (!at_end() && (peek() == ' ' || peek() == '\t')) advance();
        if (!at_end() && peek() == '"') {
            const Mark open{line, column};
            advance();
            for (;;) {
                if (at_end()) throw ScenarioError(file, open, "", "a quoted field is not closed (a '\"' is missing)");
                if (peek() == '"') {
                    advance();
                    if (at_end() || peek() != '"') break;
                }
                out.text += peek();
                advance();
            }
            while (!at_end() && (peek() == ' ' || peek() == '\t' || peek() == '\r')) advance();
            if (!at_end() && peek() != ',' && peek() != '\n')
                throw ScenarioError(file, {line, column}, "", "text after a closing quote; put the whole field in quotes");
            return out;
        }
        std::string raw;
        while (!at_end() && peek() != ',' && peek() != '\n') {
            if (peek() != '\r') raw += peek();
            advance();
        }
        out.text = trimmed(raw);
        return out;
    }

    // One record; empty when the line is blank.
    std::vector<CsvCell> record() {
        std::vector<CsvCell> cells;
        cells.push_back(cell());
        while (!at_end() && peek() == ',') {
            advance();
            cells.push_back(cell());
        }
        if (!at_end()) advance();  // the line end
        if (cells.size() == 1 && cells[0].text.empty()) cells.clear();
        return cells;
    }
};
}  // namespace

std::optional<std::size_t> CsvTable::column(const std::string& name) const {
    for (std::size_t i = 0; i < header.size(); ++i)
        if (header[i].text == name) return i;
    return std::nullopt;
}

std::size_t CsvTable::required_column(const std::string& name) const {
    if (const auto i = column(name)) return *i;
    std::string have;
    for (const auto& h : header) have += (have.empty() ? "" : ", ") + h.text;
    throw ScenarioError(file, header.empty() ? Mark{1, 1} : header.front().mark, "",
                        "the header has no column '" + name + "' (it has: " + have + ")");
}

CsvTable parse_csv(const std::string& text, const std::string& file) {
    // Names in the cells reach JSON, HTML and the terminal: refuse other encodings where they are.
    require_utf8(text, file, "file");
    // Line ends of CR alone (an old spreadsheet's export) are line ends too, counted as an editor does.
    std::string lf;
    const bool lone_cr = [&] {
        for (std::size_t i = 0; i < text.size(); ++i)
            if (text[i] == '\r' && (i + 1 == text.size() || text[i + 1] != '\n')) return true;
        return false;
    }();
    if (lone_cr) {
        lf = text;
        for (std::size_t i = 0; i < lf.size(); ++i)
            if (lf[i] == '\r' && (i + 1 == lf.size() || lf[i + 1] != '\n')) lf[i] = '\n';
    }
    Reader r{lone_cr ? lf : text, file};
    if (text.rfind("\xEF\xBB\xBF", 0) == 0) r.pos = 3;
    CsvTable table;
    table.file = file;
    while (!r.at_end() && table.header.empty()) table.header = r.record();
    if (table.header.empty()) throw ScenarioError(file, {1, 1}, "", "is empty; a header row and data rows are needed");
    std::set<std::string> names;
    for (const auto& h : table.header) {
        if (h.text.empty()) throw ScenarioError(file, h.mark, "", "a column in the header has no name");
        if (!names.insert(h.text).second)
            throw ScenarioError(file, h.mark, "", "the column '" + h.text + "' appears twice in the header");
    }
    while (!r.at_end()) {
        const int line = r.line;
        auto row = r.record();
        if (row.empty()) continue;
        if (row.size() != table.header.size())
            throw ScenarioError(file, {line, 1}, "",
                                "has " + std::to_string(row.size()) + " fields; the header has " +
                                    std::to_string(table.header.size()));
        table.rows.push_back(std::move(row));
    }
    return table;
}

std::string read_input_file(const std::string& path, const std::string& what) {
    std::error_code ec;
    if (std::filesystem::is_directory(path, ec)) throw ScenarioError(display_path(path), {0, 0}, "", "is a folder, not a " + what);
    std::ifstream in(path, std::ios::binary);
    if (!in) throw ScenarioError(display_path(path), {0, 0}, "", "cannot open the " + what);
    std::ostringstream text;
    text << in.rdbuf();
    return text.str();
}

CsvTable read_csv_file(const std::string& path) { return parse_csv(read_input_file(path, "CSV file"), display_path(path)); }

double csv_number(const CsvTable& table, const CsvCell& cell, const std::string& column, const std::string& allowed) {
    double value = 0.0;
    const char* first = cell.text.data();
    const char* last = first + cell.text.size();
    if (!cell.text.empty() && *first == '+') ++first;
    const auto [end, ec] = std::from_chars(first, last, value);
    if (cell.text.empty() || ec != std::errc() || end != last || !std::isfinite(value))
        throw ScenarioError(table.file, cell.mark, column,
                            "'" + cell.text + "' is not a number; " + allowed);
    return value;
}

}  // namespace wickgrid::scenario
