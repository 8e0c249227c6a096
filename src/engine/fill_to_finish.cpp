// The fill thickness that reaches a finished level after primary settlement, with the buoyancy of
// fill settled below the groundwater table (common practice); see stages.hpp.
#include <boost/math/tools/toms748_solve.hpp>
#include <cmath>

#include "wickgrid/errors.hpp"
#include "wickgrid/stages.hpp"
#include "wickgrid/units.hpp"

namespace wickgrid {

FillToFinish fill_to_finish(const Site& site, double gamma, double finished_m) {
    require_positive("fill unit weight (kN/m³)", gamma);
    require_positive("embankment.finished_height_m", finished_m);
    if (!site.ground.profile && !site.ground.mv_m2_per_kN)
        throw InputError("clay.layers", "given, or clay.mv_m2_per_kN (fill to a finished level needs a settlement model)");
    if (gamma <= units::gamma_w_kN_per_m3)
        throw InputError("fill unit weight (kN/m³)", gamma, "greater than the unit weight of water, 9.81 kN/m³");
    const double dw = site.ground.profile ? site.ground.profile->groundwater_depth_m : 0.0;
    Site loaded = site;
    if (!loaded.loading) loaded.loading = LoadHistory{{{0.0, 0.0, 1.0}}, std::nullopt, std::nullopt};
    const auto settle = ultimate_settlement_function(loaded);
    const auto load_for = [&](double s) { return gamma * (finished_m + s) - units::gamma_w_kN_per_m3 * std::max(0.0, s - dw); };
    const auto gap = [&](double s) { return settle(load_for(s)) - s; };
    // gap(0) > 0; the settlement grows more slowly than the thickness it adds, so gap turns negative.
    double lo = 0.0, hi = std::max(0.1, 0.5 * finished_m);
    double f_lo = gap(lo), f_hi = gap(hi);
    while (f_hi > 0.0) {
        if (hi > 1000.0) throw EvaluationError("fill to a finished level", "no fill thickness below 1000 m reaches it");
        lo = hi;
        f_lo = f_hi;
        hi *= 2.0;
        f_hi = gap(hi);
    }
    std::uintmax_t iterations = defaults::root_iterations;
    const auto r = boost::math::tools::toms748_solve(gap, lo, hi, f_lo, f_hi,
                                                     [](double a, double b) { return b - a < 1e-6; }, iterations);
    require_converged("fill to a finished level", iterations, defaults::root_iterations);
    const double s = 0.5 * (r.first + r.second);
    return {finished_m, finished_m + s, s, std::max(0.0, s - dw), load_for(s)};
}

}  // namespace wickgrid
