// wickgrid check FILE...: validate scenarios without designing.
#include "commands.hpp"
#include "scenario/text_encoding.hpp"

namespace wickgrid::cli {

Runner add_check(CLI::App& app) {
    auto* cmd = app.add_subcommand("check", "Validate scenario files only (exit 0 if valid, 2 if not)");
    auto files = std::make_shared<std::vector<std::string>>();
    cmd->add_option("FILE", *files, "Scenario file (YAML); several files, or - for standard input")->required();
    return [files] {
        return run_each(*files, {false, false}, [](const BatchItem& item) {
            const auto s = load_scenario_warned(item.file);
            item.print(scenario::display_path(item.file) + ": valid scenario '" + s.title + "': " + std::to_string(s.site.products.size()) +
                       " drain product(s) × " + std::to_string(s.site.range.patterns.size()) + " pattern(s), method " +
                       std::string(to_string(s.site.method.method)) + "\n");
            return static_cast<int>(ok);
        });
    };
}

}  // namespace wickgrid::cli
