// wickgrid design FILE: largest practical spacing per drain product and pattern.
#include <spdlog/spdlog.h>

#include <algorithm>
#include <cstdio>
#include <filesystem>

#include "commands.hpp"
#include "report/atomic_file.hpp"
#include "report/design_report.hpp"
#include "scenario/scenario.hpp"
#include "wickgrid/errors.hpp"

namespace wickgrid::cli {

UnitCell cell_from_options(const DesignInput& input, const std::string& drain, Pattern pattern, double spacing_m) {
    const DrainProductSpec& product = input.product(drain);
    try {
        return UnitCell(product_cell(input, product, pattern, spacing_m));
    } catch (const InputError& e) {
        throw InputError("--spacing", spacing_m, e.allowed() + " (" + e.quantity() + ")");
    }
}

void print_stdout(const std::string& text) {
    std::fwrite(text.data(), 1, text.size(), stdout);
    std::fflush(stdout);
}

namespace {
struct DesignOptions {
    std::string file;
    bool json = false;
    bool csv = false;
    std::string out_dir;
};
}  // namespace

Runner add_design(CLI::App& app) {
    auto* cmd = app.add_subcommand("design", "Design drain spacings for every drain product and pattern");
    auto o = std::make_shared<DesignOptions>();
    cmd->add_option("FILE", o->file, "Scenario file (YAML)")->required();
    auto* json = cmd->add_flag("--json", o->json, "Write the results as JSON on stdout");
    cmd->add_flag("--csv", o->csv, "Write the results as CSV on stdout")->excludes(json);
    cmd->add_option("--out", o->out_dir, "Also write design.json, design.csv and design.md into this folder");
    cmd->footer("Exit codes: 0 at least one design meets the target, 1 none does (outputs are still written), "
                "2 bad input, 3 an output could not be written.");
    return [o] {
        const auto s = scenario::load_scenario(o->file);
        spdlog::info("designing {} drain product(s) × {} pattern(s)", s.drains.size(), s.patterns.size());
        const DesignResult result = run_design(s.design_input());
        const auto json_text = report::design_json(s, result).dump(2) + "\n";
        if (!o->out_dir.empty()) {
            namespace fs = std::filesystem;
            report::ensure_directory(o->out_dir);
            const fs::path dir(o->out_dir);
            for (const auto& name : {"design.json", "design.csv", "design.md"}) {
                if (fs::exists(dir / name) && fs::equivalent(dir / name, fs::path(o->file)))
                    throw report::OutputError("refusing to overwrite the input file " + o->file);
            }
            report::write_file_atomically((dir / "design.json").string(), json_text);
            report::write_file_atomically((dir / "design.csv").string(), report::design_csv(result));
            report::write_file_atomically((dir / "design.md").string(), report::design_markdown(s, result));
            spdlog::info("wrote design.json, design.csv and design.md to {}", o->out_dir);
        }
        if (o->json) print_stdout(json_text);
        else if (o->csv) print_stdout(report::design_csv(result));
        else print_stdout(report::design_table(s, result));
        if (!result.any_feasible()) {
            spdlog::warn("no drain product and pattern reaches the target by the deadline");
            return static_cast<int>(no_feasible_design);
        }
        return static_cast<int>(ok);
    };
}

}  // namespace wickgrid::cli
