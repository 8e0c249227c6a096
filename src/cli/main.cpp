// wickgrid: command-line entry point.
#include <spdlog/sinks/stdout_color_sinks.h>
#include <spdlog/spdlog.h>

#include <algorithm>
#include <cstdio>
#include <iostream>

#include "commands.hpp"
#include "report/atomic_file.hpp"
#include "scenario/scenario.hpp"
#include "wickgrid/errors.hpp"
#include "wickgrid/version.hpp"

namespace {
void setup_logging(int verbosity, bool quiet) {
    auto logger = spdlog::stderr_color_mt("wickgrid");
    logger->set_pattern("wickgrid: %l: %v");
    logger->set_level(quiet ? spdlog::level::err
                            : verbosity >= 2 ? spdlog::level::debug
                            : verbosity == 1 ? spdlog::level::info
                                             : spdlog::level::warn);
    spdlog::set_default_logger(logger);
}

}  // namespace

int main(int argc, char** argv) {
    using namespace wickgrid;
    CLI::App app{"wickgrid: prefabricated vertical drain grid design for soft clay.\n"
                 "Finds, for each drain product and pattern, the largest spacing that meets the design "
                 "criterion (a degree of consolidation by a deadline, or a residual settlement after it).\n"
                 "Exit codes: 0 ok, 1 no design meets the criterion, 2 bad input (file or command line), "
                 "3 an output could not be written, 4 unexpected failure, 5 the criterion cannot be evaluated."};
    app.require_subcommand(1);
    app.fallthrough();  // -v and -q also after the command name
    int verbosity = 0;
    bool quiet = false;
    app.add_flag("-v,--verbose", verbosity, "More log messages on stderr (repeat for debug)");
    app.add_flag("-q,--quiet", quiet, "Only errors on stderr");
    app.set_version_flag("--version", std::string("wickgrid ") + wickgrid::version);
    const cli::Runner check = cli::add_check(app);
    const cli::Runner design = cli::add_design(app);
    const cli::Runner curve = cli::add_curve(app);
    const cli::Runner sweep = cli::add_sweep(app);
    const cli::Runner surcharge = cli::add_surcharge(app);
    const cli::Runner report_cmd = cli::add_report(app);
    const cli::Runner verify = cli::add_verify(app);
    const cli::Runner layout_cmd = cli::add_layout(app);
    const cli::Runner monitor = cli::add_monitor(app);
    const cli::Runner stages = cli::add_stages(app);
    const cli::Runner schedule = cli::add_schedule(app);
    // An unknown command name gets its own message (CLI11 would only say a subcommand is required).
    if (argc > 1 && argv[1][0] != '-') {
        std::vector<std::string> names;
        for (const auto* sub : app.get_subcommands({})) names.push_back(sub->get_name());
        if (std::find(names.begin(), names.end(), argv[1]) == names.end()) {
            const std::string near = cli::nearest_command(argv[1], names);
            cli::report_error("unknown command '" + cli::terminal_safe(argv[1]) + "'" +
                         (near.empty() ? "" : "; did you mean '" + near + "'?"));
            std::fprintf(stderr, "Run 'wickgrid --help' for the commands.\n");
            return cli::bad_input;
        }
    }
    try {
        app.parse(argc, argv);
    } catch (const CLI::CallForHelp& e) {
        return app.exit(e);
    } catch (const CLI::CallForAllHelp& e) {
        return app.exit(e);
    } catch (const CLI::CallForVersion& e) {
        return app.exit(e);
    } catch (const CLI::ParseError& e) {
        cli::report_error(e.what());
        std::fprintf(stderr, "Run 'wickgrid --help' or 'wickgrid COMMAND --help' for usage.\n");
        return cli::bad_input;
    }
    setup_logging(verbosity, quiet);
    try {
        if (app.got_subcommand("check")) return check();
        if (app.got_subcommand("design")) return design();
        if (app.got_subcommand("schedule")) return schedule();
        if (app.got_subcommand("curve")) return curve();
        if (app.got_subcommand("sweep")) return sweep();
        if (app.got_subcommand("surcharge")) return surcharge();
        if (app.got_subcommand("report")) return report_cmd();
        if (app.got_subcommand("verify")) return verify();
        if (app.got_subcommand("layout")) return layout_cmd();
        if (app.got_subcommand("monitor")) return monitor();
        if (app.got_subcommand("stages")) return stages();
    } catch (...) {
        return cli::report_current_exception();
    }
    return cli::internal_error;
}
