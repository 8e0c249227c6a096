// Largest spacing under a load history with the closed form: superposition of the unit cell's step
// response (as SettlementHistory), ramps by fixed Gauss–Legendre nodes in √(t − τ), safeguarded
// Newton in ln De.
#include <Eigen/Core>
#include <algorithm>
#include <boost/math/quadrature/gauss.hpp>
#include <cmath>

#include "search_newton.hpp"
#include "wickgrid/combine.hpp"
#include "wickgrid/errors.hpp"
#include "wickgrid/search.hpp"
#include "wickgrid/vertical.hpp"

namespace wickgrid {

namespace {
using Block = Eigen::Array<double, 8, 1>;
// Nodes per ramp. Near the root the radial exponent over any ramp is at most about −ln(1 − U*)
// (under 7 for targets to 0.999) and the vertical one about 2.5·Tv; 10 nodes integrate such
// exponentials to about 1e-13 (the FastPaths tests measure it against adaptive Gauss–Kronrod).
using Rule = boost::math::quadrature::gauss<double, 10>;
}  // namespace

void StagedSpacingSolver::add_increments(NodeSum& sum, const std::vector<ResponseIncrement>& increments, double time_s) {
    const double tv_per_s = cell_.tv_per_s_;
    auto add_node = [&](double x, double weight) {
        sum.x_s.push_back(x);
        sum.coefficient.push_back(weight * (1.0 - degree_vertical(tv_per_s * x)));
    };
    for (const ResponseIncrement& inc : increments) {
        if (time_s <= inc.start_s) continue;
        if (inc.end_s <= inc.start_s) {  // a step: U(t − a) = 1 − V·R
            sum.constant += inc.weight;
            add_node(time_s - inc.start_s, inc.weight);
            continue;
        }
        // (1/(b − a))∫ U(x)dx over x in [max(0, t − b), t − a], with x = y²: the length less ∫V·R.
        const double x0 = std::max(0.0, time_s - inc.end_s), x1 = time_s - inc.start_s;
        const double scale = inc.weight / (inc.end_s - inc.start_s);
        sum.constant += scale * (x1 - x0);
        const double y0 = std::sqrt(x0), y1 = std::sqrt(x1);
        const double half = 0.5 * (y1 - y0), mid = 0.5 * (y0 + y1);
        const auto& xi = Rule::abscissa();
        const auto& w = Rule::weights();
        for (std::size_t k = 0; k < xi.size(); ++k)
            for (const double side : {-1.0, 1.0}) {
                const double y = mid + side * half * xi[k];
                add_node(y * y, scale * w[k] * half * 2.0 * y);
            }
    }
}

void StagedSpacingSolver::reset(const CellSpec& spec, const SpacingBounds& bounds, const LoadIncrements& loads,
                                double deadline_s) {
    require_positive("deadline (s)", deadline_s);
    if (spec.drain.theory != RadialTheory::hansbo_1981)
        throw InputError("radial theory", static_cast<double>(spec.drain.theory),
                         "Hansbo (1981) for the staged fast search (other theories search on cell models)");
    require_positive("ultimate settlement (m)", loads.final_m);
    cell_.reset(spec, bounds);
    final_m_ = loads.final_m;
    after_removal_ = loads.removal_s && deadline_s > *loads.removal_s;
    // Cleared, not replaced: the node storage is reused from sample to sample.
    for (NodeSum* sum : {&loaded_, &permanent_}) {
        sum->constant = 0.0;
        sum->x_s.clear();
        sum->coefficient.clear();
    }
    add_increments(loaded_, loads.all, after_removal_ ? *loads.removal_s : deadline_s);
    if (after_removal_) add_increments(permanent_, loads.permanent, deadline_s);
    // The load-weighted age of the increments at the deadline: the instantaneous load that starts
    // the search.
    const double t = after_removal_ ? *loads.removal_s : deadline_s;
    double weight = 0.0, age = 0.0;
    for (const ResponseIncrement& inc : loads.all) {
        if (t <= inc.start_s) continue;
        weight += inc.weight;
        age += inc.weight * (t - 0.5 * (inc.start_s + std::min(inc.end_s, t)));
    }
    equivalent_age_s_ = weight > 0.0 && age > 0.0 ? age / weight : 0.5 * t;
}

double StagedSpacingSolver::sum_at(const NodeSum& sum, double log_de, double& slope) const {
    // R(x) = Σ w·exp(−κ·x) over the depth nodes, κ = 8·ch/(De²·m), m = μ(De) + g, dκ/dy = −κ(2 + 1/m).
    const SpacingSolver& c = cell_;
    const double mu = c.mu_constant_ + log_de;
    const double a = 8.0 * c.spec_.clay.ch_m2_per_s * std::exp(-2.0 * log_de);
    double settled = sum.constant, d_settled = 0.0;
    for (std::size_t i = 0; i < c.weight_.size(); i += SpacingSolver::block) {
        const Eigen::Map<const Block> w(c.weight_.data() + i), g(c.well_term_.data() + i);
        const Block inv_m = (mu + g).inverse();
        const Block kappa = a * inv_m;
        const Block d_kappa = kappa * (2.0 + inv_m);
        for (std::size_t j = 0; j < sum.x_s.size(); ++j) {
            const Block we = w * (-sum.x_s[j] * kappa).exp();
            settled -= sum.coefficient[j] * we.sum();
            d_settled -= sum.coefficient[j] * sum.x_s[j] * (we * d_kappa).sum();
        }
    }
    slope = d_settled;
    return settled;
}

double StagedSpacingSolver::degree_at(double log_de) const {
    double slope = 0.0;
    double settled = sum_at(loaded_, log_de, slope);
    if (after_removal_) settled = std::max(settled, sum_at(permanent_, log_de, slope));
    return settled / final_m_;
}

detail::LogStep StagedSpacingSolver::log_step(const NodeSum& sum, double log_de, double target_m) const {
    // The sum's own consolidated share c − ΣC·R over c (c: the load applied by then) is below 1 and
    // falls with De like one load's degree, so h = ln(−ln(1 − share)) − ln(−ln(1 − share*)) is
    // nearly linear in ln De; a share* of 1 or more cannot be met by this sum.
    const double share_target = target_m / sum.constant;
    if (!(share_target < 1.0)) return {-HUGE_VAL, 0.0};
    double slope = 0.0;
    const double share = sum_at(sum, log_de, slope) / sum.constant;
    if (!(share < 1.0)) return {HUGE_VAL, 0.0};
    if (!(share > 0.0)) return {-HUGE_VAL, 0.0};
    const double g = -std::log1p(-share);
    return {std::log(g) - std::log(-std::log1p(-share_target)), slope / sum.constant / ((1.0 - share) * g)};
}

double StagedSpacingSolver::degree(double spacing_m) const {
    return degree_at(std::log(cell_.factor_ * spacing_m));
}

double StagedSpacingSolver::first_guess(double target_degree) const {
    // One instantaneous load of the equivalent age meeting the loaded sum's share of the target.
    const double share = target_degree * final_m_ / loaded_.constant;
    const double uv = degree_vertical(cell_.tv_per_s_ * equivalent_age_s_);
    if (!(share < 1.0)) return cell_.logs_.log_de_min;
    if (!(uv < share)) return cell_.logs_.log_de_max;
    return cell_.first_guess(std::log(-std::log((1.0 - share) / (1.0 - uv))), equivalent_age_s_);
}

SpacingLimit StagedSpacingSolver::solve(double target_degree) const {
    require_open_unit("target degree of consolidation", target_degree);
    const double target_m = target_degree * final_m_;
    // Met when either superposition meets it (the settlement is their max after the removal).
    auto step = [&](double y) {
        const detail::LogStep loaded = log_step(loaded_, y, target_m);
        if (!after_removal_) return loaded;
        const detail::LogStep permanent = log_step(permanent_, y, target_m);
        return permanent.h > loaded.h ? permanent : loaded;
    };
    const auto& logs = cell_.logs_;
    const auto root = detail::newton_in_log_de(step, first_guess(target_degree), logs.log_de_min, logs.log_de_max);
    SpacingLimit limit;
    if (root.where == detail::LogRoot::Where::below_all) {
        limit.degree_at_minimum = degree_at(logs.log_de_min);
        return limit;
    }
    limit.feasible = true;
    limit.at_maximum = root.where == detail::LogRoot::Where::above_all;
    const SpacingBounds& b = cell_.bounds_;
    limit.spacing_m = limit.at_maximum ? b.max_m : std::clamp(std::exp(root.y) / cell_.factor_, b.min_m, b.max_m);
    return limit;
}

}  // namespace wickgrid
