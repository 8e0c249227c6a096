#include "results/stage_record.hpp"

#include <algorithm>

#include "wickgrid/cell_model.hpp"
#include "wickgrid/errors.hpp"
#include "wickgrid/units.hpp"

namespace wickgrid::results {

std::optional<std::pair<std::string, std::string>> stage_check_refusal(const scenario::Scenario& s) {
    const Site& site = s.site;
    if (!site.embankment)
        return std::pair<std::string, std::string>{"embankment", "stage checks need an 'embankment' block (the cross-section)"};
    if (!site.loading || site.loading->stages.empty())
        return std::pair<std::string, std::string>{"loading", "stage checks need 'loading.stages' (the fill stages)"};
    if (site.loading->vacuum)
        return std::pair<std::string, std::string>{"loading.vacuum",
                                                   "stage checks do not model the strength gained under vacuum"};
    if (!site.ground.profile)
        return std::pair<std::string, std::string>{"clay", "stage checks need 'clay.layers', each with 'su_top_kPa' or 'su_ratio'"};
    for (std::size_t i = 0; i < site.ground.profile->layers.size(); ++i)
        if (!site.ground.profile->layers[i].strength)
            return std::pair<std::string, std::string>{"clay.layers[" + std::to_string(i) + "]",
                                                       "stage checks need an undrained strength in every layer: "
                                                       "'su_top_kPa' (with 'su_gradient_kPa_per_m') or 'su_ratio'"};
    if (site.method.method == CellMethod::numerical)
        return std::pair<std::string, std::string>{"method", "stage checks need the degree over depth: 'analytical' or "
                                                             "'layered_series' (the numerical cell reports depth averages only)"};
    return std::nullopt;
}

StageRecord stage_record(const scenario::Scenario& s, const std::string& drain, Pattern pattern, double spacing_m,
                         bool plan, int chart_points) {
    const Site& site = s.site;
    const DrainProductSpec& product = site.product(drain);
    StageRecord r;
    r.drain = drain;
    r.pattern = pattern;
    r.spacing_m = spacing_m;
    r.method = site.method.method;
    r.plan = plan ? plan_stages(site, product, pattern, spacing_m) : check_stages(site, product, pattern, spacing_m);
    r.section = *site.embankment;
    r.final_height_m = *final_fill_height_m(site);
    r.clay_thickness_m = site.ground.thickness_m;
    double bottom = 0.0;
    for (const auto& l : site.ground.profile->layers) {
        r.layer_bottoms_m.push_back(bottom += l.thickness_m);
        r.layer_strengths.push_back(*l.strength);  // present in every layer (stage_check_refusal)
    }
    r.groundwater_depth_m = site.ground.profile->groundwater_depth_m;
    // The chart follows the schedule checked: the planned one when planning.
    const Site charted = plan ? with_planned_schedule(site, r.plan) : site;
    // Planned: the schedule moved, so the criterion is asked again under it (one loop, not two commands).
    if (plan && plan_is_complete(site, r.plan)) {
        const auto model = make_cell_model(charted, product, pattern, spacing_m);
        PlanCriterionCheck c;
        c.meets = model->margin(charted.criterion) >= 0.0;
        c.degree_at_deadline = model->degree(charted.criterion.deadline_s);
        if (const auto* res = charted.criterion.residual())
            c.residual_m = model->residual_m(charted.criterion.deadline_s, res->service_s);
        const SpacingLimit limit = spacing_limit(charted, product, pattern);
        if (limit.feasible) c.spacing_limit_m = limit.spacing_m;
        c.limited_by_maximum = limit.at_maximum;
        r.plan_check = c;
    }
    // The top-up was planned once with the scenario (a lift of its own in the stages checked here).
    if (s.top_up) {
        r.finish = s.top_up->finish;
        r.top_up = s.top_up;
    }
    double last = site.criterion.deadline_s;
    for (const StageCheck& c : r.plan.stages) last = std::max(last, c.end_s);
    std::vector<double> times;
    for (int i = 1; i <= chart_points; ++i) times.push_back(1.5 * last * i / chart_points);
    // The moments just after each placement, where the factor of safety is lowest.
    for (const StageCheck& c : r.plan.stages) times.push_back(c.end_s);
    std::sort(times.begin(), times.end());
    times.erase(std::unique(times.begin(), times.end()), times.end());
    r.history = safety_history(charted, product, pattern, spacing_m, times);
    const EmbankmentSection& e = *site.embankment;
    const std::string reinforcement =
        e.reinforcement ? "basal reinforcement of design force " + format_value(e.reinforcement->tensile_force_kN_per_m) +
                              " kN/m at the base of the fill, restoring T × the centre's height where the slip cuts it "
                              "within the footprint (Jewell 1996; the force after every reduction factor and pull-out "
                              "beyond the slip is the designer's)"
                        : "no reinforcement";
    const std::string crack =
        e.tension_crack ? std::string(e.tension_crack->water_filled ? "a water-filled" : "a dry") + " tension crack " +
                              format_value(e.tension_crack->depth_m) + " m deep (no deeper than the fill placed) at the "
                              "slip's upslope end, carrying no shear" +
                              (e.tension_crack->water_filled ? ", its water thrust driving the slip" : "")
                        : "no tension crack";
    r.assumptions = {
        "Circular slips by Bishop's simplified method; undrained (φ = 0) strength in the clay, c′–φ′ in the dry fill; " +
            crack + "; " + reinforcement + "; the section drawn at its placed height on the original ground. Non-circular "
            "and three-dimensional failure need a separate analysis.",
        "Strength gain from the consolidated share of the unit cell's load at each depth times the stress the section adds "
        "there; the drains are taken to treat the whole base out to the toes, with no gain beyond them.",
        "Each stage is checked when its placement is complete, the moment of least safety during construction (the load "
        "added undrained).",
    };
    if (has_effective_strength(site))
        r.assumptions.push_back(
            "Effective-stress check beside it: each layer's c′ and φ′ with the pore pressure at the slip's base, hydrostatic "
            "below the groundwater table plus the excess: the section's vertical stress times the unit cell's unconsolidated "
            "share at that depth within the toes, the whole of it beyond them (no drains there). The schedule is planned on "
            "the total-stress check.");
    return r;
}

bool stages_meet_target_and_criterion(const StageRecord& record) {
    return stages_meet_target(record) && (!record.plan_check || record.plan_check->meets);
}

bool stages_meet_target(const StageRecord& record) {
    const auto& p = record.plan;
    for (const StageCheck& c : p.stages)
        if (c.factor_of_safety < p.target_factor_of_safety) return false;
    if (p.planned && !p.stages.empty() && !p.stages.back().next_reachable) return false;
    return true;
}

}  // namespace wickgrid::results
