#pragma once
// The scheme search of a scenario (schedule.hpp), asked once: `schedule` and the report's section
// format the same result.
#include "scenario/scenario.hpp"
#include "wickgrid/schedule.hpp"

namespace wickgrid::results {

// Checks what the search needs at its key (the stage checks' inputs, a cost per metre on every drain,
// the budget of defaults::max_schedule_schemes; ScenarioError, located) and runs it with the
// scenario's `schedule:` block (or its own surcharge) on `threads` threads (0: all).
ScheduleResult schedule_record(const scenario::Scenario& s, unsigned threads);

}  // namespace wickgrid::results
