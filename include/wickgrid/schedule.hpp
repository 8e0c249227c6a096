#pragma once
// The whole scheme as one search: for every drain product × pattern × spacing × surcharge height,
// the lift schedule planned stage by stage (stages.hpp, plan_stages: each lift at its earliest day
// that keeps the target factor of safety, the surcharge and the finished-level top-up included), then
// the site's criterion asked under that schedule by the site's own cell model. The schemes that stand
// and meet the criterion by the deadline are ranked by cost and by finish day; the cost–finish front
// is every such scheme that no other beats on both.
#include <optional>
#include <string>
#include <vector>

#include "wickgrid/stages.hpp"

namespace wickgrid {

// Costs beyond the products' cost per metre, each optional (absent: not counted), per hectare of the
// treated area (the fill's plan area; side slopes are not counted).
struct ScheduleCosts {
    std::optional<double> fill_per_m3;               // permanent fill placed (the top-up included)
    std::optional<double> surcharge_per_m3;          // surcharge placed
    std::optional<double> surcharge_removal_per_m3;  // surcharge removed
    std::optional<double> per_hectare_per_day;       // the programme, to the finish day
};

struct ScheduleSpec {
    // Surcharge heights to try (m, >= 0; 0: none). Empty: the site's own surcharge, or none.
    std::vector<double> surcharge_heights_m;
    ScheduleCosts costs;
    unsigned threads = 0;  // 0: every hardware thread; results do not depend on it
};

// Why a scheme is not on the front (names.hpp: scheme_exclusion_names).
enum class SchemeExclusion { none, stage_below_target, criterion_missed, beaten };

struct Scheme {
    std::string drain;
    Pattern pattern = Pattern::triangular;
    double spacing_m = 0.0;
    double surcharge_height_m = 0.0;
    std::vector<double> stage_start_s;  // as planned: the load stages in the site's order, then the surcharge
    LoadHistory schedule;               // the planned load history (up to where the plan ended)
    bool every_stage_stands = false;    // every placement planned and at or above the target
    double min_factor_of_safety = 0.0;  // the least over the placements planned
    bool meets_criterion = false;       // by the deadline, under the planned schedule
    double degree_at_deadline = 0.0;
    std::optional<double> residual_m;  // residual criterion: at the deadline
    // The later of the last placement's end, the surcharge's removal and the day the criterion is
    // first met (s); nullopt when the criterion is not met within the search horizon.
    std::optional<double> finish_s;
    // The sum of the parts below; none when the programme is costed but the scheme has no finish day
    // (the criterion is not met within the search horizon: its programme has no end to cost to).
    std::optional<double> cost_per_hectare;
    struct CostParts {
        double drains = 0.0, fill = 0.0, surcharge = 0.0;
        std::optional<double> programme;  // 0 when the scenario gives no cost per day
    } cost_parts;                         // per hectare; a part the scenario gives no cost for is 0
    bool on_front = false;
    SchemeExclusion excluded_because = SchemeExclusion::none;
};

struct ScheduleResult {
    std::vector<Scheme> schemes;    // product × pattern × surcharge height × spacing, in that order
    std::optional<std::size_t> cheapest;  // index of the cheapest feasible scheme (ties: the sooner)
    std::optional<std::size_t> soonest;   // index of the soonest feasible scheme (ties: the cheaper)
};

// The spacings tried for each product and pattern: the multiples of the range's increment within its
// bounds (the spacings the design rounds to).
std::vector<double> schedule_spacings(const SearchRange& range);

// The site with a surcharge of height_m of fill (the fill unit weight of its embankment): 0 removes
// it; the site's own surcharge keeps its days; otherwise it goes on after the last lift at that lift's
// rate and is held to the deadline (or, placed later, removed a day after). Throws InputError for a
// negative or non-finite height; std::invalid_argument without an embankment and load stages.
Site with_surcharge_height(const Site& site, double height_m);

// The search. Requires what plan_stages requires (InputError naming what is missing) and a cost per
// metre for every product (std::invalid_argument: the scenario reader checks it first). Cost: one plan_stages and one criterion evaluation per scheme
// (about 20 critical-circle searches a placement), shared across `threads`; thread-safe (no shared
// mutable state); results identical for any thread count.
ScheduleResult search_schedules(const Site& site, const ScheduleSpec& spec);

}  // namespace wickgrid
