#pragma once
// The stage-stability result a writer shows: the checks of each stage (or the planned schedule),
// the factor of safety against time for the chart, and the section the circles are drawn on.
// Computed once here; `stages`, `report` and their writers only format it.
#include <optional>
#include <string>
#include <vector>

#include "scenario/scenario.hpp"
#include "wickgrid/stages.hpp"

namespace wickgrid::results {

// With --plan: whether the planned schedule still meets the design criterion at the spacing checked,
// and the largest spacing that does under it (same product and pattern, the scenario's range).
struct PlanCriterionCheck {
    bool meets = false;
    double degree_at_deadline = 0.0;
    std::optional<double> residual_m;       // residual criterion: the residual at the deadline
    std::optional<double> spacing_limit_m;  // none: no spacing in the range meets it
    bool limited_by_maximum = false;        // met even at the range's largest spacing
};

struct StageRecord {
    std::string drain;
    Pattern pattern = Pattern::triangular;
    double spacing_m = 0.0;
    CellMethod method = CellMethod::closed_form;
    StagePlan plan;
    std::vector<SafetyPoint> history;  // the chart: factor of safety, fill height, settlement against time
    EmbankmentSection section;
    double final_height_m = 0.0;  // the highest fill of the schedule: the section the stages are cut from
    double clay_thickness_m = 0.0;
    std::vector<double> layer_bottoms_m;
    std::vector<UndrainedStrength> layer_strengths;  // as given, one per layer (the figure prints them)
    double groundwater_depth_m = 0.0;                // below the original ground
    std::vector<std::string> assumptions;
    // With embankment.finished_height_m: the fill to place in all, and the top-up lift the scenario
    // planned for it (checked here as a stage of its own).
    std::optional<FillToFinish> finish;
    std::optional<scenario::TopUpPlan> top_up;
    std::optional<PlanCriterionCheck> plan_check;  // planned, with every stage placed
};

// Whether the scenario can be checked stage by stage: an embankment, stages, and a strength in
// every layer; otherwise the reason (the key path and what is missing), for a located error.
std::optional<std::pair<std::string, std::string>> stage_check_refusal(const scenario::Scenario& s);

// The checks (or with plan, the earliest schedule) for one drain × pattern × spacing; the chart's
// times run to 1.5 × the last stage's end (or the deadline, if later), with chart_points of them.
StageRecord stage_record(const scenario::Scenario& s, const std::string& drain, Pattern pattern, double spacing_m,
                         bool plan, int chart_points);

// Whether every stage meets the target (and, planned, every stage could be placed).
bool stages_meet_target(const StageRecord& record);
// Whether the stages meet the target and, planned, the schedule still meets the design criterion.
bool stages_meet_target_and_criterion(const StageRecord& record);

}  // namespace wickgrid::results
