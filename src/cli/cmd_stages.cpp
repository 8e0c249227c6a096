// wickgrid stages FILE: the stability of each fill stage when placed, with the strength gained by
// then, and the earliest day the next may start; --plan gives the earliest schedule.
#include <cmath>

#include "commands.hpp"
#include "report/stage_report.hpp"
#include "wickgrid/design.hpp"
#include "wickgrid/errors.hpp"

namespace wickgrid::cli {

namespace {
struct StagesOptions {
    std::vector<std::string> files;
    std::string drain;
    std::string pattern;
    std::optional<double> spacing_m;
    bool plan = false;
    bool json = false;
    std::string out_dir;
};
}  // namespace

Runner add_stages(CLI::App& app) {
    auto* cmd = app.add_subcommand("stages", "Stability of each fill stage and the earliest day the next may start");
    auto o = std::make_shared<StagesOptions>();
    cmd->add_option("FILE", o->files,
                    "Scenario file with an 'embankment' block, 'loading.stages' and an undrained strength in every "
                    "layer; several files, or - for standard input")
        ->required();
    auto* drain = cmd->add_option("--drain", o->drain, "Drain product name (default: the design's recommendation)");
    auto* pattern = cmd->add_option("--pattern", o->pattern, "triangular or square")->check(pattern_check());
    auto* spacing = cmd->add_option("--spacing", o->spacing_m, "Drain spacing (m)")->check(positive_number());
    drain->needs(pattern, spacing);
    pattern->needs(drain, spacing);
    spacing->needs(drain, pattern);
    cmd->add_flag("--plan", o->plan,
                  "Move each stage (the surcharge too) to the earliest day that keeps the target factor of safety, "
                  "then check the design criterion under the planned days and give the largest spacing that meets it");
    cmd->add_flag("--json", o->json, "JSON on stdout");
    cmd->add_option("--out", o->out_dir, "Folder for the section and chart SVG files (stages-section.svg, "
                                         "stages-safety.svg, stages-height.svg)");
    cmd->footer("Exit codes: 0 every stage meets the target (and, with --plan, the criterion still holds); 1 a stage "
                "does not, or the planned days miss the criterion (outputs are still written); "
                "2 bad input; 3 output failed; 5 cannot evaluate.");
    return [o] {
        return run_each(o->files, {o->json, false}, [&](const BatchItem& item) {
            const auto s = load_scenario_warned(item.file);
            if (const auto refusal = results::stage_check_refusal(s)) s.fail_at(refusal->first, refusal->second);
            std::string drain_name = o->drain;
            Pattern pat = Pattern::triangular;
            double spacing_m = 0.0;
            if (o->spacing_m) {
                pat = pattern_option(o->pattern);
                spacing_m = *o->spacing_m;
                drain_name = s.drain(o->drain).name;
                model_from_options(s, o->drain, pat, spacing_m);  // the spacing, checked against --spacing
            } else {
                const DesignResult design = run_design(s.site);
                const DesignRow* best = design.best();
                if (!best)
                    throw UsageError("--spacing", "no design meets the criterion, so there is no recommendation to check; "
                                                  "give --drain, --pattern and --spacing");
                drain_name = best->drain;
                pat = best->pattern;
                spacing_m = best->spacing_m;
            }
            const auto record = results::stage_record(s, drain_name, pat, spacing_m, o->plan, defaults::chart_points / 2);
            if (!o->out_dir.empty()) {
                std::vector<std::pair<std::string, std::string>> files;
                for (const auto& chart : report::stage_charts(record)) files.emplace_back(chart.file, chart.svg);
                write_outputs(item.out_dir(o->out_dir), {item.file}, files, report::trace_fields(s));
            }
            if (o->json) item.print(report::stages_json(s, record).dump(2) + "\n");
            else item.print(report::stages_table(s, record));
            return static_cast<int>(results::stages_meet_target_and_criterion(record) ? ok : no_feasible_design);
        });
    };
}

}  // namespace wickgrid::cli
