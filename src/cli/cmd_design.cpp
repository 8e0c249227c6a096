// wickgrid design FILE: largest practical spacing per drain product and pattern.
#include <spdlog/spdlog.h>

#include "commands.hpp"
#include "report/design_report.hpp"

namespace wickgrid::cli {

namespace {
struct DesignOptions {
    std::vector<std::string> files;
    bool json = false;
    bool csv = false;
    std::string out_dir;
};
}  // namespace

Runner add_design(CLI::App& app) {
    auto* cmd = app.add_subcommand("design", "Design drain spacings for every drain product and pattern");
    auto o = std::make_shared<DesignOptions>();
    cmd->add_option("FILE", o->files, "Scenario file (YAML); several files, or - for standard input")->required();
    auto* json = cmd->add_flag("--json", o->json, "Write the results as JSON on stdout");
    cmd->add_flag("--csv", o->csv, "Write the results as CSV on stdout")->excludes(json);
    cmd->add_option("--out", o->out_dir,
                    "Also write design.json, design.csv and design.md into this folder (several files: one folder "
                    "each, and summary.csv and summary.json of the recommended designs)");
    cmd->footer("Exit codes: 0 at least one design meets the criterion, 1 none does (outputs are still written), "
                "2 bad input, 3 an output could not be written, 5 the criterion cannot be evaluated.");
    return [o] {
        std::vector<nlohmann::json> summary;  // the recommended design of each file, for a batch
        const int code = run_each(o->files, {o->json, o->csv}, [&](const BatchItem& item) {
            const std::string& file = item.file;
            const auto s = load_scenario_warned(file);
            spdlog::info("designing {} drain product(s) × {} pattern(s)", s.site.products.size(), s.site.range.patterns.size());
            const results::DesignRecord record = results::design_record(s);
            // The record's warnings start with the input's own, shown when it was read.
            for (std::size_t i = s.input_warnings.size(); i < record.warnings.size(); ++i) spdlog::warn("{}", record.warnings[i]);
            const auto json_text = report::design_json(record).dump(2) + "\n";
            if (!o->out_dir.empty()) {
                write_outputs(item.out_dir(o->out_dir), {file},
                              {{"design.json", json_text}, {"design.csv", report::design_csv(record)},
                               {"design.md", report::design_markdown(record)}},
                              report::trace_fields(s));
                spdlog::info("wrote design.json, design.csv and design.md to {}", item.out_dir(o->out_dir));
            }
            summary.push_back(report::design_summary_row(record));
            if (o->json) item.print(json_text);
            else if (o->csv) item.print(report::design_csv(record));
            else item.print(report::design_table(record));
            if (!record.result.any_feasible()) {
                spdlog::warn("no drain product and pattern meets the criterion");
                return static_cast<int>(no_feasible_design);
            }
            return static_cast<int>(ok);
        });
        if (o->files.size() > 1 && !o->out_dir.empty()) {
            write_outputs(o->out_dir, o->files,
                          {{"summary.json", nlohmann::json(summary).dump(2) + "\n"},
                           {"summary.csv", report::design_summary_csv(summary)}},
                          report::batch_trace_fields());
            spdlog::info("wrote summary.json and summary.csv ({} scenarios) to {}", summary.size(), o->out_dir);
        }
        return code;
    };
}

}  // namespace wickgrid::cli
