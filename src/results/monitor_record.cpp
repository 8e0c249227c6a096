#include "monitor_record.hpp"

#include <algorithm>
#include <cmath>
#include <limits>

#include "report/format.hpp"
#include "wickgrid/errors.hpp"
#include "wickgrid/units.hpp"
#include "wickgrid/studies.hpp"
#include "wickgrid/vertical.hpp"

namespace wickgrid::results {

namespace {
using report::fixed;
double days(double s) { return units::seconds_to_days(s); }
constexpr int chart_points = 120;

// When the placing of the lifts (top-up included) and of the surcharge begun by `by_s` ends; with
// `by_s` infinite, when the plan's last placing ends.
double last_placing_end_s(const Site& site, double by_s) {
    double t = 0.0;
    if (!site.loading) return t;
    for (const auto& st : site.loading->stages)
        if (st.start_s <= by_s) t = std::max(t, st.end_s);
    if (const auto& su = site.loading->surcharge; su && su->start_s <= by_s) t = std::max(t, su->end_s);
    return t;
}

// The last change of load by the last reading, or the plate's own last change of fill height,
// whichever is later. A lift still being placed at the last reading moves the window past it
// (Asaoka then has no readings to use, rightly).
double last_load_change_s(const Site& site, const scenario::PlateRecord& plate, double now_s) {
    const double t = last_placing_end_s(site, now_s);
    return plate.last_fill_change_s ? std::max(t, *plate.last_fill_change_s) : t;
}

// Flags an s∞ that is not the final settlement under the permanent fill (a note says why).
void flag_asaoka(PlateAnalysis& a, const Site& site) {
    if (!site.loading) return;
    if (const auto& v = site.loading->vacuum; v && v->start_s < a.now_s && v->end_s > a.window_start_s) {
        a.asaoka_flags.emplace_back("under_vacuum");
        a.notes.push_back("Asaoka: s∞ is taken while the vacuum acts (day " + fixed(days(v->start_s), 0) + " to " +
                          fixed(days(v->end_s), 0) + "): the limit under fill and vacuum together, not the final "
                          "settlement under the fill alone");
    }
    if (const double last = last_placing_end_s(site, std::numeric_limits<double>::infinity()); last > a.now_s) {
        a.asaoka_flags.emplace_back("before_last_lift");
        a.notes.push_back("Asaoka: s∞ is taken before the last lift of the plan (placed by day " + fixed(days(last), 0) +
                          "): the limit of the load placed so far, not of the full load");
    }
}

void analyse_asaoka(PlateAnalysis& a, const std::vector<monitoring::Reading>& used, const Site& site, const CellModel& design,
                    std::optional<double> interval_s) {
    try {
        a.asaoka = monitoring::asaoka(used, a.window_start_s, interval_s);
    } catch (const EvaluationError& e) {
        a.notes.push_back("Asaoka: " + e.reason());
        return;
    }
    const double relative_se = a.asaoka->final_settlement_se_m / std::abs(a.asaoka->final_settlement_m);
    a.asaoka_reliable = relative_se <= asaoka_max_relative_se;
    if (!a.asaoka_reliable)
        a.notes.push_back("Asaoka: the standard error of s∞ is " + fixed(100.0 * relative_se, 0) +
                          " % of it (more than 10 %): too noisy to rely on");
    if (!site.ground.cv_m2_per_s) {
        a.notes.push_back("Asaoka: no clay-wide cv to separate the vertical drainage from the radial; ch not given");
        return;
    }
    const auto& fig = design.figures();
    a.asaoka_ch_m2_per_s = monitoring::asaoka_ch_m2_per_s(
        a.asaoka->beta1, a.asaoka->interval_s, fig.influence_diameter_m, fig.mu_depth_mean, *site.ground.cv_m2_per_s,
        drainage_path_m(site.ground.thickness_m, site.ground.drainage));
    if (!a.asaoka_ch_m2_per_s)
        a.notes.push_back("Asaoka: the record settles no faster than vertical drainage alone would; ch not given");
}

void analyse_fit(PlateAnalysis& a, const std::vector<monitoring::Reading>& used, const scenario::Scenario& s,
                 const DrainProductSpec& product, Pattern pattern, double spacing_m) {
    try {
        a.fit = monitoring::fit_ch_and_settlement(s.site, product, pattern, spacing_m, used);
    } catch (const EvaluationError& e) {
        a.notes.push_back("Direct fit: " + e.reason());
        return;
    }
    const auto& ci = a.fit->ch_factor_interval_95;
    a.fit_reliable = !a.fit->at_search_bound && ci && (*ci)[1] / (*ci)[0] <= fit_max_interval_ratio;
    if (a.fit->at_search_bound)
        a.notes.push_back("Direct fit: ch sits at a bound of its search (a factor 100 from the design's): not determined");
    else if (!ci)
        a.notes.push_back("Direct fit: the record does not bound ch");
    else if (!a.fit_reliable)
        a.notes.push_back("Direct fit: the 95 % interval of ch spans a factor " + fixed((*ci)[1] / (*ci)[0], 1) +
                          " (more than 4): too short or too noisy a record to forecast from");
}
}  // namespace

MonitorRecord monitor_record(const scenario::Scenario& s, const std::string& drain, Pattern pattern, double spacing_m,
                             const scenario::ReadingsFile& readings, std::optional<double> asaoka_interval_s) {
    MonitorRecord r;
    r.scenario = &s;
    const DrainProductSpec& product = s.site.product(drain);
    r.drain = product.name;
    r.pattern = pattern;
    r.spacing_m = spacing_m;
    r.readings_file = readings.file;
    r.design_ch_m2_per_s = s.site.ground.ch_m2_per_s;
    r.warnings = readings.warnings;
    const auto design = make_cell_model(s.site, product, pattern, spacing_m);
    for (const auto& plate : readings.plates) {
        PlateAnalysis a;
        a.plate = plate.plate;
        a.readings = plate.readings.size();
        std::vector<monitoring::Reading> used = plate.readings;
        if (s.site.loading && s.site.loading->surcharge && plate.readings.back().time_s > s.site.loading->surcharge->removal_s) {
            a.window_end_s = s.site.loading->surcharge->removal_s;
            std::erase_if(used, [&](const auto& x) { return x.time_s > *a.window_end_s; });
            a.notes.push_back("Readings after the surcharge removal (day " + fixed(days(*a.window_end_s), 0) +
                              ") are not used: rebound is outside the methods.");
        }
        if (used.empty()) {
            a.notes.push_back("No reading before the surcharge removal.");
            r.plates.push_back(std::move(a));
            continue;
        }
        a.now_s = used.back().time_s;
        a.window_start_s = last_load_change_s(s.site, plate, a.now_s);
        analyse_asaoka(a, used, s.site, *design, asaoka_interval_s);
        if (a.asaoka) flag_asaoka(a, s.site);
        try {
            a.hyperbolic = monitoring::hyperbolic(used, a.window_start_s);
        } catch (const EvaluationError& e) {
            a.notes.push_back("Hyperbolic: " + e.reason());
        }
        analyse_fit(a, used, s, product, pattern, spacing_m);
        a.design_final_m = design->final_settlement_m();
        a.design_forecast = monitoring::forecast(*design, a.design_final_m.value_or(0.0), s.site, a.now_s);
        a.observed = plate.readings;
        const double until = 1.2 * std::max(s.site.criterion.deadline_s, plate.readings.back().time_s);
        for (int i = 0; i <= chart_points; ++i) a.curve_times_s.push_back(until * i / chart_points);
        if (a.design_final_m)
            for (const double u : design->combined(a.curve_times_s)) a.design_curve_m.push_back(*a.design_final_m * u);
        if (a.fit) {
            const Site fitted = with_input(s.site, StudyInput::ch_factor, a.fit->ch_factor);
            const auto model = make_cell_model(fitted, product, pattern, spacing_m);
            for (const double u : model->combined(a.curve_times_s)) a.fitted_curve_m.push_back(a.fit->final_settlement_m * u);
            if (a.fit_reliable) a.fitted_forecast = monitoring::forecast(*model, a.fit->final_settlement_m, fitted, a.now_s);
        }
        r.plates.push_back(std::move(a));
    }
    r.assumptions = {
        "Days count from the start of loading (the scenario's day 0); settlements from a plate installed then.",
        "Asaoka (1978): the record resampled at a constant interval from the last load change (linear interpolation), "
        "s_i = β0 + β1·s_(i−1) by least squares, s∞ = β0/(1 − β1); ch from β1 with radial and vertical drainage "
        "together, −ln β1/Δt = 8ch/(De²μ) + π²cv/(4d²) (Magnan & Deroy 1980), μ the design cell's depth mean.",
        "Hyperbolic (Tan, Inoue & Lee 1991), plain form: (t − t0)/(s − s0) = α + β(t − t0), s∞ = s0 + 1/β; it tends to "
        "overestimate s∞ (Tan et al. give a correction, not applied here).",
        "Asaoka's and the hyperbolic s∞ are limits under the load acting over the window: with a surcharge on, above "
        "the final settlement under the permanent load (the direct fit's S).",
        "Direct fit: s(t) = S·U(t; f·ch) of the design's cell model (any method, every layer's ch times f) under the "
        "scenario's load history, least squares over ln f (Brent) with S exact; 95 % interval of f from the Jacobian "
        "with Student's t.",
        "Relied on only when: Asaoka's standard error of s∞ is at most 10 % of it; the direct fit's ch is inside its "
        "search and its 95 % interval spans at most a factor 4. Otherwise the record is too short or too noisy and no "
        "back-analysed forecast is given.",
        "The back-analysed forecast keeps every other design input; a surcharge may come off when U relative to the "
        "final permanent load reaches 1 (Johnson 1970).",
    };
    return r;
}

void add_piezometers(MonitorRecord& record, std::vector<scenario::PiezometerRecord> piezometers) {
    record.piezometers = std::move(piezometers);
    const Site& site = record.scenario->site;
    if (!site.loading || record.piezometers.empty()) return;
    double until = site.criterion.deadline_s;
    for (const auto& p : record.piezometers) until = std::max(until, p.readings.back().first);
    until *= 1.2;
    const auto design = make_cell_model(site, site.product(record.drain), record.pattern, record.spacing_m);
    // After a surcharge comes off the closed form holds the settlement (no rebound): the curve stops there.
    if (site.loading->surcharge) until = std::min(until, site.loading->surcharge->removal_s);
    for (int i = 0; i <= chart_points; ++i) record.pore_times_s.push_back(until * i / chart_points);
    const auto u = design->combined(record.pore_times_s);
    const LoadHistory& h = *site.loading;
    for (std::size_t i = 0; i < u.size(); ++i) {
        // Linear theory: the mean effective stress gained is U × the final permanent load.
        record.design_mean_excess_kPa.push_back(h.applied_at_kPa(record.pore_times_s[i]) - u[i] * h.permanent_kPa());
    }
    // At each piezometer's depth, where the method resolves depth.
    const double thickness = site.ground.thickness_m;
    for (const auto& p : record.piezometers) {
        std::vector<double> at;
        if (p.depth_m > thickness) {
            record.warnings.push_back("Piezometer " + p.piezometer + " at " + format_value(p.depth_m) +
                                      " m is below the clay (" + format_value(thickness) +
                                      " m): no design value at its depth.");
        } else {
            for (const double t : record.pore_times_s) {
                const auto state = design->over_depth({p.depth_m}, t);
                if (!state) {
                    at.clear();
                    break;
                }
                at.push_back(state->front().excess_pore_pressure_kPa);
            }
        }
        record.design_excess_at_piezometer_kPa.push_back(std::move(at));
    }
}

}  // namespace wickgrid::results
