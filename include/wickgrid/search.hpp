#pragma once
// Inverse problems on unit cells: time to a degree, largest spacing by a deadline.
#include <vector>

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
// deadline_s reaches target. Degree falls monotonically with spacing. Uses SpacingSolver.
SpacingLimit largest_spacing(const CellSpec& spec, double target_degree, double deadline_s,
                             const SpacingBounds& bounds);

// The same search done the plain way: a reference-accuracy UnitCell built at every trial spacing.
// Slow; kept so that the fast path can be checked against it.
SpacingLimit largest_spacing_reference(const CellSpec& spec, double target_degree, double deadline_s,
                                       const SpacingBounds& bounds);

// The fast path of spacing searches, for sweeps and Monte Carlo: validation, the vertical degree at
// the deadline and the depth-quadrature layout are done once; a trial spacing then costs one
// logarithm and a few exponentials. Valid for spacings from bounds.min_m up.
class SpacingSolver {
public:
    SpacingSolver() = default;
    SpacingSolver(const CellSpec& spec, const SpacingBounds& bounds);

    // Re-targets the solver at another cell, reusing its storage (no allocation once warm).
    void reset(const CellSpec& spec, const SpacingBounds& bounds);

    // Combined degree at time_s for a spacing within the bounds (no validation: hot path).
    double degree(double spacing_m, double time_s) const;
    SpacingLimit solve(double target_degree, double deadline_s) const;

private:
    double radial(double spacing_m, double time_s) const;
    double first_guess(double target_degree, double uv, double deadline_s) const;  // 0: none

    CellSpec spec_;
    SpacingBounds bounds_;
    double factor_ = 0.0;    // De/s
    double tv_per_s_ = 0.0;  // cv/d²
    double log_s_ = 0.0;     // ln(ds/dw)
    std::vector<double> weight_;
    std::vector<double> well_term_;  // w·l²·ζ(2 − ζ) at each node
};

}  // namespace wickgrid
