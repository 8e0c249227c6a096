#pragma once
// Inverse problems on unit cells: time to a degree, largest spacing by a deadline.
#include <cstddef>
#include <optional>
#include <vector>

#include "wickgrid/cell.hpp"
#include "wickgrid/settlement.hpp"

namespace wickgrid {

namespace detail {
struct LogStep;
}

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
    double radial(double spacing_m, double time_s) const;
    double first_guess(double log_g_target, double deadline_s) const;  // ln De, Hansbo only
    // ln(−ln R) − ln(−ln R*) at y = ln De (R: remaining radial fraction) and its slope in y.
    detail::LogStep log_step(double log_de, double eight_ch_t, double log_g_target) const;
    SpacingLimit solve_newton(double target_degree, double uv, double deadline_s) const;

    friend class StagedSpacingSolver;
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

// The fast path of spacing searches under a load history, for the closed form with Hansbo's (1981)
// radial flow: the degree at the deadline as SettlementHistory superposes it (the increments of
// load_increments, the surcharge's removal and the max after it), each ramp integrated by fixed
// Gauss–Legendre nodes in √(t − τ). The node layout and the vertical degree at every node are set
// once per reset; a trial spacing then costs the exponentials of nodes × depth nodes. The nodes stay
// accurate (FastPaths tests: within 1e-9 of the adaptive reference) wherever the degree is near a
// target below 1, i.e. near the root; far from it only the sign is used.
// reset() mutates (one object per sampling thread); the const members may run concurrently. No
// allocation once warm.
class StagedSpacingSolver {
public:
    // Throws InputError for an invalid cell, bounds, a deadline <= 0, or a radial theory other than
    // Hansbo's (use the cell models' search).
    void reset(const CellSpec& spec, const SpacingBounds& bounds, const LoadIncrements& loads, double deadline_s);

    double degree(double spacing_m) const;  // at the deadline, spacing within the bounds
    SpacingLimit solve(double target_degree) const;

private:
    struct NodeSum {  // c − Σ coefficient·R(x) (m): settlement of one superposition at one time
        double constant = 0.0;
        std::vector<double> x_s, coefficient;
    };
    void add_increments(NodeSum& sum, const std::vector<ResponseIncrement>& increments, double time_s);
    double degree_at(double log_de) const;
    detail::LogStep log_step(const NodeSum& sum, double log_de, double target_m) const;
    double sum_at(const NodeSum& sum, double log_de, double& slope) const;
    double first_guess(double target_degree) const;  // ln De

    SpacingSolver cell_;
    NodeSum loaded_, permanent_;
    bool after_removal_ = false;  // the deadline follows the surcharge's removal: max of the two
    double final_m_ = 1.0, equivalent_age_s_ = 0.0;
};

}  // namespace wickgrid
