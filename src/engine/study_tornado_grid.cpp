// One-at-a-time (tornado) and two-input grid studies: largest-spacing searches at varied inputs.
#include <algorithm>
#include <cmath>

#include "wickgrid/errors.hpp"
#include "wickgrid/studies.hpp"

namespace wickgrid {

namespace {
void check_in_range(const DesignInput& base, StudyInput input, double value) {
    const InputRange range = physical_range(base, input);
    if (!(value >= range.low && value < range.high))
        throw InputError(std::string(to_string(input)), study_value_from_si(input, value),
                         "at least " + format_value(study_value_from_si(input, range.low)) +
                             (std::isfinite(range.high)
                                  ? " and below " + format_value(study_value_from_si(input, range.high))
                                  : std::string()));
}

// The spacing limit under the design's own criterion, loading and method.
SpacingLimit limit_for(const DesignInput& input, const DrainProductSpec& product, Pattern pattern) {
    if (!input.staged() && !input.numerical)
        return largest_spacing(product_cell(input, product, pattern, input.bounds.min_m), input.target_degree,
                               input.deadline_s, input.bounds);
    DesignInput one = input;
    one.products = {product};
    one.patterns = {pattern};
    const DesignRow row = run_design(one).rows.front();
    SpacingLimit limit;
    limit.feasible = row.feasible;
    limit.at_maximum = row.limited_by_maximum;
    limit.spacing_m = row.spacing_limit_m;
    limit.degree_at_minimum = row.feasible ? 0.0 : row.at_deadline.combined;
    return limit;
}

// The degree at the deadline at one spacing, under the design's loading and method.
double degree_for(const DesignInput& input, const DrainProductSpec& product, Pattern pattern, double spacing_m) {
    if (input.numerical)
        return NumericalCell(numerical_cell(input, product, pattern, spacing_m), input.numerical_mesh)
            .solve({input.deadline_s})
            .front()
            .degree_settlement;
    const UnitCell cell(product_cell(input, product, pattern, spacing_m));
    if (input.staged()) return history_of(input, cell).degree(input.deadline_s);
    return cell.at(input.deadline_s).combined;
}
}  // namespace

std::vector<TornadoRow> tornado_study(const DesignInput& base, const DesignResult& base_result,
                                      const std::vector<TornadoInput>& inputs) {
    for (const auto& in : inputs) {
        check_in_range(base, in.input, in.low_si);
        check_in_range(base, in.input, in.high_si);
        if (!(in.low_si <= in.high_si))
            throw InputError(std::string(to_string(in.input)) + " high value", study_value_from_si(in.input, in.high_si),
                             "at least the low value " + format_value(study_value_from_si(in.input, in.low_si)));
    }
    std::vector<TornadoRow> rows;
    for (const DesignRow& design : base_result.rows) {
        std::vector<TornadoRow> group;
        for (const auto& in : inputs) {
            TornadoRow row;
            row.drain = design.drain;
            row.pattern = design.pattern;
            row.input = in.input;
            row.low_si = in.low_si;
            row.high_si = in.high_si;
            auto run = [&](double value, SpacingLimit& limit, double& degree) {
                const DesignInput varied = with_input(base, in.input, value);
                const DrainProductSpec& product = varied.product(design.drain);
                limit = limit_for(varied, product, design.pattern);
                degree = degree_for(varied, product, design.pattern, design.spacing_m);
            };
            run(in.low_si, row.at_low, row.degree_low);
            run(in.high_si, row.at_high, row.degree_high);
            const double low = row.at_low.feasible ? row.at_low.spacing_m : 0.0;
            const double high = row.at_high.feasible ? row.at_high.spacing_m : 0.0;
            row.swing_m = std::fabs(high - low);
            group.push_back(row);
        }
        std::stable_sort(group.begin(), group.end(),
                         [](const TornadoRow& a, const TornadoRow& b) { return a.swing_m > b.swing_m; });
        rows.insert(rows.end(), group.begin(), group.end());
    }
    return rows;
}

std::vector<double> GridAxis::values() const {
    if (steps < 2) throw InputError(std::string(to_string(input)) + " steps", steps, "at least 2");
    std::vector<double> v;
    for (int i = 0; i < steps; ++i) v.push_back(from_si + (to_si - from_si) * i / (steps - 1));
    return v;
}

std::vector<GridCell> grid_study(const DesignInput& base, const GridAxis& x, const GridAxis& y) {
    if (x.input == y.input)
        throw InputError("grid y input (" + std::string(to_string(y.input)) + ")", 0.0,
                         "different from the x input");
    const auto xs = x.values(), ys = y.values();
    for (const double v : xs) check_in_range(base, x.input, v);
    for (const double v : ys) check_in_range(base, y.input, v);
    std::vector<GridCell> cells;
    for (const auto& product : base.products)
        for (const Pattern pattern : base.patterns)
            for (const double yv : ys)
                for (const double xv : xs) {
                    const DesignInput varied = with_input(with_input(base, x.input, xv), y.input, yv);
                    const DrainProductSpec& p = varied.product(product.name);
                    GridCell cell{product.name, pattern, xv, yv, {}};
                    cell.limit = limit_for(varied, p, pattern);
                    cells.push_back(cell);
                }
    return cells;
}

}  // namespace wickgrid
