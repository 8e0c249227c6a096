#include "study_report.hpp"

#include <sstream>

#include "design_report.hpp"

namespace wickgrid::report {

namespace {
using nlohmann::json;

json limit_json(const SpacingLimit& l) {
    return l.feasible ? json(l.spacing_m) : json(nullptr);
}

double shown(StudyInput input, double si) { return study_value_from_si(input, si); }

std::string spacing_text(const SpacingLimit& l) {
    if (!l.feasible) return "none";
    return fixed(l.spacing_m, 3) + (l.at_maximum ? "+" : "");
}

std::string value_text(double v) {
    std::ostringstream out;
    out.precision(4);
    out << v;
    return out.str();
}
}  // namespace

nlohmann::json sweep_json(const scenario::Scenario& s, const SweepResults& r) {
    json doc{{"schema", 1}, {"title", s.title}, {"scenario", s.file},
             {"target", {{"degree", s.target_degree}, {"deadline_days", s.deadline_days}}}};
    if (r.tornado) {
        json rows = json::array();
        for (const auto& t : *r.tornado)
            rows.push_back({{"drain", t.drain},
                            {"pattern", std::string(to_string(t.pattern))},
                            {"input", std::string(to_string(t.input))},
                            {"low", shown(t.input, t.low_si)},
                            {"high", shown(t.input, t.high_si)},
                            {"spacing_limit_low_m", limit_json(t.at_low)},
                            {"spacing_limit_high_m", limit_json(t.at_high)},
                            {"degree_low", t.degree_low},
                            {"degree_high", t.degree_high},
                            {"swing_m", t.swing_m}});
        doc["tornado"] = rows;
    }
    if (r.grid) {
        json cells = json::array();
        for (const auto& c : *r.grid)
            cells.push_back({{"drain", c.drain},
                             {"pattern", std::string(to_string(c.pattern))},
                             {"x", shown(r.grid_x.input, c.x_si)},
                             {"y", shown(r.grid_y.input, c.y_si)},
                             {"spacing_limit_m", limit_json(c.limit)},
                             {"limited_by_max_spacing", c.limit.at_maximum}});
        doc["grid"] = {{"x", std::string(to_string(r.grid_x.input))},
                       {"y", std::string(to_string(r.grid_y.input))},
                       {"cells", cells}};
    }
    if (r.monte_carlo) {
        json rows = json::array();
        for (const auto& m : r.monte_carlo->rows)
            rows.push_back({{"drain", m.drain},
                            {"pattern", std::string(to_string(m.pattern))},
                            {"spacing_m", m.spacing_m},
                            {"probability", m.probability},
                            {"probability_low", m.probability_low},
                            {"probability_high", m.probability_high},
                            {"reliability_spacing_m",
                             m.reliability_spacing_m ? json(*m.reliability_spacing_m) : json(nullptr)},
                            {"reliability_at_max_spacing", m.reliability_at_maximum},
                            {"median_spacing_limit_m", m.median_spacing_m},
                            {"feasible_fraction", m.feasible_fraction}});
        const auto& spec = *s.studies.monte_carlo;
        doc["monte_carlo"] = {{"samples", r.monte_carlo->samples}, {"seed", r.monte_carlo->seed},
                              {"reliability", spec.reliability}, {"confidence", spec.confidence},
                              {"rows", rows}};
    }
    return doc;
}

std::string tornado_csv(const std::vector<TornadoRow>& rows) {
    std::ostringstream out;
    out.precision(10);
    out << "drain,pattern,input,low,high,spacing_limit_low_m,spacing_limit_high_m,degree_low,degree_high,swing_m\n";
    for (const auto& t : rows) {
        out << t.drain << ',' << to_string(t.pattern) << ',' << to_string(t.input) << ',' << shown(t.input, t.low_si)
            << ',' << shown(t.input, t.high_si) << ',';
        if (t.at_low.feasible) out << t.at_low.spacing_m;
        out << ',';
        if (t.at_high.feasible) out << t.at_high.spacing_m;
        out << ',' << t.degree_low << ',' << t.degree_high << ',' << t.swing_m << '\n';
    }
    return out.str();
}

std::string grid_csv(const std::vector<GridCell>& cells, const GridAxis& x, const GridAxis& y) {
    std::ostringstream out;
    out.precision(10);
    out << "drain,pattern," << to_string(x.input) << ',' << to_string(y.input) << ",spacing_limit_m\n";
    for (const auto& c : cells) {
        out << c.drain << ',' << to_string(c.pattern) << ',' << shown(x.input, c.x_si) << ',' << shown(y.input, c.y_si)
            << ',';
        if (c.limit.feasible) out << c.limit.spacing_m;
        out << '\n';
    }
    return out.str();
}

std::string monte_carlo_csv(const MonteCarloResult& mc) {
    std::ostringstream out;
    out.precision(10);
    out << "drain,pattern,spacing_m,probability,probability_low,probability_high,reliability_spacing_m,"
           "median_spacing_limit_m,feasible_fraction\n";
    for (const auto& m : mc.rows) {
        out << m.drain << ',' << to_string(m.pattern) << ',' << m.spacing_m << ',' << m.probability << ','
            << m.probability_low << ',' << m.probability_high << ',';
        if (m.reliability_spacing_m) out << *m.reliability_spacing_m;
        out << ',' << m.median_spacing_m << ',' << m.feasible_fraction << '\n';
    }
    return out.str();
}

std::string sweep_table(const scenario::Scenario& s, const SweepResults& r) {
    std::ostringstream out;
    out << s.title << "\ntarget U = " << fixed(100.0 * s.target_degree, 1) << " % by day " << fixed(s.deadline_days, 0)
        << "\n";
    if (r.tornado) {
        out << "\nOne input at a time (required spacing, m; degree at the design spacing, %)\n";
        std::string group;
        for (const auto& t : *r.tornado) {
            const std::string key = t.drain + " / " + std::string(to_string(t.pattern));
            if (key != group) {
                out << "\n  " << key << "\n";
                group = key;
            }
            out << "    " << to_string(t.input) << " " << value_text(shown(t.input, t.low_si)) << " → "
                << spacing_text(t.at_low) << " m (U " << fixed(100.0 * t.degree_low, 1) << " %),  "
                << value_text(shown(t.input, t.high_si)) << " → " << spacing_text(t.at_high) << " m (U "
                << fixed(100.0 * t.degree_high, 1) << " %),  swing " << fixed(t.swing_m, 3) << " m\n";
        }
    }
    if (r.grid) {
        const auto xs = r.grid_x.values(), ys = r.grid_y.values();
        out << "\nRequired spacing (m) over " << to_string(r.grid_y.input) << " (rows) × " << to_string(r.grid_x.input)
            << " (columns)\n";
        for (std::size_t start = 0; start < r.grid->size(); start += xs.size() * ys.size()) {
            const auto& first = (*r.grid)[start];
            out << "\n  " << first.drain << " / " << to_string(first.pattern) << "\n  " << std::string(8, ' ');
            for (const double x : xs) out << ' ' << std::string(6 - std::min<std::size_t>(6, value_text(shown(r.grid_x.input, x)).size()), ' ') << value_text(shown(r.grid_x.input, x));
            out << "\n";
            for (std::size_t j = 0; j < ys.size(); ++j) {
                const std::string label = value_text(shown(r.grid_y.input, ys[j]));
                out << "  " << std::string(8 - std::min<std::size_t>(8, label.size()), ' ') << label;
                for (std::size_t i = 0; i < xs.size(); ++i) {
                    const auto& cell = (*r.grid)[start + j * xs.size() + i];
                    const std::string v = cell.limit.feasible ? fixed(cell.limit.spacing_m, 2) : "-";
                    out << ' ' << std::string(6 - std::min<std::size_t>(6, v.size()), ' ') << v;
                }
                out << "\n";
            }
        }
    }
    if (r.monte_carlo) {
        const auto& spec = *s.studies.monte_carlo;
        out << "\nMonte Carlo: " << r.monte_carlo->samples << " samples, seed " << r.monte_carlo->seed << "\n";
        for (const auto& m : r.monte_carlo->rows) {
            out << "  " << m.drain << " / " << to_string(m.pattern) << ": P(target by deadline at "
                << fixed(m.spacing_m, 2) << " m) = " << fixed(100.0 * m.probability, 1) << " % ("
                << fixed(100.0 * spec.confidence, 0) << " % interval " << fixed(100.0 * m.probability_low, 1) << "–"
                << fixed(100.0 * m.probability_high, 1) << " %); spacing for " << fixed(100.0 * spec.reliability, 0)
                << " % reliability: "
                << (m.reliability_spacing_m ? fixed(*m.reliability_spacing_m, 3) + " m" + (m.reliability_at_maximum ? "+" : "")
                                            : std::string("none within the spacing range"))
                << "\n";
        }
    }
    out << "\nEstimates from idealised theory: confirm parameters by site investigation and by monitoring.\n";
    return out.str();
}

}  // namespace wickgrid::report
