// Largest spacing that reaches a degree by a deadline (monotone root in spacing, TOMS 748).
#include <Eigen/Core>
#include <boost/math/constants/constants.hpp>
#include <boost/math/tools/toms748_solve.hpp>
#include <cmath>
#include <cstdint>

#include "wickgrid/combine.hpp"
#include "wickgrid/defaults.hpp"
#include "wickgrid/errors.hpp"
#include "wickgrid/search.hpp"

namespace wickgrid {

namespace {
// The message is built only when the check fails: these checks run once per Monte Carlo sample.
void validate_bounds(const SpacingBounds& bounds) {
    require_positive("minimum spacing (m)", bounds.min_m);
    if (!(std::isfinite(bounds.max_m) && bounds.max_m > bounds.min_m))
        throw InputError("maximum spacing (m)", bounds.max_m,
                         "greater than the minimum spacing " + format_value(bounds.min_m) + " m");
}

void validate_search(double target_degree, double deadline_s, const SpacingBounds& bounds) {
    require_open_unit("target degree of consolidation", target_degree);
    require_positive("deadline (s)", deadline_s);
    validate_bounds(bounds);
}

// Shared bracketing logic: f is the degree at the deadline as a function of spacing.
// guess: a spacing near the root (the fast path's first estimate); the bracket is narrowed to a 1 %
// step around it before TOMS 748 starts, which saves most of its iterations. The root is the same.
template <class DegreeAt>
SpacingLimit solve_spacing(DegreeAt&& degree_at, double target_degree, const SpacingBounds& bounds,
                           double guess = 0.0) {
    SpacingLimit limit;
    limit.degree_at_minimum = degree_at(bounds.min_m);
    if (limit.degree_at_minimum < target_degree) return limit;  // infeasible within bounds
    limit.feasible = true;
    const double f_hi = degree_at(bounds.max_m) - target_degree;
    if (f_hi >= 0.0) {
        limit.at_maximum = true;
        limit.spacing_m = bounds.max_m;
        return limit;
    }
    const double f_lo = limit.degree_at_minimum - target_degree;
    if (f_lo == 0.0) {
        limit.spacing_m = bounds.min_m;
        return limit;
    }
    auto f = [&](double s) { return degree_at(s) - target_degree; };
    double lo = bounds.min_m, hi = bounds.max_m, f_low = f_lo, f_high = f_hi;
    if (guess > lo && guess < hi) {
        // The degree falls as the spacing widens: the guess and one 1 % step narrow the bracket.
        const double fg = f(guess);
        (fg >= 0.0 ? lo : hi) = guess;
        (fg >= 0.0 ? f_low : f_high) = fg;
        const double step = fg >= 0.0 ? std::min(hi, guess * 1.01) : std::max(lo, guess * 0.99);
        if (step > lo && step < hi) {
            const double fs = f(step);
            (fs >= 0.0 ? lo : hi) = step;
            (fs >= 0.0 ? f_low : f_high) = fs;
        }
    }
    std::uintmax_t iterations = defaults::root_iterations;
    const auto root = boost::math::tools::toms748_solve(f, lo, hi, f_low, f_high,
                                                        boost::math::tools::eps_tolerance<double>(40), iterations);
    require_converged("largest spacing", iterations, defaults::root_iterations);
    limit.spacing_m = 0.5 * (root.first + root.second);
    return limit;
}
}  // namespace

SpacingLimit largest_spacing_reference(const CellSpec& spec, double target_degree, double deadline_s,
                                       const SpacingBounds& bounds) {
    validate_search(target_degree, deadline_s, bounds);
    auto degree_at = [&](double spacing_m) {
        CellSpec trial = spec;
        trial.spacing_m = spacing_m;
        return UnitCell(trial, DepthAverageRule::Accuracy::reference).at(deadline_s).combined;
    };
    return solve_spacing(degree_at, target_degree, bounds);
}

SpacingSolver::SpacingSolver(const CellSpec& spec, const SpacingBounds& bounds) { reset(spec, bounds); }

void SpacingSolver::reset(const CellSpec& spec, const SpacingBounds& bounds) {
    validate_bounds(bounds);
    validate_clay(spec.clay);
    validate_drain(spec.drain, spec.clay);
    spec_ = spec;
    bounds_ = bounds;
    factor_ = influence_diameter_factor(spec.pattern);
    // The smallest spacing has the smallest n: check that its cell is valid and take its μs, the
    // smallest of the range, hence the nearest quadrature pole; that layout serves every spacing.
    const double n_min = factor_ * bounds.min_m / spec.drain.equivalent_diameter_m;
    const double s = spec.drain.smear_diameter_m / spec.drain.equivalent_diameter_m;
    if (!(n_min > 1.0 && s < n_min))
        throw InputError("drain spacing (m)", bounds.min_m,
                         "greater than " + format_value(minimum_spacing_m(spec.drain, spec.pattern)) +
                             " m so that the smear zone lies inside the unit cell");
    const double mu_min = smear_mu(spec.drain, n_min, bounds.min_m);
    log_s_ = std::log(s);
    const double d = drainage_path_m(spec.clay.thickness_m, spec.clay.drainage);
    tv_per_s_ = spec.clay.cv_m2_per_s / (d * d);
    const double well = boost::math::double_constants::pi * spec.clay.kh_m_per_s / spec.drain.discharge_capacity_m3_per_s;
    const double l = spec.drain.outlets == DrainOutlets::top ? spec.drain.length_m : 0.5 * spec.drain.length_m;
    depth_average_nodes(mu_min, well, l, DepthAverageRule::Accuracy::design, weight_, well_term_);
}

double SpacingSolver::radial(double spacing_m, double time_s) const {
    const double de = factor_ * spacing_m;
    const double n = de / spec_.drain.equivalent_diameter_m;
    // Hansbo (1981): ln(n/s) + (kh/ks) ln s − 0.75, with ln s cached.
    const double mu = spec_.drain.theory == RadialTheory::hansbo_1981
                          ? std::log(n) - log_s_ + spec_.drain.smear_permeability_ratio * log_s_ - 0.75
                          : smear_mu(spec_.drain, n, spacing_m);
    const double th8 = 8.0 * spec_.clay.ch_m2_per_s * time_s / (de * de);
    // Σ w·exp(−8Th/(μ + g)) over the depth nodes, with Eigen's vectorised array exp (the reference
    // path, UnitCell at reference accuracy, stays scalar; FastPaths tests hold the two together).
    const auto n_nodes = static_cast<Eigen::Index>(weight_.size());
    const Eigen::Map<const Eigen::ArrayXd> w(weight_.data(), n_nodes), g(well_term_.data(), n_nodes);
    const double remaining = (w * (-th8 / (mu + g)).exp()).sum();
    return remaining < 1.0 ? 1.0 - remaining : 0.0;
}

double SpacingSolver::degree(double spacing_m, double time_s) const {
    const double uv = degree_vertical(tv_per_s_ * time_s);
    return 1.0 - (1.0 - uv) * (1.0 - radial(spacing_m, time_s));
}


double SpacingSolver::first_guess(double target_degree, double uv, double deadline_s) const {
    // The radial degree the target needs, met by Hansbo's Ur = 1 − exp(−8Th/μ̄) with the depth-mean μ̄:
    // De² = 8·ch·t/(μ̄(De)·(−ln(1 − Ur))), a fixed point in De (μ̄ varies as ln De) that settles in
    // a few steps. Only a starting point: the root is solved on the depth-averaged degree.
    if (spec_.drain.theory != RadialTheory::hansbo_1981 || !(uv < target_degree)) return 0.0;
    const double ur = 1.0 - (1.0 - target_degree) / (1.0 - uv);
    double well_mean = 0.0;
    for (std::size_t i = 0; i < weight_.size(); ++i) well_mean += weight_[i] * well_term_[i];
    const double lhs = 8.0 * spec_.clay.ch_m2_per_s * deadline_s / -std::log1p(-ur);
    double de = factor_ * 0.5 * (bounds_.min_m + bounds_.max_m);
    for (int k = 0; k < 4; ++k) {
        const double n = de / spec_.drain.equivalent_diameter_m;
        const double mu = std::log(n) - log_s_ + spec_.drain.smear_permeability_ratio * log_s_ - 0.75 + well_mean;
        if (!(mu > 0.0)) return 0.0;
        de = std::sqrt(lhs / mu);
    }
    return de / factor_;
}

SpacingLimit SpacingSolver::solve(double target_degree, double deadline_s) const {
    validate_search(target_degree, deadline_s, bounds_);
    // The vertical degree does not depend on spacing: solve for the radial degree it leaves.
    const double uv = degree_vertical(tv_per_s_ * deadline_s);
    auto degree_at = [&](double spacing_m) {
        return 1.0 - (1.0 - uv) * (1.0 - radial(spacing_m, deadline_s));
    };
    return solve_spacing(degree_at, target_degree, bounds_, first_guess(target_degree, uv, deadline_s));
}

SpacingLimit largest_spacing(const CellSpec& spec, double target_degree, double deadline_s,
                             const SpacingBounds& bounds) {
    validate_search(target_degree, deadline_s, bounds);
    return SpacingSolver(spec, bounds).solve(target_degree, deadline_s);
}

}  // namespace wickgrid
