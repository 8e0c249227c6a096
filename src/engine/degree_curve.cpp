// Degree–time tables of a unit cell.
#include "wickgrid/design.hpp"
#include "wickgrid/errors.hpp"

namespace wickgrid {

std::vector<CurvePoint> degree_curve(const UnitCell& cell, const std::vector<double>& times_s) {
    std::vector<CurvePoint> points;
    points.reserve(times_s.size());
    for (const double t : times_s) points.push_back({t, cell.at(t), std::nullopt});
    return points;
}

std::vector<CurvePoint> degree_curve(const DesignInput& input, const UnitCell& cell, const std::vector<double>& times_s) {
    if (!input.loading) {
        auto points = degree_curve(cell, times_s);
        return points;
    }
    const SettlementHistory history = history_of(input, cell);
    const LoadHistory loads = load_history_of(input);
    const SettlementHistory vertical(input.ultimate_settlement(), loads, [&cell](double t) { return cell.at(t).vertical; });
    const SettlementHistory radial(input.ultimate_settlement(), loads, [&cell](double t) { return cell.at(t).radial; });
    std::vector<CurvePoint> points;
    for (const double t : times_s) {
        require_non_negative("time (s)", t);
        CurvePoint p{t, {vertical.degree(t), radial.degree(t), history.degree(t)}, std::nullopt};
        if (input.has_settlement()) p.settlement_m = history.settlement_m(t);
        points.push_back(p);
    }
    return points;
}

std::vector<double> even_times_s(double span_s, int points) {
    require_positive("curve time span (s)", span_s);
    if (points < 2) throw InputError("number of curve points", points, "at least 2");
    std::vector<double> times;
    for (int i = 0; i < points; ++i) times.push_back(span_s * i / (points - 1));
    return times;
}

}  // namespace wickgrid
