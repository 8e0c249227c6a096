#pragma once
// The command-line front end: each command parses its options, loads the scenario (the site),
// asks the engine through the result layer and hands the record to the writers. Exit codes and
// option helpers are shared.
#include <CLI/CLI.hpp>
#include <functional>
#include <memory>
#include <stdexcept>
#include <string>

#include "report/trace.hpp"
#include "scenario/scenario.hpp"
#include "wickgrid/cell_model.hpp"

namespace wickgrid::cli {

enum ExitCode : int {
    ok = 0,
    no_feasible_design = 1,  // no product and pattern meets the criterion (outputs are still written)
    bad_input = 2,           // a bad scenario file (located) or a bad command line
    output_failed = 3,       // an output could not be written
    internal_error = 4,      // an unexpected failure (a library error wickgrid did not foresee)
    cannot_evaluate = 5,     // valid inputs, but the question has no answer here (EvaluationError)
};

// A command-line usage error: names the option and what is wrong, with no file location.
class UsageError : public std::runtime_error {
public:
    UsageError(const std::string& option, const std::string& message) : std::runtime_error(option + ": " + message) {}
};

// Loads a scenario (ScenarioError when it is bad) and shows its plausibility warnings on stderr;
// "-" reads the scenario from standard input (once a run).
scenario::Scenario load_scenario_warned(const std::string& file);

// Control characters (terminal escape sequences among them) never reach the terminal.
std::string terminal_safe(const std::string& text);
void report_error(const std::string& text);
// Reports the exception being handled on stderr and returns its exit code (call inside a catch).
int report_current_exception();

// Several scenario files in one run. Each command's body runs once per file with a BatchItem: the
// file, where its output goes on stdout, and its own output folder. One file: the body as it is.
// Several: each file's terminal output under a heading, JSON as one array; a file that fails is
// reported on stderr and the others still run; the exit code is the highest of the files'.
using Printer = std::function<void(const std::string&)>;
struct BatchItem {
    std::string file;
    std::size_t count = 1;   // files in the run
    std::string folder;      // this file's folder name under --out when there are several
    Printer print;
    // The output folder of this file: `dir` itself for one file, `dir/<folder>` for several.
    std::string out_dir(const std::string& dir) const;
};
struct BatchFormat {
    bool json = false;
    bool csv = false;  // one table only: refused with several files
};
int run_each(const std::vector<std::string>& files, BatchFormat format, const std::function<int(const BatchItem&)>& body);

// Registers a subcommand; the returned function runs it after parsing.
using Runner = std::function<int()>;
Runner add_check(CLI::App& app);
Runner add_design(CLI::App& app);
Runner add_curve(CLI::App& app);
Runner add_sweep(CLI::App& app);
Runner add_surcharge(CLI::App& app);
Runner add_report(CLI::App& app);
Runner add_verify(CLI::App& app);
Runner add_layout(CLI::App& app);
Runner add_monitor(CLI::App& app);
Runner add_stages(CLI::App& app);
Runner add_schedule(CLI::App& app);

// Number checks with plain messages (no NaN, no infinity, no 309-digit bounds).
CLI::Validator positive_number();
CLI::Validator number_between(double low, double high);
CLI::Validator whole_between(long low, long high);

// The --pattern option's check and value, from the pattern name table.
CLI::Validator pattern_check();
Pattern pattern_option(const std::string& name);

// The cell model a command's --drain/--pattern/--spacing options name, by the scenario's method;
// a spacing the cell cannot take is reported against --spacing.
std::unique_ptr<CellModel> model_from_options(const scenario::Scenario& s, const std::string& drain, Pattern pattern,
                                              double spacing_m);

// Prints stdout text whole (one write) so a broken pipe never leaves half a JSON document; a write
// error (a full disk, a closed stream) throws report::OutputError (exit 3).
void print_stdout(const std::string& text);

// The command name nearest to an unknown one, for "did you mean" (empty when nothing is near).
std::string nearest_command(const std::string& word, const std::vector<std::string>& commands);

// Writes files into an output folder whole or not at all, refusing to overwrite any input file;
// CSV, SVG and GeoJSON files are stamped with the trace (report/trace.hpp).
void write_outputs(const std::string& dir, const std::vector<std::string>& input_files,
                   std::vector<std::pair<std::string, std::string>> files, const std::vector<report::TraceField>& trace);

}  // namespace wickgrid::cli
