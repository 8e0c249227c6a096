// The design study: largest-spacing search per product and pattern, rounding and ranking.
#include <algorithm>
#include <boost/math/tools/toms748_solve.hpp>
#include <cstdint>
#include <cmath>

#include "wickgrid/combine.hpp"
#include "wickgrid/design.hpp"
#include "wickgrid/errors.hpp"
#include "wickgrid/units.hpp"

namespace wickgrid {

const DrainProductSpec& DesignInput::product(const std::string& name) const {
    const auto it = std::find_if(products.begin(), products.end(), [&](const DrainProductSpec& p) { return p.name == name; });
    if (it == products.end()) throw InputError("drain product '" + name + "'", 0.0, "one of the design's products");
    return *it;
}

bool DesignResult::any_feasible() const {
    return std::any_of(rows.begin(), rows.end(), [](const DesignRow& r) { return r.feasible; });
}

NumericalCellSpec numerical_cell(const DesignInput& input, const DrainProductSpec& product, Pattern pattern,
                                 double spacing_m) {
    const CellSpec cell = product_cell(input, product, pattern, spacing_m);
    NumericalCellSpec spec = numerical_spec(cell, input.loading);
    if (!input.numerical_layers.empty()) spec.layers = input.numerical_layers;
    return spec;
}

CellSpec product_cell(const DesignInput& input, const DrainProductSpec& product, Pattern pattern,
                      double spacing_m) {
    CellSpec spec;
    spec.clay = input.clay;
    spec.drain = input.installation;
    spec.drain.equivalent_diameter_m = product.equivalent_diameter_m;
    spec.drain.discharge_capacity_m3_per_s = product.discharge_capacity_m3_per_s;
    spec.drain.smear_diameter_m = input.smear_diameter_ratio * input.mandrel_diameter_m;
    spec.pattern = pattern;
    spec.spacing_m = spacing_m;
    return spec;
}

double round_down_spacing(double limit_m, double increment_m, double minimum_m) {
    require_positive("spacing increment (m)", increment_m);
    // A hair of tolerance keeps 1.7 from becoming 1.65 through 1.6999999999.
    const double steps = std::floor(limit_m / increment_m + 1e-9);
    return std::max(minimum_m, steps * increment_m);
}

namespace {
// Drains, drain metres and cost per hectare at the chosen spacing.
void density_columns(const DrainProductSpec& product, const CellSpec& chosen, DesignRow& row) {
    row.drains_per_hectare = drains_per_hectare(chosen.pattern, chosen.spacing_m);
    row.drain_length_per_hectare_m = row.drains_per_hectare * chosen.drain.length_m;
    if (product.cost_per_m) row.cost_per_hectare = row.drain_length_per_hectare_m * *product.cost_per_m;
}

// Geometry columns of a row from its closed-form unit cell.
void cell_columns(const UnitCell& cell, DesignRow& row) {
    row.equivalent_diameter_m = cell.spec().drain.equivalent_diameter_m;
    row.smear_diameter_m = cell.spec().drain.smear_diameter_m;
    row.influence_diameter_m = cell.influence_diameter_m();
    row.n = cell.n();
    row.s = cell.s();
    row.mu_smear = cell.mu_smear();
    row.mu = cell.mu_depth_mean();
}

// How well a unit cell meets the design criterion: >= 0 when met.
double margin(const DesignInput& input, const SettlementHistory& history) {
    if (input.residual_limit_m) return *input.residual_limit_m - history.residual_m(input.deadline_s, input.service_s);
    return history.degree(input.deadline_s) - input.target_degree;
}

double margin_at(const DesignInput& input, const CellSpec& base, double spacing_m) {
    CellSpec spec = base;
    spec.spacing_m = spacing_m;
    const UnitCell cell(spec);
    return margin(input, history_of(input, cell));
}

// Largest spacing meeting the criterion: scan the increment grid from the minimum, then bisect the
// first failing step to far below a millimetre.
SpacingLimit staged_limit(const DesignInput& input, const CellSpec& base) {
    SpacingLimit limit;
    const double lo = input.bounds.min_m, hi = input.bounds.max_m;
    double ok = lo;
    if (margin_at(input, base, lo) < 0.0) return limit;
    limit.feasible = true;
    for (int k = 1;; ++k) {
        const double s = std::min(hi, lo + k * input.increment_m);
        if (margin_at(input, base, s) < 0.0) {
            double bad = s;
            while (bad - ok > 1e-7) {
                const double mid = 0.5 * (ok + bad);
                (margin_at(input, base, mid) >= 0.0 ? ok : bad) = mid;
            }
            limit.spacing_m = ok;
            return limit;
        }
        ok = s;
        if (s >= hi) break;
    }
    limit.at_maximum = true;
    limit.spacing_m = hi;
    return limit;
}

// Earliest time at which the criterion holds for this cell (s); scans log-spaced times to 100
// years, then bisects the first crossing.
double staged_time_to_target(const DesignInput& input, const SettlementHistory& history) {
    auto met = [&](double t) {
        if (input.residual_limit_m) return history.residual_m(t, input.service_s) <= *input.residual_limit_m;
        return history.degree(t) >= input.target_degree;
    };
    double before = 0.0;
    const double first = units::seconds_per_day, last = 100.0 * units::seconds_per_year;
    for (int i = 0; i <= 400; ++i) {
        const double t = first * std::pow(last / first, i / 400.0);
        if (met(t)) {
            double after = t;
            while (after - before > 1.0) {
                const double mid = 0.5 * (before + after);
                (met(mid) ? after : before) = mid;
            }
            return after;
        }
        before = t;
    }
    throw InputError("design criterion", input.residual_limit_m ? *input.residual_limit_m : input.target_degree,
                     "reachable within 100 years for this unit cell");
}

DesignRow evaluate_staged(const DesignInput& input, const DrainProductSpec& product, Pattern pattern) {
    DesignRow row;
    row.drain = product.name;
    row.pattern = pattern;
    const CellSpec base = product_cell(input, product, pattern, input.bounds.min_m);
    const SpacingLimit limit = staged_limit(input, base);
    row.feasible = limit.feasible;
    row.limited_by_maximum = limit.at_maximum;
    row.spacing_limit_m = limit.spacing_m;
    row.spacing_m = limit.feasible ? round_down_spacing(limit.spacing_m, input.increment_m, input.bounds.min_m)
                                   : input.bounds.min_m;
    CellSpec chosen = base;
    chosen.spacing_m = row.spacing_m;
    const UnitCell cell(chosen);
    const SettlementHistory history = history_of(input, cell);
    const auto part = [&](auto&& response) {
        return SettlementHistory(input.ultimate_settlement(), load_history_of(input), response).degree(input.deadline_s);
    };
    row.at_deadline.vertical = part([&cell](double t) { return cell.at(t).vertical; });
    row.at_deadline.radial = part([&cell](double t) { return cell.at(t).radial; });
    row.at_deadline.combined = history.degree(input.deadline_s);
    cell_columns(cell, row);
    row.time_to_target_s = staged_time_to_target(input, history);
    density_columns(product, chosen, row);
    if (input.has_settlement()) {
        row.ultimate_settlement_m = history.final_m();
        row.settlement_at_deadline_m = history.settlement_m(input.deadline_s);
        row.residual_settlement_m = history.residual_m(input.deadline_s, input.service_s);
    }
    return row;
}

// Geometry columns of a row without building a closed-form cell (which refuses partial drains).
void geometry_columns(const DesignInput& input, const CellSpec& chosen, DesignRow& row) {
    row.equivalent_diameter_m = chosen.drain.equivalent_diameter_m;
    row.smear_diameter_m = chosen.drain.smear_diameter_m;
    row.influence_diameter_m = influence_diameter_m(chosen.pattern, chosen.spacing_m);
    row.n = row.influence_diameter_m / chosen.drain.equivalent_diameter_m;
    row.s = chosen.drain.smear_diameter_m / chosen.drain.equivalent_diameter_m;
    row.mu_smear = smear_mu(chosen.drain, row.n, chosen.spacing_m);
    const double l = chosen.drain.outlets == DrainOutlets::top ? chosen.drain.length_m : 0.5 * chosen.drain.length_m;
    row.mu = mu_depth_mean(row.mu_smear, 3.141592653589793 * input.clay.kh_m_per_s / chosen.drain.discharge_capacity_m3_per_s, l);
}

double numerical_degree(const DesignInput& input, const NumericalCellSpec& spec) {
    return NumericalCell(spec, input.numerical_mesh).solve({input.deadline_s}).front().degree_settlement;
}

DesignRow evaluate_numerical(const DesignInput& input, const DrainProductSpec& product, Pattern pattern) {
    DesignRow row;
    row.drain = product.name;
    row.pattern = pattern;
    auto margin = [&](double spacing) {
        return numerical_degree(input, numerical_cell(input, product, pattern, spacing)) - input.target_degree;
    };
    const double lo = input.bounds.min_m, hi = input.bounds.max_m;
    const double f_lo = margin(lo);
    if (f_lo >= 0.0) {
        row.feasible = true;
        const double f_hi = margin(hi);
        if (f_hi >= 0.0) {
            row.limited_by_maximum = true;
            row.spacing_limit_m = hi;
        } else {
            std::uintmax_t iterations = 60;
            const auto r = boost::math::tools::toms748_solve(margin, lo, hi, f_lo, f_hi,
                                                             [](double a, double b) { return b - a < 1e-5; }, iterations);
            row.spacing_limit_m = r.first;  // the side that still meets the target
        }
    }
    row.spacing_m = row.feasible ? round_down_spacing(row.spacing_limit_m, input.increment_m, lo) : lo;
    const CellSpec chosen = product_cell(input, product, pattern, row.spacing_m);
    geometry_columns(input, chosen, row);
    NumericalCellSpec spec = numerical_cell(input, product, pattern, row.spacing_m);
    const NumericalCell cell(spec, input.numerical_mesh);
    row.at_deadline.combined = cell.solve({input.deadline_s}).front().degree_settlement;
    spec.has_drain = false;
    row.at_deadline.vertical = numerical_degree(input, spec);
    // The radial degree that Carrillo's rule would need to give the combined degree.
    row.at_deadline.radial = 1.0 - (1.0 - row.at_deadline.combined) / (1.0 - row.at_deadline.vertical);
    row.time_to_target_s = cell.time_to_degree_s(input.target_degree);
    density_columns(product, chosen, row);
    return row;
}

DesignRow evaluate(const DesignInput& input, const DrainProductSpec& product, Pattern pattern) {
    if (input.numerical) return evaluate_numerical(input, product, pattern);
    if (input.staged()) return evaluate_staged(input, product, pattern);
    DesignRow row;
    row.drain = product.name;
    row.pattern = pattern;
    const CellSpec base = product_cell(input, product, pattern, input.bounds.min_m);
    const SpacingLimit limit = largest_spacing(base, input.target_degree, input.deadline_s, input.bounds);
    row.feasible = limit.feasible;
    row.limited_by_maximum = limit.at_maximum;
    row.spacing_limit_m = limit.spacing_m;
    row.spacing_m = limit.feasible
                        ? round_down_spacing(limit.spacing_m, input.increment_m, input.bounds.min_m)
                        : input.bounds.min_m;
    CellSpec chosen = base;
    chosen.spacing_m = row.spacing_m;
    const UnitCell cell(chosen);
    cell_columns(cell, row);
    row.at_deadline = cell.at(input.deadline_s);
    row.time_to_target_s = time_to_degree_s(cell, input.target_degree);
    density_columns(product, chosen, row);
    return row;
}
}  // namespace

DesignResult run_design(const DesignInput& input) {
    if (input.numerical && input.residual_limit_m)
        throw InputError("residual settlement limit (m)", *input.residual_limit_m,
                         "used with the closed-form method; the numerical method designs for a degree");
    if (input.residual_limit_m) {
        require_non_negative("residual settlement limit (m)", *input.residual_limit_m);
        if (!input.has_settlement())
            throw InputError("residual settlement limit (m)", *input.residual_limit_m,
                             "used with a loading and a settlement model (clay layers or mv)");
    } else {
        require_open_unit("target degree of consolidation", input.target_degree);
    }
    require_positive("deadline (s)", input.deadline_s);
    DesignResult result;
    for (const auto& product : input.products)
        for (const Pattern pattern : input.patterns) result.rows.push_back(evaluate(input, product, pattern));

    // Cheapest first when every feasible row has a cost; otherwise fewest drain metres.
    std::vector<DesignRow*> feasible;
    for (auto& row : result.rows)
        if (row.feasible) feasible.push_back(&row);
    const bool all_costed = !feasible.empty() &&
                            std::all_of(feasible.begin(), feasible.end(),
                                        [](const DesignRow* r) { return r->cost_per_hectare.has_value(); });
    result.ranking = all_costed ? RankingBasis::cost_per_hectare : RankingBasis::drain_length_per_hectare;
    std::stable_sort(feasible.begin(), feasible.end(), [&](const DesignRow* a, const DesignRow* b) {
        if (all_costed && *a->cost_per_hectare != *b->cost_per_hectare)
            return *a->cost_per_hectare < *b->cost_per_hectare;
        return a->drain_length_per_hectare_m < b->drain_length_per_hectare_m;
    });
    for (std::size_t i = 0; i < feasible.size(); ++i) feasible[i]->rank = static_cast<int>(i) + 1;
    return result;
}

}  // namespace wickgrid
