// Degree–time tables of a unit cell.
#include "wickgrid/design.hpp"
#include "wickgrid/errors.hpp"

namespace wickgrid {

std::vector<CurvePoint> degree_curve(const UnitCell& cell, const std::vector<double>& times_s) {
    std::vector<CurvePoint> points;
    points.reserve(times_s.size());
    for (const double t : times_s) points.push_back({t, cell.at(t)});
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
