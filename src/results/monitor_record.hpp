#pragma once
// The result of `wickgrid monitor`: each settlement plate back-analysed (Asaoka, hyperbolic, direct
// fit of the site model) and forecast with the design and the back-analysed parameters. Writers
// format it; they never call the engine.
#include <optional>
#include <string>
#include <vector>

#include "scenario/readings_file.hpp"
#include "scenario/scenario.hpp"
#include "wickgrid/monitoring.hpp"

namespace wickgrid::results {

// When a back-analysis is too uncertain to forecast from (the rules the README states).
inline constexpr double asaoka_max_relative_se = 0.10;  // of s∞
inline constexpr double fit_max_interval_ratio = 4.0;   // upper / lower 95 % bound of ch

struct PlateAnalysis {
    std::string plate;
    std::size_t readings = 0;
    double window_start_s = 0.0;  // the last load change
    std::optional<double> window_end_s;  // the surcharge removal, when readings go past it
    double now_s = 0.0;           // the last reading used
    std::optional<monitoring::AsaokaFit> asaoka;
    std::optional<double> asaoka_ch_m2_per_s;
    bool asaoka_reliable = false;
    // Why Asaoka's s∞ is not the final settlement under the permanent fill (its value is kept, shown
    // with the flag): "under_vacuum" (the window overlaps the vacuum), "before_last_lift" (the plan
    // places more load after the last reading).
    std::vector<std::string> asaoka_flags;
    std::optional<monitoring::HyperbolicFit> hyperbolic;
    std::optional<monitoring::DirectFit> fit;
    bool fit_reliable = false;
    std::optional<double> design_final_m;
    monitoring::Forecast design_forecast;
    std::optional<monitoring::Forecast> fitted_forecast;
    std::vector<std::string> notes;  // why a method gave nothing, or why it is not relied on
    // For the charts: the readings, and the settlement of the design and of the fitted model.
    std::vector<monitoring::Reading> observed;
    std::vector<double> curve_times_s;
    std::vector<double> design_curve_m;  // empty without a design settlement model
    std::vector<double> fitted_curve_m;  // empty without a fit
};

struct MonitorRecord {
    const scenario::Scenario* scenario = nullptr;
    std::string drain;
    Pattern pattern = Pattern::triangular;
    double spacing_m = 0.0;
    std::string readings_file;
    std::optional<double> design_ch_m2_per_s;  // the clay-wide ch; none when each layer gives its own
    std::vector<PlateAnalysis> plates;
    std::vector<std::string> warnings;
    std::vector<std::string> assumptions;
    // Piezometers, shown against the design's depth-mean excess pore pressure p(t) − U(t)·p_final
    // (empty without a load history).
    std::vector<scenario::PiezometerRecord> piezometers;
    std::vector<double> pore_times_s;
    std::vector<double> design_mean_excess_kPa;
    // The design's excess pore pressure at each piezometer's depth at pore_times_s (CellModel::
    // over_depth); empty for a piezometer below the clay or with a method that reports depth means only.
    std::vector<std::vector<double>> design_excess_at_piezometer_kPa;
};

// Adds the piezometer records and the design's depth-mean excess pore pressure over their span.
void add_piezometers(MonitorRecord& record, std::vector<scenario::PiezometerRecord> piezometers);

// Back-analyses every plate. Throws ScenarioError-free engine errors only for the design cell
// itself (InputError, EvaluationError); a method that cannot analyse a plate leaves a note instead.
MonitorRecord monitor_record(const scenario::Scenario& s, const std::string& drain, Pattern pattern, double spacing_m,
                             const scenario::ReadingsFile& readings, std::optional<double> asaoka_interval_s);

}  // namespace wickgrid::results
