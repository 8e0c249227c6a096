#pragma once
// The scenario of one scheme of `schedule` (schedule.hpp): the file as read, narrowed to the scheme's
// drain and pattern, its spacing as the range's largest, its surcharge height and the planned days of
// every lift, the surcharge and the finished-level top-up. Read back, `design`, `stages`, `report` and
// `layout` of it evaluate the same plan the search did.
#include <string>

#include "scenario/scenario.hpp"
#include "wickgrid/schedule.hpp"

namespace wickgrid::scenario {

// YAML text (comments of the source are not kept; a header names the source and its digest). Throws
// std::invalid_argument when the scheme was not searched on this scenario (a stage count that differs).
std::string scheme_scenario_yaml(const Scenario& s, const Scheme& scheme);

}  // namespace wickgrid::scenario
