#pragma once
// Plausibility warnings (not errors): values that are allowed but outside the range met in
// practice, each naming the key, its place in the file, the usual range with its source and a
// likely cause. Shown on stderr by every command, in the notes and in JSON `warnings`.
#include <string>
#include <vector>

#include "scenario.hpp"

namespace wickgrid::scenario {

// One line per implausible value, e.g. "demo.yaml:12:3: clay.ch_m2_per_year = 3e-08 is outside the
// usual 0.1–100 m²/year (common practice): a value in m²/s?". Cost O(keys). Thread-safe.
std::vector<std::string> plausibility_warnings(const Scenario& s);

}  // namespace wickgrid::scenario
