#include "report/stage_report.hpp"

#include <algorithm>
#include <cmath>
#include <sstream>

#include "report/design_report.hpp"
#include "report/format.hpp"
#include "report/svg_chart.hpp"
#include "wickgrid/names.hpp"
#include "wickgrid/units.hpp"

namespace wickgrid::report {

namespace {
const char* const stage_colours[] = {"#0f6b6b", "#c4621d", "#4a5868", "#7a8b2c", "#7d3c6e"};

std::string day_text(std::optional<double> s) { return s ? fixed(units::seconds_to_days(*s), 1) : "none"; }

std::string stage_name(const StageCheck& c) { return c.surcharge ? "surcharge" : "stage " + std::to_string(c.stage); }

std::string num(double v) { return fixed(v, 1); }
}  // namespace

namespace {
bool has_effective(const results::StageRecord& record) {
    return std::any_of(record.plan.stages.begin(), record.plan.stages.end(),
                       [](const StageCheck& c) { return c.effective_factor_of_safety.has_value(); });
}
}  // namespace

std::vector<std::string> stage_header(const results::StageRecord& record) {
    std::vector<std::string> h{"stage", "start (day)", "end (day)", "fill height (m)", "settlement (mm)", "factor of safety"};
    if (has_effective(record)) h.push_back("effective-stress FS");
    h.push_back("next may start (day)");
    return h;
}

std::vector<std::vector<std::string>> stage_rows(const results::StageRecord& record) {
    std::vector<std::vector<std::string>> rows;
    const auto& stages = record.plan.stages;
    for (const StageCheck& c : stages) {
        const std::string next = !c.next_reachable         ? "never (target not reached)"
                                 : c.earliest_next_start_s ? day_text(c.earliest_next_start_s)
                                                           : "–";
        std::string fs = fixed(c.factor_of_safety, 2);
        if (c.factor_of_safety < record.plan.target_factor_of_safety) fs += " (below target)";
        std::vector<std::string> row{stage_name(c), day_text(c.start_s), day_text(c.end_s), fixed(c.height_m, 2),
                                     c.settlement_m ? fixed(*c.settlement_m * 1000.0, 0) : "–", fs};
        if (has_effective(record))
            row.push_back(c.effective_factor_of_safety ? fixed(*c.effective_factor_of_safety, 2) +
                                                             (*c.effective_factor_of_safety < record.plan.target_factor_of_safety
                                                                  ? " (below target)"
                                                                  : "")
                                                       : "–");
        row.push_back(next);
        rows.push_back(std::move(row));
    }
    return rows;
}

namespace {
nlohmann::json plan_check_json(const results::StageRecord& r) {
    using nlohmann::json;
    if (!r.plan_check) return nullptr;
    const auto& c = *r.plan_check;
    return {{"meets_criterion", c.meets},
            {"spacing_m", r.spacing_m},
            {"degree_at_deadline", c.degree_at_deadline},
            {"residual_settlement_mm", c.residual_m ? json(*c.residual_m * 1000.0) : json(nullptr)},
            {"spacing_limit_m", c.spacing_limit_m ? json(*c.spacing_limit_m) : json(nullptr)},
            {"limited_by_max_spacing", c.limited_by_maximum}};
}

// The planned schedule against the design criterion, in words.
std::string plan_check_text(const scenario::Scenario& s, const results::StageRecord& r) {
    if (!r.plan_check) return "";
    const auto& c = *r.plan_check;
    std::string text = "Planned schedule against the criterion (" + results::criterion_text(s.site) + "): at " +
                       fixed(r.spacing_m, 2) + " m, U = " + fixed(100.0 * c.degree_at_deadline, 1) + " % at the deadline" +
                       (c.residual_m ? ", residual " + fixed(*c.residual_m * 1000.0, 0) + " mm" : std::string()) +
                       (c.meets ? ": met." : ": NOT met.");
    if (c.spacing_limit_m)
        text += " Under this schedule the largest spacing that meets it is " + fixed(*c.spacing_limit_m, 3) + " m" +
                (c.limited_by_maximum ? " (the range's largest)" : "") + " for " + r.drain + " in a " +
                std::string(to_string(r.pattern)) + " pattern" +
                (c.meets ? "." : "; check the stages at that spacing (a closer spacing plans faster lifts: `wickgrid "
                                 "schedule` searches spacing, surcharge and lifts together).");
    else
        text += " No spacing in the scenario's range meets it under this schedule: move the deadline, add a surcharge "
                "or change the product (`wickgrid schedule` searches spacing, surcharge and lifts together).";
    return text + "\n";
}
}  // namespace

nlohmann::json stages_json(const scenario::Scenario& s, const results::StageRecord& r) {
    using nlohmann::json;
    json stages = json::array();
    for (const StageCheck& c : r.plan.stages) {
        const auto& k = c.critical;
        stages.push_back({{"stage", c.stage},
                          {"surcharge", c.surcharge},
                          {"start_day", units::seconds_to_days(c.start_s)},
                          {"end_day", units::seconds_to_days(c.end_s)},
                          {"height_m", c.height_m},
                          {"settlement_mm", c.settlement_m ? json(*c.settlement_m * 1000.0) : json(nullptr)},
                          {"factor_of_safety", c.factor_of_safety},
                          {"effective_factor_of_safety",
                           c.effective_factor_of_safety ? json(*c.effective_factor_of_safety) : json(nullptr)},
                          {"meets_target", c.factor_of_safety >= r.plan.target_factor_of_safety},
                          {"earliest_next_start_day",
                           c.earliest_next_start_s ? json(units::seconds_to_days(*c.earliest_next_start_s)) : json(nullptr)},
                          {"next_reachable", c.next_reachable},
                          {"critical_circle",
                           {{"centre_x_m", k.circle.centre_x_m}, {"centre_y_m", k.circle.centre_y_m},
                            {"radius_m", k.circle.radius_m}, {"entry_x_m", k.entry_x_m}, {"exit_x_m", k.exit_x_m}}}});
    }
    json history = json::array();
    for (const SafetyPoint& p : r.history)
        history.push_back({{"day", units::seconds_to_days(p.time_s)}, {"height_m", p.height_m},
                           {"factor_of_safety", p.factor_of_safety},
                           {"settlement_mm", p.settlement_m ? json(*p.settlement_m * 1000.0) : json(nullptr)}});
    json out{{"scenario", s.file},
             {"drain", r.drain},
             {"pattern", std::string(to_string(r.pattern))},
             {"spacing_m", r.spacing_m},
             {"method", std::string(to_string(r.method))},
             {"planned", r.plan.planned},
             {"target_factor_of_safety", r.plan.target_factor_of_safety},
             {"meets_target", results::stages_meet_target(r)},
             {"stages", stages},
             {"history", history},
             {"plan_check", plan_check_json(r)},
             {"fill_to_finish", r.finish ? json{{"finished_height_m", r.finish->finished_height_m},
                                                {"placed_height_m", r.finish->placed_height_m},
                                                {"final_settlement_m", r.finish->final_settlement_m},
                                                {"submerged_m", r.finish->submerged_m},
                                                {"load_kPa", r.finish->load_kPa},
                                                {"scheduled_height_m", r.top_up->scheduled_height_m},
                                                {"last_stage_placed_m", r.top_up->height_m},
                                                {"top_up_height_m", r.top_up->height_m},
                                                {"top_up_load_kPa", r.top_up->load_kPa},
                                                {"top_up_rule", std::string(name_of(top_up_names, r.top_up->rule))},
                                                {"top_up_stage", r.top_up->stage ? json(*r.top_up->stage + 1) : json(nullptr)}}
                                         : json(nullptr)},
             {"reinforcement_kN_per_m", r.section.reinforcement ? json(r.section.reinforcement->tensile_force_kN_per_m)
                                                                : json(nullptr)},
             {"tension_crack", r.section.tension_crack ? json{{"depth_m", r.section.tension_crack->depth_m},
                                                              {"water_filled", r.section.tension_crack->water_filled}}
                                                       : json(nullptr)},
             {"coordinates", "x across the section from its centre line, y up from the top of the clay (m)"},
             {"assumptions", r.assumptions},
             {"cautions", results::cautions()}};
    add_title_block(out, s);
    return out;
}

namespace {
// What the planned top-up adds, in words.
std::string top_up_words(const results::StageRecord& r) {
    const auto& t = *r.top_up;
    if (!t.stage) return "the stages already place " + fixed(t.scheduled_height_m, 2) + " m, so no top-up is planned";
    return "the stages place " + fixed(t.scheduled_height_m, 2) + " m and a top-up lift (stage " +
           std::to_string(*t.stage + 1) + ", " +
           (t.rule == TopUpRule::with_last_lift ? "after the last lift" : "after the surcharge is removed") + ") places " +
           fixed(t.height_m, 2) + " m (its load " + fixed(t.load_kPa, 1) +
           " kPa: fill settled below the groundwater table weighs γ − γw, so the table's fill height, load / γ, is less)";
}
}  // namespace

std::string stage_summary(const results::StageRecord& r) {
    std::ostringstream o;
    o << "Each stage checked when its placement is complete, for drain " << r.drain << " in a " << to_string(r.pattern)
      << " pattern at " << fixed(r.spacing_m, 2) << " m, against a target factor of safety of "
      << fixed(r.plan.target_factor_of_safety, 2) << ": "
      << (results::stages_meet_target(r) ? "every stage meets it." : "a stage does not meet it.");
    if (r.finish)
        o << " To finish " << fixed(r.finish->finished_height_m, 2) << " m above the original ground after primary "
          << "settlement, " << fixed(r.finish->placed_height_m, 2) << " m of fill is placed in all (final settlement "
          << fixed(r.finish->final_settlement_m, 2) << " m, " << fixed(r.finish->submerged_m, 2)
          << " m of it below the groundwater table); " << top_up_words(r) << ".";
    return o.str();
}

std::string stages_table(const scenario::Scenario& s, const results::StageRecord& r) {
    std::ostringstream o;
    o << s.title << "\nstage stability: drain " << r.drain << ", " << to_string(r.pattern) << " pattern at "
      << fixed(r.spacing_m, 2) << " m (" << to_string(r.method) << "); target factor of safety "
      << fixed(r.plan.target_factor_of_safety, 2) << (r.plan.planned ? "; schedule planned to the earliest days" : "")
      << "\n\n"
      << text_table(stage_header(r), stage_rows(r), 1) << "\n";
    for (const StageCheck& c : r.plan.stages)
        o << stage_name(c) << ": critical circle centre (" << fixed(c.critical.circle.centre_x_m, 2) << ", "
          << fixed(c.critical.circle.centre_y_m, 2) << ") m, radius " << fixed(c.critical.circle.radius_m, 2)
          << " m, from x = " << fixed(c.critical.entry_x_m, 2) << " to " << fixed(c.critical.exit_x_m, 2) << " m\n";
    if (r.finish)
        o << "To finish " << fixed(r.finish->finished_height_m, 2) << " m above the original ground after primary settlement: "
          << "place " << fixed(r.finish->placed_height_m, 2) << " m of fill in all (final settlement "
          << fixed(r.finish->final_settlement_m, 2) << " m, of which " << fixed(r.finish->submerged_m, 2)
          << " m below the groundwater table weighing γ − γw; load " << fixed(r.finish->load_kPa, 1)
          << " kPa); " << top_up_words(r) << ". The top-up is loaded, settled and checked as a stage of its own.\n";
    o << (results::stages_meet_target(r) ? "Every stage meets the target factor of safety.\n"
                                         : "WARNING: a stage does not meet the target factor of safety.\n");
    o << plan_check_text(s, r);
    o << "\nAssumptions:\n";
    for (const auto& a : r.assumptions) o << "  - " << a << "\n";
    o << "\n" << results::caution_block();
    return o.str();
}

std::string stage_section_svg(const results::StageRecord& r) {
    const double width = 900.0, height = 420.0, margin = 50.0;
    double h_max = 0.0, x_max = 1.0;
    for (const StageCheck& c : r.plan.stages) {
        h_max = std::max(h_max, c.height_m);
        x_max = std::max(x_max, c.critical.exit_x_m);
    }
    x_max = std::max(x_max, fill_profile(r.section, std::max(r.final_height_m, h_max), h_max).toe_m()) + 0.2 * r.clay_thickness_m;
    double y_top = h_max;
    for (const StageCheck& c : r.plan.stages) y_top = std::max(y_top, std::min(c.critical.circle.centre_y_m, 2.0 * h_max + 2.0));
    const double y_bottom = -r.clay_thickness_m;
    // One scale in both directions, so that circles are drawn round.
    const double k = std::min((width - 2 * margin) / x_max, (height - 2 * margin - 30.0) / (y_top - y_bottom));
    const auto px = [&](double x) { return margin + k * x; };
    const auto py = [&](double y) { return margin + 30.0 + k * (y_top - y); };
    std::ostringstream o;
    o << "<svg xmlns=\"http://www.w3.org/2000/svg\" viewBox=\"0 0 " << width << ' ' << height << "\" width=\"" << width
      << "\" height=\"" << height << "\" role=\"img\" aria-label=\"Section and critical circles\" class=\"wg-chart\">\n"
      << "<title>Section and critical circles</title>\n<rect width=\"" << width << "\" height=\"" << height
      << "\" fill=\"#ffffff\"/>\n<g font-family=\"sans-serif\" font-size=\"11\" fill=\"#1d2a33\">\n"
      << "<text x=\"" << margin << "\" y=\"24\" font-size=\"15\" font-weight=\"bold\">Section (to scale, right half) and "
         "the critical circle of each stage</text>\n";
    double top = 0.0;
    for (std::size_t i = 0; i < r.layer_bottoms_m.size(); ++i) {
        const double bottom = r.layer_bottoms_m[i];
        o << "<rect x=\"" << num(px(0)) << "\" y=\"" << num(py(-top)) << "\" width=\"" << num(k * x_max) << "\" height=\""
          << num(k * (bottom - top)) << "\" fill=\"" << (i % 2 ? "#e7e1d6" : "#efe9dd") << "\" stroke=\"#9c8f78\"/>\n"
          << "<text x=\"" << num(px(x_max) - 6) << "\" y=\"" << num(py(-top) + 14) << "\" text-anchor=\"end\">layer " << i + 1
          << ", " << fixed(bottom - top, 2) << " m: "
          << escape_xml(i < r.layer_strengths.size() ? strength_text(r.layer_strengths[i]) : std::string()) << "</text>\n";
        top = bottom;
    }
    o << "<line x1=\"" << num(px(0)) << "\" y1=\"" << num(py(y_bottom)) << "\" x2=\"" << num(px(x_max)) << "\" y2=\""
      << num(py(y_bottom)) << "\" stroke=\"#1d2a33\" stroke-width=\"3\"/>\n";
    // The groundwater table and the section's dimensions, so the figure can be checked against the inputs.
    const double gwl = py(-r.groundwater_depth_m);
    o << "<line x1=\"" << num(px(0)) << "\" y1=\"" << num(gwl) << "\" x2=\"" << num(px(x_max)) << "\" y2=\"" << num(gwl)
      << "\" stroke=\"#2b6cb0\" stroke-width=\"1.5\" stroke-dasharray=\"8 4\"/>\n<text x=\"" << num(px(0) + 4)
      << "\" y=\"" << num(gwl - 4) << "\" fill=\"#2b6cb0\">groundwater " << fixed(r.groundwater_depth_m, 2)
      << " m below the original ground</text>\n";
    std::string dims = "crest width " + fixed(r.section.crest_width_m, 2) + " m, side slopes " +
                       fixed(r.section.side_slope_h_per_v, 2) + " H : 1 V, full fill height " + fixed(r.final_height_m, 2) + " m";
    for (const Berm& b : r.section.berms) dims += "; berm " + fixed(b.width_m, 2) + " m wide × " + fixed(b.height_m, 2) + " m high";
    o << "<text x=\"" << margin << "\" y=\"40\">" << escape_xml(dims) << "</text>\n";
    // The fills first (the highest, filled, under the others' outlines), then the circles over them.
    for (std::size_t i = r.plan.stages.size(); i-- > 0;) {
        const double h = r.plan.stages[i].height_m;  // a surcharge rises above the full height
        const FillProfile fill = fill_profile(r.section, std::max(r.final_height_m, h), h);
        o << "<polyline fill=\"" << (i + 1 == r.plan.stages.size() ? "#d9dcc8" : "none") << "\" stroke=\"#6b6f55\" points=\""
          << num(px(0)) << ',' << num(py(0));
        for (std::size_t k = 0; k < fill.x_m.size(); ++k) o << ' ' << num(px(fill.x_m[k])) << ',' << num(py(fill.y_m[k]));
        o << "\"/>\n";
    }
    for (std::size_t i = 0; i < r.plan.stages.size(); ++i) {
        const StageCheck& c = r.plan.stages[i];
        const char* colour = stage_colours[i % 5];
        const SlipCircle& circle = c.critical.circle;
        o << "<polyline fill=\"none\" stroke=\"" << colour << "\" stroke-width=\"2\" points=\"";
        for (int j = 0; j <= 60; ++j) {
            const double x = c.critical.entry_x_m + (c.critical.exit_x_m - c.critical.entry_x_m) * j / 60.0;
            const double dx = x - circle.centre_x_m;
            const double y = circle.centre_y_m - std::sqrt(std::max(0.0, circle.radius_m * circle.radius_m - dx * dx));
            o << num(px(std::max(x, 0.0))) << ',' << num(py(y)) << ' ';
        }
        o << "\"/>\n<text x=\"" << num(width - 250.0) << "\" y=\"" << num(60.0 + 16.0 * i) << "\" fill=\"" << colour << "\">"
          << escape_xml(stage_name(c)) << ": h = " << fixed(c.height_m, 2) << " m, F = " << fixed(c.factor_of_safety, 2)
          << "</text>\n";
    }
    o << "<text x=\"" << num(px(0) + 4) << "\" y=\"" << num(py(y_bottom) - 6) << "\">firm base</text>\n"
      << "<text x=\"" << num(px(0) + 4) << "\" y=\"" << num(height - 10.0) << "\">centre line at left; scale bar: "
      << "</text>\n<line x1=\"" << num(px(0) + 170) << "\" y1=\"" << num(height - 14.0) << "\" x2=\"" << num(px(0) + 170 + 5.0 * k)
      << "\" y2=\"" << num(height - 14.0) << "\" stroke=\"#1d2a33\" stroke-width=\"2\"/>\n<text x=\"" << num(px(0) + 176 + 5.0 * k)
      << "\" y=\"" << num(height - 10.0) << "\">5 m</text>\n</g>\n</svg>\n";
    return o.str();
}

std::vector<Chart> stage_charts(const results::StageRecord& r) {
    std::vector<Chart> charts;
    charts.push_back({"stages-section.svg",
                      "The section to scale (right half of a symmetric section) with each stage's fill and its critical "
                      "circle by Bishop's simplified method.",
                      stage_section_svg(r)});
    Series fs{"factor of safety", {}, {}, 0, false}, target{"target", {}, {}, 1, false};
    Series height{"fill height (m)", {}, {}, 0, false}, settlement{"settlement (m)", {}, {}, 2, false};
    for (const SafetyPoint& p : r.history) {
        const double day = units::seconds_to_days(p.time_s);
        fs.x.push_back(day);
        fs.y.push_back(p.factor_of_safety);
        height.x.push_back(day);
        height.y.push_back(p.height_m);
        if (p.settlement_m) {
            settlement.x.push_back(day);
            settlement.y.push_back(*p.settlement_m);
        }
    }
    if (!fs.x.empty()) {
        target.x = {fs.x.front(), fs.x.back()};
        target.y = {r.plan.target_factor_of_safety, r.plan.target_factor_of_safety};
        LineChart safety{"Factor of safety against time", "time (days)", "factor of safety", {fs, target}, false, 0.0,
                         std::nullopt, std::nullopt, ""};
        charts.push_back({"stages-safety.svg",
                          "The factor of safety of the critical circle against time: it drops as each stage is placed and "
                          "recovers as the clay consolidates under it.",
                          render(safety)});
        std::vector<Series> lines{height};
        if (!settlement.x.empty()) lines.push_back(settlement);
        LineChart fill{"Fill height and settlement against time", "time (days)", "m", lines, false, 0.0, std::nullopt,
                       std::nullopt, ""};
        charts.push_back({"stages-height.svg", "The fill placed and the settlement of the unit cell against time.", render(fill)});
    }
    return charts;
}

}  // namespace wickgrid::report
