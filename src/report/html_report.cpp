#include "html_report.hpp"
#include "unit_cell_sketch.hpp"

#include "results/bibliography.hpp"

#include <algorithm>
#include <cmath>
#include <sstream>

#include "report/columns.hpp"
#include "report/design_report.hpp"
#include "report/schedule_report.hpp"
#include "report/stage_report.hpp"
#include "wickgrid/names.hpp"
#include "wickgrid/version.hpp"
#include "report/svg_chart.hpp"
#include "wickgrid/units.hpp"

namespace wickgrid::report {

namespace {
double days(double s) { return units::seconds_to_days(s); }

// A line chart against time with the deadline marked.
// A drain name as part of a file name: letters, digits, '-' and '_' kept, anything else '_'.
std::string safe_file_part(const std::string& name) {
    std::string out;
    for (const char c : name) out += std::isalnum(static_cast<unsigned char>(c)) || c == '-' || c == '_' ? c : '_';
    return out;
}

LineChart time_chart(const Site& site, std::string title, std::string x_label, std::string y_label) {
    LineChart c;
    c.title = std::move(title);
    c.x_label = std::move(x_label);
    c.y_label = std::move(y_label);
    c.marker_x = days(site.criterion.deadline_s);
    c.marker_label = "deadline";
    return c;
}

Chart degree_chart(const Site& site, const results::Curve& curve, bool log_time) {
    LineChart c = time_chart(site,
                             "Degree of consolidation, " + curve.drain + ", " + std::string(to_string(curve.pattern)) +
                                 " at " + fixed(curve.spacing_m, 2) + " m",
                             log_time ? "time since start of loading (days, logarithmic)" : "time since start of loading (days)",
                             "degree of consolidation (%)");
    c.log_x = log_time;
    Series uv{"Uv vertical", {}, {}, 2}, ur{"Ur radial", {}, {}, 1}, u{"U combined", {}, {}, 0};
    for (const auto& p : curve.points) {
        for (Series* ser : {&uv, &ur, &u}) ser->x.push_back(days(p.time_s));
        uv.y.push_back(100.0 * p.degrees.vertical);
        ur.y.push_back(100.0 * p.degrees.radial);
        u.y.push_back(100.0 * p.degrees.combined);
    }
    // 0–100 %, widened to whole tens where the table's values go beyond (U above 100 % under a
    // surcharge): a chart never clips a value the table prints.
    double lo = 0.0, hi = 100.0;
    for (const Series* ser : {&uv, &ur, &u})
        for (const double y : ser->y) {
            lo = std::min(lo, 10.0 * std::floor(y / 10.0));
            hi = std::max(hi, 10.0 * std::ceil(y / 10.0));
        }
    c.y_min = lo;
    c.y_max = hi;
    c.series = {u, ur, uv};
    if (const auto* d = site.criterion.degree()) {
        Series target{"target " + fixed(100.0 * d->degree, 0) + " %", {c.series[0].x.front(), c.series[0].x.back()},
                      {100.0 * d->degree, 100.0 * d->degree}, 4};
        c.series.push_back(target);
    }
    return {"degree-time-" + std::string(to_string(curve.pattern)) + ".svg",
            "Degree of consolidation against time at the chosen spacing (" + std::string(to_string(curve.pattern)) +
                " pattern, " + std::string(to_string(curve.method)) + " method): vertical, radial and combined" +
                (site.loading ? ", under the load history." : "."),
            render(c)};
}

// The load history on the same time axis as the degree and settlement charts below it.
Chart load_chart(const Site& site, const results::Curve& curve, const std::vector<double>& load_kPa,
                 const std::vector<double>& vacuum_kPa, bool log_time) {
    LineChart c = time_chart(site, "Applied load", log_time ? "time since start of loading (days, logarithmic)"
                                                            : "time since start of loading (days)",
                             "applied load (kPa)");
    c.log_x = log_time;
    c.y_min = 0.0;
    Series load{"fill and surcharge", {}, {}, 3};
    for (std::size_t i = 0; i < load_kPa.size(); ++i) {
        load.x.push_back(days(curve.points[i].time_s));
        load.y.push_back(load_kPa[i]);
    }
    c.series = {load};
    if (!vacuum_kPa.empty()) {
        Series vacuum{"vacuum at the drain head (suction, kPa)", load.x, vacuum_kPa, 1};
        c.series.push_back(vacuum);
    }
    return {"load-time.svg", std::string("Applied load against time (the lifts and the surcharge of the scenario") +
                                 (vacuum_kPa.empty() ? "" : ", and the vacuum held through the drains") +
                                 "), on the time axis of the charts below.",
            render(c)};
}

// For a residual criterion: what would be left to settle if the deadline fell at each time, primary
// and secondary, against the limit, at the recommended design.
Chart residual_chart(const Site& site, const results::Curve& curve,
                     const std::vector<results::DesignRecord::ResidualPoint>& points) {
    const auto* r = site.criterion.residual();
    LineChart c = time_chart(site, "Residual settlement, " + curve.drain + ", " + std::string(to_string(curve.pattern)) +
                                       " at " + fixed(curve.spacing_m, 2) + " m",
                             "deadline: time since start of loading (days)", "settlement still to come (mm)");
    c.y_min = 0.0;
    Series total{"residual (primary + secondary)", {}, {}, 0}, primary{"primary", {}, {}, 2}, secondary{"secondary", {}, {}, 1};
    for (const auto& p : points) {
        for (Series* ser : {&total, &primary, &secondary}) ser->x.push_back(days(p.time_s));
        total.y.push_back(1000.0 * (p.primary_m + p.secondary_m));
        primary.y.push_back(1000.0 * p.primary_m);
        secondary.y.push_back(1000.0 * p.secondary_m);
    }
    c.series = {total, primary};
    if (std::any_of(secondary.y.begin(), secondary.y.end(), [](double y) { return y > 0.0; })) c.series.push_back(secondary);
    c.series.push_back({"limit " + fixed(r->limit_m * 1000.0, 0) + " mm", {total.x.front(), total.x.back()},
                        {r->limit_m * 1000.0, r->limit_m * 1000.0}, 4});
    return {"residual-time.svg",
            "Settlement still to come " +
                (r->service_s ? "over the " + fixed(days(*r->service_s), 0) + "-day service period"
                              : std::string("to the end of primary consolidation")) +
                " if the deadline fell at each time, split into primary and secondary, at the recommended design.",
            render(c)};
}

Chart settlement_chart(const Site& site, const std::vector<results::Curve>& curves, bool log_time) {
    LineChart c = time_chart(site, "Settlement, " + curves.front().drain, "time since start of loading (days)",
                             "settlement (mm)");
    c.log_x = log_time;
    int style = 0;
    for (const auto& curve : curves) {
        Series ser{std::string(to_string(curve.pattern)) + " " + fixed(curve.spacing_m, 2) + " m", {}, {}, style++};
        for (const auto& p : curve.points) {
            ser.x.push_back(days(p.time_s));
            ser.y.push_back(1000.0 * *p.settlement_m);
        }
        c.series.push_back(ser);
    }
    return {"settlement-time.svg", "Settlement against time at the chosen spacings.", render(c)};
}

Chart design_chart(const Site& site, const std::vector<results::SpacingSeries>& series, const std::string& drain) {
    LineChart c = time_chart(site, "Required spacing against available time, " + drain,
                             "time available from the start of loading (days)", "largest spacing meeting the criterion (m)");
    int style = 0;
    for (const auto& s : series) {
        Series ser{std::string(to_string(s.pattern)), {}, s.spacing_limit_m, style++};
        for (const double t : s.deadline_s) ser.x.push_back(days(t));
        c.series.push_back(ser);
    }
    return {"design-chart.svg",
            "Largest spacing that meets the criterion for each available time (capped at the largest spacing considered).",
            render(c)};
}

std::vector<Chart> study_charts(const results::Studies& studies, const std::vector<results::Curve>& rows,
                                const DesignResult& result) {
    std::vector<Chart> charts;
    auto base_limit = [&](const results::Curve& c) {
        for (const auto& r : result.rows)
            if (r.drain == c.drain && r.pattern == c.pattern) return r.spacing_limit_m;
        return 0.0;
    };
    if (studies.tornado)
        for (const auto& row : rows) {
            RangeChart c;
            c.title = "One input at a time: " + row.drain + ", " + std::string(to_string(row.pattern));
            c.x_label = "required spacing (m)";
            c.base = base_limit(row);
            for (const auto& t : *studies.tornado) {
                if (t.drain != row.drain || t.pattern != row.pattern) continue;
                const auto end = [](const SpacingLimit& l) { return l.feasible ? std::optional<double>(l.spacing_m) : std::nullopt; };
                c.bars.push_back({std::string(study_input_label(t.input)), end(t.at_low), end(t.at_high),
                                  tick_text(study_value_from_si(t.input, t.low_si)),
                                  tick_text(study_value_from_si(t.input, t.high_si))});
            }
            charts.push_back({"tornado-" + std::string(to_string(row.pattern)) + ".svg",
                              "Required spacing with each input at its low and high value, the others at base; "
                              "bar ends are labelled with the input value.",
                              render(c)});
        }
    if (studies.grid)
        for (const auto& row : rows) {
            ShadedGrid g;
            g.title = "Required spacing (m): " + row.drain + ", " + std::string(to_string(row.pattern));
            g.x_label = std::string(study_input_label(studies.grid_x.input));
            g.y_label = std::string(study_input_label(studies.grid_y.input));
            g.value_label = "required spacing (m)";
            for (const double x : studies.grid_x.values()) g.xs.push_back(study_value_from_si(studies.grid_x.input, x));
            for (const double y : studies.grid_y.values()) g.ys.push_back(study_value_from_si(studies.grid_y.input, y));
            for (const auto& cell : *studies.grid)
                if (cell.drain == row.drain && cell.pattern == row.pattern)
                    g.values.push_back(cell.limit.feasible ? std::optional<double>(cell.limit.spacing_m) : std::nullopt);
            charts.push_back({"grid-" + std::string(to_string(row.pattern)) + ".svg",
                              "Required spacing over two inputs at once.", render(g)});
        }
    if (studies.monte_carlo)
        for (const auto& m : studies.monte_carlo->rows) {
            if (m.histogram_counts.empty()) continue;
            LineChart c;
            c.title = "Monte Carlo: limiting spacing, " + m.drain + ", " + std::string(to_string(m.pattern));
            c.x_label = "limiting spacing of a sample (m)";
            c.y_label = "samples";
            c.y_min = 0.0;
            Series bars{"samples per bin", {}, {}, 0};
            double x = m.histogram_low_m;
            bars.x.push_back(x);
            bars.y.push_back(0.0);
            for (const std::size_t count : m.histogram_counts) {  // drawn as steps: the outline of the bars
                bars.x.insert(bars.x.end(), {x, x + m.histogram_bin_m});
                bars.y.insert(bars.y.end(), 2, static_cast<double>(count));
                x += m.histogram_bin_m;
            }
            bars.x.push_back(x);
            bars.y.push_back(0.0);
            c.series.push_back(bars);
            if (m.reliability_spacing_m) {
                c.marker_x = *m.reliability_spacing_m;
                c.marker_label = "reliability spacing " + fixed(*m.reliability_spacing_m, 2) + " m";
            }
            charts.push_back({"monte-carlo-" + std::string(to_string(m.pattern)) + "-" + safe_file_part(m.drain) + ".svg",
                              "Limiting spacing of each Monte Carlo sample (" + std::to_string(studies.monte_carlo->samples) +
                                  " samples" +
                                  (m.infeasible_samples ? ", " + std::to_string(m.infeasible_samples) + " with no feasible spacing"
                                                        : std::string()) +
                                  "), with the spacing reached at the stated reliability.",
                              render(c)});
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
.warning { color: #8a3b00; font-weight: bold; }
figure { margin: 1rem 0; page-break-inside: avoid; }
figure svg { max-width: 100%; height: auto; }
figcaption { font-size: .85rem; color: #4a5868; }
footer { margin-top: 2rem; font-size: .8rem; color: #4a5868; }
@page { size: A4; margin: 15mm; }
@page wide { size: A4 landscape; margin: 10mm; }
@media print {
  body { max-width: none; padding: 0; font-size: 10pt; }
  h2 { page-break-after: avoid; }
  table { page-break-inside: avoid; }
  /* On paper every column of the results stands: no scrolling box, a landscape page of its own. */
  .wide { overflow: visible; }
  section.results-section { page: wide; }
  table.results { font-size: 6.5pt; width: 100%; }
  table.results th, table.results td { padding: .1rem .15rem; }
}
)";

// Text as a CSS string literal inside a <style> element: quotes and backslashes escaped, and
// '<' written as an escape so that no text can close the element.
std::string css_string(const std::string& text) {
    std::string out = "\"";
    for (const char c : text) {
        if (c == '"' || c == '\\') out += std::string("\\") + c;
        else if (c == '<') out += "\\3C ";
        else if (c == '\n' || c == '\r') out += ' ';
        else out += c;
    }
    return out + "\"";
}

std::string cell(const std::string& key, double value, const std::string& shown) {
    std::ostringstream o;
    o.precision(17);
    o << "<td data-key=\"" << key << "\" data-value=\"" << value << "\">" << escape_xml(shown) << "</td>";
    return o.str();
}

std::string results_table(const results::DesignRecord& record) {
    const auto columns = shown_design_columns(record);
    std::ostringstream o;
    o << "<div class=\"wide\"><table class=\"results\">\n<tr><th class=\"text\">drain</th><th class=\"text\">pattern</th>"
         "<th class=\"text\">status</th>";
    for (const auto& c : columns) o << "<th>" << escape_xml(c.heading_with_unit(" (", ")")) << "</th>";
    o << "</tr>\n";
    for (const auto& r : record.result.rows) {
        const bool best = r.rank && *r.rank == 1;
        const std::string status = !r.feasible ? "does not meet the criterion" : best ? "RECOMMENDED (rank 1)" : "rank " + std::to_string(*r.rank);
        o << "<tr" << (best ? " class=\"recommended\"" : "") << " data-drain=\"" << escape_xml(r.drain) << "\" data-pattern=\""
          << to_string(r.pattern) << "\"><td class=\"text\">" << escape_xml(r.drain) << "</td><td class=\"text\">"
          << to_string(r.pattern) << "</td><td class=\"text\">" << status << "</td>";
        for (const auto& c : columns) {
            const auto v = c.value(r);
            if (v) o << cell(c.key, *v, c.shown(r));
            else o << "<td>" << escape_xml(c.shown(r)) << "</td>";
        }
        o << "</tr>\n";
    }
    o << "</table></div>\n<p>Degrees are at the deadline at the chosen spacing"
      << (record.site().loading ? ", " + results::degree_reference_text(record.site()) : std::string()) << ". Criterion: "
      << escape_xml(results::criterion_text(record.site())) << ". μ mean is the depth mean of μ(z).</p>\n";
    for (const auto& w : record.warnings) o << "<p class=\"warning\">Warning: " << escape_xml(w) << "</p>\n";
    return o.str();
}

std::string inputs_table(const results::DesignRecord& record) {
    std::ostringstream o;
    o << "<table class=\"inputs\">\n";
    for (const auto& [k, v] : input_rows(record))
        o << "<tr><td class=\"text\">" << escape_xml(k) << "</td><td class=\"text\">" << escape_xml(v) << "</td></tr>\n";
    o << "</table>\n";
    return o.str();
}
}  // namespace

std::string title_block_html(const scenario::Scenario& s) {
    std::ostringstream o;
    o << "<table class=\"title-block\">\n";
    for (const auto& f : results::title_block(s))
        o << "<tr><th class=\"text\">" << escape_xml(f.label) << "</th><td class=\"text\" data-key=\"" << f.key << "\">"
          << escape_xml(f.value) << "</td></tr>\n";
    o << "</table>\n";
    return o.str();
}

std::string print_page_css(const scenario::Scenario& s) {
    return "@page { @top-left { content: " + css_string(results::running_header(s)) +
           "; font-size: 8pt; color: #4a5868; } @bottom-right { content: \"page \" counter(page) \" of \" counter(pages); "
           "font-size: 8pt; color: #4a5868; } }\n";
}

namespace {
// A header and rows as an HTML table (cells escaped) and as a Markdown table.
std::string html_table(const std::string& css_class, const std::vector<std::string>& header,
                       const std::vector<std::vector<std::string>>& rows) {
    std::ostringstream o;
    o << "<table class=\"" << css_class << "\">\n<tr>";
    for (const auto& h : header) o << "<th>" << escape_xml(h) << "</th>";
    o << "</tr>\n";
    for (const auto& row : rows) {
        o << "<tr>";
        for (const auto& cell : row) o << "<td>" << escape_xml(cell) << "</td>";
        o << "</tr>\n";
    }
    o << "</table>\n";
    return o.str();
}

std::string markdown_table(const std::vector<std::string>& header, const std::vector<std::vector<std::string>>& rows) {
    std::ostringstream o;
    o << "|";
    for (const auto& h : header) o << ' ' << markdown_text(h) << " |";
    o << "\n|";
    for (std::size_t i = 0; i < header.size(); ++i) o << "---|";
    o << "\n";
    for (const auto& row : rows) {
        o << "|";
        for (const auto& cell : row) o << ' ' << markdown_text(cell) << " |";
        o << "\n";
    }
    return o.str();
}

// The report's sections beyond the design note, in Markdown: the reliability table and the charts.
std::string markdown_sections(const results::DesignRecord& record, const std::vector<Chart>& charts) {
    std::ostringstream o;
    if (const auto& mc = record.studies.monte_carlo) {
        const auto& spec = *record.studies.monte_carlo_spec;
        o << "## Reliability (Monte Carlo)\n\n" << mc->samples << " samples, seed " << mc->seed << "; P with its "
          << fixed(100.0 * spec.confidence, 0) << " % Clopper–Pearson interval; the spacing met with "
          << fixed(100.0 * spec.reliability, 0) << " % reliability.\n\n| drain | pattern | spacing (m) | P (%) | interval (%) | "
          << "spacing at reliability (m) | median limit (m) | samples not evaluated |\n|---|---|---|---|---|---|---|---|\n";
        for (const auto& m : mc->rows)
            o << "| " << markdown_text(m.drain) << " | " << to_string(m.pattern) << " | " << fixed(m.spacing_m, 2) << " | "
              << fixed(100.0 * m.probability, 1) << " | " << fixed(100.0 * m.probability_low, 1) << "–"
              << fixed(100.0 * m.probability_high, 1) << " | "
              << (m.reliability_spacing_m ? fixed(*m.reliability_spacing_m, 3) : "none") << " | " << fixed(m.median_spacing_m, 3)
              << " | " << m.unevaluated << " |\n";
        o << "\n";
    }
    if (const auto& st = record.stages) {
        o << "## Stage stability\n\n" << markdown_text(stage_summary(*st)) << "\n\n"
          << markdown_table(stage_header(*st), stage_rows(*st)) << "\n";
        for (const auto& a : st->assumptions) o << "- " << markdown_text(a) << "\n";
        o << "\n";
    }
    if (const auto& sch = record.schedule) {
        o << "## Scheme search: spacing, surcharge and lift schedule\n\n" << markdown_text(schedule_summary(*sch)) << "\n\n";
        if (sch->cheapest)
            o << "The cost–finish front (no other scheme is both cheaper and sooner):\n\n"
              << markdown_table(schedule_front_header(record.site().criterion), schedule_front_rows(*sch)) << "\n";
        for (const auto& a : schedule_assumptions()) o << "- " << markdown_text(a) << "\n";
        o << "\n";
    }
    o << "## Charts\n\n";
    for (std::size_t i = 0; i < charts.size(); ++i)
        o << "![Figure " << i + 1 << "](" << charts[i].file << ")\n\nFigure " << i + 1 << ". " << markdown_text(charts[i].caption)
          << "\n\n";
    return o.str();
}
}  // namespace

ReportBundle build_report(const results::DesignRecord& record) {
    const Site& site = record.site();
    const auto& s = *record.scenario;
    ReportBundle bundle;
    if (const std::string sketch = unit_cell_sketch(record); !sketch.empty())
        bundle.charts.push_back({"unit-cell.svg",
                                 "The unit cell of the recommended design, drawn from the inputs: the pattern in plan with "
                                 "the influence circle; in section the clay, the drain, its smear zone (widened to be seen) "
                                 "and outlets.",
                                 sketch});
    if (!record.load_kPa.empty())
        bundle.charts.push_back(
            load_chart(site, record.chart_curves.front(), record.load_kPa, record.vacuum_kPa, record.log_time));
    for (const auto& curve : record.chart_curves) bundle.charts.push_back(degree_chart(site, curve, record.log_time));
    if (!record.spacing_vs_time.empty())
        bundle.charts.push_back(design_chart(site, record.spacing_vs_time, record.chart_curves.front().drain));
    if (!record.chart_curves.empty() && record.chart_curves.front().points.front().settlement_m)
        bundle.charts.push_back(settlement_chart(site, record.chart_curves, record.log_time));
    if (!record.residual_vs_time.empty())
        bundle.charts.push_back(residual_chart(site, record.chart_curves.front(), record.residual_vs_time));
    for (auto& c : study_charts(record.studies, record.chart_curves, record.result)) bundle.charts.push_back(std::move(c));
    if (record.stages)
        for (auto& c : stage_charts(*record.stages)) bundle.charts.push_back(std::move(c));
    if (record.schedule && record.schedule->cheapest) bundle.charts.push_back(schedule_chart(*record.schedule));

    std::ostringstream o;
    o << "<!DOCTYPE html>\n<html lang=\"en\">\n<head>\n<meta charset=\"utf-8\"/>\n<title>" << escape_xml(s.title)
      << "</title>\n<style>" << style_sheet << print_page_css(s) << "</style>\n</head>\n<body>\n";
    o << "<h1>Vertical drain design: " << escape_xml(s.title) << "</h1>\n" << title_block_html(s);
    o << "<section class=\"verdict\"><h2>Result</h2><p id=\"recommendation\">" << escape_xml(results::recommendation(record))
      << "</p></section>\n";
    o << "<section><h2>Inputs</h2>\n" << inputs_table(record) << "</section>\n";
    o << "<section class=\"results-section\"><h2>Results for every drain and pattern</h2>\n" << results_table(record)
      << "</section>\n";
    bundle.markdown = design_markdown(record, markdown_sections(record, bundle.charts));
    if (const auto& mc = record.studies.monte_carlo) {
        const auto& spec = *record.studies.monte_carlo_spec;
        o << "<section><h2>Reliability (Monte Carlo)</h2>\n<p>" << mc->samples << " samples, seed " << mc->seed
          << "; the probability that the criterion is met at each design spacing with its "
          << fixed(100.0 * spec.confidence, 0) << " % Clopper–Pearson interval, and the spacing met with "
          << fixed(100.0 * spec.reliability, 0) << " % reliability.</p>\n<table class=\"reliability\">\n<tr><th class=\"text\">drain</th>"
             "<th class=\"text\">pattern</th><th>spacing (m)</th><th>P (%)</th><th>interval (%)</th><th>spacing at "
          << fixed(100.0 * spec.reliability, 0)
          << " % (m)</th><th>median limit (m)</th><th>samples not evaluated</th></tr>\n";
        for (const auto& m : mc->rows)
            o << "<tr><td class=\"text\">" << escape_xml(m.drain) << "</td><td class=\"text\">" << to_string(m.pattern)
              << "</td><td>" << fixed(m.spacing_m, 2) << "</td><td>" << fixed(100.0 * m.probability, 1) << "</td><td>"
              << fixed(100.0 * m.probability_low, 1) << "–" << fixed(100.0 * m.probability_high, 1) << "</td><td>"
              << (m.reliability_spacing_m ? fixed(*m.reliability_spacing_m, 3) : "none") << "</td><td>"
              << fixed(m.median_spacing_m, 3) << "</td><td>" << m.unevaluated << "</td></tr>\n";
        o << "</table>\n</section>\n";
    }
    if (!record.sublayers.empty()) {
        o << "<section><h2>Settlement by sub-layer</h2>\n<p>For the recommended design (the first row when none meets the "
             "criterion), under the final permanent load; u and the local degree at the slice centre at the deadline "
             "show how consolidation is spread over depth (– where the method reports depth averages only); the "
             "settlement at the deadline applies the design's average degree, so that the slices add up to the design "
             "row.</p>\n"
          << html_table("sublayers", sublayer_header(), sublayer_table_rows(record)) << "</section>\n";
    }
    if (const auto& st = record.stages) {
        o << "<section id=\"stages\"><h2>Stage stability</h2>\n<p>" << escape_xml(stage_summary(*st)) << "</p>\n"
          << html_table("stages", stage_header(*st), stage_rows(*st)) << "<ul>\n";
        for (const auto& a : st->assumptions) o << "<li>" << escape_xml(a) << "</li>\n";
        o << "</ul>\n</section>\n";
    }
    if (const auto& sch = record.schedule) {
        o << "<section id=\"schedule\"><h2>Scheme search: spacing, surcharge and lift schedule</h2>\n<p>"
          << escape_xml(schedule_summary(*sch)) << "</p>\n";
        if (sch->cheapest)
            o << html_table("schedule", schedule_front_header(site.criterion), schedule_front_rows(*sch));
        o << "<ul>\n";
        for (const auto& a : schedule_assumptions()) o << "<li>" << escape_xml(a) << "</li>\n";
        o << "</ul>\n</section>\n";
    }
    o << "<section><h2>Charts</h2>\n";
    for (std::size_t i = 0; i < bundle.charts.size(); ++i)
        o << "<figure id=\"chart-" << i + 1 << "\">\n" << bundle.charts[i].svg << "<figcaption>Figure " << i + 1 << ". "
          << escape_xml(bundle.charts[i].caption) << "</figcaption>\n</figure>\n";
    o << "</section>\n<section><h2>Method and sources</h2>\n<ul>\n";
    for (const auto& line : record.method_notes) o << "<li>" << escape_xml(line) << "</li>\n";
    o << "</ul>\n</section>\n<section id=\"references\"><h2>References</h2>\n<ul>\n";
    for (const auto& key : results::reference_keys(record))
        o << "<li data-key=\"" << key << "\">" << escape_xml(results::reference(key).text) << "</li>\n";
    o << "</ul>\n</section>\n<section><h2>Assumptions</h2>\n<ul>\n";
    for (const auto& line : record.assumptions) o << "<li>" << escape_xml(line) << "</li>\n";
    o << "</ul>\n</section>\n<section class=\"cautions\"><h2>Cautions</h2>\n<ul>\n";
    for (const auto& c : results::cautions()) o << "<li>" << escape_xml(c) << "</li>\n";
    o << "</ul>\n</section>\n<footer>Produced by wickgrid " << version << " from " << escape_xml(s.file)
      << ".</footer>\n</body>\n</html>\n";
    bundle.html = o.str();
    return bundle;
}

}  // namespace wickgrid::report
