// wickgrid curve FILE --drain NAME --pattern P --spacing S: degree–time table of one unit cell, by
// the scenario's own method, loading and settlement model.
#include <cmath>

#include "commands.hpp"
#include "report/design_report.hpp"
#include "wickgrid/errors.hpp"
#include "wickgrid/units.hpp"

namespace wickgrid::cli {

namespace {
struct CurveOptions {
    std::vector<std::string> files;
    std::string drain;
    std::string pattern;
    double spacing_m = 0.0;
    std::vector<double> at_days;
    std::vector<double> depths_m;
    int points = defaults::curve_points;
    double until_days = 0.0;
    bool json = false;
    bool csv = false;
};
}  // namespace

Runner add_curve(CLI::App& app) {
    auto* cmd = app.add_subcommand("curve", "Degree of consolidation against time for one drain, pattern and spacing");
    auto o = std::make_shared<CurveOptions>();
    cmd->add_option("FILE", o->files, "Scenario file (YAML); several files, or - for standard input")->required();
    cmd->add_option("--drain", o->drain, "Drain product name from the scenario")->required();
    cmd->add_option("--pattern", o->pattern, "triangular or square")->required()->check(pattern_check());
    cmd->add_option("--spacing", o->spacing_m, "Drain spacing (m)")->required()->check(positive_number());
    // A comma-separated option takes one argument, so options and files may come in any order.
    auto* at = cmd->add_option("--at-days", o->at_days, "Comma-separated times (days), e.g. 30,60,90")
                   ->delimiter(',')
                   ->allow_extra_args(false);
    cmd->add_option("--points", o->points, "Number of evenly spaced times (default 31)")
        ->check(whole_between(2, 100000))
        ->excludes(at);
    cmd->add_option("--until-days", o->until_days, "Last time of the even table (default 1.5 × deadline)")
        ->check(positive_number())
        ->excludes(at);
    cmd->add_option("--depths", o->depths_m,
                    "Comma-separated depths (m below the top of the clay) at which to list the local degree and excess "
                    "pore pressure, e.g. 2,5,8")
        ->delimiter(',')
        ->allow_extra_args(false);
    auto* json = cmd->add_flag("--json", o->json, "JSON on stdout");
    cmd->add_flag("--csv", o->csv, "CSV on stdout")->excludes(json);
    return [o] {
        return run_each(o->files, {o->json, o->csv}, [&](const BatchItem& item) {
            const std::string& file = item.file;
            const auto s = load_scenario_warned(file);
            std::vector<double> times;
            for (const double d : o->at_days) {
                if (!(std::isfinite(d) && d >= 0.0)) throw InputError("--at-days", d, "a list of times of at least 0 days");
                if (!times.empty() && units::days_to_seconds(d) < times.back())
                    throw InputError("--at-days", d, "in ascending order");
                times.push_back(units::days_to_seconds(d));
            }
            if (times.empty()) {
                const double until = o->until_days > 0.0 ? units::days_to_seconds(o->until_days)
                                                         : defaults::curve_span_of_deadline * s.site.criterion.deadline_s;
                times = even_times_s(until, o->points);
            }
            const Pattern pattern = pattern_option(o->pattern);
            const auto model = model_from_options(s, o->drain, pattern, o->spacing_m);
            results::Curve curve{s.drain(o->drain).name, pattern, o->spacing_m, model->method(),
                                 degree_curve(*model, times), {}, {}};
            for (const double z : o->depths_m)
                if (!(std::isfinite(z) && z >= 0.0 && z <= s.site.ground.thickness_m))
                    throw InputError("--depths", z, "depths from 0 to the clay thickness " +
                                                         format_value(s.site.ground.thickness_m) + " m");
            if (!o->depths_m.empty()) {
                curve.depths_m = o->depths_m;
                for (const double t : times) {
                    auto states = model->over_depth(o->depths_m, t);
                    if (!states)
                        throw InputError("--depths", o->depths_m.front(),
                                         "asked of the closed form or the layered series (the numerical cell reports "
                                         "depth averages only)");
                    curve.over_depth.push_back(std::move(*states));
                }
            }
            if (o->json) item.print(report::curve_json(s.site, curve).dump(2) + "\n");
            else if (o->csv) item.print(report::curve_csv(curve));
            else item.print(report::curve_table(s.site, curve));
            return static_cast<int>(ok);
        });
    };
}

}  // namespace wickgrid::cli
