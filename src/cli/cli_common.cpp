// Helpers shared by the commands: options, cell models named on the command line, output files.
#include <spdlog/spdlog.h>

#include <cerrno>
#include <cmath>
#include <cstdio>
#include <cstring>
#include <filesystem>

#include "commands.hpp"
#include "report/atomic_file.hpp"
#include "scenario/suggest.hpp"
#include "wickgrid/errors.hpp"
#include "wickgrid/names.hpp"

namespace wickgrid::cli {

namespace {
std::string plain(double v) { return format_value(v); }
}  // namespace

CLI::Validator positive_number() {
    return CLI::Validator(
        [](std::string& text) -> std::string {
            double v = 0.0;
            if (!CLI::detail::lexical_cast(text, v)) return "'" + text + "' is not a number";
            if (!std::isfinite(v) || !(v > 0.0)) return text + " is not allowed: it must be a finite number greater than 0";
            return {};
        },
        "POSITIVE");
}

CLI::Validator number_between(double low, double high) {
    return CLI::Validator(
        [low, high](std::string& text) -> std::string {
            double v = 0.0;
            if (!CLI::detail::lexical_cast(text, v)) return "'" + text + "' is not a number";
            if (!std::isfinite(v) || v < low || v > high)
                return text + " is not allowed: it must be a number from " + plain(low) + " to " + plain(high);
            return {};
        },
        "NUMBER in [" + plain(low) + ", " + plain(high) + "]");
}

CLI::Validator whole_between(long low, long high) {
    return CLI::Validator(
        [low, high](std::string& text) -> std::string {
            long v = 0;
            if (!CLI::detail::lexical_cast(text, v)) return "'" + text + "' is not a whole number";
            if (v < low || v > high)
                return text + " is not allowed: it must be a whole number from " + std::to_string(low) + " to " +
                       std::to_string(high);
            return {};
        },
        "INT in [" + std::to_string(low) + ", " + std::to_string(high) + "]");
}

std::string nearest_command(const std::string& word, const std::vector<std::string>& commands) {
    if (auto best = scenario::closest(word, commands)) return *best;
    return {};
}

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
    const std::size_t written = std::fwrite(text.data(), 1, text.size(), stdout);
    if (written != text.size() || std::fflush(stdout) != 0 || std::ferror(stdout))
        throw report::OutputError(std::string("cannot write to standard output: ") + std::strerror(errno));
}

scenario::Scenario load_scenario_warned(const std::string& file) {
    scenario::Scenario s = scenario::load_scenario(file);
    for (const auto& w : s.input_warnings) spdlog::warn("{}", w);
    return s;
}

void write_outputs(const std::string& dir, const std::vector<std::string>& input_files,
                   const std::vector<std::pair<std::string, std::string>>& files) {
    namespace fs = std::filesystem;
    report::ensure_directory(dir);
    for (const auto& [name, content] : files) {
        const fs::path path = fs::path(dir) / name;
        std::error_code ec;
        // Identity, not name: a link or another spelling of an input's path is the input too.
        for (const auto& input_file : input_files)
            if (fs::exists(path, ec) && fs::equivalent(path, fs::path(input_file), ec))
                throw report::OutputError("refusing to overwrite the input file " + input_file + " with " + path.string());
    }
    report::write_files_atomically(dir, files);
}

}  // namespace wickgrid::cli
