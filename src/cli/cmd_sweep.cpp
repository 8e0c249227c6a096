// wickgrid sweep FILE: one-at-a-time, grid and Monte Carlo studies of a design.
#include <spdlog/spdlog.h>

#include <chrono>
#include <cstdio>
#include <filesystem>
#include <unistd.h>

#include "commands.hpp"
#include "report/atomic_file.hpp"
#include "report/study_report.hpp"
#include "wickgrid/errors.hpp"

namespace wickgrid::cli {

namespace {
struct SweepOptions {
    std::vector<std::string> files;
    std::vector<std::string> only;
    std::optional<std::size_t> samples;
    std::optional<std::uint64_t> seed;
    unsigned threads = 0;
    bool json = false;
    bool csv = false;
    std::string out_dir;
};

// A progress bar on stderr, only on a terminal and only once a run has lasted a second.
Progress progress_bar() {
    if (!::isatty(STDERR_FILENO)) return {};
    const auto start = std::chrono::steady_clock::now();
    return [start](std::size_t done, std::size_t total) {
        const double seconds = std::chrono::duration<double>(std::chrono::steady_clock::now() - start).count();
        if (seconds < 1.0 && done < total) return;
        const int width = 40;
        const int filled = static_cast<int>(width * static_cast<double>(done) / static_cast<double>(total));
        std::fprintf(stderr, "\r  Monte Carlo [%s%s] %3.0f %%", std::string(filled, '#').c_str(),
                     std::string(width - filled, '.').c_str(), 100.0 * static_cast<double>(done) / static_cast<double>(total));
        if (done >= total) std::fprintf(stderr, "\n");
        std::fflush(stderr);
    };
}

bool wanted(const SweepOptions& o, const std::string& study) {
    return o.only.empty() || std::find(o.only.begin(), o.only.end(), study) != o.only.end();
}
}  // namespace

Runner add_sweep(CLI::App& app) {
    auto* cmd = app.add_subcommand("sweep", "Sensitivity (one at a time, grid) and Monte Carlo studies of the design");
    auto o = std::make_shared<SweepOptions>();
    cmd->add_option("FILE", o->files,
                    "Scenario file (YAML) with optional 'studies' and 'uncertain' blocks; several files, or - for standard input")
        ->required();
    cmd->add_option("--only", o->only, "Studies to run: tornado, grid, monte_carlo (comma-separated; default all)")
        ->delimiter(',')
        ->allow_extra_args(false)  // one argument: the scenario file after it is not swallowed
        ->check(CLI::IsMember({"tornado", "grid", "monte_carlo"}));
    cmd->add_option("--samples", o->samples, "Monte Carlo samples (overrides the file)")->check(whole_between(1, 1000000000));
    cmd->add_option("--seed", o->seed, "Monte Carlo seed (overrides the file); same seed, same result");
    cmd->add_option("--threads", o->threads, "Worker threads (default: all cores)")->check(whole_between(0, 1024));
    auto* json = cmd->add_flag("--json", o->json, "All results as JSON on stdout");
    cmd->add_flag("--csv", o->csv, "CSV on stdout (needs exactly one study, see --only)")->excludes(json);
    cmd->add_option("--out", o->out_dir, "Also write sweep.json and one CSV per study into this folder");
    return [o] {
        return run_each(o->files, {o->json, o->csv}, [&](const BatchItem& item) {
            const std::string& file = item.file;
            const auto s = load_scenario_warned(file);
            const Site& site = s.site;
            const bool tornado = wanted(*o, "tornado") && !s.studies.tornado.empty();
            const bool monte = wanted(*o, "monte_carlo") && s.studies.monte_carlo.has_value();
            if (!o->only.empty()) {
                if (wanted(*o, "tornado") && s.studies.tornado.empty())
                    throw UsageError("--only tornado", "needs a 'studies: tornado:' block in " + s.file);
                if (wanted(*o, "monte_carlo") && !s.studies.monte_carlo)
                    throw UsageError("--only monte_carlo", "needs an 'uncertain:' block in " + s.file);
            }
            const bool grid = wanted(*o, "grid");
            if (o->csv && (tornado + grid + monte) != 1)
                throw UsageError("--csv", "writes exactly 1 study, and " + std::to_string(tornado + grid + monte) +
                                              " are asked: choose one with --only, or use --json or --out");
            results::DesignRecord record = results::design_record(s);
            results::Studies& r = record.studies;
            r.grid_x = s.studies.grid_x;
            r.grid_y = s.studies.grid_y;
            if (tornado) r.tornado = tornado_study(site, record.result, s.studies.tornado);
            if (grid) r.grid = grid_study(site, s.studies.grid_x, s.studies.grid_y);
            if (monte) {
                MonteCarloSpec spec = *s.studies.monte_carlo;
                if (o->samples) spec.samples = *o->samples;
                if (o->seed) spec.seed = *o->seed;
                spec.threads = o->threads;
                spdlog::info("Monte Carlo: {} samples × {} designs", spec.samples, record.result.rows.size());
                const auto started = std::chrono::steady_clock::now();
                r.monte_carlo = monte_carlo(site, record.result, spec, progress_bar());
                const double seconds = std::chrono::duration<double>(std::chrono::steady_clock::now() - started).count();
                spdlog::info("Monte Carlo: {:.3g} samples per second, {} designs each, {} thread(s)",
                             static_cast<double>(spec.samples) / std::max(seconds, 1e-9), record.result.rows.size(),
                             r.monte_carlo->threads);
                r.monte_carlo_spec = spec;
            }
            const std::string json_text = report::sweep_json(record).dump(2) + "\n";
            if (!o->out_dir.empty()) {
                std::vector<std::pair<std::string, std::string>> files{{"sweep.json", json_text}};
                if (r.tornado) files.emplace_back("tornado.csv", report::tornado_csv(site, *r.tornado));
                if (r.grid) files.emplace_back("grid.csv", report::grid_csv(*r.grid, r.grid_x, r.grid_y));
                if (r.monte_carlo) files.emplace_back("monte_carlo.csv", report::monte_carlo_csv(*r.monte_carlo));
                write_outputs(item.out_dir(o->out_dir), {file}, files, report::trace_fields(s));
            }
            if (o->json) item.print(json_text);
            else if (o->csv) item.print(r.tornado ? report::tornado_csv(site, *r.tornado)
                                          : r.grid  ? report::grid_csv(*r.grid, r.grid_x, r.grid_y)
                                                    : report::monte_carlo_csv(*r.monte_carlo));
            else item.print(report::sweep_table(record));
            return static_cast<int>(ok);
        });
    };
}

}  // namespace wickgrid::cli
