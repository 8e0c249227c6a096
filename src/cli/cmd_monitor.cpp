// wickgrid monitor FILE --readings CSV --drain NAME --pattern P --spacing S: settlement plate
// records back-analysed (Asaoka, hyperbolic, direct fit) and the forecast they imply.
#include <spdlog/spdlog.h>

#include "commands.hpp"
#include "report/monitor_report.hpp"
#include "results/monitor_record.hpp"
#include "scenario/readings_file.hpp"
#include "wickgrid/errors.hpp"
#include "wickgrid/monitoring.hpp"
#include "wickgrid/units.hpp"

namespace wickgrid::cli {

namespace {
struct MonitorOptions {
    std::vector<std::string> files;
    std::string readings;
    std::string piezometers;
    std::string drain;
    std::string pattern;
    double spacing_m = 0.0;
    double interval_days = 0.0;
    bool json = false;
    bool csv = false;
    std::string out_dir;
};
}  // namespace

Runner add_monitor(CLI::App& app) {
    auto* cmd = app.add_subcommand("monitor", "Back-analyse settlement plate readings and forecast the rest");
    auto o = std::make_shared<MonitorOptions>();
    cmd->add_option("FILE", o->files, "Scenario file (YAML); several files, or - for standard input")->required();
    cmd->add_option("--readings", o->readings, "CSV with plate,day,settlement_mm[,fill_height_m]; days from the start of loading")
        ->required();
    cmd->add_option("--piezometers", o->piezometers,
                    "CSV with piezometer,day,depth_m,excess_pore_pressure_kPa (shown against the design)");
    cmd->add_option("--drain", o->drain, "Drain product installed (a name from the scenario)")->required();
    cmd->add_option("--pattern", o->pattern, "Pattern installed: triangular or square")->required()->check(pattern_check());
    cmd->add_option("--spacing", o->spacing_m, "Spacing installed (m)")->required()->check(positive_number());
    auto* interval = cmd->add_option("--interval-days", o->interval_days,
                                     "Asaoka's constant interval (days; default: up to 12 steps after the last load change)")
                         ->check(positive_number());
    auto* json = cmd->add_flag("--json", o->json, "JSON on stdout");
    cmd->add_flag("--csv", o->csv, "CSV on stdout (one row per plate)")->excludes(json);
    cmd->add_option("--out", o->out_dir, "Also write monitor.json, monitor.csv and monitor.html (charts) into this folder");
    cmd->footer("Exit codes: 0 ok, 2 bad input (the readings file names its line), 3 an output could not be written, "
                "5 the installed cell cannot be evaluated.");
    return [o, interval] {
        return run_each(o->files, {o->json, o->csv}, [&](const BatchItem& item) {
            const std::string& file = item.file;
            const auto s = load_scenario_warned(file);
            const auto readings = scenario::read_readings_file(o->readings);
            const Pattern pattern = pattern_option(o->pattern);
            model_from_options(s, o->drain, pattern, o->spacing_m);  // the installed cell, refused with the option at fault
            const std::optional<double> asaoka_interval =
                interval->count() > 0 ? std::optional(units::days_to_seconds(o->interval_days)) : std::nullopt;
            if (asaoka_interval) {  // bounded before any work: the record from day 0 to its last reading
                double last_s = 0.0;
                for (const auto& plate : readings.plates) last_s = std::max(last_s, plate.readings.back().time_s);
                if (!(last_s / *asaoka_interval < static_cast<double>(monitoring::asaoka_max_points)))
                    throw UsageError("--interval-days",
                                     format_value(o->interval_days) + " days resamples the record (to day " +
                                         format_value(units::seconds_to_days(last_s)) + ") into more than " +
                                         std::to_string(monitoring::asaoka_max_points) + " points; give at least " +
                                         format_value(units::seconds_to_days(last_s) / monitoring::asaoka_max_points) + " days");
            }
            auto record = results::monitor_record(s, s.drain(o->drain).name, pattern, o->spacing_m, readings, asaoka_interval);
            std::vector<std::string> inputs{file, o->readings};
            if (!o->piezometers.empty()) {
                results::add_piezometers(record, scenario::read_piezometer_file(o->piezometers));
                inputs.push_back(o->piezometers);
            }
            for (const auto& w : record.warnings) spdlog::warn("{}", w);
            const std::string json_text = report::monitor_json(record).dump(2) + "\n";
            if (!o->out_dir.empty())
                write_outputs(item.out_dir(o->out_dir), inputs,
                              {{"monitor.json", json_text},
                               {"monitor.csv", report::monitor_csv(record)},
                               {"monitor.html", report::monitor_html(record)}},
                              report::trace_fields(s));
            if (o->json) item.print(json_text);
            else if (o->csv) item.print(report::monitor_csv(record));
            else item.print(report::monitor_table(record));
            return static_cast<int>(ok);
        });
    };
}

}  // namespace wickgrid::cli
