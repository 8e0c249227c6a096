#pragma once
// Safeguarded Newton in y = ln De for the largest-spacing searches (internal to the engine).
#include <algorithm>
#include <cmath>

#include "wickgrid/defaults.hpp"
#include "wickgrid/errors.hpp"

namespace wickgrid::detail {

// One evaluation: h >= 0 means the criterion is met at this influence diameter (h may be +∞ when
// consolidation is complete); h falls as y grows and slope = dh/dy.
struct LogStep {
    double h;
    double slope;
};

struct LogRoot {
    enum class Where { inside, above_all, below_all } where;
    double y;  // the root (inside)
};

// [lo, hi] brackets the root once both ends are evaluated; a bound is evaluated only when a step
// points beyond it, and a step that leaves a known bracket bisects. Newton's error after a step Δ is
// about |h''/2h'|·Δ² (at most Δ² for the closed forms here, whose h is nearly linear in y), so a
// Newton step below 1e-6 ends the search with an error near 1e-12 in ln De.
template <class Step>
LogRoot newton_in_log_de(Step&& step, double y, double y_min, double y_max) {
    double lo = y_min, hi = y_max;
    bool lo_known = false, hi_known = false;
    for (int iteration = 0; iteration < defaults::root_iterations; ++iteration) {
        const LogStep at = step(y);
        if (at.h >= 0.0) {
            if (y >= y_max) return {LogRoot::Where::above_all, y_max};
            lo = y;
            lo_known = true;
        } else {
            if (y <= y_min) return {LogRoot::Where::below_all, y_min};
            hi = y;
            hi_known = true;
        }
        if (at.h == 0.0) return {LogRoot::Where::inside, y};
        const bool newton = std::isfinite(at.h) && at.slope < 0.0;
        double next = newton ? y - at.h / at.slope : y;
        bool bisected = false;
        if (!(next > lo && next < hi)) {
            // The root lies above y when the criterion is met there: an end not yet evaluated is
            // tried first, then the known bracket is halved.
            if (at.h >= 0.0 && !hi_known) next = y_max;
            else if (at.h < 0.0 && !lo_known) next = y_min;
            else next = 0.5 * (lo + hi), bisected = true;
        }
        if ((!bisected && std::fabs(next - y) < 1e-6) || (lo_known && hi_known && hi - lo < 1e-13))
            return {LogRoot::Where::inside, next};
        y = next;
    }
    require_converged("largest spacing", defaults::root_iterations, defaults::root_iterations);
    return {LogRoot::Where::inside, y};
}

}  // namespace wickgrid::detail
