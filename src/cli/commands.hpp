#pragma once
// The command-line front end: each command parses its options, calls the scenario layer and the
// engine, and hands the results to the writers. Exit codes are shared.
#include <CLI/CLI.hpp>
#include <functional>
#include <string>

#include "wickgrid/design.hpp"

namespace wickgrid::cli {

enum ExitCode : int {
    ok = 0,
    no_feasible_design = 1,
    bad_input = 2,
    output_failed = 3,
    internal_error = 4,
};

// Registers a subcommand; the returned function runs it after parsing.
using Runner = std::function<int()>;
Runner add_check(CLI::App& app);
Runner add_design(CLI::App& app);
Runner add_curve(CLI::App& app);
Runner add_sweep(CLI::App& app);
Runner add_surcharge(CLI::App& app);
Runner add_report(CLI::App& app);
Runner add_verify(CLI::App& app);

// The unit cell a command's --drain/--pattern/--spacing options name; engine refusals of the
// spacing are reported against --spacing.
wickgrid::UnitCell cell_from_options(const wickgrid::DesignInput& input, const std::string& drain,
                                     wickgrid::Pattern pattern, double spacing_m);

// Prints stdout text whole (one write) so a broken pipe never leaves half a JSON document.
void print_stdout(const std::string& text);

}  // namespace wickgrid::cli
