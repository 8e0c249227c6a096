// wickgrid report FILE --out DIR: the HTML design report with its charts.
#include <spdlog/spdlog.h>

#include <filesystem>

#include "commands.hpp"
#include "report/atomic_file.hpp"
#include "report/html_report.hpp"
#include "scenario/scenario.hpp"

namespace wickgrid::cli {

namespace {
struct ReportCommandOptions {
    std::string file;
    std::string out_dir;
    std::string time_axis = "linear";
};
}  // namespace

Runner add_report(CLI::App& app) {
    auto* cmd = app.add_subcommand("report", "Write a self-contained HTML design report with SVG charts");
    auto o = std::make_shared<ReportCommandOptions>();
    cmd->add_option("FILE", o->file, "Scenario file (YAML)")->required();
    cmd->add_option("--out", o->out_dir, "Folder for report.html and the chart SVG files")->required();
    cmd->add_option("--time-axis", o->time_axis, "Degree–time charts: linear or log")->check(CLI::IsMember({"linear", "log"}));
    cmd->footer("Studies in the scenario ('studies:' one-at-a-time and grid) are charted too. Exit codes as for design.");
    return [o] {
        const auto s = scenario::load_scenario(o->file);
        const DesignInput input = s.design_input();
        const DesignResult result = run_design(input);
        report::SweepResults studies;
        studies.grid_x = s.studies.grid_x;
        studies.grid_y = s.studies.grid_y;
        if (!s.studies.tornado.empty()) studies.tornado = tornado_study(input, result, s.studies.tornado);
        if (s.studies.grid_given) studies.grid = grid_study(input, s.studies.grid_x, s.studies.grid_y);
        const auto bundle = report::build_report(s, result, studies, {o->time_axis == "log"});
        namespace fs = std::filesystem;
        report::ensure_directory(o->out_dir);
        const fs::path dir(o->out_dir);
        report::write_file_atomically((dir / "report.html").string(), bundle.html);
        for (const auto& chart : bundle.charts) report::write_file_atomically((dir / chart.file).string(), chart.svg);
        print_stdout("wrote " + (dir / "report.html").string() + " and " + std::to_string(bundle.charts.size()) +
                     " chart(s)\n");
        return static_cast<int>(result.any_feasible() ? ok : no_feasible_design);
    };
}

}  // namespace wickgrid::cli
