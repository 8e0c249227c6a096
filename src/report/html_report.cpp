#include "html_report.hpp"

#include <algorithm>
#include <cmath>
#include <sstream>

#include "report/design_report.hpp"
#include "report/svg_chart.hpp"
#include "wickgrid/units.hpp"

namespace wickgrid::report {

namespace {
double days(double s) { return units::seconds_to_days(s); }

// The rows the charts follow: the recommended product (or the first) in every pattern.
std::vector<const DesignRow*> chart_rows(const DesignResult& result) {
    const DesignRow* best = best_row(result);
    const std::string& drain = best ? best->drain : result.rows.front().drain;
    std::vector<const DesignRow*> rows;
    for (const auto& r : result.rows)
        if (r.drain == drain) rows.push_back(&r);
    return rows;
}

// A line chart against time with the deadline marked.
LineChart time_chart(const scenario::Scenario& s, std::string title, std::string x_label, std::string y_label) {
    LineChart c;
    c.title = std::move(title);
    c.x_label = std::move(x_label);
    c.y_label = std::move(y_label);
    c.marker_x = s.deadline_days;
    c.marker_label = "deadline";
    return c;
}

std::vector<double> curve_times(double deadline_s, bool log_time) {
    std::vector<double> t;
    if (log_time) {
        const double first = units::seconds_per_day, last = 3.0 * deadline_s;
        for (int i = 0; i <= 120; ++i) t.push_back(first * std::pow(last / first, i / 120.0));
    } else {
        for (int i = 0; i <= 120; ++i) t.push_back(1.5 * deadline_s * i / 120.0);
    }
    return t;
}

Chart degree_chart(const scenario::Scenario& s, const DesignInput& in, const DesignRow& row, bool log_time) {
    const UnitCell cell(product_cell(in, in.product(row.drain), row.pattern, row.spacing_m));
    const auto points = degree_curve(in, cell, curve_times(in.deadline_s, log_time));
    LineChart c = time_chart(s,
                             "Degree of consolidation, " + row.drain + ", " + std::string(to_string(row.pattern)) +
                                 " at " + fixed(row.spacing_m, 2) + " m",
                             log_time ? "time since start of loading (days, logarithmic)" : "time since start of loading (days)",
                             "degree of consolidation (%)");
    c.log_x = log_time;
    c.y_min = 0.0;
    c.y_max = 100.0;
    Series uv{"Uv vertical", {}, {}, 2}, ur{"Ur radial", {}, {}, 1}, u{"U combined", {}, {}, 0};
    for (const auto& p : points) {
        for (Series* ser : {&uv, &ur, &u}) ser->x.push_back(days(p.time_s));
        uv.y.push_back(100.0 * p.degrees.vertical);
        ur.y.push_back(100.0 * p.degrees.radial);
        u.y.push_back(100.0 * p.degrees.combined);
    }
    c.series = {u, ur, uv};
    if (!s.residual_limit_m) {
        Series target{"target " + fixed(100.0 * s.target_degree, 0) + " %", {c.series[0].x.front(), c.series[0].x.back()},
                      {100.0 * s.target_degree, 100.0 * s.target_degree}, 4};
        c.series.push_back(target);
    }
    return {"degree-time-" + std::string(to_string(row.pattern)) + ".svg",
            "Degree of consolidation against time at the chosen spacing (" + std::string(to_string(row.pattern)) +
                " pattern): vertical, radial and combined" + (s.loading ? ", under the load history." : "."),
            render(c)};
}

Chart settlement_chart(const scenario::Scenario& s, const DesignInput& in, const std::vector<const DesignRow*>& rows) {
    LineChart c = time_chart(s, "Settlement, " + rows.front()->drain, "time since start of loading (days)", "settlement (mm)");
    const auto times = curve_times(in.deadline_s, false);
    int style = 0;
    for (const DesignRow* row : rows) {
        const UnitCell cell(product_cell(in, in.product(row->drain), row->pattern, row->spacing_m));
        const SettlementHistory history = history_of(in, cell);
        Series ser{std::string(to_string(row->pattern)) + " " + fixed(row->spacing_m, 2) + " m", {}, {}, style++};
        for (const double t : times) {
            ser.x.push_back(days(t));
            ser.y.push_back(1000.0 * history.settlement_m(t));
        }
        c.series.push_back(ser);
        if (style == 1)
            c.series.push_back({"final (permanent load)", {days(times.front()), days(times.back())},
                                {1000.0 * history.final_m(), 1000.0 * history.final_m()}, 4});
    }
    return {"settlement-time.svg", "Settlement against time at the chosen spacings, with the final primary settlement.",
            render(c)};
}

Chart design_chart(const scenario::Scenario& s, const DesignInput& in, const std::vector<const DesignRow*>& rows) {
    LineChart c = time_chart(s, "Required spacing against available time, " + rows.front()->drain,
                             "time available from the start of loading (days)", "largest spacing meeting the criterion (m)");
    int style = 0;
    for (const DesignRow* row : rows) {
        Series ser{std::string(to_string(row->pattern)), {}, {}, style++};
        for (int i = 0; i <= 24; ++i) {
            DesignInput varied = in;
            varied.deadline_s = in.deadline_s * (0.3 + 1.7 * i / 24.0);
            varied.products = {in.product(row->drain)};
            varied.patterns = {row->pattern};
            const DesignResult r = run_design(varied);
            if (!r.rows.front().feasible) continue;
            ser.x.push_back(days(varied.deadline_s));
            ser.y.push_back(r.rows.front().spacing_limit_m);
        }
        c.series.push_back(ser);
    }
    return {"design-chart.svg",
            "Largest spacing that meets the criterion for each available time (capped at the largest spacing considered).",
            render(c)};
}

std::vector<Chart> study_charts(const SweepResults& studies, const std::vector<const DesignRow*>& rows) {
    std::vector<Chart> charts;
    if (studies.tornado)
        for (const DesignRow* row : rows) {
            RangeChart c;
            c.title = "One input at a time: " + row->drain + ", " + std::string(to_string(row->pattern));
            c.x_label = "required spacing (m)";
            c.base = row->spacing_limit_m;
            for (const auto& t : *studies.tornado) {
                if (t.drain != row->drain || t.pattern != row->pattern) continue;
                const double lo = t.at_low.feasible ? t.at_low.spacing_m : 0.0, hi = t.at_high.feasible ? t.at_high.spacing_m : 0.0;
                c.bars.push_back({std::string(to_string(t.input)), lo, hi, tick_text(study_value_from_si(t.input, t.low_si)),
                                  tick_text(study_value_from_si(t.input, t.high_si))});
            }
            charts.push_back({"tornado-" + std::string(to_string(row->pattern)) + ".svg",
                              "Required spacing with each input at its low and high value, the others at base; "
                              "bar ends are labelled with the input value.",
                              render(c)});
        }
    if (studies.grid)
        for (const DesignRow* row : rows) {
            ShadedGrid g;
            g.title = "Required spacing (m): " + row->drain + ", " + std::string(to_string(row->pattern));
            g.x_label = std::string(to_string(studies.grid_x.input));
            g.y_label = std::string(to_string(studies.grid_y.input));
            g.value_label = "required spacing (m)";
            for (const double x : studies.grid_x.values()) g.xs.push_back(study_value_from_si(studies.grid_x.input, x));
            for (const double y : studies.grid_y.values()) g.ys.push_back(study_value_from_si(studies.grid_y.input, y));
            for (const auto& cell : *studies.grid)
                if (cell.drain == row->drain && cell.pattern == row->pattern)
                    g.values.push_back(cell.limit.feasible ? std::optional<double>(cell.limit.spacing_m) : std::nullopt);
            charts.push_back({"grid-" + std::string(to_string(row->pattern)) + ".svg",
                              "Required spacing over two inputs at once.", render(g)});
        }
    return charts;
}

const char* const style_sheet = R"(
body { font-family: "DejaVu Sans", "Liberation Sans", sans-serif; color: #1d2a33; margin: 0 auto; max-width: 60rem; padding: 1.5rem; line-height: 1.45; }
h1 { font-size: 1.6rem; border-bottom: 3px solid #0f6b6b; padding-bottom: .3rem; }
h2 { font-size: 1.2rem; color: #0f6b6b; margin-top: 2rem; }
table { border-collapse: collapse; margin: .6rem 0; font-size: .85rem; }
table.results { font-size: .72rem; }
.wide { overflow-x: auto; }
th, td { border: 1px solid #c9d2d8; padding: .25rem .45rem; text-align: right; }
th { background: #e8f1f0; }
td.text, th.text { text-align: left; }
tr.recommended td { background: #fbefe4; font-weight: bold; }
.verdict { border-left: 5px solid #c4621d; background: #fdf7f1; padding: .6rem 1rem; }
.cautions { border: 2px solid #c4621d; padding: .4rem 1rem; }
figure { margin: 1rem 0; page-break-inside: avoid; }
figure svg { max-width: 100%; height: auto; }
figcaption { font-size: .85rem; color: #4a5868; }
footer { margin-top: 2rem; font-size: .8rem; color: #4a5868; }
@page { size: A4; margin: 15mm; }
@media print { body { max-width: none; padding: 0; font-size: 10pt; } h2 { page-break-after: avoid; } table { page-break-inside: avoid; } }
)";

std::string cell(const std::string& key, double value, const std::string& shown) {
    std::ostringstream o;
    o.precision(17);
    o << "<td data-key=\"" << key << "\" data-value=\"" << value << "\">" << escape_xml(shown) << "</td>";
    return o.str();
}

std::string results_table(const scenario::Scenario& s, const DesignResult& result) {
    std::ostringstream o;
    const bool settle = std::any_of(result.rows.begin(), result.rows.end(), [](const DesignRow& r) { return r.ultimate_settlement_m.has_value(); });
    o << "<div class=\"wide\"><table class=\"results\">\n<tr><th class=\"text\">drain</th><th class=\"text\">pattern</th><th class=\"text\">status</th>"
         "<th>limit (m)</th><th>spacing (m)</th><th>De (m)</th><th>n</th><th>s</th><th>μ</th><th>Uv (%)</th><th>Ur (%)</th>"
         "<th>U (%)</th><th>time to target (days)</th><th>drains/ha</th><th>drain m/ha</th><th>cost/ha</th>"
      << (settle ? "<th>final (mm)</th><th>at deadline (mm)</th><th>residual (mm)</th>" : "") << "</tr>\n";
    for (const auto& r : result.rows) {
        const bool best = r.rank && *r.rank == 1;
        const std::string status = !r.feasible ? "does not meet the criterion" : best ? "RECOMMENDED (rank 1)" : "rank " + std::to_string(*r.rank);
        o << "<tr" << (best ? " class=\"recommended\"" : "") << " data-drain=\"" << escape_xml(r.drain) << "\" data-pattern=\""
          << to_string(r.pattern) << "\"><td class=\"text\">" << escape_xml(r.drain) << "</td><td class=\"text\">"
          << to_string(r.pattern) << "</td><td class=\"text\">" << status << "</td>";
        o << (r.feasible ? cell("spacing_limit_m", r.spacing_limit_m, fixed(r.spacing_limit_m, 3)) : "<td>—</td>")
          << cell(r.feasible ? "spacing_m" : "evaluated_spacing_m", r.spacing_m, fixed(r.spacing_m, 2))
          << cell("influence_diameter_m", r.influence_diameter_m, fixed(r.influence_diameter_m, 3)) << cell("n", r.n, fixed(r.n, 1))
          << cell("s", r.s, fixed(r.s, 2)) << cell("mu", r.mu, fixed(r.mu, 2))
          << cell("degree_vertical", r.at_deadline.vertical, fixed(100 * r.at_deadline.vertical, 1))
          << cell("degree_radial", r.at_deadline.radial, fixed(100 * r.at_deadline.radial, 1))
          << cell("degree", r.at_deadline.combined, fixed(100 * r.at_deadline.combined, 1))
          << cell("time_to_target_days", days(r.time_to_target_s), fixed(days(r.time_to_target_s), 1))
          << cell("drains_per_hectare", r.drains_per_hectare, fixed(r.drains_per_hectare, 0))
          << cell("drain_length_per_hectare_m", r.drain_length_per_hectare_m, fixed(r.drain_length_per_hectare_m, 0))
          << (r.cost_per_hectare ? cell("cost_per_hectare", *r.cost_per_hectare, fixed(*r.cost_per_hectare, 0)) : "<td>—</td>");
        if (settle)
            o << cell("ultimate_settlement_mm", 1000 * *r.ultimate_settlement_m, fixed(1000 * *r.ultimate_settlement_m, 0))
              << cell("settlement_at_deadline_mm", 1000 * *r.settlement_at_deadline_m, fixed(1000 * *r.settlement_at_deadline_m, 0))
              << cell("residual_settlement_mm", 1000 * *r.residual_settlement_m, fixed(1000 * *r.residual_settlement_m, 0));
        o << "</tr>\n";
    }
    o << "</table></div>\n<p>Degrees are at the deadline at the chosen spacing"
      << (s.loading ? ", relative to the final permanent load under the load history" : "") << ". Criterion: "
      << escape_xml(criterion_text(s)) << ".</p>\n";
    return o.str();
}

std::string inputs_table(const scenario::Scenario& s) {
    std::ostringstream o;
    auto row = [&](const std::string& k, const std::string& v) {
        o << "<tr><td class=\"text\">" << escape_xml(k) << "</td><td class=\"text\">" << escape_xml(v) << "</td></tr>\n";
    };
    o << "<table class=\"inputs\">\n";
    row("scenario file", s.file);
    row("design criterion", criterion_text(s));
    row("clay thickness", fixed(s.clay.thickness_m, 2) + " m, drainage " + std::string(scenario::to_string(s.clay.drainage)));
    row("cv / ch", fixed(units::per_second_to_per_year(s.clay.cv_m2_per_s), 3) + " / " +
                       fixed(units::per_second_to_per_year(s.clay.ch_m2_per_s), 3) + " m²/year");
    char kh[32];
    std::snprintf(kh, sizeof kh, "%.3e m/s", s.clay.kh_m_per_s);
    row("kh", std::string(kh) + (s.kh_given ? "" : " (from ch·mv·γw)"));
    row("drain length and outlets", fixed(s.drain_length_m, 2) + " m, " + std::string(scenario::to_string(s.outlets)));
    row("mandrel equivalent diameter", fixed(s.mandrel_diameter_m * 1000, 1) + " mm");
    row("smear zone", "ds = " + fixed(s.smear_diameter_ratio, 2) + " × dm, kh/ks = " + fixed(s.smear_permeability_ratio, 2) +
                          ", profile " + std::string(scenario::to_string(s.smear_shape)));
    row("spacings considered", fixed(s.spacing.min_m, 2) + "–" + fixed(s.spacing.max_m, 2) + " m in steps of " + fixed(s.increment_m, 2) + " m");
    for (const auto& d : s.drains)
        row("drain " + d.name, "dw = " + fixed(d.equivalent_diameter_m * 1000, 1) + " mm (" +
                                   (d.method ? std::string(to_string(*d.method)) : std::string("given")) + "), qw = " +
                                   fixed(units::per_second_to_per_year(d.discharge_capacity_m3_per_s), 1) + " m³/year" +
                                   (d.cost_per_m ? ", cost " + fixed(*d.cost_per_m, 2) + " per m" : std::string()));
    if (s.loading)
        for (std::size_t i = 0; i < s.loading->stages.size(); ++i) {
            const auto& st = s.loading->stages[i];
            row("load stage " + std::to_string(i + 1), fixed(st.pressure_kPa, 1) + " kPa, day " + fixed(days(st.start_s), 0) +
                                                           " to " + fixed(days(st.end_s), 0));
        }
    if (s.loading && s.loading->surcharge) {
        const auto& su = *s.loading->surcharge;
        row("surcharge", fixed(su.pressure_kPa, 1) + " kPa, day " + fixed(days(su.start_s), 0) + " to " + fixed(days(su.end_s), 0) +
                             ", removed day " + fixed(days(su.removal_s), 0));
    }
    if (s.profile)
        row("settlement model", std::to_string(s.profile->layers.size()) + " clay layers (e–log σ'), groundwater " +
                                    fixed(s.profile->groundwater_depth_m, 2) + " m");
    o << "</table>\n";
    return o.str();
}
}  // namespace

ReportBundle build_report(const scenario::Scenario& s, const DesignResult& result, const SweepResults& studies,
                          const ReportOptions& options) {
    const DesignInput in = s.design_input();
    ReportBundle bundle;
    const auto rows = chart_rows(result);
    for (const DesignRow* row : rows) bundle.charts.push_back(degree_chart(s, in, *row, options.log_time));
    bundle.charts.push_back(design_chart(s, in, rows));
    if (in.has_settlement()) bundle.charts.push_back(settlement_chart(s, in, rows));
    for (auto& c : study_charts(studies, rows)) bundle.charts.push_back(std::move(c));

    std::ostringstream o;
    o << "<!DOCTYPE html>\n<html lang=\"en\">\n<head>\n<meta charset=\"utf-8\"/>\n<title>" << escape_xml(s.title)
      << "</title>\n<style>" << style_sheet << "</style>\n</head>\n<body>\n";
    o << "<h1>Vertical drain design: " << escape_xml(s.title) << "</h1>\n";
    o << "<section class=\"verdict\"><h2>Result</h2><p id=\"recommendation\">" << escape_xml(recommendation(s, result))
      << "</p></section>\n";
    o << "<section><h2>Inputs</h2>\n" << inputs_table(s) << "</section>\n";
    o << "<section><h2>Results for every drain and pattern</h2>\n" << results_table(s, result) << "</section>\n";
    o << "<section><h2>Charts</h2>\n";
    for (std::size_t i = 0; i < bundle.charts.size(); ++i)
        o << "<figure id=\"chart-" << i + 1 << "\">\n" << bundle.charts[i].svg << "<figcaption>Figure " << i + 1 << ". "
          << escape_xml(bundle.charts[i].caption) << "</figcaption>\n</figure>\n";
    o << "</section>\n<section><h2>Method and sources</h2>\n<ul>\n";
    for (const auto& line : method_notes(s)) o << "<li>" << escape_xml(line) << "</li>\n";
    o << "</ul>\n</section>\n<section><h2>Assumptions</h2>\n<p>" << escape_xml(assumptions(s)) << "</p>\n</section>\n";
    o << "<section class=\"cautions\"><h2>Cautions</h2>\n<ul>\n";
    for (const char* c : cautions) o << "<li>" << escape_xml(c) << "</li>\n";
    o << "</ul>\n</section>\n<footer>Produced by wickgrid 0.1.0 from " << escape_xml(s.file) << ".</footer>\n</body>\n</html>\n";
    bundle.html = o.str();
    return bundle;
}

}  // namespace wickgrid::report
