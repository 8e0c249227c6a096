// Depth to the clay base between boreholes: inverse-distance weighting with power 2 (Shepard 1968),
// and the drain length it implies.
#include <cmath>
#include <limits>

#include "wickgrid/errors.hpp"
#include "wickgrid/layout.hpp"

namespace wickgrid::layout {

double base_depth_m(const std::vector<BaseDepthPoint>& points, Point at) {
    if (points.empty()) throw InputError("base depth points", 0.0, "at least one borehole with a base depth");
    // Within a micrometre of a borehole the borehole's own depth is returned: the weights would
    // overflow there, and the interpolant is exact at the data points by construction.
    constexpr double coincident_m2 = 1e-12;
    double weighted = 0.0;
    double weights = 0.0;
    for (const auto& p : points) {
        const double dx = at.x_m - p.x_m;
        const double dy = at.y_m - p.y_m;
        const double d2 = dx * dx + dy * dy;
        if (d2 < coincident_m2) return p.depth_m;
        const double w = 1.0 / d2;
        weighted += w * p.depth_m;
        weights += w;
    }
    return weighted / weights;
}

double drain_length_m(const LengthRule& rule, Point at) {
    if (rule.base_points.empty()) return rule.design_length_m;
    const double base = base_depth_m(rule.base_points, at);
    // A design drain that reaches the base follows it; one that stops short is cut where the clay is
    // thinner than the drain (a relative tolerance absorbs the scenario's rounding).
    const bool reaches_base = rule.design_length_m >= rule.clay_thickness_m * (1.0 - 1e-9);
    return reaches_base ? base : std::min(rule.design_length_m, base);
}

}  // namespace wickgrid::layout
