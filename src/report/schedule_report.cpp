#include "report/schedule_report.hpp"

#include <algorithm>
#include <map>
#include <sstream>

#include "report/design_report.hpp"
#include "report/format.hpp"
#include "report/svg_chart.hpp"
#include "results/design_record.hpp"
#include "wickgrid/names.hpp"
#include "wickgrid/units.hpp"

namespace wickgrid::report {

using nlohmann::json;

namespace {
json optional_day(const std::optional<double>& s) { return s ? json(units::seconds_to_days(*s)) : json(nullptr); }

json scheme_json(const Scheme& s) {
    json starts = json::array();
    for (const double t : s.stage_start_s) starts.push_back(units::seconds_to_days(t));
    return {{"drain", s.drain},
            {"pattern", std::string(to_string(s.pattern))},
            {"spacing_m", s.spacing_m},
            {"surcharge_height_m", s.surcharge_height_m},
            {"stage_start_days", starts},
            {"surcharge_removal_day", s.schedule.surcharge ? optional_day(s.schedule.surcharge->removal_s) : json(nullptr)},
            {"finish_day", optional_day(s.finish_s)},
            {"cost_per_hectare", s.cost_per_hectare ? json(*s.cost_per_hectare) : json(nullptr)},
            {"cost_parts_per_hectare", {{"drains", s.cost_parts.drains}, {"fill", s.cost_parts.fill},
                                        {"surcharge", s.cost_parts.surcharge}, {"programme", s.cost_parts.programme ? json(*s.cost_parts.programme) : json(nullptr)}}},
            {"meets_criterion", s.meets_criterion},
            {"degree_at_deadline", s.degree_at_deadline},
            {"residual_settlement_mm", s.residual_m ? json(*s.residual_m * 1000.0) : json(nullptr)},
            {"min_factor_of_safety", s.min_factor_of_safety},
            {"every_stage_stands", s.every_stage_stands},
            {"on_front", s.on_front},
            {"excluded_because", s.excluded_because == SchemeExclusion::none
                                     ? json(nullptr)
                                     : json(std::string(name_of(scheme_exclusion_names, s.excluded_because)))}};
}

std::string finish_text(const Scheme& s) { return s.finish_s ? fixed(units::seconds_to_days(*s.finish_s), 1) : "-"; }

std::string starts_text(const Scheme& s) {
    std::string out;
    for (const double t : s.stage_start_s) out += (out.empty() ? "" : " ") + fixed(units::seconds_to_days(t), 1);
    return out;
}

// The criterion's own figure at the deadline: the degree, or the residual settlement.
std::vector<std::string> scheme_row(const Scheme& s) {
    return {s.drain, std::string(to_string(s.pattern)), fixed(s.spacing_m, 2), fixed(s.surcharge_height_m, 2),
            starts_text(s), finish_text(s), s.cost_per_hectare ? fixed(*s.cost_per_hectare, 0) : "-",
            fixed(s.min_factor_of_safety, 3),
            s.residual_m ? fixed(*s.residual_m * 1000.0, 1) : fixed(100.0 * s.degree_at_deadline, 1)};
}

std::vector<std::string> front_header(const Criterion& criterion) {
    return {"drain", "pattern", "spacing (m)", "surcharge (m)", "start days (lifts, surcharge)", "finish day",
            "cost/ha", "min FS", criterion.residual() ? "residual at deadline (mm)" : "U at deadline (%)"};
}

std::string exclusion_words(SchemeExclusion e) {
    switch (e) {
        case SchemeExclusion::stage_below_target: return "a stage cannot reach the target factor of safety at any wait";
        case SchemeExclusion::criterion_missed: return "the planned schedule misses the criterion by the deadline";
        case SchemeExclusion::beaten: return "another scheme is no dearer and no later";
        case SchemeExclusion::none: break;
    }
    return "on the front";
}

// One scheme in words: drain, pattern, spacing, surcharge, finish day and cost (feasible schemes).
std::string scheme_words(const Scheme& x) {
    return x.drain + ", " + std::string(to_string(x.pattern)) + " at " + fixed(x.spacing_m, 2) + " m, surcharge " +
           fixed(x.surcharge_height_m, 2) + " m, finish day " + finish_text(x) + ", " + fixed(*x.cost_per_hectare, 0) +
           " per hectare";
}

// How many schemes each condition left off the front.
std::map<SchemeExclusion, std::size_t> left_out(const ScheduleResult& r) {
    std::map<SchemeExclusion, std::size_t> counts;
    for (const Scheme& x : r.schemes)
        if (!x.on_front) ++counts[x.excluded_because];
    return counts;
}
}  // namespace

const std::vector<std::string>& schedule_assumptions() {
    static const std::vector<std::string> a{
        "Each lift (the surcharge and the finished-level top-up included) starts on the earliest day that keeps the "
        "target factor of safety once it is placed, as `stages --plan` plans it; the criterion is then asked under "
        "the planned days by the design's own cell model.",
        "A surcharge height the scenario does not place goes on after the last lift at that lift's rate and stays to "
        "the deadline; the scenario's own surcharge keeps its days, moved with the plan.",
        "Costs per hectare of the fill's plan area: drains (drain metres × cost per metre), and where the scenario "
        "gives them fill and surcharge per m³ placed and removed and the programme per hectare per day to the finish "
        "day; side slopes are not counted.",
        "The finish day is the latest of the last placement's end, the surcharge's removal and the day the criterion "
        "is first met. A scheme is feasible when every stage stands and the criterion holds by the deadline with the "
        "works complete.",
        "Stability is checked on circular slips only (Bishop's simplified method); non-circular and three-dimensional "
        "failure need a separate analysis."};
    return a;
}

std::vector<std::string> schedule_front_header(const Criterion& criterion) { return front_header(criterion); }

std::vector<std::vector<std::string>> schedule_front_rows(const ScheduleResult& r) {
    std::vector<std::vector<std::string>> rows;
    for (const Scheme& x : r.schemes)
        if (x.on_front) rows.push_back(scheme_row(x));
    return rows;
}

std::string schedule_summary(const ScheduleResult& r) {
    std::ostringstream o;
    o << r.schemes.size() << " schemes searched (drain × pattern × surcharge height × spacing, each lift on its earliest "
      << "safe day). ";
    if (!r.cheapest) {
        o << "None stands at every stage and meets the criterion by the deadline.";
    } else {
        o << "Cheapest: " << scheme_words(r.schemes[*r.cheapest]) << ". Soonest: " << scheme_words(r.schemes[*r.soonest])
          << ".";
    }
    for (const auto& [why, n] : left_out(r)) o << " " << n << " left out: " << exclusion_words(why) << ".";
    return o.str();
}

json schedule_json(const scenario::Scenario& s, const ScheduleResult& r) {
    json schemes = json::array();
    for (const Scheme& x : r.schemes) schemes.push_back(scheme_json(x));
    json out{{"scenario", s.file},
             {"deadline_day", units::seconds_to_days(s.site.criterion.deadline_s)},
             {"target_factor_of_safety", s.site.embankment->target_factor_of_safety},
             {"schemes", schemes},
             {"cheapest", r.cheapest ? scheme_json(r.schemes[*r.cheapest]) : json(nullptr)},
             {"soonest", r.soonest ? scheme_json(r.schemes[*r.soonest]) : json(nullptr)},
             {"assumptions", schedule_assumptions()},
             {"cautions", results::cautions()}};
    add_title_block(out, s);
    return out;
}

std::string schedule_table(const scenario::Scenario& s, const ScheduleResult& r) {
    std::ostringstream o;
    o << s.title << "\nscheme search: " << r.schemes.size() << " schemes (drain × pattern × surcharge × spacing), "
      << "target factor of safety " << fixed(s.site.embankment->target_factor_of_safety, 2) << ", deadline day "
      << fixed(units::seconds_to_days(s.site.criterion.deadline_s), 0) << "\n\n";
    const auto front = schedule_front_rows(r);
    if (front.empty()) {
        o << "No scheme stands at every stage and meets the criterion by the deadline.\n";
    } else {
        o << "Cost–finish front (no other scheme is both cheaper and sooner):\n"
          << text_table(front_header(s.site.criterion), front, 2) << "\n";
        o << "Cheapest: " << scheme_words(r.schemes[*r.cheapest]) << ".\n"
          << "Soonest: " << scheme_words(r.schemes[*r.soonest]) << ".\n";
    }
    const auto counts = left_out(r);
    if (!counts.empty()) o << "\nLeft out:\n";
    for (const auto& [why, n] : counts) o << "  " << n << " scheme" << (n == 1 ? "" : "s") << ": " << exclusion_words(why) << "\n";
    o << "\nAssumptions:\n";
    for (const auto& a : schedule_assumptions()) o << "  - " << a << "\n";
    o << "\n" << results::caution_block();
    return o.str();
}

Chart schedule_chart(const ScheduleResult& r) {
    LineChart chart;
    chart.title = "Schemes: cost against finish day";
    chart.x_label = "finish day";
    chart.y_label = "cost per hectare";
    Series all{"feasible schemes", {}, {}, 1, true};
    Series front{"cost–finish front", {}, {}, 0, false};
    std::vector<const Scheme*> on_front;
    for (const Scheme& x : r.schemes) {
        if (x.excluded_because != SchemeExclusion::none && x.excluded_because != SchemeExclusion::beaten) continue;
        all.x.push_back(units::seconds_to_days(*x.finish_s));
        all.y.push_back(*x.cost_per_hectare);
        if (x.on_front) on_front.push_back(&x);
    }
    std::sort(on_front.begin(), on_front.end(), [](const Scheme* a, const Scheme* b) { return *a->finish_s < *b->finish_s; });
    for (const Scheme* x : on_front) {
        front.x.push_back(units::seconds_to_days(*x->finish_s));
        front.y.push_back(*x->cost_per_hectare);
    }
    if (!all.x.empty()) chart.series.push_back(all);
    if (!front.x.empty()) chart.series.push_back(front);
    return {"schedule-front.svg", "Cost per hectare against finish day of every feasible scheme; the front joined.", render(chart)};
}

}  // namespace wickgrid::report
