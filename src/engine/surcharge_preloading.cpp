// Surcharge sizing and removal time by the preloading criterion (Johnson 1970): monotone roots
// in the surcharge pressure and in the removal time, TOMS 748.
#include "wickgrid/surcharge.hpp"

#include <boost/math/tools/toms748_solve.hpp>
#include <cstdint>

#include "wickgrid/errors.hpp"
#include "wickgrid/units.hpp"

namespace wickgrid {

namespace {
// Settlement at time t under the permanent load plus a surcharge still in place at t.
double loaded_settlement(const DesignInput& input, const UnitCell& cell, const Surcharge& sur, double t) {
    LoadHistory loads = load_history_of(input);
    Surcharge held = sur;
    held.removal_s = std::max(t, sur.end_s) + units::seconds_per_day;  // not yet removed at t
    loads.surcharge = held;
    return SettlementHistory(input.ultimate_settlement(), loads, [&cell](double x) { return cell.at(x).combined; })
        .settlement_m(t);
}

void check(const DesignInput& input, const Surcharge& timing) {
    if (!input.has_settlement())
        throw InputError("settlement model", 0.0, "a loading with clay layers or mv, for surcharge design");
    require_non_negative("surcharge start (s)", timing.start_s);
    require_at_least("surcharge end (s)", timing.end_s, timing.start_s, "at least the surcharge start");
}

template <class F>
double root(F&& f, double lo, double hi) {
    std::uintmax_t iterations = 200;
    const auto r = boost::math::tools::toms748_solve(f, lo, hi, boost::math::tools::eps_tolerance<double>(40), iterations);
    return 0.5 * (r.first + r.second);
}
}  // namespace

SurchargeResult surcharge_for_removal(const DesignInput& input, const UnitCell& cell, const Surcharge& timing) {
    check(input, timing);
    require_greater("surcharge removal (s)", timing.removal_s, timing.end_s, "after the surcharge is complete");
    SurchargeResult out{0.0, timing.start_s, timing.end_s, timing.removal_s, 0.0, 0.0, true};
    const SettlementHistory permanent = history_of(input, cell);
    out.final_m = permanent.final_m();
    auto gap = [&](double q) {
        Surcharge s = timing;
        s.pressure_kPa = q;
        return loaded_settlement(input, cell, s, timing.removal_s) - out.final_m;
    };
    const double without = permanent.settlement_m(timing.removal_s) - out.final_m;
    if (without >= 0.0) {
        out.needed = false;
        out.settlement_at_removal_m = permanent.settlement_m(timing.removal_s);
        return out;
    }
    double hi = 10.0;
    while (gap(hi) < 0.0) {
        hi *= 2.0;
        if (hi > 5000.0)
            throw InputError("surcharge removal (days)", units::seconds_to_days(timing.removal_s),
                             "late enough that a surcharge below 5000 kPa can reach the final settlement");
    }
    out.pressure_kPa = root(gap, 1e-9, hi);
    out.settlement_at_removal_m = out.final_m + gap(out.pressure_kPa);
    return out;
}

SurchargeResult removal_for_surcharge(const DesignInput& input, const UnitCell& cell, const Surcharge& timing) {
    check(input, timing);
    require_positive("surcharge pressure (kPa)", timing.pressure_kPa);
    SurchargeResult out{timing.pressure_kPa, timing.start_s, timing.end_s, timing.end_s, 0.0, 0.0, true};
    out.final_m = history_of(input, cell).final_m();
    auto gap = [&](double t) { return loaded_settlement(input, cell, timing, t) - out.final_m; };
    const double earliest = std::max(timing.end_s, load_history_of(input).end_of_construction_s());
    if (gap(earliest) >= 0.0) {
        out.removal_s = earliest;
        out.settlement_at_removal_m = out.final_m + gap(earliest);
        return out;
    }
    double hi = earliest + units::seconds_per_day;
    while (gap(hi) < 0.0) {
        hi = earliest + 2.0 * (hi - earliest);
        if (hi > 100.0 * units::seconds_per_year)
            throw InputError("surcharge pressure (kPa)", timing.pressure_kPa, "large enough to reach the final settlement within 100 years");
    }
    out.removal_s = root(gap, earliest, hi);
    out.settlement_at_removal_m = out.final_m + gap(out.removal_s);
    return out;
}

}  // namespace wickgrid
