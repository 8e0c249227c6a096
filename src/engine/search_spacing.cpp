// Largest spacing that reaches a degree by a deadline (monotone root in spacing, TOMS 748).
#include <boost/math/tools/toms748_solve.hpp>
#include <cstdint>

#include "wickgrid/errors.hpp"
#include "wickgrid/search.hpp"

namespace wickgrid {

SpacingLimit largest_spacing(const CellSpec& spec, double target_degree, double deadline_s,
                             const SpacingBounds& bounds) {
    require_open_unit("target degree of consolidation", target_degree);
    require_positive("deadline (s)", deadline_s);
    require_positive("minimum spacing (m)", bounds.min_m);
    require_greater("maximum spacing (m)", bounds.max_m, bounds.min_m,
                    "greater than the minimum spacing " + format_value(bounds.min_m) + " m");
    auto degree_at = [&](double spacing_m) {
        CellSpec trial = spec;
        trial.spacing_m = spacing_m;
        return UnitCell(trial).at(deadline_s).combined;
    };
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
    std::uintmax_t iterations = 200;
    const auto root = boost::math::tools::toms748_solve(
        [&](double s) { return degree_at(s) - target_degree; }, bounds.min_m, bounds.max_m, f_lo, f_hi,
        boost::math::tools::eps_tolerance<double>(44), iterations);
    limit.spacing_m = 0.5 * (root.first + root.second);
    return limit;
}

}  // namespace wickgrid
