#pragma once
// Settlement plate readings (CSV): columns plate, day, settlement_mm and optionally fill_height_m,
// several plates in one file, each plate's rows in time order. Every error names the file line.
#include <optional>
#include <string>
#include <vector>

#include "scenario.hpp"
#include "wickgrid/monitoring.hpp"

namespace wickgrid::scenario {

struct PlateRecord {
    std::string plate;
    std::vector<monitoring::Reading> readings;  // ascending time, SI
    std::optional<double> last_fill_change_s;  // the last day the plate's fill height changed
};

struct ReadingsFile {
    std::string file;
    std::vector<PlateRecord> plates;  // in order of first appearance
    std::vector<std::string> warnings;  // gaps in a record
};

// Throws ScenarioError (located) for: a missing column, a settlement column in other units
// (settlement_m, settlement_cm), an empty plate name, a cell that is not a number, a negative day,
// a plate's rows out of time order, two readings of one plate on one day, a settlement beyond
// ±20 m or a fill height beyond 0–50 m (units that do not fit), no readings.
ReadingsFile parse_readings(const std::string& text, const std::string& file);
ReadingsFile read_readings_file(const std::string& path);

// Piezometer readings (CSV): columns piezometer, day, depth_m, excess_pore_pressure_kPa.
struct PiezometerRecord {
    std::string piezometer;
    double depth_m = 0.0;  // below the top of the clay; one depth per piezometer
    std::vector<std::pair<double, double>> readings;  // (time s, excess pore pressure kPa), ascending
};
// Throws ScenarioError (located) as parse_readings does, and for a piezometer whose depth changes,
// a depth outside 0–200 m or an excess pore pressure outside −200…2000 kPa (a value in Pa?).
std::vector<PiezometerRecord> parse_piezometers(const std::string& text, const std::string& file);
std::vector<PiezometerRecord> read_piezometer_file(const std::string& path);

}  // namespace wickgrid::scenario
