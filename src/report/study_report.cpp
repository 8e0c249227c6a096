#include "report/study_report.hpp"

#include <sstream>

#include "report/design_report.hpp"
#include "wickgrid/names.hpp"
#include "wickgrid/units.hpp"

namespace wickgrid::report {

namespace {
using nlohmann::json;

json limit_json(const SpacingLimit& l) { return l.feasible ? json(l.spacing_m) : json(nullptr); }
double shown(StudyInput input, double si) { return study_value_from_si(input, si); }

std::string spacing_text(const SpacingLimit& l) {
    if (!l.feasible) return "no feasible spacing";
    return fixed(l.spacing_m, 3) + (l.at_maximum ? "+" : "") + " m";
}

std::string value_text(double v) {
    std::ostringstream out;
    out.precision(4);
    out << v;
    return out.str();
}

// The criterion's measure as the tables show it: "U 91.0 %" or "residual 45 mm".
std::string measure_text(CriterionKind kind, double value) {
    return kind == CriterionKind::degree ? "U " + fixed(100.0 * value, 1) + " %" : "residual " + fixed(1000.0 * value, 0) + " mm";
}
std::string measure_key(CriterionKind kind, const char* end) {
    return kind == CriterionKind::degree ? std::string("degree_") + end : std::string("residual_settlement_") + end + "_mm";
}
double measure_value(CriterionKind kind, double value) { return kind == CriterionKind::degree ? value : 1000.0 * value; }
}  // namespace

nlohmann::json sweep_json(const results::DesignRecord& record) {
    const auto& s = *record.scenario;
    const auto& r = record.studies;
    json doc{{"schema", 1}, {"title", s.title}, {"scenario", s.file}, {"target", target_json(record.site())}};
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
                            {measure_key(t.measure, "low"), measure_value(t.measure, t.measure_low)},
                            {measure_key(t.measure, "high"), measure_value(t.measure, t.measure_high)},
                            {"swing_m", t.swing_m ? json(*t.swing_m) : json(nullptr)}});
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
                            {"feasible_fraction", m.feasible_fraction},
                            {"unevaluated_samples", m.unevaluated},
                            {"histogram", {{"low_m", m.histogram_low_m},
                                           {"bin_m", m.histogram_bin_m},
                                           {"counts", m.histogram_counts},
                                           {"infeasible_samples", m.infeasible_samples}}}});
        const auto& spec = *r.monte_carlo_spec;
        doc["monte_carlo"] = {{"samples", r.monte_carlo->samples}, {"seed", r.monte_carlo->seed},
                              {"reliability", spec.reliability}, {"confidence", spec.confidence},
                              {"rows", rows}};
    }
    json cautions = json::array();
    for (const auto& c : results::cautions()) cautions.push_back(c);
    doc["cautions"] = cautions;
    return doc;
}

std::string tornado_csv(const Site& site, const std::vector<TornadoRow>& rows) {
    const CriterionKind kind = site.criterion.kind();
    std::vector<std::vector<std::string>> out;
    for (const auto& t : rows)
        out.push_back({t.drain, std::string(to_string(t.pattern)), std::string(to_string(t.input)),
                       csv_number(shown(t.input, t.low_si)), csv_number(shown(t.input, t.high_si)),
                       csv_number(t.at_low.feasible ? std::optional<double>(t.at_low.spacing_m) : std::nullopt),
                       csv_number(t.at_high.feasible ? std::optional<double>(t.at_high.spacing_m) : std::nullopt),
                       csv_number(measure_value(kind, t.measure_low)), csv_number(measure_value(kind, t.measure_high)),
                       csv_number(t.swing_m)});
    return csv_document({"drain", "pattern", "input", "low", "high", "spacing_limit_low_m", "spacing_limit_high_m",
                         measure_key(kind, "low"), measure_key(kind, "high"), "swing_m"},
                        out);
}

std::string grid_csv(const std::vector<GridCell>& cells, const GridAxis& x, const GridAxis& y) {
    std::vector<std::vector<std::string>> out;
    for (const auto& c : cells)
        out.push_back({c.drain, std::string(to_string(c.pattern)), csv_number(shown(x.input, c.x_si)),
                       csv_number(shown(y.input, c.y_si)),
                       csv_number(c.limit.feasible ? std::optional<double>(c.limit.spacing_m) : std::nullopt)});
    return csv_document({"drain", "pattern", std::string(to_string(x.input)), std::string(to_string(y.input)), "spacing_limit_m"},
                        out);
}

std::string monte_carlo_csv(const MonteCarloResult& mc) {
    std::vector<std::vector<std::string>> out;
    for (const auto& m : mc.rows)
        out.push_back({m.drain, std::string(to_string(m.pattern)), csv_number(m.spacing_m), csv_number(m.probability),
                       csv_number(m.probability_low), csv_number(m.probability_high), csv_number(m.reliability_spacing_m),
                       csv_number(m.median_spacing_m), csv_number(m.feasible_fraction),
                       std::to_string(m.unevaluated)});
    return csv_document({"drain", "pattern", "spacing_m", "probability", "probability_low", "probability_high",
                         "reliability_spacing_m", "median_spacing_limit_m", "feasible_fraction", "unevaluated_samples"},
                        out);
}

std::string sweep_table(const results::DesignRecord& record) {
    const auto& r = record.studies;
    std::ostringstream out;
    out << record.scenario->title << "\ncriterion: " << results::criterion_text(record.site()) << "\n";
    if (r.tornado) {
        out << "\nOne input at a time (required spacing; the criterion's measure at the design spacing)\n";
        std::string group;
        for (const auto& t : *r.tornado) {
            const std::string key = t.drain + " / " + std::string(to_string(t.pattern));
            if (key != group) {
                out << "\n  " << key << "\n";
                group = key;
            }
            out << "    " << to_string(t.input) << " " << value_text(shown(t.input, t.low_si)) << " → "
                << spacing_text(t.at_low) << " (" << measure_text(t.measure, t.measure_low) << "),  "
                << value_text(shown(t.input, t.high_si)) << " → " << spacing_text(t.at_high) << " ("
                << measure_text(t.measure, t.measure_high) << "),  swing "
                << (t.swing_m ? fixed(*t.swing_m, 3) + " m" : std::string("none: no feasible spacing at one end")) << "\n";
        }
    }
    if (r.grid) {
        const auto xs = r.grid_x.values(), ys = r.grid_y.values();
        out << "\nRequired spacing (m) over " << to_string(r.grid_y.input) << " (rows) × " << to_string(r.grid_x.input)
            << " (columns); '-' no feasible spacing\n";
        for (std::size_t start = 0; start < r.grid->size(); start += xs.size() * ys.size()) {
            const auto& first = (*r.grid)[start];
            out << "\n  " << first.drain << " / " << to_string(first.pattern) << "\n  " << std::string(8, ' ');
            for (const double x : xs) {
                const std::string label = value_text(shown(r.grid_x.input, x));
                out << ' ' << std::string(6 - std::min<std::size_t>(6, label.size()), ' ') << label;
            }
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
        const auto& spec = *r.monte_carlo_spec;
        out << "\nMonte Carlo: " << r.monte_carlo->samples << " samples, seed " << r.monte_carlo->seed << "\n";
        for (const auto& m : r.monte_carlo->rows) {
            out << "  " << m.drain << " / " << to_string(m.pattern) << ": P(" << results::criterion_label(record.site())
                << " at " << fixed(m.spacing_m, 2) << " m, deadline day "
                << fixed(units::seconds_to_days(record.site().criterion.deadline_s), 0) << ") = " << fixed(100.0 * m.probability, 1) << " % ("
                << fixed(100.0 * spec.confidence, 0) << " % interval " << fixed(100.0 * m.probability_low, 1) << "–"
                << fixed(100.0 * m.probability_high, 1) << " %); spacing for " << fixed(100.0 * spec.reliability, 0)
                << " % reliability: "
                << (m.reliability_spacing_m ? fixed(*m.reliability_spacing_m, 3) + " m" + (m.reliability_at_maximum ? "+" : "")
                                            : std::string("none within the spacing range"))
                << (m.unevaluated ? "; " + std::to_string(m.unevaluated) + " sample(s) the model could not evaluate, "
                                        "counted as not meeting the criterion"
                                  : std::string())
                << "\n";
        }
    }
    out << "\n" << results::caution_block();
    return out.str();
}

}  // namespace wickgrid::report
