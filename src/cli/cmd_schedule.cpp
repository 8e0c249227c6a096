// wickgrid schedule FILE: the scheme search — every drain product × pattern × spacing × surcharge
// height with its lift schedule planned stage by stage — and the cheapest, the soonest and the
// cost–finish front of the schemes that stand and meet the criterion by the deadline.
#include "commands.hpp"
#include "report/schedule_report.hpp"
#include "results/schedule_record.hpp"
#include "scenario/scheme_scenario.hpp"
#include "wickgrid/schedule.hpp"

namespace wickgrid::cli {

namespace {
struct ScheduleOptions {
    std::vector<std::string> files;
    bool json = false;
    std::string out_dir;
    unsigned threads = 0;
    std::string choose = "cheapest";
};

}  // namespace

Runner add_schedule(CLI::App& app) {
    auto* cmd = app.add_subcommand(
        "schedule", "Search drain, pattern, spacing, surcharge and lift schedule together: cheapest, soonest, front");
    auto o = std::make_shared<ScheduleOptions>();
    cmd->add_option("FILE", o->files,
                    "Scenario file with an 'embankment' block, 'loading.stages', an undrained strength in every layer "
                    "and a cost_per_m on every drain; optional 'schedule:' block (surcharge heights, costs); several "
                    "files, or - for standard input")
        ->required();
    cmd->add_flag("--json", o->json, "JSON on stdout");
    cmd->add_option("--out", o->out_dir,
                    "Folder for schedule.json, schedule-front.svg and chosen.yaml (the scenario of the chosen scheme: "
                    "its drain, pattern, spacing, surcharge and planned days)");
    cmd->add_option("--choose", o->choose, "The scheme --out writes as chosen.yaml: cheapest or soonest (default: cheapest)")
        ->check(CLI::IsMember({"cheapest", "soonest"}));
    cmd->add_option("--threads", o->threads, "Threads for the search (default: every hardware thread; results do not "
                                             "depend on it)")
        ->check(CLI::Range(1u, 256u));
    cmd->footer("Exit codes: 0 a scheme stands at every stage and meets the criterion by the deadline; 1 none does "
                "(outputs are still written); 2 bad input; 3 output failed; 5 cannot evaluate.");
    return [o] {
        return run_each(o->files, {o->json, false}, [&](const BatchItem& item) {
            const auto s = load_scenario_warned(item.file);
            const ScheduleResult result = results::schedule_record(s, o->threads);
            const std::string json = report::schedule_json(s, result).dump(2) + "\n";
            if (!o->out_dir.empty()) {
                std::vector<std::pair<std::string, std::string>> files;
                files.emplace_back("schedule.json", json);
                if (result.cheapest) {
                    const auto chart = report::schedule_chart(result);
                    files.emplace_back(chart.file, chart.svg);
                    const std::size_t chosen = o->choose == "soonest" ? *result.soonest : *result.cheapest;
                    files.emplace_back("chosen.yaml", scenario::scheme_scenario_yaml(s, result.schemes[chosen]));
                }
                write_outputs(item.out_dir(o->out_dir), {item.file}, files, report::trace_fields(s));
            }
            if (o->json) item.print(json);
            else item.print(report::schedule_table(s, result));
            return static_cast<int>(result.cheapest ? ok : no_feasible_design);
        });
    };
}

}  // namespace wickgrid::cli
