// The design study: spacing limit per product and pattern from the site's cell model, rounding,
// the row's figures, and the ranking.
#include <algorithm>
#include <cmath>

#include "wickgrid/design.hpp"
#include "wickgrid/errors.hpp"
#include "wickgrid/units.hpp"

namespace wickgrid {

bool DesignResult::any_feasible() const {
    return std::any_of(rows.begin(), rows.end(), [](const DesignRow& r) { return r.feasible; });
}

const DesignRow* DesignResult::best() const {
    for (const auto& row : rows)
        if (row.rank && *row.rank == 1) return &row;
    return nullptr;
}

double round_down_spacing(double limit_m, double increment_m, double minimum_m) {
    require_positive("spacing increment (m)", increment_m);
    // A hair of tolerance keeps 1.7 from becoming 1.65 through 1.6999999999.
    const double steps = std::floor(limit_m / increment_m + 1e-9);
    return std::max(minimum_m, steps * increment_m);
}

namespace {
std::string mm(double m) { return format_value(std::round(m * 1000.0)) + " mm"; }

void settlement_columns(const Site& site, const CellModel& model, DesignRow& row) {
    const auto final_m = model.final_settlement_m();
    if (!final_m) return;
    const double deadline = site.criterion.deadline_s;
    const auto* residual = site.criterion.residual();
    const std::optional<double> period = residual ? residual->service_s : std::nullopt;
    row.ultimate_settlement_m = final_m;
    row.settlement_at_deadline_m = model.settlement_m(deadline);
    // Without a period and with Cα the residual does not end: shown only where it is defined.
    if (period || !model.secondary_model()) {
        const auto parts = model.residual_parts(deadline, period);
        row.residual_settlement_m = parts.total_m();
        row.residual_primary_m = parts.primary_m;
        row.residual_secondary_m = parts.secondary_m;
    }
    if (!residual || !residual->service_s) return;
    const double end = deadline + *residual->service_s;
    row.settlement_after_service_m = *final_m * (model.eventual_degree() - model.degree(end));
    // A short service period can hide settlement that comes after it: say so.
    if (*row.settlement_after_service_m > residual->limit_m)
        row.warnings.push_back(mm(*row.settlement_after_service_m) + " of primary settlement is still to come after the " +
                               format_value(units::seconds_to_days(*residual->service_s)) +
                               "-day service period (day " + format_value(std::round(units::seconds_to_days(end))) +
                               "); the criterion counts only settlement within that period");
}
}  // namespace

DesignRow design_row(const Site& site, const DrainProductSpec& product, Pattern pattern) {
    DesignRow row;
    row.drain = product.name;
    row.pattern = pattern;
    const SpacingLimit limit = spacing_limit(site, product, pattern);
    const SpacingBounds& bounds = site.range.bounds;
    row.feasible = limit.feasible;
    row.limited_by_maximum = limit.at_maximum;
    row.spacing_limit_m = limit.spacing_m;
    row.spacing_m = limit.feasible ? round_down_spacing(limit.spacing_m, site.range.increment_m, bounds.min_m) : bounds.min_m;
    const auto model = make_cell_model(site, product, pattern, row.spacing_m);
    row.figures = model->figures();
    row.at_deadline = model->degrees({site.criterion.deadline_s}).front();
    row.time_to_target_s = model->time_criterion_met_s(site.criterion);
    row.drains_per_hectare = drains_per_hectare(pattern, row.spacing_m);
    row.drain_length_per_hectare_m = row.drains_per_hectare * site.installation.drain_length_m;
    if (product.cost_per_m) row.cost_per_hectare = row.drain_length_per_hectare_m * *product.cost_per_m;
    settlement_columns(site, *model, row);
    return row;
}

DesignResult run_design(const Site& site) {
    validate_site(site);
    if (const auto why = method_refusal(site)) throw why->error();
    DesignResult result;
    for (const auto& product : site.products)
        for (const Pattern pattern : site.range.patterns) result.rows.push_back(design_row(site, product, pattern));

    // Cheapest first when every feasible row has a cost; otherwise fewest drain metres.
    std::vector<DesignRow*> feasible;
    for (auto& row : result.rows)
        if (row.feasible) feasible.push_back(&row);
    const bool all_costed = !feasible.empty() &&
                            std::all_of(feasible.begin(), feasible.end(),
                                        [](const DesignRow* r) { return r->cost_per_hectare.has_value(); });
    result.ranking = site.range.rank_by.value_or(all_costed ? RankingBasis::cost_per_hectare
                                                             : RankingBasis::drain_length_per_hectare);
    const bool by_cost = result.ranking == RankingBasis::cost_per_hectare;
    std::stable_sort(feasible.begin(), feasible.end(), [&](const DesignRow* a, const DesignRow* b) {
        if (by_cost && *a->cost_per_hectare != *b->cost_per_hectare)
            return *a->cost_per_hectare < *b->cost_per_hectare;
        return a->drain_length_per_hectare_m < b->drain_length_per_hectare_m;
    });
    for (std::size_t i = 0; i < feasible.size(); ++i) feasible[i]->rank = static_cast<int>(i) + 1;
    return result;
}

std::vector<CurvePoint> degree_curve(const CellModel& model, const std::vector<double>& times_s) {
    const auto degrees = model.degrees(times_s);
    const auto final_m = model.final_settlement_m();
    std::vector<CurvePoint> points;
    points.reserve(times_s.size());
    for (std::size_t i = 0; i < times_s.size(); ++i) {
        CurvePoint p{times_s[i], degrees[i], std::nullopt};
        if (final_m) p.settlement_m = *final_m * degrees[i].combined;
        points.push_back(p);
    }
    return points;
}

std::vector<double> even_times_s(double span_s, int points) {
    require_positive("curve time span (s)", span_s);
    if (points < 2) throw InputError("number of curve points", points, "at least 2");
    std::vector<double> times;
    for (int i = 0; i < points; ++i) times.push_back(span_s * i / (points - 1));
    return times;
}

}  // namespace wickgrid
