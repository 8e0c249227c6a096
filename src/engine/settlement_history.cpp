// Settlement against time under a load history with an optional surcharge: superposition of the
// unit cell's step response, increments weighted by the ultimate settlement they add.
#include <algorithm>

#include "wickgrid/errors.hpp"
#include "wickgrid/settlement.hpp"

namespace wickgrid {

namespace {
struct Event {
    double start_s, end_s, pressure_kPa;
};

std::vector<ResponseIncrement> increments(std::vector<Event> events, const std::function<double(double)>& ultimate) {
    std::stable_sort(events.begin(), events.end(), [](const Event& a, const Event& b) { return a.start_s < b.start_s; });
    std::vector<ResponseIncrement> out;
    double q = 0.0, s = ultimate(0.0);
    for (const auto& e : events) {
        const double s_next = ultimate(q + e.pressure_kPa);
        out.push_back({e.start_s, e.end_s, s_next - s});
        q += e.pressure_kPa;
        s = s_next;
    }
    return out;
}
}  // namespace

LoadIncrements load_increments(const std::function<double(double)>& ultimate, const LoadHistory& history) {
    validate_load_history(history);
    LoadIncrements out;
    std::vector<Event> permanent;
    for (const auto& s : history.stages) permanent.push_back({s.start_s, s.end_s, s.pressure_kPa});
    out.permanent = increments(permanent, ultimate);
    out.final_m = ultimate(history.permanent_kPa()) - ultimate(0.0);
    if (!(out.final_m > 0.0)) throw InputError("ultimate settlement (m)", out.final_m, "greater than 0");
    if (history.surcharge) {
        std::vector<Event> all = permanent;
        all.push_back({history.surcharge->start_s, history.surcharge->end_s, history.surcharge->pressure_kPa});
        out.all = increments(all, ultimate);
        out.removal_s = history.surcharge->removal_s;
    } else {
        out.all = out.permanent;
    }
    return out;
}

SettlementHistory::SettlementHistory(std::function<double(double)> ultimate, const LoadHistory& history,
                                     StepResponse response)
    : response_(std::move(response)) {
    LoadIncrements loads = load_increments(ultimate, history);
    permanent_ = std::move(loads.permanent);
    all_ = std::move(loads.all);
    removal_s_ = loads.removal_s;
    final_m_ = loads.final_m;
}

double SettlementHistory::permanent_m(double time_s) const { return superpose(response_, permanent_, time_s); }
double SettlementHistory::loaded_m(double time_s) const { return superpose(response_, all_, time_s); }

double SettlementHistory::settlement_m(double time_s) const {
    require_non_negative("time (s)", time_s);
    if (!removal_s_ || time_s <= *removal_s_) return loaded_m(time_s);
    return std::max(loaded_m(*removal_s_), permanent_m(time_s));
}

double SettlementHistory::residual_m(double time_s, std::optional<double> period_s) const {
    const double eventual = removal_s_ ? std::max(final_m_, loaded_m(*removal_s_)) : final_m_;
    const double end = period_s ? settlement_m(time_s + *period_s) : eventual;
    return end - settlement_m(time_s);
}

}  // namespace wickgrid
