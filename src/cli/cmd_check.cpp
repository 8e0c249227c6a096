// wickgrid check FILE: validate a scenario without designing.
#include <spdlog/spdlog.h>

#include "commands.hpp"
#include "scenario/scenario.hpp"

namespace wickgrid::cli {

Runner add_check(CLI::App& app) {
    auto* cmd = app.add_subcommand("check", "Validate a scenario file only (exit 0 if valid, 2 if not)");
    auto file = std::make_shared<std::string>();
    cmd->add_option("FILE", *file, "Scenario file (YAML)")->required();
    return [file] {
        const auto s = scenario::load_scenario(*file);
        print_stdout(*file + ": valid scenario '" + s.title + "': " + std::to_string(s.drains.size()) +
                     " drain product(s) × " + std::to_string(s.patterns.size()) + " pattern(s)\n");
        return static_cast<int>(ok);
    };
}

}  // namespace wickgrid::cli
