#pragma once
// Staged construction on soft clay: the stability of each fill stage when it is placed, with the
// strength the clay has gained by then, and the earliest day the next stage may start.
//
// The clay's effective stress increase at depth z and offset x at time t is taken as
// Δσ'(x, z, t) = Δσ(x, z, h(t))·(q(t) − u(z, t))/q(t): the stress the section adds at the fill height
// h(t) (embankment.hpp), times the consolidated share of the unit cell's load at that depth (the
// cell-averaged excess pore pressure u of the site's cell model under the uniform load q(t), so the
// drains are taken to treat the whole base out to the toes; no gain beyond the toes). Strength gain
// follows strength.hpp; stability, stability.hpp. The surcharge, when the site has one, is checked
// as the last stage.
#include <optional>
#include <vector>

#include "wickgrid/cell_model.hpp"
#include "wickgrid/stability.hpp"

namespace wickgrid {

struct StageCheck {
    int stage = 0;                  // 1-based, as the load stages are numbered (the surcharge: the next number)
    bool surcharge = false;
    double start_s = 0.0;
    double end_s = 0.0;             // when its placement is complete (the moment it is checked)
    double height_m = 0.0;          // fill height once placed (all stages so far)
    double factor_of_safety = 0.0;  // at end_s
    CircleResult critical;
    // The effective-stress check at end_s (every layer with c′ and φ′): the clay's drained strength
    // with the pore pressure of the cell model (stage_slope_model, StressBasis::effective); the
    // schedule is planned on the total-stress check above, this one is reported beside it.
    std::optional<double> effective_factor_of_safety;
    std::optional<CircleResult> effective_critical;
    std::optional<double> settlement_m;  // at end_s, from the cell model
    // For the next stage: the earliest start (s) at which it meets the target once placed, with its
    // own duration; nullopt for the last stage or when no wait reaches the target.
    std::optional<double> earliest_next_start_s;
    bool next_reachable = true;     // false: the next stage fails the target even after full consolidation
};

struct StagePlan {
    std::vector<StageCheck> stages;
    double target_factor_of_safety = 0.0;
    bool planned = false;  // true: start days moved to the earliest that keep the target
    LoadHistory schedule;  // the stages as checked (planned: on their new days; up to where the plan ended)
};

// The checks of the site's stage schedule for one drain product × pattern × spacing. Requires the
// site's embankment, a loading with stages, layers with an undrained strength each, and a method
// that resolves depth (closed form or layered series); throws InputError naming what is missing.
// Cost: one critical-circle search per stage, and about 20 more per stage for the earliest start.
StagePlan check_stages(const Site& site, const DrainProductSpec& product, Pattern pattern, double spacing_m);

// A schedule that meets the target with the fewest days: each stage starts at the earliest day its
// check allows given the stages planned before it (keeping its duration and the gaps the surcharge
// keeps to its removal). Waiting never lowers a later stage's factor of safety (the clay only gains
// strength with time), so starting each stage as early as allowed gives the shortest schedule.
// A stage that cannot meet the target at any wait ends the plan there (its check says so).
StagePlan plan_stages(const Site& site, const DrainProductSpec& product, Pattern pattern, double spacing_m);

// The site with a plan's schedule as its load history, the section kept at the site's full fill
// height: what the criterion, the chart and the settlement are asked of once the days have moved.
Site with_planned_schedule(const Site& site, const StagePlan& plan);
// Whether the plan placed every placement of the site's load history (it stops at a stage that can
// never reach the target).
bool plan_is_complete(const Site& site, const StagePlan& plan);

// The factor of safety against time for a schedule (the chart): at each time, the fill placed so far
// with the strength gained by then, by the same search as the stage checks (so the chart and the
// table agree at each stage's end). Cost: one cell model and one critical-circle search per time,
// spread over the hardware threads (results do not depend on their number).
struct SafetyPoint {
    double time_s = 0.0;
    double height_m = 0.0;
    double factor_of_safety = 0.0;
    std::optional<double> settlement_m;
};
std::vector<SafetyPoint> safety_history(const Site& site, const DrainProductSpec& product, Pattern pattern,
                                        double spacing_m, const std::vector<double>& times_s);

// Fill to reach a finished level (common practice): the thickness to place so that, once primary
// settlement is over, the fill surface stands finished_height_m above the original ground. The
// settlement consumes fill, and the fill that settles below the groundwater table weighs its
// submerged unit weight (γ − γw), so the load is q = γ·H − γw·max(0, S − dw) with S the final
// settlement under q (the site's settlement model, under the section when there is one) and dw the
// groundwater depth; H = finished + S solved for S by TOMS 748. Throws InputError without a
// settlement model or fill unit weight, EvaluationError when no thickness below 1000 m does it.
struct FillToFinish {
    double finished_height_m = 0.0;
    double placed_height_m = 0.0;      // H
    double final_settlement_m = 0.0;   // S
    double submerged_m = 0.0;          // fill below the groundwater table, max(0, S − dw)
    double load_kPa = 0.0;             // q
};
FillToFinish fill_to_finish(const Site& site, double fill_unit_weight_kN_per_m3, double finished_height_m);

// The slope model of the site at time t under its own load history. The strength gain needs the
// section's stress at every slice base; `tabulated` (the fast path every command uses) samples the
// gained effective stress on a grid of offsets (0 to the toe) × depths and interpolates bilinearly,
// `exact` (the reference) integrates the stress at each call; a test holds them within 0.5 kPa of
// su. Cost: tabulated, one grid (about 5000 stress integrals) then O(1) a call.
enum class StrengthField { tabulated, exact };
// The basis of the clay's strength: `total` (φ = 0 with the gained su, the check that plans the
// schedule) or `effective` (every layer's c′ and φ′, with the pore pressure u = γw·(z − dw) above
// hydrostatic plus the excess Δσv(x, z)·u_cell(z, t)/q(t) within the toes, the unit cell's
// unconsolidated share of the section's stress, and Δσv(x, z) beyond them, where no drains are;
// Δσv tabulated over offsets and depths as the gain is). Effective throws InputError naming the
// first layer without c′ and φ′.
enum class StressBasis { total, effective };
SlopeModel stage_slope_model(const Site& site, const CellModel& model, double time_s,
                             StrengthField field = StrengthField::tabulated, StressBasis basis = StressBasis::total);
// Whether every layer gives c′ and φ′ (so the effective-stress check is made).
bool has_effective_strength(const Site& site);

}  // namespace wickgrid
