#include "report/columns.hpp"

#include <algorithm>
#include <cmath>

#include "report/format.hpp"
#include "wickgrid/units.hpp"

namespace wickgrid::report {

std::string Column::shown(const DesignRow& row) const {
    const auto v = value(row);
    const std::string text = v ? fixed(*v * shown_scale, decimals) : missing;
    return text + (mark ? mark(row) : std::string());
}

std::string Column::heading_with_unit(const char* open, const char* close) const {
    return unit.empty() ? heading : heading + open + unit + close;
}

namespace {
using Row = const DesignRow&;
std::optional<double> mm(const std::optional<double>& m) { return m ? std::optional<double>(*m * 1000.0) : std::nullopt; }
}  // namespace

std::vector<Column> all_design_columns(const Site& site) {
    const std::string t_heading = site.criterion.degree()
                                      ? "t" + fixed(100.0 * site.criterion.degree()->degree, 0)
                                      : std::string("t residual");
    return {
        {"spacing_limit_m", "limit", "m", 3, 1.0,
         [](Row r) { return r.feasible ? std::optional<double>(r.spacing_limit_m) : std::nullopt; },
         [](Row r) { return std::string(r.limited_by_maximum ? "+" : ""); }, "none"},
        {"spacing_m", "chosen", "m", 2, 1.0,
         [](Row r) { return r.feasible ? std::optional<double>(r.spacing_m) : std::nullopt; }, {}, "-"},
        {"evaluated_spacing_m", "spacing", "m", 2, 1.0, [](Row r) { return std::optional<double>(r.spacing_m); },
         [](Row r) { return std::string(r.feasible ? "" : "*"); }, "-"},
        {"equivalent_diameter_m", "dw", "mm", 1, 1000.0,
         [](Row r) { return std::optional<double>(r.figures.equivalent_diameter_m); }, {}, "-"},
        {"smear_diameter_m", "ds", "mm", 1, 1000.0, [](Row r) { return std::optional<double>(r.figures.smear_diameter_m); },
         {}, "-"},
        {"influence_diameter_m", "De", "m", 3, 1.0,
         [](Row r) { return std::optional<double>(r.figures.influence_diameter_m); }, {}, "-"},
        {"n", "n", "", 1, 1.0, [](Row r) { return std::optional<double>(r.figures.n); }, {}, "-"},
        {"s", "s", "", 2, 1.0, [](Row r) { return std::optional<double>(r.figures.s); }, {}, "-"},
        {"mu_smear", "μs", "", 2, 1.0, [](Row r) { return std::optional<double>(r.figures.mu_smear); }, {}, "-"},
        {"mu", "μ mean", "", 2, 1.0, [](Row r) { return std::optional<double>(r.figures.mu_depth_mean); }, {}, "-"},
        {"degree_vertical", "Uv", "%", 1, 100.0, [](Row r) { return std::optional<double>(r.at_deadline.vertical); }, {}, "-"},
        {"degree_radial", "Ur", "%", 1, 100.0, [](Row r) { return std::optional<double>(r.at_deadline.radial); }, {}, "-"},
        {"degree", "U", "%", 1, 100.0, [](Row r) { return std::optional<double>(r.at_deadline.combined); }, {}, "-"},
        {"time_to_target_days", t_heading, "days", 1, 1.0,
         [](Row r) {
             return r.time_to_target_s ? std::optional<double>(units::seconds_to_days(*r.time_to_target_s)) : std::nullopt;
         },
         {}, "not reached"},
        {"drains_per_hectare", "drains/ha", "", 0, 1.0, [](Row r) { return std::optional<double>(r.drains_per_hectare); },
         {}, "-"},
        {"drain_length_per_hectare_m", "drain m/ha", "", 0, 1.0,
         [](Row r) { return std::optional<double>(r.drain_length_per_hectare_m); }, {}, "-"},
        {"cost_per_hectare", "cost/ha", "", 0, 1.0, [](Row r) { return r.cost_per_hectare; }, {}, "-"},
        {"ultimate_settlement_mm", "s final", "mm", 0, 1.0, [](Row r) { return mm(r.ultimate_settlement_m); }, {}, "-"},
        {"settlement_at_deadline_mm", "s deadline", "mm", 0, 1.0, [](Row r) { return mm(r.settlement_at_deadline_m); },
         {}, "-"},
        {"residual_settlement_mm", "residual", "mm", 0, 1.0, [](Row r) { return mm(r.residual_settlement_m); }, {}, "-"},
        {"residual_primary_mm", "res. primary", "mm", 0, 1.0, [](Row r) { return mm(r.residual_primary_m); }, {}, "-"},
        {"residual_secondary_mm", "res. secondary", "mm", 0, 1.0, [](Row r) { return mm(r.residual_secondary_m); }, {},
         "-"},
        {"settlement_after_service_mm", "after service", "mm", 0, 1.0,
         [](Row r) { return mm(r.settlement_after_service_m); }, {}, "-"},
    };
}

std::vector<Column> shown_design_columns(const results::DesignRecord& record) {
    const auto& rows = record.result.rows;
    auto any = [&](const Column& c) {
        return std::any_of(rows.begin(), rows.end(), [&](const DesignRow& r) { return c.value(r).has_value(); });
    };
    std::vector<Column> out;
    for (auto& c : all_design_columns(record.site())) {
        if (c.key == "spacing_m" || c.key == "equivalent_diameter_m" || c.key == "smear_diameter_m" || c.key == "mu_smear")
            continue;
        const bool settlement = c.key.find("settlement") != std::string::npos || c.key.rfind("residual_", 0) == 0;
        if ((c.key == "cost_per_hectare" || settlement) && !any(c)) continue;
        out.push_back(std::move(c));
    }
    return out;
}

}  // namespace wickgrid::report
