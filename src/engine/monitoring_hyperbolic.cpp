// The hyperbolic method of settlement prediction (Tan, Inoue & Lee 1991), in its plain form.
#include <cmath>

#include "wickgrid/errors.hpp"
#include "wickgrid/monitoring.hpp"

namespace wickgrid::monitoring {

HyperbolicFit hyperbolic(const std::vector<Reading>& readings, double start_s) {
    HyperbolicFit fit;
    // The origin: the first reading at or after the start (the last load change).
    std::size_t origin = 0;
    while (origin < readings.size() && readings[origin].time_s < start_s) ++origin;
    if (origin >= readings.size()) throw EvaluationError("hyperbolic fit", "no reading after the last load change");
    fit.start_s = readings[origin].time_s;
    fit.start_settlement_m = readings[origin].settlement_m;
    std::vector<double> xs, ys;
    for (std::size_t i = origin + 1; i < readings.size(); ++i) {
        const double dt = readings[i].time_s - fit.start_s;
        const double ds = readings[i].settlement_m - fit.start_settlement_m;
        if (dt > 0.0 && ds > 0.0) {
            xs.push_back(dt);
            ys.push_back(dt / ds);
        }
    }
    fit.points = xs.size();
    if (fit.points < 4)
        throw EvaluationError("hyperbolic fit", "only " + std::to_string(fit.points) +
                                                    " settling readings after the last load change; at least 4 are needed");
    double mx = 0.0, my = 0.0;
    for (std::size_t i = 0; i < xs.size(); ++i) {
        mx += xs[i];
        my += ys[i];
    }
    mx /= static_cast<double>(xs.size());
    my /= static_cast<double>(xs.size());
    double sxx = 0.0, sxy = 0.0;
    for (std::size_t i = 0; i < xs.size(); ++i) {
        sxx += (xs[i] - mx) * (xs[i] - mx);
        sxy += (xs[i] - mx) * (ys[i] - my);
    }
    fit.beta_per_m = sxy / sxx;
    fit.alpha_s_per_m = my - fit.beta_per_m * mx;
    if (!(fit.beta_per_m > 0.0))
        throw EvaluationError("hyperbolic fit", "the slope of t/s against t is not positive: the record does not settle "
                                                "towards a limit yet");
    fit.final_settlement_m = fit.start_settlement_m + 1.0 / fit.beta_per_m;
    return fit;
}

}  // namespace wickgrid::monitoring
