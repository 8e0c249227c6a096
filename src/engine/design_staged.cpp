// Designs under staged loading or a residual-settlement criterion: the unit cell's response
// superposed over the load history; the spacing limit by a scan on the increment grid refined by
// bisection (the residual over a service period need not be monotone in spacing).
#include <cmath>

#include "wickgrid/design.hpp"
#include "wickgrid/errors.hpp"
#include "wickgrid/units.hpp"

namespace wickgrid {

std::function<double(double)> DesignInput::ultimate_settlement() const {
    if (profile) {
        const SoilProfile p = *profile;
        return [p](double q) { return ultimate_settlement_m(p, q); };
    }
    if (clay_mv_m2_per_kN && loading) {
        const double mv = *clay_mv_m2_per_kN, h = clay.thickness_m;
        return [mv, h](double q) { return mv * q * h; };
    }
    return [](double q) { return q; };
}

LoadHistory load_history_of(const DesignInput& input) {
    if (input.loading) return *input.loading;
    LoadHistory h;
    h.stages.push_back({0.0, 0.0, 1.0});
    return h;
}

SettlementHistory history_of(const DesignInput& input, const UnitCell& cell) {
    return SettlementHistory(input.ultimate_settlement(), load_history_of(input),
                             [&cell](double t) { return cell.at(t).combined; });
}

}  // namespace wickgrid
