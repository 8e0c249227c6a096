// Time to reach a degree of consolidation in a unit cell (monotone root, TOMS 748).
#include <boost/math/tools/toms748_solve.hpp>
#include <cstdint>

#include "wickgrid/defaults.hpp"
#include "wickgrid/errors.hpp"
#include "wickgrid/search.hpp"
#include "wickgrid/units.hpp"

namespace wickgrid {

double time_to_degree_s(const UnitCell& cell, double target_degree) {
    require_open_unit("target degree of consolidation", target_degree);
    auto f = [&](double t) { return cell.at(t).combined - target_degree; };
    // Bracket by doubling from one day; a thousand years caps pathological inputs.
    double lo = 0.0;
    double hi = units::seconds_per_day;
    const double cap = 1000.0 * units::seconds_per_year;
    while (f(hi) < 0.0) {
        lo = hi;
        hi *= 2.0;
        if (hi > cap)
            throw InputError("target degree of consolidation", target_degree,
                             "reachable within 1000 years for this unit cell");
    }
    std::uintmax_t iterations = defaults::root_iterations;
    const auto root = boost::math::tools::toms748_solve(
        f, lo, hi, boost::math::tools::eps_tolerance<double>(44), iterations);
    require_converged("time to the target degree", iterations, defaults::root_iterations);
    return 0.5 * (root.first + root.second);
}

}  // namespace wickgrid
