#include "results/schedule_record.hpp"

#include <algorithm>
#include <string>

#include "results/stage_record.hpp"

namespace wickgrid::results {

ScheduleResult schedule_record(const scenario::Scenario& s, unsigned threads) {
    // What the search needs beyond the stage checks, refused at its key before any work.
    if (const auto refusal = results::stage_check_refusal(s)) s.fail_at(refusal->first, refusal->second);
    for (std::size_t i = 0; i < s.site.products.size(); ++i)
        if (!s.site.products[i].cost_per_m)
            s.fail_at("drains[" + std::to_string(i) + "]",
                      "the scheme search ranks by cost: give 'cost_per_m' for drain '" + s.site.products[i].name + "'");
    ScheduleSpec spec = s.schedule.value_or(ScheduleSpec{});
    spec.threads = threads;
    const std::size_t heights = std::max<std::size_t>(1, spec.surcharge_heights_m.size());
    const std::size_t schemes =
        s.site.products.size() * s.site.range.patterns.size() * heights * schedule_spacings(s.site.range).size();
    if (schemes > defaults::max_schedule_schemes)
        s.fail_at("spacing.increment_m",
                  "the search would plan " + std::to_string(schemes) + " schemes (" + std::to_string(s.site.products.size()) +
                      " drains × " + std::to_string(s.site.range.patterns.size()) + " patterns × " + std::to_string(heights) +
                      " surcharge heights × " + std::to_string(schedule_spacings(s.site.range).size()) +
                      " spacings); at most " + std::to_string(defaults::max_schedule_schemes) +
                      ": a coarser increment, a narrower range, fewer heights or products");
    return search_schedules(s.site, spec);
}

}  // namespace wickgrid::results
