#include "monitor_report.hpp"

#include <sstream>

#include "design_report.hpp"
#include "format.hpp"
#include "html_report.hpp"
#include "results/bibliography.hpp"
#include "svg_chart.hpp"
#include "wickgrid/units.hpp"
#include "wickgrid/version.hpp"

namespace wickgrid::report {

namespace {
using nlohmann::json;
double days(double s) { return units::seconds_to_days(s); }
double per_year(double m2_per_s) { return units::per_second_to_per_year(m2_per_s); }

json forecast_json(const monitoring::Forecast& f, bool with_settlement) {
    json out{{"degree_now", f.degree_now},
             {"criterion_met_day", f.criterion_met_s ? json(days(*f.criterion_met_s)) : json(nullptr)},
             {"surcharge_removal_day", f.surcharge_removal_s ? json(days(*f.surcharge_removal_s)) : json(nullptr)}};
    out["settlement_now_mm"] = with_settlement ? json(f.settlement_now_m * 1000.0) : json(nullptr);
    out["residual_at_deadline_mm"] = with_settlement && f.residual_at_deadline_m ? json(*f.residual_at_deadline_m * 1000.0) : json(nullptr);
    out["residual_primary_mm"] =
        with_settlement && f.residual_primary_at_deadline_m ? json(*f.residual_primary_at_deadline_m * 1000.0) : json(nullptr);
    out["residual_secondary_mm"] =
        with_settlement && f.residual_secondary_at_deadline_m ? json(*f.residual_secondary_at_deadline_m * 1000.0) : json(nullptr);
    return out;
}

json plate_json(const results::PlateAnalysis& a) {
    json p{{"plate", a.plate}, {"readings", a.readings}, {"last_load_change_day", days(a.window_start_s)},
           {"last_reading_day", days(a.now_s)}};
    if (a.asaoka)
        p["asaoka"] = {{"final_settlement_mm", a.asaoka->final_settlement_m * 1000.0},
                       {"final_settlement_se_mm", a.asaoka->final_settlement_se_m * 1000.0},
                       {"beta0_mm", a.asaoka->beta0_m * 1000.0},
                       {"beta0_se_mm", a.asaoka->beta0_se_m * 1000.0},
                       {"beta1", a.asaoka->beta1},
                       {"beta1_se", a.asaoka->beta1_se},
                       {"interval_days", days(a.asaoka->interval_s)},
                       {"points", a.asaoka->resampled_m.size()},
                       {"residuals_mm", [&] {
                            json rs = json::array();
                            for (const double x : a.asaoka->residuals_m) rs.push_back(x * 1000.0);
                            return rs;
                        }()},
                       {"ch_m2_per_year", a.asaoka_ch_m2_per_s ? json(per_year(*a.asaoka_ch_m2_per_s)) : json(nullptr)},
                       {"reliable", a.asaoka_reliable},
                       {"flags", a.asaoka_flags}};
    else p["asaoka"] = nullptr;
    if (a.hyperbolic)
        p["hyperbolic"] = {{"final_settlement_mm", a.hyperbolic->final_settlement_m * 1000.0},
                           {"points", a.hyperbolic->points}};
    else p["hyperbolic"] = nullptr;
    if (a.fit) {
        p["fit"] = {{"ch_m2_per_year", a.fit->ch_m2_per_s ? json(per_year(*a.fit->ch_m2_per_s)) : json(nullptr)},
                    {"ch_factor", a.fit->ch_factor},
                    {"ch_factor_interval",
                     a.fit->ch_factor_interval_95
                         ? json::array({(*a.fit->ch_factor_interval_95)[0], (*a.fit->ch_factor_interval_95)[1]})
                         : json(nullptr)},
                    {"final_settlement_mm", a.fit->final_settlement_m * 1000.0},
                    {"rms_mm", a.fit->rms_m * 1000.0},
                    {"reliable", a.fit_reliable}};
        p["fit"]["ch_interval_95"] = a.fit->ch_interval_95
                                         ? json::array({per_year((*a.fit->ch_interval_95)[0]), per_year((*a.fit->ch_interval_95)[1])})
                                         : json(nullptr);
    } else {
        p["fit"] = nullptr;
    }
    p["forecast"] = a.fitted_forecast ? forecast_json(*a.fitted_forecast, true) : json(nullptr);
    p["design_forecast"] = forecast_json(a.design_forecast, a.design_final_m.has_value());
    p["design_forecast"]["final_settlement_mm"] = a.design_final_m ? json(*a.design_final_m * 1000.0) : json(nullptr);
    json notes = json::array();
    for (const auto& n : a.notes) notes.push_back(n);
    p["notes"] = notes;
    return p;
}

std::string mm(const std::optional<double>& m) { return m ? fixed(*m * 1000.0, 0) : "–"; }
std::string day_text(const std::optional<double>& s) { return s ? fixed(days(*s), 0) : "–"; }
}  // namespace

json monitor_json(const results::MonitorRecord& r) {
    json plates = json::array();
    for (const auto& a : r.plates) plates.push_back(plate_json(a));
    json list = json::array(), assumptions = json::array(), cautions = json::array();
    for (const auto& w : r.warnings) list.push_back(w);
    for (const auto& a : r.assumptions) assumptions.push_back(a);
    for (const auto& c : results::cautions()) cautions.push_back(c);
    json piezometers = json::array();
    for (const auto& p : r.piezometers) {
        double peak = p.readings.front().second;
        for (const auto& [t, u] : p.readings) peak = std::max(peak, u);
        json readings = json::array();
        for (const auto& [t, u] : p.readings) readings.push_back({{"day", days(t)}, {"excess_pore_pressure_kPa", u}});
        const std::size_t k = static_cast<std::size_t>(&p - r.piezometers.data());
        json design = json::array();
        if (k < r.design_excess_at_piezometer_kPa.size())
            for (std::size_t i = 0; i < r.design_excess_at_piezometer_kPa[k].size(); ++i)
                design.push_back({{"day", days(r.pore_times_s[i])},
                                  {"excess_pore_pressure_kPa", r.design_excess_at_piezometer_kPa[k][i]}});
        piezometers.push_back({{"piezometer", p.piezometer},
                               {"depth_m", p.depth_m},
                               {"design_at_depth", design},
                               {"last_day", days(p.readings.back().first)},
                               {"last_excess_pore_pressure_kPa", p.readings.back().second},
                               {"peak_excess_pore_pressure_kPa", peak},
                               {"readings", readings}});
    }
    json out{{"schema", 1},
             {"title", r.scenario->title},
             {"piezometers", piezometers},
             {"readings", r.readings_file},
             {"drain", r.drain},
             {"pattern", to_string(r.pattern)},
             {"spacing_m", r.spacing_m},
             {"design_ch_m2_per_year", r.design_ch_m2_per_s ? json(per_year(*r.design_ch_m2_per_s)) : json(nullptr)},
             {"target", target_json(r.scenario->site)},
             {"plates", plates},
             {"warnings", list},
             {"assumptions", assumptions},
             {"cautions", cautions}};
    add_title_block(out, *r.scenario);
    return out;
}

std::string monitor_table(const results::MonitorRecord& r) {
    std::vector<std::vector<std::string>> rows;
    for (const auto& a : r.plates) {
        const auto& f = a.fitted_forecast;
        rows.push_back({a.plate, std::to_string(a.readings), fixed(days(a.now_s), 0),
                        a.asaoka ? fixed(a.asaoka->final_settlement_m * 1000.0, 0) + (a.asaoka_reliable ? "" : "?") +
                                       (a.asaoka_flags.empty() ? "" : "!")
                                 : "–",
                        a.asaoka_ch_m2_per_s ? fixed(per_year(*a.asaoka_ch_m2_per_s), 2) : "–",
                        a.hyperbolic ? fixed(a.hyperbolic->final_settlement_m * 1000.0, 0) : "–",
                        a.fit ? fixed(a.fit->ch_factor, 3) + (a.fit_reliable ? "" : "?") : "–",
                        a.fit && a.fit->ch_factor_interval_95 ? fixed((*a.fit->ch_factor_interval_95)[0], 3) + "–" +
                                                                    fixed((*a.fit->ch_factor_interval_95)[1], 3)
                                                              : "–",
                        a.fit ? fixed(a.fit->final_settlement_m * 1000.0, 0) : "–",
                        f ? fixed(100.0 * f->degree_now, 1) : fixed(100.0 * a.design_forecast.degree_now, 1) + " (design)",
                        day_text(f ? f->criterion_met_s : a.design_forecast.criterion_met_s),
                        f ? mm(f->residual_at_deadline_m) : "–",
                        day_text(f ? f->surcharge_removal_s : a.design_forecast.surcharge_removal_s)});
    }
    std::ostringstream o;
    o << "Monitoring back-analysis: " << r.scenario->title << "\n" << r.drain << ", " << to_string(r.pattern) << " at "
      << fixed(r.spacing_m, 2) << " m; design ch "
      << (r.design_ch_m2_per_s ? fixed(per_year(*r.design_ch_m2_per_s), 2) + " m²/year" : std::string("per layer"))
      << "; the fit's ch factor multiplies every layer's ch\n\n";
    o << text_table({"plate", "readings", "last day", "Asaoka s∞ mm", "Asaoka ch m²/yr", "hyperbolic s∞ mm", "ch factor",
                     "factor 95 %", "fit s∞ mm", "U now %", "criterion day", "residual mm", "surcharge off day"},
                    rows, 1);
    o << "\n'?' marks a value too uncertain to rely on, '!' an s∞ that is not the final settlement under the permanent "
         "fill (taken under vacuum or before the last lift; see the notes); without a reliable fit the forecast columns "
         "are the design's.\n";
    for (const auto& a : r.plates)
        for (const auto& n : a.notes) o << "  " << a.plate << ": " << n << "\n";
    for (const auto& w : r.warnings) o << "Warning: " << w << "\n";
    o << "\n" << results::caution_block();
    return o.str();
}

std::string monitor_csv(const results::MonitorRecord& r) {
    std::vector<std::vector<std::string>> rows;
    for (const auto& a : r.plates) {
        auto num = [](std::optional<double> v) { return csv_number(v); };
        rows.push_back({a.plate, std::to_string(a.readings), num(days(a.now_s)),
                        num(a.asaoka ? std::optional(a.asaoka->final_settlement_m * 1000.0) : std::nullopt),
                        num(a.asaoka_ch_m2_per_s ? std::optional(per_year(*a.asaoka_ch_m2_per_s)) : std::nullopt),
                        num(a.hyperbolic ? std::optional(a.hyperbolic->final_settlement_m * 1000.0) : std::nullopt),
                        num(a.fit && a.fit->ch_m2_per_s ? std::optional(per_year(*a.fit->ch_m2_per_s)) : std::nullopt),
                        num(a.fit ? std::optional(a.fit->ch_factor) : std::nullopt),
                        num(a.fit ? std::optional(a.fit->final_settlement_m * 1000.0) : std::nullopt),
                        a.fit_reliable ? "yes" : "no"});
    }
    return csv_document({"plate", "readings", "last_reading_day", "asaoka_final_settlement_mm", "asaoka_ch_m2_per_year",
                         "hyperbolic_final_settlement_mm", "fit_ch_m2_per_year", "fit_ch_factor", "fit_final_settlement_mm",
                         "fit_reliable"},
                        rows);
}

namespace {
std::string settlement_chart(const results::PlateAnalysis& a, const Site& site) {
    LineChart c;
    c.title = "Plate " + a.plate + ": settlement against time";
    c.x_label = "time (days)";
    c.y_label = "settlement (mm)";
    Series obs{"observed", {}, {}, 0, true};
    for (const auto& r : a.observed) {
        obs.x.push_back(days(r.time_s));
        obs.y.push_back(r.settlement_m * 1000.0);
    }
    c.series.push_back(obs);
    auto curve = [&](const std::string& name, const std::vector<double>& m, int style) {
        Series s{name, {}, {}, style, false};
        for (std::size_t i = 0; i < m.size(); ++i) {
            s.x.push_back(days(a.curve_times_s[i]));
            s.y.push_back(m[i] * 1000.0);
        }
        c.series.push_back(s);
    };
    if (!a.design_curve_m.empty()) curve("design", a.design_curve_m, 1);
    if (!a.fitted_curve_m.empty()) curve(a.fit_reliable ? "back-analysed" : "back-analysed (not relied on)", a.fitted_curve_m, 2);
    c.marker_x = days(site.criterion.deadline_s);
    c.marker_label = "deadline";
    return render(c);
}

std::string asaoka_chart(const results::PlateAnalysis& a) {
    const auto& f = *a.asaoka;
    LineChart c;
    c.title = "Plate " + a.plate + ": Asaoka plot (Δt = " + fixed(days(f.interval_s), 1) + " days)";
    c.x_label = "settlement s(i−1) (mm)";
    c.y_label = "settlement s(i) (mm)";
    Series pts{"resampled readings", {}, {}, 0, true};
    for (std::size_t i = 0; i + 1 < f.resampled_m.size(); ++i) {
        pts.x.push_back(f.resampled_m[i] * 1000.0);
        pts.y.push_back(f.resampled_m[i + 1] * 1000.0);
    }
    const double lo = 0.9 * pts.x.front();
    const double hi = std::max(1.05 * f.final_settlement_m, f.resampled_m.back()) * 1000.0;
    c.series.push_back(pts);
    c.series.push_back({"fit s(i) = β0 + β1·s(i−1)", {lo, hi}, {f.beta0_m * 1000.0 + f.beta1 * lo, f.beta0_m * 1000.0 + f.beta1 * hi}, 1, false});
    c.series.push_back({"45° line", {lo, hi}, {lo, hi}, 2, false});
    return render(c);
}

std::string pore_pressure_chart(const results::MonitorRecord& r) {
    LineChart c;
    c.title = "Excess pore pressure against time";
    c.x_label = "time (days)";
    c.y_label = "excess pore pressure (kPa)";
    static const int observed_styles[] = {0, 2, 3, 4};  // style 1 is the design's line
    for (std::size_t k = 0; k < r.piezometers.size(); ++k) {
        const auto& p = r.piezometers[k];
        Series s{p.piezometer + " at " + fixed(p.depth_m, 1) + " m", {}, {}, observed_styles[k % 4], true};
        for (const auto& [t, u] : p.readings) {
            s.x.push_back(days(t));
            s.y.push_back(u);
        }
        c.series.push_back(s);
        // The design at this piezometer's depth, in the piezometer's colour, drawn as a line.
        if (k < r.design_excess_at_piezometer_kPa.size() && !r.design_excess_at_piezometer_kPa[k].empty()) {
            Series d{"design at " + fixed(p.depth_m, 1) + " m", {}, {}, observed_styles[k % 4], false};
            for (std::size_t i = 0; i < r.design_excess_at_piezometer_kPa[k].size(); ++i) {
                d.x.push_back(days(r.pore_times_s[i]));
                d.y.push_back(r.design_excess_at_piezometer_kPa[k][i]);
            }
            c.series.push_back(d);
        }
    }
    if (!r.design_mean_excess_kPa.empty()) {
        Series d{"design (clay mean)", {}, {}, 1, false};
        for (std::size_t i = 0; i < r.design_mean_excess_kPa.size(); ++i) {
            d.x.push_back(days(r.pore_times_s[i]));
            d.y.push_back(r.design_mean_excess_kPa[i]);
        }
        c.series.push_back(d);
    }
    return render(c);
}

std::vector<std::string> monitor_reference_keys(const results::MonitorRecord& r) {
    std::vector<std::string> keys{"asaoka1978", "magnan_deroy1980", "tan1991", "hansbo1981", "carrillo1942"};
    if (r.scenario->site.loading && r.scenario->site.loading->surcharge) keys.push_back("johnson1970");
    return keys;
}
}  // namespace

std::string monitor_html(const results::MonitorRecord& r) {
    const auto& s = *r.scenario;
    std::ostringstream o;
    o << "<!DOCTYPE html>\n<html lang=\"en\">\n<head>\n<meta charset=\"utf-8\"/>\n<title>Monitoring: " << escape_xml(s.title)
      << "</title>\n<style>\nbody { font-family: sans-serif; max-width: 64rem; margin: auto; padding: 1rem; color: #1d2731; }\n"
         "table { border-collapse: collapse; } th, td { border: 1px solid #c9d2d8; padding: .2rem .4rem; text-align: right; }\n"
         "th { background: #e8f1f0; } .text { text-align: left; } .cautions { border: 2px solid #c4621d; padding: .4rem 1rem; }\n"
         "figure { page-break-inside: avoid; } figure svg { max-width: 100%; height: auto; }\n"
         "@page { size: A4; margin: 15mm; }\n"
      << print_page_css(s) << "</style>\n</head>\n<body>\n<h1>Monitoring back-analysis: " << escape_xml(s.title) << "</h1>\n"
      << title_block_html(s) << "<p>" << escape_xml(r.drain) << ", " << to_string(r.pattern) << " at " << fixed(r.spacing_m, 2)
      << " m; readings from " << escape_xml(r.readings_file) << ".</p>\n<h2>Plates</h2>\n<table>\n<tr><th class=\"text\">plate</th>"
         "<th>readings</th><th>Asaoka s∞ (mm)</th><th>Asaoka ch (m²/year)</th><th>hyperbolic s∞ (mm)</th><th>fit ch factor</th>"
         "<th>fit s∞ (mm)</th><th>U now (%)</th><th>criterion met (day)</th><th>surcharge off (day)</th></tr>\n";
    for (const auto& a : r.plates) {
        const auto& f = a.fitted_forecast ? *a.fitted_forecast : a.design_forecast;
        o << "<tr><td class=\"text\">" << escape_xml(a.plate) << "</td><td>" << a.readings << "</td><td>"
          << (a.asaoka ? fixed(a.asaoka->final_settlement_m * 1000.0, 0) : "–") << "</td><td>"
          << (a.asaoka_ch_m2_per_s ? fixed(per_year(*a.asaoka_ch_m2_per_s), 2) : "–") << "</td><td>"
          << (a.hyperbolic ? fixed(a.hyperbolic->final_settlement_m * 1000.0, 0) : "–") << "</td><td>"
          << (a.fit ? fixed(a.fit->ch_factor, 3) + (a.fit_reliable ? "" : " (not relied on)") : "–") << "</td><td>"
          << (a.fit ? fixed(a.fit->final_settlement_m * 1000.0, 0) : "–") << "</td><td>" << fixed(100.0 * f.degree_now, 1)
          << (a.fitted_forecast ? "" : " (design)") << "</td><td>" << escape_xml(day_text(f.criterion_met_s)) << "</td><td>"
          << escape_xml(day_text(f.surcharge_removal_s)) << "</td></tr>\n";
    }
    o << "</table>\n";
    for (const auto& w : r.warnings) o << "<p><strong>Warning:</strong> " << escape_xml(w) << "</p>\n";
    for (const auto& a : r.plates) {
        o << "<h2>Plate " << escape_xml(a.plate) << "</h2>\n<figure>" << settlement_chart(a, s.site) << "</figure>\n";
        if (a.asaoka) o << "<figure>" << asaoka_chart(a) << "</figure>\n";
        if (!a.notes.empty()) {
            o << "<ul>\n";
            for (const auto& n : a.notes) o << "<li>" << escape_xml(n) << "</li>\n";
            o << "</ul>\n";
        }
    }
    if (!r.piezometers.empty())
        o << "<h2>Piezometers</h2>\n<figure>" << pore_pressure_chart(r)
          << "<figcaption>Observed excess pore pressure at each piezometer (points) beside the design's value at its "
             "depth (line of the same colour; the closed form and the layered series resolve depth) and the design's "
             "mean over the clay (applied load less U × the final permanent load).</figcaption></figure>\n";
    o << "<h2>Method and assumptions</h2>\n<ul>\n";
    for (const auto& a : r.assumptions) o << "<li>" << escape_xml(a) << "</li>\n";
    o << "</ul>\n<h2>References</h2>\n<ul>\n";
    for (const auto& key : monitor_reference_keys(r)) o << "<li>" << escape_xml(results::reference(key).text) << "</li>\n";
    o << "</ul>\n<section class=\"cautions\"><h2>Cautions</h2>\n<ul>\n";
    for (const auto& c : results::cautions()) o << "<li>" << escape_xml(c) << "</li>\n";
    o << "</ul></section>\n</body>\n</html>\n";
    return o.str();
}

}  // namespace wickgrid::report
