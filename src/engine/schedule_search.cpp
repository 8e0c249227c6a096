// The scheme search (schedule.hpp): plan_stages and the site's cell model for every product ×
// pattern × surcharge height × spacing, then the cost–finish front.
#include "wickgrid/schedule.hpp"

#include <algorithm>
#include <cmath>
#include <stdexcept>

#include "parallel_for.hpp"
#include "wickgrid/errors.hpp"
#include "wickgrid/geometry.hpp"
#include "wickgrid/units.hpp"

namespace wickgrid {

namespace {
constexpr double square_metres_per_hectare = 1e4;

struct SchemeKey {
    const DrainProductSpec* product;
    Pattern pattern;
    double surcharge_height_m;
    double spacing_m;
};

// One scheme: the plan, then the criterion under it.
Scheme evaluate(const Site& site, const SchemeKey& key, const ScheduleCosts& costs) {
    Scheme s;
    s.drain = key.product->name;
    s.pattern = key.pattern;
    s.spacing_m = key.spacing_m;
    s.surcharge_height_m = key.surcharge_height_m;
    const StagePlan plan = plan_stages(site, *key.product, key.pattern, key.spacing_m);
    s.schedule = plan.schedule;
    s.min_factor_of_safety = plan.stages.empty() ? 0.0 : plan.stages.front().factor_of_safety;
    std::optional<double> surcharge_start_s;
    for (const StageCheck& c : plan.stages) {
        // Placements come in time order; the permanent ones keep the site's order among themselves.
        if (c.surcharge) surcharge_start_s = c.start_s;
        else s.stage_start_s.push_back(c.start_s);
        s.min_factor_of_safety = std::min(s.min_factor_of_safety, c.factor_of_safety);
    }
    if (surcharge_start_s) s.stage_start_s.push_back(*surcharge_start_s);
    s.every_stage_stands = plan_is_complete(site, plan) && s.min_factor_of_safety >= plan.target_factor_of_safety;
    // The criterion under the planned days: the same model every command builds for this schedule.
    const Site planned = with_planned_schedule(site, plan);
    const auto model = make_cell_model(planned, *key.product, key.pattern, key.spacing_m);
    const Criterion& criterion = planned.criterion;
    s.degree_at_deadline = model->degree(criterion.deadline_s);
    if (const auto* r = criterion.residual()) s.residual_m = model->residual_m(criterion.deadline_s, r->service_s);
    s.meets_criterion = s.every_stage_stands && model->margin(criterion) >= 0.0;
    double works_end_s = 0.0;
    for (const StageCheck& c : plan.stages) works_end_s = std::max(works_end_s, c.end_s);
    if (plan.schedule.surcharge) works_end_s = std::max(works_end_s, plan.schedule.surcharge->removal_s);
    if (const auto met = model->time_criterion_met_s(criterion)) s.finish_s = std::max(works_end_s, *met);
    if (s.meets_criterion && !(s.finish_s && *s.finish_s <= criterion.deadline_s + 1e-6 * units::seconds_per_day))
        s.meets_criterion = false;  // met at the deadline, but the works (or the surcharge) run past it
    // Cost per hectare, by part.
    Scheme::CostParts& c = s.cost_parts;
    c.drains = drains_per_hectare(key.pattern, key.spacing_m) * site.installation.drain_length_m * *key.product->cost_per_m;
    const double gamma = site.embankment->fill_unit_weight_kN_per_m3;
    if (costs.fill_per_m3) c.fill = *costs.fill_per_m3 * site.loading->permanent_kPa() / gamma * square_metres_per_hectare;
    const double surcharge_m3 = key.surcharge_height_m * square_metres_per_hectare;
    c.surcharge = (costs.surcharge_per_m3.value_or(0.0) + costs.surcharge_removal_per_m3.value_or(0.0)) * surcharge_m3;
    if (!costs.per_hectare_per_day) c.programme = 0.0;
    else if (s.finish_s) c.programme = *costs.per_hectare_per_day * units::seconds_to_days(*s.finish_s);
    if (c.programme) s.cost_per_hectare = c.drains + c.fill + c.surcharge + *c.programme;
    s.excluded_because = !s.every_stage_stands ? SchemeExclusion::stage_below_target
                         : !s.meets_criterion  ? SchemeExclusion::criterion_missed
                                               : SchemeExclusion::none;
    return s;
}

// Marks the front (no other feasible scheme is both no dearer and no later, and better in one) and
// names the cheapest and the soonest.
void rank(ScheduleResult& r) {
    std::vector<std::size_t> feasible;
    for (std::size_t i = 0; i < r.schemes.size(); ++i)
        if (r.schemes[i].excluded_because == SchemeExclusion::none) feasible.push_back(i);
    auto cheaper = [&](std::size_t a, std::size_t b) {
        const Scheme &x = r.schemes[a], &y = r.schemes[b];
        return *x.cost_per_hectare != *y.cost_per_hectare ? *x.cost_per_hectare < *y.cost_per_hectare : *x.finish_s < *y.finish_s;
    };
    auto sooner = [&](std::size_t a, std::size_t b) {
        const Scheme &x = r.schemes[a], &y = r.schemes[b];
        return *x.finish_s != *y.finish_s ? *x.finish_s < *y.finish_s : *x.cost_per_hectare < *y.cost_per_hectare;
    };
    if (feasible.empty()) return;
    r.cheapest = *std::min_element(feasible.begin(), feasible.end(), cheaper);
    r.soonest = *std::min_element(feasible.begin(), feasible.end(), sooner);
    for (const std::size_t i : feasible) {
        const Scheme& s = r.schemes[i];
        const bool beaten = std::any_of(feasible.begin(), feasible.end(), [&](std::size_t j) {
            const Scheme& o = r.schemes[j];
            return j != i && *o.cost_per_hectare <= *s.cost_per_hectare && *o.finish_s <= *s.finish_s &&
                   (*o.cost_per_hectare < *s.cost_per_hectare || *o.finish_s < *s.finish_s);
        });
        r.schemes[i].on_front = !beaten;
        if (beaten) r.schemes[i].excluded_because = SchemeExclusion::beaten;
    }
}
}  // namespace

std::vector<double> schedule_spacings(const SearchRange& range) {
    const double inc = range.increment_m;
    require_positive("spacing increment (m)", inc);
    std::vector<double> out;
    // The same hair of tolerance as the design's rounding (design.hpp: round_down_spacing).
    const auto first = static_cast<long>(std::ceil(range.bounds.min_m / inc - 1e-9));
    const auto last = static_cast<long>(std::floor(range.bounds.max_m / inc + 1e-9));
    for (long k = first; k <= last; ++k) out.push_back(static_cast<double>(k) * inc);
    return out;
}

Site with_surcharge_height(const Site& site, double height_m) {
    if (!site.embankment || !site.loading || site.loading->stages.empty())
        throw std::invalid_argument("with_surcharge_height: the site needs an embankment and load stages");
    if (!(height_m >= 0.0) || !std::isfinite(height_m))
        throw InputError("surcharge height (m)", height_m, "0 or more (0: no surcharge)");
    Site out = site;
    LoadHistory& h = *out.loading;
    if (height_m == 0.0) {
        h.surcharge.reset();
        return out;
    }
    const double q = height_m * site.embankment->fill_unit_weight_kN_per_m3;
    if (h.surcharge) {
        h.surcharge->pressure_kPa = q;
        return out;
    }
    const auto last = std::max_element(h.stages.begin(), h.stages.end(),
                                       [](const LoadStage& a, const LoadStage& b) { return a.end_s < b.end_s; });
    Surcharge s;
    s.start_s = last->end_s;
    s.end_s = s.start_s + (last->end_s - last->start_s) / last->pressure_kPa * q;
    s.removal_s = std::max(site.criterion.deadline_s, s.end_s + units::seconds_per_day);
    s.pressure_kPa = q;
    h.surcharge = s;
    return out;
}

ScheduleResult search_schedules(const Site& site, const ScheduleSpec& spec) {
    for (const DrainProductSpec& p : site.products)
        if (!p.cost_per_m) throw std::invalid_argument("search_schedules: drain " + p.name + " has no cost per metre");
    std::vector<Site> variants;
    std::vector<double> heights = spec.surcharge_heights_m;
    if (heights.empty()) {
        const double gamma = site.embankment ? site.embankment->fill_unit_weight_kN_per_m3 : 1.0;
        heights.push_back(site.loading && site.loading->surcharge ? site.loading->surcharge->pressure_kPa / gamma : 0.0);
    }
    for (const double h : heights) variants.push_back(with_surcharge_height(site, h));
    std::vector<SchemeKey> keys;
    std::vector<std::size_t> variant_of;
    const auto spacings = schedule_spacings(site.range);
    for (const DrainProductSpec& p : site.products)
        for (const Pattern pattern : site.range.patterns)
            for (std::size_t v = 0; v < heights.size(); ++v)
                for (const double s : spacings) {
                    keys.push_back({&p, pattern, heights[v], s});
                    variant_of.push_back(v);
                }
    ScheduleResult r;
    r.schemes.resize(keys.size());
    // Each scheme to its own slot: the order and the numbers do not depend on the thread count.
    detail::parallel_for(keys.size(), spec.threads, [&](std::size_t i) {
        r.schemes[i] = evaluate(variants[variant_of[i]], keys[i], spec.costs);
    });
    rank(r);
    return r;
}

}  // namespace wickgrid
