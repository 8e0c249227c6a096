#include "report/design_report.hpp"

#include "results/bibliography.hpp"

#include <cmath>
#include <sstream>

#include "report/columns.hpp"
#include "wickgrid/geometry.hpp"
#include "wickgrid/names.hpp"
#include "wickgrid/units.hpp"
#include "wickgrid/version.hpp"

namespace wickgrid::report {

namespace {
using nlohmann::json;
double days(double seconds) { return units::seconds_to_days(seconds); }
json or_null(std::optional<double> v) { return v ? json(*v) : json(nullptr); }

std::string scientific(double v) {
    char buffer[32];
    std::snprintf(buffer, sizeof buffer, "%.3e", v);
    return buffer;
}

json string_array(const std::vector<std::string>& lines) {
    json a = json::array();
    for (const auto& l : lines) a.push_back(l);
    return a;
}

// Leading text columns of every design table.
std::vector<std::string> lead(const DesignRow& r) {
    return {r.drain, std::string(to_string(r.pattern)), r.rank ? std::to_string(*r.rank) : "-"};
}

std::string notes_under_table(const results::DesignRecord& record) {
    const Site& site = record.site();
    std::string text = "Degrees are at the deadline at the chosen spacing";
    if (site.loading) text += ", " + results::degree_reference_text(site);
    text += "; the time column is when the criterion (" + results::criterion_label(site) + ") is first met there. " +
            "μ mean is the depth mean of μ(z). '+' marks a limit capped at the largest spacing; '*' an infeasible "
            "row evaluated at the minimum spacing.";
    if (site.loading || site.method.method != CellMethod::closed_form)
        text += " Ur is the radial degree that Carrillo's rule needs to give U.";
    return text;
}
}  // namespace

json target_json(const Site& site) {
    json t{{"deadline_days", days(site.criterion.deadline_s)}, {"criterion", std::string(to_string(site.criterion.kind()))},
           {"label", results::criterion_text(site)}};
    if (const auto* r = site.criterion.residual()) {
        t["residual_settlement_mm"] = r->limit_m * 1000.0;
        t["service_days"] = r->service_s ? json(days(*r->service_s)) : json(nullptr);
    } else {
        t["degree"] = site.criterion.degree()->degree;
    }
    return t;
}

// The plan of the works as every command loads it: each stage (the top-up marked), the surcharge,
// and the fill height standing once each is placed (applied load / γ of the fill).
json load_plan_json(const scenario::Scenario& s) {
    const Site& site = s.site;
    json plan = json::array();
    if (!site.loading) return plan;
    const auto& h = *site.loading;
    const std::optional<double> gamma =
        site.embankment ? std::optional(site.embankment->fill_unit_weight_kN_per_m3) : s.fill_unit_weight_kN_per_m3;
    auto height = [&](double time_s) { return gamma ? json(h.applied_at_kPa(time_s) / *gamma) : json(nullptr); };
    for (std::size_t i = 0; i < h.stages.size(); ++i) {
        const auto& st = h.stages[i];
        const bool top_up = s.top_up && s.top_up->stage == i;
        plan.push_back({{"kind", top_up ? "top_up" : "stage"}, {"stage", i + 1}, {"start_day", days(st.start_s)},
                        {"end_day", days(st.end_s)}, {"load_kPa", st.pressure_kPa}, {"removal_day", nullptr},
                        {"height_m", height(st.end_s)}});
    }
    if (const auto& su = h.surcharge)
        plan.push_back({{"kind", "surcharge"}, {"stage", nullptr}, {"start_day", days(su->start_s)}, {"end_day", days(su->end_s)},
                        {"load_kPa", su->pressure_kPa}, {"removal_day", days(su->removal_s)}, {"height_m", height(su->end_s)}});
    return plan;
}

json design_json(const results::DesignRecord& record) {
    const Site& site = record.site();
    const auto columns = all_design_columns(site);
    json designs = json::array();
    for (const auto& r : record.result.rows) {
        json row{{"drain", r.drain},
                 {"pattern", std::string(to_string(r.pattern))},
                 {"feasible", r.feasible},
                 {"limited_by_max_spacing", r.limited_by_maximum},
                 {"rank", r.rank ? json(*r.rank) : json(nullptr)},
                 {"warnings", string_array(r.warnings)}};
        for (const auto& c : columns) row[c.key] = or_null(c.value(r));
        designs.push_back(std::move(row));
    }
    json schema = json::array();
    for (const auto& c : columns) schema.push_back({{"key", c.key}, {"heading", c.heading}, {"unit", c.unit}});
    const auto& s = *record.scenario;
    json out{{"schema", 1},
                {"wickgrid_version", version},
                {"title", s.title},
                {"scenario", s.file},
                {"target", target_json(site)},
                {"loading", site.loading ? "staged" : "instantaneous"},
                {"method", std::string(to_string(site.method.method))},
                {"degree_basis", site.loading && site.loading->stages.empty() ? "relative to the steady state under the vacuum held"
                                                                               : "relative to the final permanent load"},
                {"radial_theory", std::string(to_string(site.installation.theory))},
                {"smear_shape", std::string(to_string(site.installation.smear_shape))},
                {"ranking", std::string(to_string(record.result.ranking))},
                {"any_feasible", record.result.any_feasible()},
                {"columns", schema},
                {"designs", designs},
                {"warnings", string_array(record.warnings)},
                {"assumptions", string_array(record.assumptions)},
                {"cautions", string_array(results::cautions())}};
    json sublayers = json::array();
    for (const auto& r : record.sublayers)
        sublayers.push_back({{"layer", r.layer}, {"depth_m", r.depth_m}, {"thickness_m", r.thickness_m},
                             {"sigma_v0_kPa", r.sigma_v0_kPa ? json(*r.sigma_v0_kPa) : json(nullptr)},
                             {"delta_sigma_kPa", r.delta_sigma_kPa},
                             {"excess_pore_pressure_kPa", r.excess_pore_pressure_kPa ? json(*r.excess_pore_pressure_kPa) : json(nullptr)},
                             {"local_degree", r.local_degree ? json(*r.local_degree) : json(nullptr)},
                             {"final_settlement_mm", r.final_m * 1000.0}, {"settlement_at_deadline_mm", r.at_deadline_m * 1000.0}});
    out["sublayers"] = sublayers;
    out["load_plan"] = load_plan_json(s);
    out["calibration"] = s.calibration ? json{{"ch_factor", s.calibration->ch_factor},
                                              {"cv_factor", s.calibration->cv_factor},
                                              {"source", s.calibration->source ? json(*s.calibration->source) : json(nullptr)}}
                                       : json(nullptr);
    if (site.loading && site.loading->vacuum) {
        const auto& v = *site.loading->vacuum;
        out["vacuum"] = {{"pressure_kPa", v.pressure_kPa}, {"start_day", days(v.start_s)}, {"end_day", days(v.end_s)},
                         {"tip_ratio", v.tip_ratio}};
    } else {
        out["vacuum"] = nullptr;
    }
    add_title_block(out, s);
    return out;
}

namespace {
const std::vector<std::string> summary_keys{"scenario", "title", "scenario_sha256", "feasible", "drain", "pattern",
                                            "spacing_m", "degree", "time_to_target_days", "cost_per_hectare"};
}

json design_summary_row(const results::DesignRecord& record) {
    const auto& s = *record.scenario;
    json row{{"scenario", s.file}, {"title", s.title}, {"scenario_sha256", s.sha256}, {"feasible", record.result.any_feasible()}};
    const DesignRow* best = record.result.best();
    row["drain"] = best ? json(best->drain) : json(nullptr);
    row["pattern"] = best ? json(std::string(to_string(best->pattern))) : json(nullptr);
    row["spacing_m"] = best ? json(best->spacing_m) : json(nullptr);
    row["degree"] = best ? json(best->at_deadline.combined) : json(nullptr);
    row["time_to_target_days"] = best && best->time_to_target_s ? json(days(*best->time_to_target_s)) : json(nullptr);
    row["cost_per_hectare"] = best && best->cost_per_hectare ? json(*best->cost_per_hectare) : json(nullptr);
    // A summary handed on alone still carries the cautions.
    row["cautions"] = string_array(results::cautions());
    return row;
}

std::string design_summary_csv(const std::vector<json>& rows) {
    std::vector<std::vector<std::string>> cells;
    for (const auto& r : rows) {
        std::vector<std::string> line;
        for (const auto& k : summary_keys) {
            const json& v = r.at(k);
            line.push_back(v.is_null()      ? std::string()
                           : v.is_string()  ? v.get<std::string>()
                           : v.is_boolean() ? (v.get<bool>() ? "yes" : "no")
                                            : csv_number(v.get<double>()));
        }
        cells.push_back(line);
    }
    return csv_document(summary_keys, cells);
}

void add_title_block(json& out, const scenario::Scenario& s) {
    json project = json::object();
    for (const auto& f : results::title_block(s)) {
        if (f.project) project[f.key] = f.value;
        else out[f.key] = f.value;
    }
    out["project"] = std::move(project);
}

std::string title_block_markdown(const scenario::Scenario& s) {
    std::string out = "| | |\n|---|---|\n";
    for (const auto& f : results::title_block(s)) out += "| " + markdown_text(f.label) + " | " + markdown_text(f.value) + " |\n";
    return out;
}

std::vector<std::string> sublayer_header() {
    return {"layer", "depth (m)", "thickness (m)", "σ'v0 (kPa)", "Δσ' (kPa)", "u at the deadline (kPa)",
            "local degree at the deadline (%)", "final settlement (mm)", "settlement at the deadline (mm)"};
}

std::vector<std::vector<std::string>> sublayer_table_rows(const results::DesignRecord& record) {
    std::vector<std::vector<std::string>> rows;
    for (const auto& r : record.sublayers)
        rows.push_back({std::to_string(r.layer), fixed(r.depth_m, 2), fixed(r.thickness_m, 2),
                        r.sigma_v0_kPa ? fixed(*r.sigma_v0_kPa, 1) : "–",
                        fixed(r.delta_sigma_kPa, 1),
                        r.excess_pore_pressure_kPa ? fixed(*r.excess_pore_pressure_kPa, 1) : "–",
                        r.local_degree ? fixed(100.0 * *r.local_degree, 1) : "–", fixed(r.final_m * 1000.0, 1),
                        fixed(r.at_deadline_m * 1000.0, 1)});
    return rows;
}

std::string design_csv(const results::DesignRecord& record) {
    const auto columns = all_design_columns(record.site());
    std::vector<std::string> header{"drain", "pattern", "feasible", "rank"};
    for (const auto& c : columns) header.push_back(c.key);
    std::vector<std::vector<std::string>> rows;
    for (const auto& r : record.result.rows) {
        std::vector<std::string> row{r.drain, std::string(to_string(r.pattern)), r.feasible ? "true" : "false",
                                     r.rank ? std::to_string(*r.rank) : ""};
        for (const auto& c : columns) row.push_back(csv_number(c.value(r)));
        rows.push_back(std::move(row));
    }
    return csv_document(header, rows);
}

namespace {
std::vector<std::string> table_header(const std::vector<Column>& columns) {
    std::vector<std::string> h{"drain", "pattern", "rank"};
    for (const auto& c : columns) h.push_back(c.heading_with_unit());
    return h;
}
std::vector<std::vector<std::string>> table_rows(const results::DesignRecord& record, const std::vector<Column>& columns) {
    std::vector<std::vector<std::string>> rows;
    for (const auto& r : record.result.rows) {
        auto row = lead(r);
        for (const auto& c : columns) row.push_back(c.shown(r));
        rows.push_back(std::move(row));
    }
    return rows;
}
}  // namespace

std::string design_table(const results::DesignRecord& record) {
    const Site& site = record.site();
    const auto columns = shown_design_columns(record);
    std::ostringstream out;
    out << record.scenario->title << "\n";
    out << "criterion: " << results::criterion_text(site) << (site.loading ? "; " + results::loading_label(site) : std::string()) << "; method "
        << to_string(site.method.method) << "; spacings " << fixed(site.range.bounds.min_m, 2) << "–"
        << fixed(site.range.bounds.max_m, 2) << " m in steps of " << fixed(site.range.increment_m, 2) << " m\n\n";
    out << text_table(table_header(columns), table_rows(record, columns), 2);
    out << "\n" << notes_under_table(record) << "\n";
    for (const auto& w : record.warnings) out << "WARNING: " << w << "\n";
    out << results::recommendation(record) << "\n";
    out << "\n" << results::caution_block();
    return out.str();
}

// A layer's undrained strength as the file gives it, with the level its su_top refers to.
std::string strength_text(const UndrainedStrength& st) {
    if (st.su_top_kPa)
        return "su = " + fixed(*st.su_top_kPa, 1) + " kPa at the top of the layer " +
               (st.su_gradient_kPa_per_m && *st.su_gradient_kPa_per_m != 0.0
                    ? (*st.su_gradient_kPa_per_m > 0.0 ? "+ " : "− ") + fixed(std::abs(*st.su_gradient_kPa_per_m), 2) +
                          " kPa/m below it"
                    : std::string("(constant)")) +
               ", gain Δsu/Δσ′v = " + fixed(st.gain_ratio, 2);
    return "su = S·σ′v·OCR^m with S = " + fixed(*st.su_ratio, 3) + ", m = " + fixed(st.strength_exponent, 2) +
           " (Ladd & Foott 1974)";
}

// The section, its fill, the stability target and the finished level with the top-up planned for it.
void section_rows(const results::DesignRecord& record, std::vector<std::pair<std::string, std::string>>& rows) {
    const Site& site = record.site();
    if (!site.embankment) return;
    const EmbankmentSection& e = *site.embankment;
    const auto height = final_fill_height_m(site);
    rows.emplace_back("embankment section", "crest width " + fixed(e.crest_width_m, 2) + " m, side slopes " +
                                                fixed(e.side_slope_h_per_v, 2) + " horizontal to 1 vertical" +
                                                (height ? ", fill height " + fixed(*height, 2) + " m" : std::string()));
    for (std::size_t i = 0; i < e.berms.size(); ++i)
        rows.emplace_back("berm " + std::to_string(i + 1), fixed(e.berms[i].width_m, 2) + " m wide, " +
                                                               fixed(e.berms[i].height_m, 2) +
                                                               " m high, on each side (outwards from the crest)");
    rows.emplace_back("fill strength", "φ′ = " + fixed(e.fill_friction_angle_deg, 1) + "°, c′ = " +
                                           fixed(e.fill_cohesion_kPa, 1) + " kPa, γ = " +
                                           fixed(e.fill_unit_weight_kN_per_m3, 1) + " kN/m³");
    if (e.reinforcement)
        rows.emplace_back("basal reinforcement", fixed(e.reinforcement->tensile_force_kN_per_m, 1) +
                                                     " kN/m design tensile force at the base of the fill");
    if (e.tension_crack)
        rows.emplace_back("tension crack", fixed(e.tension_crack->depth_m, 2) + " m deep in the fill, " +
                                               (e.tension_crack->water_filled ? "water-filled" : "dry"));
    rows.emplace_back("target factor of safety", fixed(e.target_factor_of_safety, 2) + " for every stage");
    const auto& plan = record.scenario->top_up;
    if (e.finished_height_m && plan) {
        std::string text = fixed(*e.finished_height_m, 2) + " m above the original ground once primary settlement is over: " +
                           fixed(plan->finish.placed_height_m, 2) + " m of fill placed in all for a final settlement of " +
                           fixed(plan->finish.final_settlement_m * 1000.0, 0) + " mm";
        if (plan->stage)
            text += "; top-up " + fixed(plan->height_m, 2) + " m (" + fixed(plan->load_kPa, 1) + " kPa) as load stage " +
                    std::to_string(*plan->stage + 1) + " from day " +
                    fixed(days(site.loading->stages[*plan->stage].start_s), 0) +
                    (plan->rule == TopUpRule::with_last_lift ? ", placed with the last lift"
                                                             : ", placed after the surcharge is removed");
        else
            text += "; no top-up needed beyond the stages";
        rows.emplace_back("finished level", text);
    }
}

std::vector<std::pair<std::string, std::string>> input_rows(const results::DesignRecord& record) {
    const Site& site = record.site();
    const auto& s = *record.scenario;
    const Ground& g = site.ground;
    const Installation& in = site.installation;
    std::vector<std::pair<std::string, std::string>> rows;
    rows.emplace_back("scenario file", s.file);
    rows.emplace_back("design criterion", results::criterion_text(site));
    rows.emplace_back("deadline from the start of loading", fixed(days(site.criterion.deadline_s), 0) + " days");
    rows.emplace_back("clay thickness and vertical drainage",
                      fixed(g.thickness_m, 2) + " m, " + std::string(to_string(g.drainage)));
    if (g.cv_m2_per_s) rows.emplace_back("cv of the clay", fixed(units::per_second_to_per_year(*g.cv_m2_per_s), 3) + " m²/year");
    if (g.ch_m2_per_s) rows.emplace_back("ch of the clay", fixed(units::per_second_to_per_year(*g.ch_m2_per_s), 3) + " m²/year");
    if (g.kh_source == KhSource::given && g.kh_m_per_s) rows.emplace_back("kh of the clay", scientific(*g.kh_m_per_s) + " m/s");
    if (g.kh_source == KhSource::from_ch_and_mv && g.ch_m2_per_s)
        rows.emplace_back("kh of the clay", scientific(g.uniform_clay().kh_m_per_s) + " m/s (from ch·mv·γw)");
    if (g.mv_m2_per_kN) rows.emplace_back("mv of the clay", scientific(*g.mv_m2_per_kN) + " m²/kN");
    rows.emplace_back("drain length and outlets", fixed(in.drain_length_m, 2) + " m, " + std::string(to_string(in.outlets)));
    rows.emplace_back("mandrel equivalent diameter dm", fixed(in.mandrel_diameter_m * 1000.0, 1) + " mm");
    rows.emplace_back("smear zone", "ds = " + fixed(in.smear_diameter_ratio, 2) + " × dm = " +
                                        fixed(in.smear_diameter_m() * 1000.0, 1) + " mm, kh/ks = " +
                                        fixed(in.smear_permeability_ratio, 2) + ", profile " +
                                        std::string(to_string(in.smear_shape)));
    rows.emplace_back("method", std::string(to_string(site.method.method)) + ", radial theory " +
                                    std::string(to_string(in.theory)) +
                                    (site.method.method == CellMethod::numerical
                                         ? ", mesh " + std::to_string(site.method.mesh.radial_cells) + " × " +
                                               std::to_string(site.method.mesh.vertical_cells) + " cells"
                                     : site.method.method == CellMethod::layered
                                         ? ", " + std::to_string(site.method.series_terms) + " terms"
                                         : std::string()));
    if (const auto& c = s.calibration)
        rows.emplace_back("calibration from monitoring", "ch × " + fixed(c->ch_factor, 3) + ", cv × " + fixed(c->cv_factor, 3) +
                                                             " on every layer (the ch and cv in this table include it)" +
                                                             (c->source ? "; " + *c->source : std::string()));
    rows.emplace_back("spacings considered", fixed(site.range.bounds.min_m, 2) + "–" + fixed(site.range.bounds.max_m, 2) +
                                                 " m, rounded down to " + fixed(site.range.increment_m, 2) + " m");
    for (std::size_t i = 0; i < site.products.size(); ++i) {
        const auto& p = site.products[i];
        const auto& d = s.drains[i];
        const std::string size = d.width_m && d.thickness_m ? fixed(*d.width_m * 1000.0, 0) + " × " +
                                                                  fixed(*d.thickness_m * 1000.0, 1) + " mm, "
                                                            : std::string();
        rows.emplace_back("drain " + p.name, size + "dw = " + fixed(p.equivalent_diameter_m * 1000.0, 1) + " mm (" +
                                                 (d.method ? std::string(to_string(*d.method)) : std::string("given")) +
                                                 "), qw = " +
                                                 fixed(units::per_second_to_per_year(p.discharge_capacity_m3_per_s), 1) +
                                                 " m³/year" +
                                                 (p.cost_per_m ? ", cost " + fixed(*p.cost_per_m, 2) + " per m" : std::string()));
    }
    rows.emplace_back("influence diameter De", fixed(influence_diameter_factor(Pattern::triangular), 3) +
                                                   " × spacing (triangular), " +
                                                   fixed(influence_diameter_factor(Pattern::square), 3) +
                                                   " × spacing (square): equal area, Barron (1948)");
    rows.emplace_back("units of time and water", "1 year = " + fixed(units::days_per_year, 2) + " days, 1 day = " +
                                                     fixed(units::seconds_per_day, 0) + " s; γw = " +
                                                     fixed(units::gamma_w_kN_per_m3, 2) + " kN/m³");
    if (s.fill_unit_weight_kN_per_m3)
        rows.emplace_back("fill unit weight", fixed(*s.fill_unit_weight_kN_per_m3, 1) + " kN/m³");
    if (site.loading) {
        for (std::size_t i = 0; i < site.loading->stages.size(); ++i) {
            const auto& st = site.loading->stages[i];
            rows.emplace_back("load stage " + std::to_string(i + 1), fixed(st.pressure_kPa, 1) + " kPa, day " +
                                                                         fixed(days(st.start_s), 0) + " to " +
                                                                         fixed(days(st.end_s), 0));
        }
        if (const auto& su = site.loading->surcharge)
            rows.emplace_back("surcharge", fixed(su->pressure_kPa, 1) + " kPa, day " + fixed(days(su->start_s), 0) + " to " +
                                               fixed(days(su->end_s), 0) + ", removed day " + fixed(days(su->removal_s), 0));
        if (const auto& v = site.loading->vacuum)
            rows.emplace_back("vacuum", fixed(v->pressure_kPa, 1) + " kPa at the drain head, " + fixed(v->tip_ratio, 2) +
                                            " of it at the tip, day " + fixed(days(v->start_s), 0) + " to " +
                                            fixed(days(v->end_s), 0));
    }
    section_rows(record, rows);
    if (g.profile) {
        rows.emplace_back("groundwater", fixed(g.profile->groundwater_depth_m, 2) + " m below the top of the clay");
        for (std::size_t i = 0; i < g.profile->layers.size(); ++i) {
            const auto& l = g.profile->layers[i];
            std::string text = fixed(l.thickness_m, 2) + " m, γ = " + fixed(l.unit_weight_kN_per_m3, 1) + " kN/m³, ";
            if (l.mv_m2_per_kN) text += "mv = " + scientific(*l.mv_m2_per_kN) + " m²/kN";
            else
                text += "e0 = " + fixed(*l.e0, 2) + ", Cc = " + fixed(*l.cc, 3) + ", Cr = " + fixed(*l.cr, 3) + ", " +
                        (l.ocr       ? "OCR = " + fixed(*l.ocr, 2)
                         : l.pop_kPa ? "POP = " + fixed(*l.pop_kPa, 1) + " kPa (σ'p = σ'v0 + POP)"
                                     : "σ'p = " + fixed(*l.preconsolidation_kPa, 1) + " kPa");
            if (l.cv_m2_per_s) text += ", cv = " + fixed(units::per_second_to_per_year(*l.cv_m2_per_s), 3) + " m²/year";
            if (l.ch_m2_per_s) text += ", ch = " + fixed(units::per_second_to_per_year(*l.ch_m2_per_s), 3) + " m²/year";
            if (l.c_alpha) {
                text += ", Cα = " + fixed(*l.c_alpha, 4) + " (Δe per log cycle of time";
                text += l.cc && *l.cc > 0.0 ? ", Cα/Cc = " + fixed(*l.c_alpha / *l.cc, 3) + ")" : std::string(")");
            }
            if (l.strength) text += "; " + strength_text(*l.strength);
            if (l.effective_strength)
                text += "; c′ = " + fixed(l.effective_strength->c_prime_kPa, 1) + " kPa, φ′ = " +
                        fixed(l.effective_strength->phi_prime_deg, 1) + "° (the effective-stress stage check)";
            if (i < record.cell_layers.size()) {
                const auto& c = record.cell_layers[i];
                text += "; as the cell model takes them mv = " + scientific(c.mv_m2_per_kN) + " m²/kN, kv = " +
                        scientific(c.kv_m_per_s) + " m/s, kh = " + scientific(c.kh_m_per_s) + " m/s";
            }
            rows.emplace_back("clay layer " + std::to_string(i + 1), text);
        }
    }
    if (const auto& sch = s.schedule) {
        // The scheme search's own inputs (the report's scheme-search section).
        std::string heights;
        for (const double h : sch->surcharge_heights_m) heights += (heights.empty() ? "" : ", ") + fixed(h, 2);
        rows.emplace_back("scheme search: surcharge heights",
                          heights.empty() ? "the scenario's own surcharge, or none" : heights + " m");
        const auto cost = [](const std::optional<double>& c, const char* unit) {
            return c ? fixed(*c, 2) + " " + unit : std::string("not counted");
        };
        const ScheduleCosts& c = sch->costs;
        rows.emplace_back("scheme search: costs", "fill " + cost(c.fill_per_m3, "per m³") + "; surcharge placed " +
                                                      cost(c.surcharge_per_m3, "per m³") + ", removed " +
                                                      cost(c.surcharge_removal_per_m3, "per m³") + "; programme " +
                                                      cost(c.per_hectare_per_day, "per hectare per day"));
    }
    return rows;
}

std::string design_markdown(const results::DesignRecord& record, const std::string& extra_sections) {
    const auto& s = *record.scenario;
    const auto columns = shown_design_columns(record);
    const auto md = markdown_text;  // every piece of text is escaped: names cannot break the note
    std::ostringstream out;
    out << "# Vertical drain design note: " << md(s.title) << "\n\n";
    out << title_block_markdown(s) << "\n";
    out << "## Result\n\n" << md(results::recommendation(record)) << "\n\n";
    for (const auto& w : record.warnings) out << "**Warning:** " << md(w) << "\n\n";
    out << "## Inputs\n\n| quantity | value |\n|---|---|\n";
    for (const auto& [k, v] : input_rows(record)) out << "| " << md(k) << " | " << md(v) << " |\n";
    out << "\n## Results\n\n";
    const auto header = table_header(columns);
    out << "|";
    for (const auto& h : header) out << ' ' << md(h) << " |";
    out << "\n|";
    for (std::size_t i = 0; i < header.size(); ++i) out << "---|";
    out << '\n';
    for (const auto& row : table_rows(record, columns)) {
        out << "|";
        for (const auto& cell : row) out << ' ' << md(cell) << " |";
        out << '\n';
    }
    out << "\n" << md(notes_under_table(record)) << " Ranked by "
        << (record.result.ranking == RankingBasis::cost_per_hectare ? "cost per hectare" : "drain metres per hectare")
        << ".\n\n";
    if (!record.sublayers.empty()) {
        out << "## Settlement by sub-layer\n\nFor the recommended design (the first row when none meets the criterion), "
               "under the final permanent load; u and the local degree at the slice centre at the deadline show how "
               "consolidation is spread over depth (– where the method reports depth averages only); the settlement "
               "at the deadline applies the design's average degree, so that the slices add up to the design row.\n\n|";
        for (const auto& h : sublayer_header()) out << ' ' << md(h) << " |";
        out << "\n|";
        for (std::size_t i = 0; i < sublayer_header().size(); ++i) out << "---|";
        out << "\n";
        for (const auto& row : sublayer_table_rows(record)) {
            out << "|";
            for (const auto& cell : row) out << ' ' << md(cell) << " |";
            out << "\n";
        }
        out << "\n";
    }
    out << extra_sections << "## Method and sources\n\n";
    for (const auto& line : record.method_notes) out << "- " << md(line) << "\n";
    out << "\n## References\n\n";
    for (const auto& key : results::reference_keys(record)) out << "- " << md(results::reference(key).text) << "\n";
    out << "\n## Assumptions\n\n";
    for (const auto& line : record.assumptions) out << "- " << md(line) << "\n";
    out << "\n## Cautions\n\n";
    for (const auto& c : results::cautions()) out << "- " << md(c) << "\n";
    return out.str();
}

json curve_json(const Site& site, const results::Curve& curve) {
    json points = json::array();
    for (const auto& p : curve.points)
        points.push_back({{"time_days", days(p.time_s)},
                          {"degree_vertical", p.degrees.vertical},
                          {"degree_radial", p.degrees.radial},
                          {"degree", p.degrees.combined},
                          {"settlement_mm", p.settlement_m ? json(*p.settlement_m * 1000.0) : json(nullptr)}});
    for (std::size_t i = 0; i < curve.over_depth.size(); ++i) {
        json local = json::array(), excess = json::array();
        for (const auto& d : curve.over_depth[i]) {
            local.push_back(d.local_degree);
            excess.push_back(d.excess_pore_pressure_kPa);
        }
        points[i]["local_degree"] = local;
        points[i]["excess_pore_pressure_kPa"] = excess;
    }
    json out{{"drain", curve.drain},
                {"pattern", std::string(to_string(curve.pattern))},
                {"spacing_m", curve.spacing_m},
                {"method", std::string(to_string(curve.method))},
                {"target", target_json(site)},
                {"degree_radial_basis", "the radial degree that Carrillo's rule needs to give U"},
                {"points", points},
                {"cautions", string_array(results::cautions())}};
    if (!curve.depths_m.empty()) out["depths_m"] = curve.depths_m;
    return out;
}

std::string curve_csv(const results::Curve& curve) {
    const bool settle = !curve.points.empty() && curve.points.front().settlement_m.has_value();
    std::vector<std::string> header{"time_days", "degree_vertical", "degree_radial", "degree"};
    if (settle) header.push_back("settlement_mm");
    for (const double z : curve.depths_m) {
        header.push_back("local_degree_at_" + csv_number(z) + "_m");
        header.push_back("excess_pore_pressure_kPa_at_" + csv_number(z) + "_m");
    }
    std::vector<std::vector<std::string>> rows;
    for (std::size_t i = 0; i < curve.points.size(); ++i) {
        const auto& p = curve.points[i];
        rows.push_back({csv_number(days(p.time_s)), csv_number(p.degrees.vertical), csv_number(p.degrees.radial),
                        csv_number(p.degrees.combined)});
        if (settle) rows.back().push_back(csv_number(*p.settlement_m * 1000.0));
        if (i < curve.over_depth.size())
            for (const auto& d : curve.over_depth[i]) {
                rows.back().push_back(csv_number(d.local_degree));
                rows.back().push_back(csv_number(d.excess_pore_pressure_kPa));
            }
    }
    return csv_document(header, rows);
}

std::string curve_table(const Site& site, const results::Curve& curve) {
    std::vector<std::vector<std::string>> rows;
    const bool settle = !curve.points.empty() && curve.points.front().settlement_m.has_value();
    for (const auto& p : curve.points) {
        rows.push_back({fixed(days(p.time_s), 1), fixed(100.0 * p.degrees.vertical, 2), fixed(100.0 * p.degrees.radial, 2),
                        fixed(100.0 * p.degrees.combined, 2)});
        if (settle) rows.back().push_back(fixed(*p.settlement_m * 1000.0, 1));
    }
    std::ostringstream out;
    out << "drain " << curve.drain << ", " << to_string(curve.pattern) << " pattern at " << fixed(curve.spacing_m, 3)
        << " m; method " << to_string(curve.method) << "; criterion " << results::criterion_text(site) << "\n\n";
    std::vector<std::string> header{"day", "Uv %", "Ur %", "U %"};
    if (settle) header.push_back("settlement mm");
    out << text_table(header, rows, 0);
    if (site.loading || curve.method != CellMethod::closed_form)
        out << "\nDegrees are relative to the final permanent load; Ur is the radial degree that Carrillo's rule needs "
               "to give U.\n";
    if (!curve.depths_m.empty()) {
        // Degree over depth: local degree % and excess pore pressure (kPa) at each depth asked.
        std::vector<std::string> depth_header{"day"};
        for (const double z : curve.depths_m) depth_header.push_back("U(" + fixed(z, 2) + " m) %");
        for (const double z : curve.depths_m) depth_header.push_back("u(" + fixed(z, 2) + " m) kPa");
        std::vector<std::vector<std::string>> depth_rows;
        for (std::size_t i = 0; i < curve.over_depth.size(); ++i) {
            depth_rows.push_back({fixed(days(curve.points[i].time_s), 1)});
            for (const auto& d : curve.over_depth[i]) depth_rows.back().push_back(fixed(100.0 * d.local_degree, 2));
            for (const auto& d : curve.over_depth[i]) depth_rows.back().push_back(fixed(d.excess_pore_pressure_kPa, 2));
        }
        out << "\nDegree over depth (depth below the top of the clay): the local degree U(z) and the excess pore "
               "pressure u(z) averaged over the unit cell at that depth, by the linear model: after a surcharge or "
               "vacuum is removed u may fall below zero where the clay swells back (the settlement column holds "
               "the settlement instead).\n\n"
            << text_table(depth_header, depth_rows, 0);
    }
    out << "\n" << results::caution_block();
    return out.str();
}

}  // namespace wickgrid::report
