#pragma once
// Inverse problems on unit cells: time to a degree, largest spacing by a deadline.
#include <cstddef>
#include <optional>
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
    // Combined degree at bounds.min_m by the deadline: always given when the search is infeasible
    // (the best the range reaches); the fast solver does not evaluate it otherwise.
    std::optional<double> degree_at_minimum;
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
    // Hansbo's closed form: safeguarded Newton in ln De from a closed-form first guess (typically
    // three evaluations of the depth-averaged degree and its slope); other radial theories: TOMS 748.
    // Throws InputError for a target outside (0, 1) or a deadline <= 0.
    SpacingLimit solve(double target_degree, double deadline_s) const;

private:
    struct LogStep {
        double h;      // ln(−ln R) − ln(−ln R*) at y = ln De (R: remaining radial fraction)
        double slope;  // dh/dy
    };
    double radial(double spacing_m, double time_s) const;
    double first_guess(double log_g_target, double deadline_s) const;  // ln De, Hansbo only
    LogStep log_step(double log_de, double eight_ch_t, double log_g_target) const;
    SpacingLimit solve_newton(double target_degree, double uv, double deadline_s) const;

    static constexpr std::size_t block = 8;  // depth nodes per vectorised block (storage padded to it)

    CellSpec spec_;
    SpacingBounds bounds_;
    struct KeptLogs {  // logarithms of inputs that rarely change between resets
        double min_m = 0.0, max_m = 0.0, factor = 0.0, dw_m = 0.0;
        double log_de_min = 0.0, log_de_max = 0.0, log_dw = 0.0;
    };
    KeptLogs logs_;
    double factor_ = 0.0;    // De/s
    double tv_per_s_ = 0.0;  // cv/d²
    double log_s_ = 0.0;     // ln(ds/dw)
    double mu_constant_ = 0.0;  // Hansbo's μ minus ln De
    double well_mean_ = 0.0;    // depth mean of the well term
    std::vector<double> weight_;
    std::vector<double> well_term_;  // w·l²·ζ(2 − ζ) at each node
};

}  // namespace wickgrid
