// Time-dependent loading by superposition of step responses (linear theory; cf. Olson 1977 for
// the ramp-loaded Terzaghi case in closed form).
#include <algorithm>
#include <boost/math/quadrature/gauss_kronrod.hpp>
#include <cmath>

#include "wickgrid/errors.hpp"
#include "wickgrid/loading.hpp"

namespace wickgrid {

double LoadHistory::permanent_kPa() const {
    double q = 0.0;
    for (const auto& s : stages) q += s.pressure_kPa;
    return q;
}

double LoadHistory::permanent_at_kPa(double time_s) const {
    double q = 0.0;
    for (const auto& s : stages) {
        if (time_s < s.start_s) continue;
        q += s.end_s > s.start_s ? s.pressure_kPa * std::min(1.0, (time_s - s.start_s) / (s.end_s - s.start_s))
                                 : s.pressure_kPa;
    }
    return q;
}

double LoadHistory::applied_at_kPa(double time_s) const {
    double q = permanent_at_kPa(time_s);
    if (surcharge && time_s >= surcharge->start_s && time_s < surcharge->removal_s) {
        const auto& s = *surcharge;
        q += s.end_s > s.start_s ? s.pressure_kPa * std::min(1.0, (time_s - s.start_s) / (s.end_s - s.start_s))
                                 : s.pressure_kPa;
    }
    return q;
}

double LoadHistory::end_of_construction_s() const {
    double end = 0.0;
    for (const auto& s : stages) end = std::max(end, s.end_s);
    return end;
}

void validate_load_history(const LoadHistory& history) {
    if (history.stages.empty() && !history.vacuum)
        throw InputError("number of load stages", 0.0, "at least 1 (or a vacuum)");
    for (const auto& s : history.stages) {
        require_non_negative("stage start (s)", s.start_s);
        require_at_least("stage end (s)", s.end_s, s.start_s, "at least the stage start");
        require_positive("stage pressure (kPa)", s.pressure_kPa);
    }
    if (history.surcharge) {
        const auto& s = *history.surcharge;
        require_non_negative("surcharge start (s)", s.start_s);
        require_at_least("surcharge end (s)", s.end_s, s.start_s, "at least the surcharge start");
        require_greater("surcharge removal (s)", s.removal_s, s.end_s, "after the surcharge is complete");
        require_positive("surcharge pressure (kPa)", s.pressure_kPa);
    }
    if (history.vacuum) {
        const auto& v = *history.vacuum;
        require_non_negative("vacuum start (s)", v.start_s);
        require_greater("vacuum end (s)", v.end_s, v.start_s, "after the vacuum start");
        require_positive("vacuum pressure (kPa)", v.pressure_kPa);
        if (v.pressure_kPa > 100.0)
            throw InputError("vacuum pressure (kPa)", v.pressure_kPa, "at most 100 kPa (one atmosphere)");
        if (!(v.tip_ratio >= 0.0 && v.tip_ratio <= 1.0))
            throw InputError("vacuum tip ratio", v.tip_ratio, "from 0 to 1");
    }
}

double ramp_response(const StepResponse& response, double start_s, double end_s, double time_s) {
    if (time_s <= start_s) return 0.0;
    if (end_s <= start_s) return response(time_s - start_s);
    // (1/(b − a))∫_a^{min(t,b)} U(t − τ)dτ; with x = t − τ = y², dτ = 2y dy the integrand is smooth.
    const double y0 = std::sqrt(std::max(0.0, time_s - end_s));
    const double y1 = std::sqrt(time_s - start_s);
    const double integral = boost::math::quadrature::gauss_kronrod<double, 15>::integrate(
        [&](double y) { return response(y * y) * 2.0 * y; }, y0, y1, 12, 1e-12);
    return integral / (end_s - start_s);
}

double superpose(const StepResponse& response, const std::vector<ResponseIncrement>& increments, double time_s) {
    double total = 0.0;
    for (const auto& inc : increments) total += inc.weight * ramp_response(response, inc.start_s, inc.end_s, time_s);
    return total;
}

}  // namespace wickgrid
