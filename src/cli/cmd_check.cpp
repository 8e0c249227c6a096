// wickgrid check FILE: validate a scenario without designing.
#include "commands.hpp"

namespace wickgrid::cli {

Runner add_check(CLI::App& app) {
    auto* cmd = app.add_subcommand("check", "Validate a scenario file only (exit 0 if valid, 2 if not)");
    auto file = std::make_shared<std::string>();
    cmd->add_option("FILE", *file, "Scenario file (YAML)")->required();
    return [file] {
        const auto s = load_scenario_warned(*file);
        print_stdout(*file + ": valid scenario '" + s.title + "': " + std::to_string(s.site.products.size()) +
                     " drain product(s) × " + std::to_string(s.site.range.patterns.size()) + " pattern(s), method " +
                     std::string(to_string(s.site.method.method)) + "\n");
        return static_cast<int>(ok);
    };
}

}  // namespace wickgrid::cli
