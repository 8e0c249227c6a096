// Helpers shared by the commands: options, cell models named on the command line, output files.
#include <cstdio>
#include <filesystem>

#include "commands.hpp"
#include "report/atomic_file.hpp"
#include "wickgrid/errors.hpp"
#include "wickgrid/names.hpp"

namespace wickgrid::cli {

CLI::Validator pattern_check() {
    const auto names = names_of(pattern_names);
    return CLI::IsMember(names);
}

Pattern pattern_option(const std::string& name) {
    if (const auto p = value_of(pattern_names, name)) return *p;
    throw UsageError("--pattern", "'" + name + "' is not a pattern");
}

std::unique_ptr<CellModel> model_from_options(const scenario::Scenario& s, const std::string& drain, Pattern pattern,
                                              double spacing_m) {
    const DrainProductSpec& product = s.site.product(s.drain(drain).name);
    try {
        return make_cell_model(s.site, product, pattern, spacing_m);
    } catch (const InputError& e) {
        throw InputError("--spacing", spacing_m, e.allowed() + " (" + e.quantity() + ")");
    }
}

void print_stdout(const std::string& text) {
    std::fwrite(text.data(), 1, text.size(), stdout);
    std::fflush(stdout);
}

void write_outputs(const std::string& dir, const std::string& input_file,
                   const std::vector<std::pair<std::string, std::string>>& files) {
    namespace fs = std::filesystem;
    report::ensure_directory(dir);
    for (const auto& [name, content] : files) {
        const fs::path path = fs::path(dir) / name;
        std::error_code ec;
        if (fs::exists(path, ec) && fs::equivalent(path, fs::path(input_file), ec))
            throw report::OutputError("refusing to overwrite the input file " + input_file);
    }
    for (const auto& [name, content] : files) report::write_file_atomically((fs::path(dir) / name).string(), content);
}

}  // namespace wickgrid::cli
