// Surcharge sizing and removal time by the preloading criterion (Johnson 1970): monotone roots
// in the surcharge pressure and in the removal time, TOMS 748, on the site's own cell model.
#include "wickgrid/surcharge.hpp"

#include <algorithm>
#include <boost/math/tools/toms748_solve.hpp>
#include <cstdint>

#include "wickgrid/errors.hpp"
#include "wickgrid/units.hpp"

namespace wickgrid {

namespace {
// The cell model with the given surcharge in the site's load history (none: permanent load alone).
std::unique_ptr<CellModel> model_with(const SurchargeCell& c, std::optional<Surcharge> surcharge) {
    Site site = c.site;
    site.loading->surcharge = surcharge;
    return make_cell_model(site, c.product, c.pattern, c.spacing_m);
}

// Settlement at time t under the permanent load plus a surcharge still in place at t.
double loaded_settlement(const SurchargeCell& c, const Surcharge& sur, double t) {
    Surcharge held = sur;
    held.removal_s = std::max(t, sur.end_s) + units::seconds_per_day;  // not yet removed at t
    return *model_with(c, held)->settlement_m(t);
}

void check(const SurchargeCell& c, const Surcharge& timing) {
    if (!c.site.has_settlement())
        throw InputError("settlement model", 0.0, "a loading with clay layers or mv, for surcharge design");
    require_non_negative("surcharge start (s)", timing.start_s);
    require_at_least("surcharge end (s)", timing.end_s, timing.start_s, "at least the surcharge start");
}

// What the settlement at removal time t must reach: the final primary settlement, plus the
// secondary compression to t + service when asked.
double target_at(const SurchargeCell& c, const CellModel& permanent, double t) {
    const double primary = *permanent.final_settlement_m();
    return c.offset_secondary_service_s ? primary + permanent.secondary_m(t + *c.offset_secondary_service_s) : primary;
}

template <class F>
double root(const char* what, F&& f, double lo, double hi) {
    std::uintmax_t iterations = defaults::root_iterations;
    const auto r = boost::math::tools::toms748_solve(f, lo, hi, boost::math::tools::eps_tolerance<double>(40), iterations);
    require_converged(what, iterations, defaults::root_iterations);
    return 0.5 * (r.first + r.second);
}
}  // namespace

SurchargeResult surcharge_for_removal(const SurchargeCell& c, const Surcharge& timing) {
    check(c, timing);
    require_greater("surcharge removal (s)", timing.removal_s, timing.end_s, "after the surcharge is complete");
    SurchargeResult out{0.0, timing.start_s, timing.end_s, timing.removal_s, 0.0, 0.0, true};
    const auto permanent = model_with(c, std::nullopt);
    out.final_m = *permanent->final_settlement_m();
    const double target = target_at(c, *permanent, timing.removal_s);
    out.secondary_offset_m = target - out.final_m;
    auto gap = [&](double q) {
        Surcharge s = timing;
        s.pressure_kPa = q;
        return loaded_settlement(c, s, timing.removal_s) - target;
    };
    const double without = *permanent->settlement_m(timing.removal_s);
    if (without >= target) {
        out.needed = false;
        out.settlement_at_removal_m = without;
        return out;
    }
    double hi = 10.0;
    while (gap(hi) < 0.0) {
        hi *= 2.0;
        if (hi > 5000.0)
            throw EvaluationError("surcharge for removal on day " + format_value(units::seconds_to_days(timing.removal_s)),
                                  "no surcharge below 5000 kPa reaches the final settlement by then; remove it later");
    }
    out.pressure_kPa = root("surcharge pressure", gap, 1e-9, hi);
    out.settlement_at_removal_m = target + gap(out.pressure_kPa);
    return out;
}

SurchargeResult removal_for_surcharge(const SurchargeCell& c, const Surcharge& timing) {
    check(c, timing);
    require_positive("surcharge pressure (kPa)", timing.pressure_kPa);
    SurchargeResult out{timing.pressure_kPa, timing.start_s, timing.end_s, timing.end_s, 0.0, 0.0, true};
    const auto permanent = model_with(c, std::nullopt);
    out.final_m = *permanent->final_settlement_m();
    auto gap = [&](double t) { return loaded_settlement(c, timing, t) - target_at(c, *permanent, t); };
    const double earliest = std::max(timing.end_s, c.site.loading->end_of_construction_s());
    if (gap(earliest) >= 0.0) {
        out.removal_s = earliest;
        out.secondary_offset_m = target_at(c, *permanent, earliest) - out.final_m;
        out.settlement_at_removal_m = out.final_m + out.secondary_offset_m + gap(earliest);
        return out;
    }
    double hi = earliest + units::seconds_per_day;
    while (gap(hi) < 0.0) {
        hi = earliest + 2.0 * (hi - earliest);
        if (hi > defaults::search_horizon_years * units::seconds_per_year)
            throw EvaluationError("removal day for a surcharge of " + format_value(timing.pressure_kPa) + " kPa",
                                  "the final settlement is not reached within " +
                                      format_value(defaults::search_horizon_years) + " years; a larger surcharge is needed");
    }
    out.removal_s = root("surcharge removal day", gap, earliest, hi);
    out.secondary_offset_m = target_at(c, *permanent, out.removal_s) - out.final_m;
    out.settlement_at_removal_m = out.final_m + out.secondary_offset_m + gap(out.removal_s);
    return out;
}

}  // namespace wickgrid
