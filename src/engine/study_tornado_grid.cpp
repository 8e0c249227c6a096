// One-at-a-time (tornado) and two-input grid studies: spacing limits at varied inputs, from the
// site's own cell model and criterion.
#include <algorithm>
#include <cmath>

#include "wickgrid/errors.hpp"
#include "wickgrid/studies.hpp"

namespace wickgrid {

namespace {
void check_in_range(const Site& base, StudyInput input, double value) {
    const InputRange range = physical_range(base, input);
    if (!(value >= range.low && value < range.high))
        throw InputError(std::string(to_string(input)), study_value_from_si(input, value),
                         "at least " + format_value(study_value_from_si(input, range.low)) +
                             (std::isfinite(range.high)
                                  ? " and below " + format_value(study_value_from_si(input, range.high))
                                  : std::string()));
}

// The criterion's measure at the deadline for one spacing: the degree, or the residual settlement.
double measure_at(const Site& site, const DrainProductSpec& product, Pattern pattern, double spacing_m) {
    const auto model = make_cell_model(site, product, pattern, spacing_m);
    if (const auto* r = site.criterion.residual()) return model->residual_m(site.criterion.deadline_s, r->service_s);
    return model->degree(site.criterion.deadline_s);
}
}  // namespace

std::vector<TornadoRow> tornado_study(const Site& base, const DesignResult& base_result,
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
            row.measure = base.criterion.kind();
            auto run = [&](double value, SpacingLimit& limit, double& measure) {
                const Site varied = with_input(base, in.input, value);
                const DrainProductSpec& product = varied.product(design.drain);
                limit = spacing_limit(varied, product, design.pattern);
                measure = measure_at(varied, product, design.pattern, design.spacing_m);
            };
            run(in.low_si, row.at_low, row.measure_low);
            run(in.high_si, row.at_high, row.measure_high);
            if (row.at_low.feasible && row.at_high.feasible) row.swing_m = std::fabs(row.at_high.spacing_m - row.at_low.spacing_m);
            group.push_back(row);
        }
        // An input that makes the design infeasible at one end matters most; then the largest swing.
        std::stable_sort(group.begin(), group.end(), [](const TornadoRow& a, const TornadoRow& b) {
            if (a.swing_m.has_value() != b.swing_m.has_value()) return !a.swing_m.has_value();
            return a.swing_m && *a.swing_m > *b.swing_m;
        });
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

std::vector<GridCell> grid_study(const Site& base, const GridAxis& x, const GridAxis& y) {
    if (x.input == y.input)
        throw InputError("grid y input (" + std::string(to_string(y.input)) + ")", 0.0,
                         "different from the x input");
    const auto xs = x.values(), ys = y.values();
    const double searches = static_cast<double>(xs.size() * ys.size() * base.products.size() * base.range.patterns.size());
    if (searches > max_spacing_searches(base))
        throw InputError("grid study spacing searches (steps × steps × products × patterns)", searches,
                         "at most " + format_value(max_spacing_searches(base)) +
                             " for this site's method and loading: use fewer grid steps");
    for (const double v : xs) check_in_range(base, x.input, v);
    for (const double v : ys) check_in_range(base, y.input, v);
    std::vector<GridCell> cells;
    for (const auto& product : base.products)
        for (const Pattern pattern : base.range.patterns)
            for (const double yv : ys)
                for (const double xv : xs) {
                    const Site varied = with_input(with_input(base, x.input, xv), y.input, yv);
                    GridCell cell{product.name, pattern, xv, yv, {}};
                    cell.limit = spacing_limit(varied, varied.product(product.name), pattern);
                    cells.push_back(cell);
                }
    return cells;
}

}  // namespace wickgrid
