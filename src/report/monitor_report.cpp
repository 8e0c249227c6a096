#include "monitor_report.hpp"

#include <sstream>

#include "design_report.hpp"
#include "format.hpp"
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
                       {"ch_m2_per_year", a.asaoka_ch_m2_per_s ? json(per_year(*a.asaoka_ch_m2_per_s)) : json(nullptr)},
                       {"reliable", a.asaoka_reliable}};
    else p["asaoka"] = nullptr;
    if (a.hyperbolic)
        p["hyperbolic"] = {{"final_settlement_mm", a.hyperbolic->final_settlement_m * 1000.0},
                           {"points", a.hyperbolic->points}};
    else p["hyperbolic"] = nullptr;
    if (a.fit) {
        p["fit"] = {{"ch_m2_per_year", per_year(a.fit->ch_m2_per_s)},
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
    json out{{"schema", 1},
             {"title", r.scenario->title},
             {"readings", r.readings_file},
             {"drain", r.drain},
             {"pattern", to_string(r.pattern)},
             {"spacing_m", r.spacing_m},
             {"design_ch_m2_per_year", per_year(r.design_ch_m2_per_s)},
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
                        a.asaoka ? fixed(a.asaoka->final_settlement_m * 1000.0, 0) + (a.asaoka_reliable ? "" : "?") : "–",
                        a.asaoka_ch_m2_per_s ? fixed(per_year(*a.asaoka_ch_m2_per_s), 2) : "–",
                        a.hyperbolic ? fixed(a.hyperbolic->final_settlement_m * 1000.0, 0) : "–",
                        a.fit ? fixed(per_year(a.fit->ch_m2_per_s), 2) + (a.fit_reliable ? "" : "?") : "–",
                        a.fit && a.fit->ch_interval_95 ? fixed(per_year((*a.fit->ch_interval_95)[0]), 2) + "–" +
                                                             fixed(per_year((*a.fit->ch_interval_95)[1]), 2)
                                                       : "–",
                        a.fit ? fixed(a.fit->final_settlement_m * 1000.0, 0) : "–",
                        f ? fixed(100.0 * f->degree_now, 1) : fixed(100.0 * a.design_forecast.degree_now, 1) + " (design)",
                        day_text(f ? f->criterion_met_s : a.design_forecast.criterion_met_s),
                        f ? mm(f->residual_at_deadline_m) : "–",
                        day_text(f ? f->surcharge_removal_s : a.design_forecast.surcharge_removal_s)});
    }
    std::ostringstream o;
    o << "Monitoring back-analysis: " << r.scenario->title << "\n" << r.drain << ", " << to_string(r.pattern) << " at "
      << fixed(r.spacing_m, 2) << " m; design ch " << fixed(per_year(r.design_ch_m2_per_s), 2) << " m²/year\n\n";
    o << text_table({"plate", "readings", "last day", "Asaoka s∞ mm", "Asaoka ch m²/yr", "hyperbolic s∞ mm", "fit ch m²/yr",
                     "ch 95 %", "fit s∞ mm", "U now %", "criterion day", "residual mm", "surcharge off day"},
                    rows, 1);
    o << "\n'?' marks a value too uncertain to rely on (see the notes); without a reliable fit the forecast columns are "
         "the design's.\n";
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
                        num(a.fit ? std::optional(per_year(a.fit->ch_m2_per_s)) : std::nullopt),
                        num(a.fit ? std::optional(a.fit->final_settlement_m * 1000.0) : std::nullopt),
                        a.fit_reliable ? "yes" : "no"});
    }
    return csv_document({"plate", "readings", "last_reading_day", "asaoka_final_settlement_mm", "asaoka_ch_m2_per_year",
                         "hyperbolic_final_settlement_mm", "fit_ch_m2_per_year", "fit_final_settlement_mm", "fit_reliable"},
                        rows);
}

}  // namespace wickgrid::report
