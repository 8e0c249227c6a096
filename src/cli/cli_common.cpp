// Helpers shared by the commands: options, cell models named on the command line, output files.
#include <spdlog/spdlog.h>

#include <algorithm>
#include <cerrno>
#include <cmath>
#include <cstdio>
#include <cstring>
#include <filesystem>
#include <iostream>
#include <new>
#include <sstream>

#include "commands.hpp"
#include "report/atomic_file.hpp"
#include "scenario/suggest.hpp"
#include "scenario/text_encoding.hpp"
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
    static bool stdin_read = false;  // standard input holds one scenario; a second "-" has nothing left
    scenario::Scenario s = [&] {
        if (file != "-") return scenario::load_scenario(file);
        if (stdin_read) throw UsageError("FILE", "'-' (standard input) may be given once");
        stdin_read = true;
        std::ostringstream text;
        text << std::cin.rdbuf();
        return scenario::parse_scenario(text.str(), "<stdin>");
    }();
    for (const auto& w : s.input_warnings) spdlog::warn("{}", w);
    return s;
}

std::string terminal_safe(const std::string& text) {
    // Line by line: control characters and bytes that are not UTF-8 (a Latin-1 path) escaped.
    std::string out;
    std::size_t start = 0;
    for (;;) {
        const std::size_t end = text.find('\n', start);
        out += scenario::display_path(text.substr(start, end == std::string::npos ? std::string::npos : end - start));
        if (end == std::string::npos) return out;
        out += '\n';
        start = end + 1;
    }
}

void report_error(const std::string& text) { std::fprintf(stderr, "wickgrid: error: %s\n", terminal_safe(text).c_str()); }

int report_current_exception() {
    try {
        throw;
    } catch (const scenario::ScenarioError& e) {
        // A key the file does not give is reported against the file, without an invented line.
        report_error(e.mark().line > 0 ? e.what()
                                       : e.file() + ": " + (e.key_path().empty() ? "" : e.key_path() + ": ") + e.message());
        return bad_input;
    } catch (const UsageError& e) {
        report_error(e.what());
        std::fprintf(stderr, "Run 'wickgrid COMMAND --help' for usage.\n");
        return bad_input;
    } catch (const EvaluationError& e) {
        report_error(e.what());
        return cannot_evaluate;
    } catch (const InputError& e) {
        report_error(e.what());
        return bad_input;
    } catch (const report::OutputError& e) {
        report_error(e.what());
        return output_failed;
    } catch (const std::bad_alloc&) {
        // Said without allocating: the memory that ran out may not be there for a message either.
        std::fputs("wickgrid: error: not enough memory for this run (a smaller area, a wider spacing, fewer outputs "
                   "or fewer samples)\n",
                   stderr);
        return internal_error;
    } catch (const std::exception& e) {
        report_error(std::string("unexpected failure: ") + e.what());
        return internal_error;
    } catch (...) {
        report_error("unexpected failure");
        return internal_error;
    }
}

std::string BatchItem::out_dir(const std::string& dir) const {
    return count == 1 || dir.empty() ? dir : (std::filesystem::path(dir) / folder).string();
}

namespace {
// A folder name per file: its stem, numbered when two files share one.
std::vector<std::string> folder_names(const std::vector<std::string>& files) {
    std::vector<std::string> out;
    for (const auto& f : files) {
        std::string stem = f == "-" ? "stdin" : std::filesystem::path(f).stem().string();
        if (stem.empty() || stem == "." || stem == "..") stem = "scenario";
        if (stem.front() == '.') stem.front() = '_';  // hidden names are the writer's own (staging, lock)
        std::string name = stem;
        for (int k = 2; std::find(out.begin(), out.end(), name) != out.end(); ++k) name = stem + "-" + std::to_string(k);
        out.push_back(name);
    }
    return out;
}
}  // namespace

int run_each(const std::vector<std::string>& files, BatchFormat format, const std::function<int(const BatchItem&)>& body) {
    if (files.size() == 1) return body({files[0], 1, "", [](const std::string& text) { print_stdout(text); }});
    if (format.csv) throw UsageError("--csv", "writes one table: give one scenario file (or --json, or --out DIR)");
    const auto folders = folder_names(files);
    int worst = ok;
    std::vector<std::string> outputs;
    for (std::size_t i = 0; i < files.size(); ++i) {
        std::string buffer;
        int code = ok;
        try {
            code = body({files[i], files.size(), folders[i], [&buffer](const std::string& text) { buffer += text; }});
        } catch (...) {
            code = report_current_exception();
        }
        worst = std::max(worst, code);
        if (buffer.empty()) continue;
        if (format.json) {
            while (!buffer.empty() && buffer.back() == '\n') buffer.pop_back();
            outputs.push_back(buffer);
        } else {
            outputs.push_back("== " + scenario::display_path(files[i]) + " ==\n" + buffer);
        }
    }
    std::string all;
    for (std::size_t i = 0; i < outputs.size(); ++i) all += (i ? (format.json ? ",\n" : "\n") : "") + outputs[i];
    print_stdout(format.json ? "[\n" + all + (outputs.empty() ? "" : "\n") + "]\n" : all);
    return worst;
}

void write_outputs(const std::string& dir, const std::vector<std::string>& input_files,
                   std::vector<std::pair<std::string, std::string>> files, const std::vector<report::TraceField>& trace) {
    namespace fs = std::filesystem;
    report::ensure_directory(dir);
    for (const auto& [name, content] : files) {
        const fs::path path = fs::path(dir) / name;
        std::error_code ec;
        // Identity, not name: a link or another spelling of an input's path is the input too.
        for (const auto& input_file : input_files)
            if (fs::exists(path, ec) && fs::equivalent(path, fs::path(input_file), ec))
                throw report::OutputError("refusing to overwrite the input file " + scenario::display_path(input_file) +
                                          " with " + scenario::display_path(path.string()));
    }
    for (auto& [name, content] : files) content = report::traced(name, std::move(content), trace);  // in place
    report::write_files_atomically(dir, files);
}

}  // namespace wickgrid::cli
