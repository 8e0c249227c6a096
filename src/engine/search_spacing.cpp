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
#include "search_newton.hpp"

namespace wickgrid {

namespace {
// Fixed-size blocks of depth nodes: Eigen vectorises them without allocating.
using Block = Eigen::Array<double, 8, 1>;

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
template <class DegreeAt>
SpacingLimit solve_spacing(DegreeAt&& degree_at, double target_degree, const SpacingBounds& bounds) {
    SpacingLimit limit;
    const double at_minimum = degree_at(bounds.min_m);
    limit.degree_at_minimum = at_minimum;
    if (at_minimum < target_degree) return limit;  // infeasible within bounds
    limit.feasible = true;
    const double f_hi = degree_at(bounds.max_m) - target_degree;
    if (f_hi >= 0.0) {
        limit.at_maximum = true;
        limit.spacing_m = bounds.max_m;
        return limit;
    }
    const double f_lo = at_minimum - target_degree;
    if (f_lo == 0.0) {
        limit.spacing_m = bounds.min_m;
        return limit;
    }
    auto f = [&](double s) { return degree_at(s) - target_degree; };
    std::uintmax_t iterations = defaults::root_iterations;
    const auto root = boost::math::tools::toms748_solve(f, bounds.min_m, bounds.max_m, f_lo, f_hi,
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

// The header pads the nodes to whole blocks of this size.
static_assert(Block::RowsAtCompileTime == 8);

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
    // Logarithms that stay put between resets (the bounds, the pattern's factor, the product's dw)
    // are kept: a Monte Carlo sample resets the solver for every row.
    if (bounds.min_m != logs_.min_m || bounds.max_m != logs_.max_m || factor_ != logs_.factor ||
        spec.drain.equivalent_diameter_m != logs_.dw_m) {
        logs_ = {bounds.min_m, bounds.max_m, factor_, spec.drain.equivalent_diameter_m, 0.0, 0.0, 0.0};
        logs_.log_de_min = std::log(factor_ * bounds.min_m);
        logs_.log_de_max = std::log(factor_ * bounds.max_m);
        logs_.log_dw = std::log(spec.drain.equivalent_diameter_m);
    }
    log_s_ = std::log(s);
    // Hansbo's μ = ln De − ln dw − ln s + (kh/ks)·ln s − 0.75: all but ln De is fixed per cell.
    mu_constant_ = -logs_.log_dw - log_s_ + spec.drain.smear_permeability_ratio * log_s_ - 0.75;
    const double mu_min = spec.drain.theory == RadialTheory::hansbo_1981 ? mu_constant_ + logs_.log_de_min
                                                                          : smear_mu(spec.drain, n_min, bounds.min_m);
    if (!(mu_min > 0.0)) smear_mu(spec.drain, n_min, bounds.min_m);  // throws its named error
    const double d = drainage_path_m(spec.clay.thickness_m, spec.clay.drainage);
    tv_per_s_ = spec.clay.cv_m2_per_s / (d * d);
    const double well = boost::math::double_constants::pi * spec.clay.kh_m_per_s / spec.drain.discharge_capacity_m3_per_s;
    const double l = spec.drain.outlets == DrainOutlets::top ? spec.drain.length_m : 0.5 * spec.drain.length_m;
    depth_average_nodes(mu_min, well, l, DepthAverageRule::Accuracy::design, weight_, well_term_);
    well_mean_ = 0.0;
    for (std::size_t i = 0; i < weight_.size(); ++i) well_mean_ += weight_[i] * well_term_[i];
    // Padded with zero-weight nodes to whole blocks, so the hot loops run on fixed-size arrays
    // (vectorised, no allocation).
    const std::size_t padded = (weight_.size() + block - 1) / block * block;
    weight_.resize(padded, 0.0);
    well_term_.resize(padded, 0.0);
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
    double remaining = 0.0;
    for (std::size_t i = 0; i < weight_.size(); i += block) {
        const Eigen::Map<const Block> w(weight_.data() + i), g(well_term_.data() + i);
        remaining += (w * (-th8 / (mu + g)).exp()).sum();
    }
    return remaining < 1.0 ? 1.0 - remaining : 0.0;
}

double SpacingSolver::degree(double spacing_m, double time_s) const {
    const double uv = degree_vertical(tv_per_s_ * time_s);
    return carrillo_combined(uv, radial(spacing_m, time_s));
}


double SpacingSolver::first_guess(double log_g_target, double deadline_s) const {
    // The radial degree the target needs, met by Hansbo's Ur = 1 − exp(−8Th/μ̄) with the depth-mean μ̄:
    // De² = 8·ch·t/(μ̄(De)·(−ln(1 − Ur))), a fixed point in y = ln De (μ̄ varies as y, so each step
    // shrinks the error about tenfold). Only a starting point: the root is solved on the
    // depth-averaged degree. Returns y clamped to the bounds.
    const double log_lhs = std::log(8.0 * spec_.clay.ch_m2_per_s * deadline_s) - log_g_target;
    double y = 0.5 * (logs_.log_de_min + logs_.log_de_max);
    for (int k = 0; k < 2; ++k) {
        const double mu = mu_constant_ + y + well_mean_;
        if (!(mu > 0.0)) break;
        y = 0.5 * (log_lhs - std::log(mu));
    }
    return std::clamp(y, logs_.log_de_min, logs_.log_de_max);
}

detail::LogStep SpacingSolver::log_step(double log_de, double eight_ch_t, double log_g_target) const {
    // y = ln De. Each node's exponent x = 8·ch·t/(De²·m), m = μ(De) + g and dμ/dy = 1 (Hansbo), so
    // dx/dy = −x(2 + 1/m). h(y) = ln(−ln R) − ln(−ln R*) with R = Σ w·e^(−x) is nearly linear in y,
    // which is why Newton settles in two or three steps from the first guess.
    const double mu = mu_constant_ + log_de;
    const double a = eight_ch_t * std::exp(-2.0 * log_de);
    double remaining = 0.0, d_remaining = 0.0;
    for (std::size_t i = 0; i < weight_.size(); i += block) {
        const Eigen::Map<const Block> w(weight_.data() + i), g(well_term_.data() + i);
        const Block inv_m = (mu + g).inverse();
        const Block x = a * inv_m;
        const Block we = w * (-x).exp();
        remaining += we.sum();
        d_remaining += (we * x * (2.0 + inv_m)).sum();
    }
    const double big_g = -std::log(remaining);
    return {std::log(big_g) - log_g_target, -d_remaining / (remaining * big_g)};
}

SpacingLimit SpacingSolver::solve_newton(double target_degree, double uv, double deadline_s) const {
    SpacingLimit limit;
    // The vertical degree alone reaches the target: every spacing does.
    if (uv >= target_degree) {
        limit.feasible = limit.at_maximum = true;
        limit.spacing_m = bounds_.max_m;
        return limit;
    }
    const double log_g_target = std::log(-std::log((1.0 - target_degree) / (1.0 - uv)));
    const double eight_ch_t = 8.0 * spec_.clay.ch_m2_per_s * deadline_s;
    const auto root = detail::newton_in_log_de([&](double y) { return log_step(y, eight_ch_t, log_g_target); },
                                               first_guess(log_g_target, deadline_s), logs_.log_de_min, logs_.log_de_max);
    if (root.where == detail::LogRoot::Where::below_all) {
        limit.degree_at_minimum = degree(bounds_.min_m, deadline_s);
        return limit;
    }
    limit.feasible = true;
    limit.at_maximum = root.where == detail::LogRoot::Where::above_all;
    limit.spacing_m = limit.at_maximum ? bounds_.max_m : std::clamp(std::exp(root.y) / factor_, bounds_.min_m, bounds_.max_m);
    return limit;
}

SpacingLimit SpacingSolver::solve(double target_degree, double deadline_s) const {
    validate_search(target_degree, deadline_s, bounds_);
    // The vertical degree does not depend on spacing: solve for the radial degree it leaves.
    const double uv = degree_vertical(tv_per_s_ * deadline_s);
    if (spec_.drain.theory == RadialTheory::hansbo_1981) return solve_newton(target_degree, uv, deadline_s);
    auto degree_at = [&](double spacing_m) {
        return carrillo_combined(uv, radial(spacing_m, deadline_s));
    };
    return solve_spacing(degree_at, target_degree, bounds_);
}

SpacingLimit largest_spacing(const CellSpec& spec, double target_degree, double deadline_s,
                             const SpacingBounds& bounds) {
    validate_search(target_degree, deadline_s, bounds);
    return SpacingSolver(spec, bounds).solve(target_degree, deadline_s);
}

}  // namespace wickgrid
