#include "readings_file.hpp"

#include <algorithm>
#include <cmath>
#include <map>

#include "csv_table.hpp"
#include "text_encoding.hpp"
#include "wickgrid/errors.hpp"
#include "wickgrid/defaults.hpp"
#include "wickgrid/units.hpp"

namespace wickgrid::scenario {

namespace {
// Readings lie within the record the engine computes (defaults::search_horizon_years).
constexpr double latest_reading_day = defaults::search_horizon_years * units::days_per_year;
constexpr std::size_t most_gap_warnings = 10;  // per plate

constexpr double most_settlement_mm = 20000.0;  // 20 m: beyond any consolidation settlement
constexpr double most_fill_height_m = 50.0;
constexpr double gap_to_warn = 3.0;  // a gap over 3 × the plate's median interval is named

void refuse_other_units(const CsvTable& t) {
    for (const char* other : {"settlement_m", "settlement_cm", "settlement", "settlement_in"})
        if (const auto c = t.column(other))
            throw ScenarioError(t.file, t.header[*c].mark, "",
                                std::string("the column '") + other +
                                    "' is not read: give settlements in millimetres as 'settlement_mm'");
}

// A name that will be printed on the terminal and written to CSV, JSON and HTML: no control
// characters (ESC could rewrite the terminal, CR or NUL break a row).
void require_printable_name(const CsvTable& t, const CsvCell& cell, const std::string& column) {
    const std::size_t at = first_control_char(cell.text);
    if (at == std::string::npos) return;
    static constexpr char digits[] = "0123456789abcdef";
    const auto b = static_cast<unsigned char>(cell.text[at]);
    throw ScenarioError(t.file, cell.mark, column,
                        std::string("the name holds a control character (byte 0x") + digits[b >> 4] + digits[b & 15] +
                            "); use printable characters");
}

void gap_warnings(const ReadingsFile& f, std::vector<std::string>& out) {
    for (const auto& p : f.plates) {
        if (p.readings.size() < 3) continue;
        std::vector<double> gaps;
        for (std::size_t i = 1; i < p.readings.size(); ++i) gaps.push_back(p.readings[i].time_s - p.readings[i - 1].time_s);
        std::vector<double> sorted = gaps;
        std::nth_element(sorted.begin(), sorted.begin() + sorted.size() / 2, sorted.end());
        const double median = sorted[sorted.size() / 2];
        std::size_t shown = 0, more = 0;
        for (std::size_t i = 0; i < gaps.size(); ++i) {
            if (!(gaps[i] > gap_to_warn * median)) continue;
            if (shown == most_gap_warnings) {  // a record full of gaps: say so once, not a line per gap
                ++more;
                continue;
            }
            ++shown;
            out.push_back("plate " + p.plate + ": no reading between day " +
                          format_value(units::seconds_to_days(p.readings[i].time_s)) + " and day " +
                          format_value(units::seconds_to_days(p.readings[i + 1].time_s)) + " (" +
                          format_value(gaps[i] / median) + " × the usual interval)");
        }
        if (more > 0)
            out.push_back("plate " + p.plate + ": " + std::to_string(more) + " more gaps like these (not listed)");
    }
}
}  // namespace

ReadingsFile parse_readings(const std::string& text, const std::string& file) {
    const CsvTable t = parse_csv(text, file);
    refuse_other_units(t);
    const std::size_t cp = t.required_column("plate");
    const std::size_t cd = t.required_column("day");
    const std::size_t cs = t.required_column("settlement_mm");
    const auto cf = t.column("fill_height_m");
    if (t.rows.empty()) throw ScenarioError(file, t.header.front().mark, "", "has a header but no readings");
    ReadingsFile out;
    out.file = file;
    std::map<std::string, std::size_t> index;
    std::map<std::string, std::pair<double, int>> last;  // plate → last day, its line
    std::map<std::string, double> last_fill;
    for (const auto& row : t.rows) {
        const std::string& plate = row[cp].text;
        if (plate.empty()) throw ScenarioError(file, row[cp].mark, "plate", "a reading without a plate name");
        require_printable_name(t, row[cp], "plate");
        const double day = csv_number(t, row[cd], "day", "a day of at least 0 from the start of loading");
        if (day < 0.0)
            throw ScenarioError(file, row[cd].mark, "day", "'" + row[cd].text + "' is before the start of loading (day 0)");
        if (day > latest_reading_day)
            throw ScenarioError(file, row[cd].mark, "day",
                                "'" + row[cd].text + "' is more than 100 years after the start of loading (a day number, not a date?)");
        const double mm = csv_number(t, row[cs], "settlement_mm", "a settlement in millimetres");
        if (std::abs(mm) > most_settlement_mm)
            throw ScenarioError(file, row[cs].mark, "settlement_mm",
                                "'" + row[cs].text + "' mm is more than 20 m: the settlement must be in millimetres");
        const int line = row.front().mark.line;
        if (const auto it = last.find(plate); it != last.end()) {
            if (day == it->second.first)
                throw ScenarioError(file, row[cd].mark, "day",
                                    "a second reading of plate " + plate + " on day " + row[cd].text + " (line " +
                                        std::to_string(it->second.second) + " has one)");
            if (day < it->second.first)
                throw ScenarioError(file, row[cd].mark, "day",
                                    "day " + row[cd].text + " of plate " + plate + " comes after day " +
                                        format_value(it->second.first) + " (line " + std::to_string(it->second.second) +
                                        "); list each plate's readings in time order");
        }
        last[plate] = {day, line};
        if (!index.count(plate)) {
            index[plate] = out.plates.size();
            out.plates.push_back({plate, {}, std::nullopt});
        }
        PlateRecord& p = out.plates[index[plate]];
        p.readings.push_back({units::days_to_seconds(day), mm / 1000.0});
        if (cf) {
            const double h = csv_number(t, row[*cf], "fill_height_m", "a fill height in metres");
            if (h < 0.0 || h > most_fill_height_m)
                throw ScenarioError(file, row[*cf].mark, "fill_height_m",
                                    "'" + row[*cf].text + "' is not a fill height of 0–50 m: the height must be in metres");
            if (const auto it = last_fill.find(plate); it != last_fill.end() && std::abs(h - it->second) > 1e-9)
                p.last_fill_change_s = units::days_to_seconds(day);
            last_fill[plate] = h;
        }
    }
    gap_warnings(out, out.warnings);
    return out;
}

std::vector<PiezometerRecord> parse_piezometers(const std::string& text, const std::string& file) {
    const CsvTable t = parse_csv(text, file);
    const std::size_t cn = t.required_column("piezometer");
    const std::size_t cd = t.required_column("day");
    const std::size_t cz = t.required_column("depth_m");
    const std::size_t cu = t.required_column("excess_pore_pressure_kPa");
    if (t.rows.empty()) throw ScenarioError(file, t.header.front().mark, "", "has a header but no readings");
    std::vector<PiezometerRecord> out;
    std::map<std::string, std::size_t> index;
    std::map<std::string, int> last_line;
    for (const auto& row : t.rows) {
        const std::string& name = row[cn].text;
        if (name.empty()) throw ScenarioError(file, row[cn].mark, "piezometer", "a reading without a piezometer name");
        require_printable_name(t, row[cn], "piezometer");
        const double day = csv_number(t, row[cd], "day", "a day of at least 0 from the start of loading");
        if (day < 0.0)
            throw ScenarioError(file, row[cd].mark, "day", "'" + row[cd].text + "' is before the start of loading (day 0)");
        if (day > latest_reading_day)
            throw ScenarioError(file, row[cd].mark, "day",
                                "'" + row[cd].text + "' is more than 100 years after the start of loading (a day number, not a date?)");
        const double depth = csv_number(t, row[cz], "depth_m", "a depth in metres");
        if (depth < 0.0 || depth > 200.0)
            throw ScenarioError(file, row[cz].mark, "depth_m", "'" + row[cz].text + "' is not a depth of 0–200 m below the top of the clay");
        const double u = csv_number(t, row[cu], "excess_pore_pressure_kPa", "an excess pore pressure in kPa");
        if (u < -200.0 || u > 2000.0)
            throw ScenarioError(file, row[cu].mark, "excess_pore_pressure_kPa",
                                "'" + row[cu].text + "' is outside −200…2000 kPa: the pressure must be in kPa");
        const int line = row.front().mark.line;
        if (!index.count(name)) {
            index[name] = out.size();
            out.push_back({name, depth, {}});
        }
        PiezometerRecord& p = out[index[name]];
        if (depth != p.depth_m)
            throw ScenarioError(file, row[cz].mark, "depth_m",
                                "piezometer " + name + " was at " + format_value(p.depth_m) + " m (line " +
                                    std::to_string(last_line[name]) + "); one depth per piezometer");
        const double time = units::days_to_seconds(day);
        if (!p.readings.empty() && time == p.readings.back().first)
            throw ScenarioError(file, row[cd].mark, "day",
                                "a second reading of piezometer " + name + " on day " + row[cd].text + " (line " +
                                    std::to_string(last_line[name]) + " has one)");
        if (!p.readings.empty() && time < p.readings.back().first)
            throw ScenarioError(file, row[cd].mark, "day",
                                "day " + row[cd].text + " of piezometer " + name + " comes after day " +
                                    format_value(units::seconds_to_days(p.readings.back().first)) + " (line " +
                                    std::to_string(last_line[name]) + "); list each piezometer's readings in time order");
        p.readings.emplace_back(time, u);
        last_line[name] = line;
    }
    return out;
}

std::vector<PiezometerRecord> read_piezometer_file(const std::string& path) {
    return parse_piezometers(read_input_file(path, "piezometer file"), display_path(path));
}

ReadingsFile read_readings_file(const std::string& path) {
    return parse_readings(read_input_file(path, "readings file"), display_path(path));
}

}  // namespace wickgrid::scenario
