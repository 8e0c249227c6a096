// wickgrid report FILE --out DIR: the HTML design report with its charts.
#include "commands.hpp"
#include "results/schedule_record.hpp"
#include "report/html_report.hpp"
#include "report/study_report.hpp"
#include "results/stage_record.hpp"

namespace wickgrid::cli {

namespace {
struct ReportCommandOptions {
    std::vector<std::string> files;
    std::string out_dir;
    std::string time_axis = "linear";
};
}  // namespace

Runner add_report(CLI::App& app) {
    auto* cmd = app.add_subcommand("report", "Write a self-contained HTML design report with SVG charts");
    auto o = std::make_shared<ReportCommandOptions>();
    cmd->add_option("FILE", o->files, "Scenario file (YAML); several files, or - for standard input")->required();
    cmd->add_option("--out", o->out_dir, "Folder for report.html, report.md (the same content as a Markdown note) and the chart SVG files")->required();
    cmd->add_option("--time-axis", o->time_axis, "Degree–time charts: linear or log")->check(CLI::IsMember({"linear", "log"}));
    cmd->footer("Studies in the scenario ('studies:' one-at-a-time and grid, 'uncertain:' Monte Carlo) are charted too; a "
                "scenario with an 'embankment' and a strength in every layer gets the stage checks of the recommended "
                "design (as 'stages'), and with a 'schedule:' block the scheme search (as 'schedule'). Exit codes as for design.");
    return [o] {
        return run_each(o->files, {false, false}, [&](const BatchItem& item) {
            const std::string& file = item.file;
            const auto s = load_scenario_warned(file);
            results::DesignRecord record = results::design_record(s, {true, o->time_axis == "log"});
            record.studies.grid_x = s.studies.grid_x;
            record.studies.grid_y = s.studies.grid_y;
            if (!s.studies.tornado.empty()) record.studies.tornado = tornado_study(s.site, record.result, s.studies.tornado);
            if (s.studies.grid_given) record.studies.grid = grid_study(s.site, s.studies.grid_x, s.studies.grid_y);
            if (s.studies.monte_carlo) {  // the scenario's own samples and seed, so the report repeats sweep's figures
                record.studies.monte_carlo = monte_carlo(s.site, record.result, *s.studies.monte_carlo);
                record.studies.monte_carlo_spec = *s.studies.monte_carlo;
            }
            // A site that can be checked stage by stage gets the checks of its recommended design.
            if (const DesignRow* best = record.result.best(); best && !results::stage_check_refusal(s))
                record.stages = results::stage_record(s, best->drain, best->pattern, best->spacing_m, false,
                                                      defaults::chart_points / 2);
            // A scenario with a `schedule:` block gets its scheme search (as 'schedule').
            if (s.schedule) record.schedule = results::schedule_record(s, 0);
            const auto bundle = report::build_report(record);
            std::vector<std::pair<std::string, std::string>> files{{"report.html", bundle.html}, {"report.md", bundle.markdown}};
            for (const auto& chart : bundle.charts) files.emplace_back(chart.file, chart.svg);
            write_outputs(item.out_dir(o->out_dir), {file}, files, report::trace_fields(s));
            item.print("wrote " + item.out_dir(o->out_dir) + "/report.html, report.md and " + std::to_string(bundle.charts.size()) + " chart(s)\n");
            return static_cast<int>(record.result.any_feasible() ? ok : no_feasible_design);
        });
    };
}

}  // namespace wickgrid::cli
