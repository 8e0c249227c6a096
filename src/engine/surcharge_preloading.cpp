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
        throw InputError("settlement model", timing.pressure_kPa, "a loading with clay layers or mv, for surcharge design");
    require_non_negative("surcharge start (s)", timing.start_s);
    require_at_least("surcharge end (s)", timing.end_s, timing.start_s, "at least the surcharge start");
    if (c.offset_secondary) {
        const auto* r = c.site.criterion.residual();
        if (!r || !r->service_s)
            throw InputError("target.service_days", "given with target.residual_settlement_mm: offsetting secondary compression sizes the "
                             "surcharge against the residual limit over the service period");
    }
}

// Offsetting secondary compression: the design's criterion margin (limit − residual, primary and
// secondary) with the surcharge in the plan; it grows with the surcharge.
double residual_margin(const SurchargeCell& c, const Surcharge& sur) { return model_with(c, sur)->margin(c.site.criterion); }

// The residual split and the creep the surcharge removes, for the result.
void describe_residual(const SurchargeCell& c, const Surcharge& sur, const CellModel& permanent, SurchargeResult& out) {
    const auto* r = c.site.criterion.residual();
    const double t = c.site.criterion.deadline_s;
    out.residual = model_with(c, sur)->residual_parts(t, r->service_s);
    out.secondary_offset_m = permanent.residual_parts(t, r->service_s).secondary_m - out.residual->secondary_m;
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
    SurchargeResult out{0.0, timing.start_s, timing.end_s, timing.removal_s, 0.0, 0.0, true, 0.0, std::nullopt};
    const auto permanent = model_with(c, std::nullopt);
    out.final_m = *permanent->final_settlement_m();
    const double target = out.final_m;
    const auto with_pressure = [&](double q) {
        Surcharge s = timing;
        s.pressure_kPa = q;
        return s;
    };
    auto gap = [&](double q) {
        if (c.offset_secondary) return residual_margin(c, with_pressure(q));
        return loaded_settlement(c, with_pressure(q), timing.removal_s) - target;
    };
    const double without = *permanent->settlement_m(timing.removal_s);
    if (c.offset_secondary ? permanent->margin(c.site.criterion) >= 0.0 : without >= target) {
        out.needed = false;
        out.settlement_at_removal_m = without;
        if (c.offset_secondary) {
            const auto* r = c.site.criterion.residual();
            out.residual = permanent->residual_parts(c.site.criterion.deadline_s, r->service_s);
        }
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
    out.settlement_at_removal_m = loaded_settlement(c, with_pressure(out.pressure_kPa), timing.removal_s);
    if (c.offset_secondary) describe_residual(c, with_pressure(out.pressure_kPa), *permanent, out);
    return out;
}

SurchargeResult removal_for_surcharge(const SurchargeCell& c, const Surcharge& timing) {
    check(c, timing);
    require_positive("surcharge pressure (kPa)", timing.pressure_kPa);
    SurchargeResult out{timing.pressure_kPa, timing.start_s, timing.end_s, timing.end_s, 0.0, 0.0, true, 0.0, std::nullopt};
    const auto permanent = model_with(c, std::nullopt);
    out.final_m = *permanent->final_settlement_m();
    const auto removed_at = [&](double t) {
        Surcharge s = timing;
        s.removal_s = t;
        return s;
    };
    auto gap = [&](double t) {
        if (c.offset_secondary) return residual_margin(c, removed_at(t));
        return loaded_settlement(c, timing, t) - out.final_m;
    };
    const double earliest = std::max(timing.end_s, c.site.loading->end_of_construction_s());
    if (c.offset_secondary && earliest >= c.site.criterion.deadline_s)
        throw EvaluationError("removal day for a surcharge of " + format_value(timing.pressure_kPa) + " kPa",
                              "the surcharge is not in place before the deadline, from which the residual is counted");
    const auto finish = [&](double t) {
        out.removal_s = t;
        out.settlement_at_removal_m = loaded_settlement(c, timing, t);
        if (c.offset_secondary) describe_residual(c, removed_at(t), *permanent, out);
        return out;
    };
    if (gap(earliest) >= 0.0) return finish(earliest);
    // Offsetting secondary compression, the surcharge must be off by the deadline (the residual is
    // counted from it); otherwise the search runs to the horizon.
    const double latest = c.offset_secondary ? c.site.criterion.deadline_s
                                             : defaults::search_horizon_years * units::seconds_per_year;
    double hi = std::min(latest, earliest + units::seconds_per_day);
    while (gap(hi) < 0.0) {
        if (hi >= latest)
            throw EvaluationError("removal day for a surcharge of " + format_value(timing.pressure_kPa) + " kPa",
                                  c.offset_secondary
                                      ? "no removal by the deadline meets the residual limit; a larger surcharge is needed"
                                      : "the final settlement is not reached within " +
                                            format_value(defaults::search_horizon_years) +
                                            " years; a larger surcharge is needed");
        hi = std::min(latest, earliest + 2.0 * (hi - earliest));
    }
    return finish(root("surcharge removal day", gap, earliest, hi));
}

}  // namespace wickgrid
