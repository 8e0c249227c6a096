#pragma once
// Inverse problems on unit cells: time to a degree, largest spacing by a deadline.
#include "wickgrid/cell.hpp"

namespace wickgrid {

// Time (s) at which the combined degree reaches target (0 < target < 1). Degree rises
// monotonically in time, so the root is bracketed and solved with TOMS 748.
double time_to_degree_s(const UnitCell& cell, double target_degree);

struct SpacingBounds {
    double min_m = 0.0;
    double max_m = 0.0;
};

struct SpacingLimit {
    bool feasible = false;      // target reachable at some spacing within the bounds
    bool at_maximum = false;    // the target is still met at bounds.max_m (the limit is the bound)
    double spacing_m = 0.0;     // the limiting spacing (exact root, or max_m when at_maximum)
    double degree_at_minimum = 0.0;  // combined degree at bounds.min_m by the deadline
};

// Largest spacing (for spec.pattern; spec.spacing_m is ignored) at which the combined degree at
// deadline_s reaches target. Degree falls monotonically with spacing.
SpacingLimit largest_spacing(const CellSpec& spec, double target_degree, double deadline_s,
                             const SpacingBounds& bounds);

}  // namespace wickgrid
