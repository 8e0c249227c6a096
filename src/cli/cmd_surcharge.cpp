// wickgrid surcharge FILE: surcharge needed for a removal day, or removal day for a surcharge.
#include <spdlog/spdlog.h>

#include <nlohmann/json.hpp>
#include <sstream>

#include "commands.hpp"
#include "report/design_report.hpp"
#include "wickgrid/names.hpp"
#include "wickgrid/errors.hpp"
#include "wickgrid/surcharge.hpp"
#include "wickgrid/units.hpp"

namespace wickgrid::cli {

namespace {
struct SurchargeOptions {
    std::vector<std::string> files;
    std::string drain;
    std::string pattern;
    double spacing_m = 0.0;
    std::string find = "pressure";
    std::optional<double> removal_day;
    std::optional<double> max_height_m;
    bool offset_secondary = false;
    std::optional<double> service_days;
    bool json = false;
};

const char* const ignores[] = {"secondary compression", "rebound when the surcharge is removed",
                               "the stiffness gained by the clay during surcharging (linear theory)"};
}  // namespace

Runner add_surcharge(CLI::App& app) {
    auto* cmd = app.add_subcommand("surcharge", "Surcharge needed for a removal day, or the removal day for a surcharge");
    auto o = std::make_shared<SurchargeOptions>();
    cmd->add_option("FILE", o->files,
                    "Scenario file with a 'loading' block and a settlement model; several files, or - for standard input")
        ->required();
    cmd->add_option("--drain", o->drain, "Drain product name")->required();
    cmd->add_option("--pattern", o->pattern, "triangular or square")->required()->check(pattern_check());
    cmd->add_option("--spacing", o->spacing_m, "Drain spacing (m)")->required()->check(positive_number());
    cmd->add_option("--find", o->find, "pressure (for the removal day) or removal_day (for the surcharge in the file)")
        ->check(CLI::IsMember({"pressure", "removal_day"}));
    cmd->add_option("--removal-day", o->removal_day, "Removal day (overrides loading.surcharge.removal_day)")
        ->check(positive_number());
    cmd->add_option("--max-height", o->max_height_m, "Warn when the surcharge fill exceeds this height (m)")
        ->check(positive_number());
    cmd->add_flag("--offset-secondary", o->offset_secondary,
                  "Size the surcharge against the residual limit (target.residual_settlement_mm), primary plus the "
                  "secondary compression (c_alpha) over the service period, reduced by the surcharge's over-consolidation");
    cmd->add_option("--service-days", o->service_days,
                    "Service period after the deadline for --offset-secondary (default: target.service_days)")
        ->check(positive_number());
    cmd->add_flag("--json", o->json, "JSON on stdout");
    return [o] {
        return run_each(o->files, {o->json, false}, [&](const BatchItem& item) {
            const std::string& file = item.file;
            const auto s = load_scenario_warned(file);
            Site site = s.site;
            if (!site.loading) s.fail_at("loading", "surcharge design needs a 'loading' block with the permanent stages");
            if (!site.has_settlement())
                s.fail_at("clay", "surcharge design needs a settlement model: 'clay.layers' or 'clay.mv_m2_per_kN'");
            const Pattern pattern = pattern_option(o->pattern);
            model_from_options(s, o->drain, pattern, o->spacing_m);  // the spacing, checked against --spacing
            if (o->service_days && !o->offset_secondary)
                throw UsageError("--service-days", "goes with --offset-secondary only");
            if (o->offset_secondary) {
                if (!secondary_per_cycle_m(site))
                    throw UsageError("--offset-secondary", "needs 'c_alpha' or 'c_alpha_over_cc' in at least one clay layer");
                auto* residual = std::get_if<ResidualSettlementLimit>(&site.criterion.rule);
                if (!residual)
                    throw UsageError("--offset-secondary", "needs 'target.residual_settlement_mm' (the limit the surcharge "
                                                           "is sized for, counted from the deadline)");
                if (o->service_days) residual->service_s = units::days_to_seconds(*o->service_days);
                if (!residual->service_s)
                    throw UsageError("--offset-secondary", "needs --service-days or 'target.service_days' (the service period)");
            }
            SurchargeCell cell{site, site.product(s.drain(o->drain).name), pattern, o->spacing_m, o->offset_secondary};
            const auto& drain = s.drain(o->drain);
            Surcharge timing;
            if (site.loading->surcharge) {
                timing = *site.loading->surcharge;
            } else {
                timing.start_s = timing.end_s = site.loading->end_of_construction_s();
            }
            if (o->removal_day) timing.removal_s = units::days_to_seconds(*o->removal_day);
            SurchargeResult result;
            if (o->find == "pressure") {
                if (!site.loading->surcharge && !o->removal_day)
                    throw UsageError("--removal-day", "is required with --find pressure when the scenario has no "
                                                      "'loading.surcharge' block (the day the surcharge comes off)");
                result = surcharge_for_removal(cell, timing);
            } else {
                if (!site.loading->surcharge)
                    s.fail_at("loading.surcharge",
                              "--find removal_day needs the surcharge (height or pressure) in 'loading.surcharge'");
                result = removal_for_surcharge(cell, timing);
            }
            const std::optional<double> limit = o->max_height_m ? o->max_height_m : s.surcharge_max_height_m;
            std::optional<double> height;
            if (s.fill_unit_weight_kN_per_m3) height = result.pressure_kPa / *s.fill_unit_weight_kN_per_m3;
            const bool exceeds = limit && height && *height > *limit;
            if (exceeds) spdlog::warn("the surcharge fill of {:.2f} m exceeds the limit of {:.2f} m", *height, *limit);
            using nlohmann::json;
            if (o->json) {
                json doc{{"drain", drain.name}, {"pattern", o->pattern}, {"spacing_m", o->spacing_m}, {"find", o->find},
                         {"needed", result.needed}, {"surcharge_kPa", result.pressure_kPa},
                         {"surcharge_height_m", height ? json(*height) : json(nullptr)},
                         {"start_day", units::seconds_to_days(result.start_s)}, {"end_day", units::seconds_to_days(result.end_s)},
                         {"removal_day", units::seconds_to_days(result.removal_s)},
                         {"final_settlement_mm", result.final_m * 1000.0},
                         {"settlement_at_removal_mm", result.settlement_at_removal_m * 1000.0},
                         {"height_limit_m", limit ? json(*limit) : json(nullptr)}, {"exceeds_limit", exceeds},
                         {"method", std::string(to_string(site.method.method))},
                         {"offset_secondary", o->offset_secondary},
                         {"secondary_offset_mm", result.secondary_offset_m * 1000.0},
                         {"residual_primary_mm", result.residual ? json(result.residual->primary_m * 1000.0) : json(nullptr)},
                         {"residual_secondary_mm", result.residual ? json(result.residual->secondary_m * 1000.0) : json(nullptr)},
                         {"residual_settlement_mm", result.residual ? json(result.residual->total_m() * 1000.0) : json(nullptr)},
                         {"ignores", o->offset_secondary ? json::array({ignores[1], ignores[2]})
                                                         : json::array({ignores[0], ignores[1], ignores[2]})},
                         {"cautions", results::cautions()}};
                item.print(doc.dump(2) + "\n");
                return static_cast<int>(ok);
            }
            std::ostringstream out;
            out << s.title << "\ndrain " << drain.name << ", " << o->pattern << " pattern at " << report::fixed(o->spacing_m, 2)
                << " m\n\n";
            if (!result.needed)
                out << (o->offset_secondary
                            ? std::string("No surcharge is needed: the permanent load alone meets the residual limit.\n")
                            : "No surcharge is needed: the permanent load alone reaches its final primary settlement (" +
                                  report::fixed(result.final_m * 1000.0, 0) + " mm) by day " +
                                  report::fixed(units::seconds_to_days(result.removal_s), 0) + ".\n");
            else
                out << "Surcharge " << report::fixed(result.pressure_kPa, 1) << " kPa"
                    << (height ? " (" + report::fixed(*height, 2) + " m of fill)" : std::string()) << ", placed from day "
                    << report::fixed(units::seconds_to_days(result.start_s), 0) << " to day "
                    << report::fixed(units::seconds_to_days(result.end_s), 0) << ", removed at day "
                    << report::fixed(units::seconds_to_days(result.removal_s), 1) << ": settlement at removal "
                    << report::fixed(result.settlement_at_removal_m * 1000.0, 0) << " mm"
                    << (o->offset_secondary ? std::string(" (final primary under the permanent load ") +
                                                  report::fixed(result.final_m * 1000.0, 0) + " mm)"
                                            : std::string(" = final primary settlement under the permanent load"))
                    << ".\n";
            if (result.residual) {
                const auto* r = site.criterion.residual();
                out << "Residual after day " << report::fixed(units::seconds_to_days(site.criterion.deadline_s), 0)
                    << " over " << report::fixed(units::seconds_to_days(*r->service_s), 0) << " days: "
                    << report::fixed(result.residual->total_m() * 1000.0, 0) << " mm (primary "
                    << report::fixed(result.residual->primary_m * 1000.0, 0) << " mm, secondary "
                    << report::fixed(result.residual->secondary_m * 1000.0, 0) << " mm) against the limit of "
                    << report::fixed(r->limit_m * 1000.0, 0) << " mm; the surcharge removes "
                    << report::fixed(result.secondary_offset_m * 1000.0, 0)
                    << " mm of secondary compression (the over-consolidation it leaves, Bjerrum 1967).\n";
            }
            if (exceeds) out << "WARNING: the surcharge height exceeds the limit of " << report::fixed(*limit, 2) << " m.\n";
            if (o->offset_secondary) out << "The method ignores " << ignores[1] << " and " << ignores[2] << ".\n";
            else out << "The method ignores " << ignores[0] << ", " << ignores[1] << " and " << ignores[2] << ".\n";
            out << "\n" << results::caution_block();
            item.print(out.str());
            return static_cast<int>(ok);
        });
    };
}

}  // namespace wickgrid::cli
