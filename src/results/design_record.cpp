// Assembles the result model of a design: the engine is asked here, once; writers only format.
#include "results/design_record.hpp"

#include <algorithm>
#include <cmath>
#include <cstdio>

#include "report/format.hpp"
#include "wickgrid/errors.hpp"
#include "wickgrid/names.hpp"
#include "wickgrid/numerical.hpp"
#include "wickgrid/permeability.hpp"
#include "wickgrid/settlement.hpp"
#include "wickgrid/units.hpp"
#include "wickgrid/version.hpp"

namespace wickgrid::results {

namespace {
using report::fixed;  // one number format for every piece of text
double days(double s) { return units::seconds_to_days(s); }

// Chart times: evenly or log-spaced over 1.5 × (3 × on a log axis) the deadline, with the
// deadline itself among them so that the charts pass through the table's values.
std::vector<double> chart_times(double deadline_s, bool log_time) {
    std::vector<double> t;
    const int n = defaults::chart_points - 1;
    if (log_time) {
        const double first = units::seconds_per_day, last = 3.0 * deadline_s;
        for (int i = 0; i <= n; ++i) t.push_back(first * std::pow(last / first, static_cast<double>(i) / n));
    } else {
        for (int i = 0; i <= n; ++i) t.push_back(defaults::curve_span_of_deadline * deadline_s * i / n);
    }
    t.push_back(deadline_s);
    std::sort(t.begin(), t.end());
    t.erase(std::unique(t.begin(), t.end()), t.end());
    return t;
}

// The rows the charts follow: the recommended product (or the first) in every pattern.
std::vector<const DesignRow*> chart_rows(const DesignResult& result) {
    const DesignRow* best = result.best();
    const std::string& drain = best ? best->drain : result.rows.front().drain;
    std::vector<const DesignRow*> rows;
    for (const auto& r : result.rows)
        if (r.drain == drain) rows.push_back(&r);
    return rows;
}

SpacingSeries spacing_series(const Site& site, const DesignRow& row) {
    SpacingSeries series{row.pattern, {}, {}};
    Site varied = site;
    varied.products = {site.product(row.drain)};
    varied.range.patterns = {row.pattern};
    std::vector<double> factors{1.0};  // the design's own deadline is among the points
    for (int i = 0; i <= 24; ++i) factors.push_back(0.3 + 1.7 * i / 24.0);
    std::sort(factors.begin(), factors.end());
    for (const double factor : factors) {
        varied.criterion.deadline_s = site.criterion.deadline_s * factor;
        const SpacingLimit limit = spacing_limit(varied, varied.products.front(), row.pattern);
        if (!limit.feasible) continue;
        series.deadline_s.push_back(varied.criterion.deadline_s);
        series.spacing_limit_m.push_back(limit.spacing_m);
    }
    return series;
}
}  // namespace

Curve curve_of(const Site& site, const DrainProductSpec& product, Pattern pattern, double spacing_m,
               const std::vector<double>& times_s) {
    const auto model = make_cell_model(site, product, pattern, spacing_m);
    return {product.name, pattern, spacing_m, model->method(), degree_curve(*model, times_s), {}, {}};
}

namespace {
std::vector<SubLayerRow> sublayer_rows(const DesignRecord& record) {
    const Site& site = record.site();
    const DesignRow* row = record.result.best();
    if (!row && !record.result.rows.empty()) row = &record.result.rows.front();
    if (!row || !site.loading || !row->ultimate_settlement_m || !row->settlement_at_deadline_m) return {};
    const double load = site.loading->permanent_kPa();
    const double share = *row->settlement_at_deadline_m / *row->ultimate_settlement_m;
    std::vector<SubLayerRow> out;
    for (const SettlementSlice& slice : settlement_slices(site, load))
        out.push_back({slice.layer + 1, slice.depth_m, slice.thickness_m, slice.sigma_v0_kPa, slice.load_kPa, slice.final_m,
                       share * slice.final_m, std::nullopt, std::nullopt});
    // The degree over depth at the deadline, where the method gives it.
    std::vector<double> depths;
    for (const auto& r : out) depths.push_back(r.depth_m);
    const auto model = make_cell_model(site, site.product(row->drain), row->pattern, row->spacing_m);
    if (const auto states = model->over_depth(depths, site.criterion.deadline_s))
        for (std::size_t i = 0; i < out.size(); ++i) {
            out[i].excess_pore_pressure_kPa = (*states)[i].excess_pore_pressure_kPa;
            out[i].local_degree = (*states)[i].local_degree;
        }
    return out;
}
// The residual at about residual_chart_points of the curve's times after day 0 (each point costs a
// time-to-degree root for the end of primary, so the chart takes fewer points than the curves).
std::vector<DesignRecord::ResidualPoint> residual_series(const Site& site, const Curve& curve) {
    constexpr std::size_t residual_chart_points = 40;
    const auto model = make_cell_model(site, site.product(curve.drain), curve.pattern, curve.spacing_m);
    const auto service = site.criterion.residual()->service_s;
    const std::size_t step = std::max<std::size_t>(1, curve.points.size() / residual_chart_points);
    std::vector<DesignRecord::ResidualPoint> out;
    for (std::size_t i = step; i < curve.points.size(); i += step) {
        const double t = curve.points[i].time_s;
        const auto parts = model->residual_parts(t, service);
        out.push_back({t, parts.primary_m, parts.secondary_m});
    }
    return out;
}
}  // namespace

DesignRecord design_record(const scenario::Scenario& s, const RecordOptions& options) {
    DesignRecord record;
    record.scenario = &s;
    const Site& site = s.site;
    record.result = run_design(site);
    record.warnings = s.input_warnings;
    for (const auto& row : record.result.rows)
        for (const auto& w : row.warnings)
            record.warnings.push_back(row.drain + " / " + std::string(to_string(row.pattern)) + ": " + w);
    if (options.charts)
        for (const DesignRow* row : chart_rows(record.result)) {
            record.chart_curves.push_back(curve_of(site, site.product(row->drain), row->pattern, row->spacing_m,
                                                   chart_times(site.criterion.deadline_s, options.log_time)));
            record.spacing_vs_time.push_back(spacing_series(site, *row));
        }
    record.log_time = options.charts && options.log_time;
    if (site.loading && !record.chart_curves.empty())
        for (const auto& p : record.chart_curves.front().points) {
            record.load_kPa.push_back(site.loading->applied_at_kPa(p.time_s));
            if (const auto& v = site.loading->vacuum) record.vacuum_kPa.push_back(v->pressure_at_kPa(p.time_s));
        }
    if (!record.chart_curves.empty() && site.criterion.residual() && site.has_settlement())
        record.residual_vs_time = residual_series(site, record.chart_curves.front());
    record.assumptions = assumptions(site);
    record.method_notes = method_notes(site);
    record.sublayers = sublayer_rows(record);
    if (site.method.method != CellMethod::closed_form && site.ground.profile && !record.result.rows.empty()) {
        const DesignRow& row = record.result.rows.front();
        for (const auto& l : numerical_cell_spec(site, site.product(row.drain), row.pattern, row.spacing_m).layers)
            record.cell_layers.push_back({l.mv_m2_per_kN, permeability_from_consolidation_m_per_s(l.cv_m2_per_s, l.mv_m2_per_kN),
                                          permeability_from_consolidation_m_per_s(l.ch_m2_per_s, l.mv_m2_per_kN)});
    }
    return record;
}

std::string loading_label(const Site& site) {
    if (!site.loading) return "";
    if (!site.loading->vacuum) return "staged loading";
    return site.loading->stages.empty() ? "vacuum alone" : "vacuum with staged loading";
}

std::string degree_reference_text(const Site& site) {
    if (!site.loading) return "";
    if (site.loading->stages.empty()) return "relative to the steady state under the vacuum held";
    return "relative to the final permanent load under the load history";
}

std::string criterion_text(const Site& site) {
    const double deadline = days(site.criterion.deadline_s);
    if (const auto* r = site.criterion.residual())
        return "residual settlement at most " + fixed(r->limit_m * 1000.0, 0) + " mm after day " + fixed(deadline, 0) +
               (r->service_s ? " over " + fixed(days(*r->service_s), 0) + " days of service"
                             : std::string(" (to the end of primary consolidation)"));
    return "U = " + fixed(100.0 * site.criterion.degree()->degree, 1) + " % by day " + fixed(deadline, 0);
}

std::string criterion_label(const Site& site) {
    if (const auto* r = site.criterion.residual()) return "residual ≤ " + fixed(r->limit_m * 1000.0, 0) + " mm";
    return "U ≥ " + fixed(100.0 * site.criterion.degree()->degree, 0) + " %";
}

std::string recommendation(const DesignRecord& record) {
    const Site& site = record.site();
    const DesignResult& result = record.result;
    const DesignRow* best = result.best();
    const std::string range = fixed(site.range.bounds.min_m, 2) + "–" + fixed(site.range.bounds.max_m, 2) + " m";
    if (!best)
        return "No drain product and pattern meets the criterion (" + criterion_text(site) + ") within spacings of " +
               range + ". Rows marked * are evaluated at the minimum spacing.";
    const double deadline = days(site.criterion.deadline_s);
    std::string text = "Recommended: drain " + best->drain + " in a " + std::string(to_string(best->pattern)) +
                       " pattern at " + fixed(best->spacing_m, 2) + " m spacing (" +
                       (result.ranking == RankingBasis::cost_per_hectare ? "lowest cost per hectare"
                                                                          : "fewest drain metres per hectare") +
                       "), reaching U = " + fixed(100.0 * best->at_deadline.combined, 1) + " % at day " +
                       fixed(deadline, 0);
    if (best->time_to_target_s) text += " and meeting the criterion at day " + fixed(days(*best->time_to_target_s), 1);
    text += ".";
    if (best->residual_settlement_m) {
        const auto* r = site.criterion.residual();
        text += " Settlement: " + fixed(*best->settlement_at_deadline_m * 1000.0, 0) + " mm of " +
                fixed(*best->ultimate_settlement_m * 1000.0, 0) + " mm by the deadline, " +
                fixed(*best->residual_settlement_m * 1000.0, 0) + " mm still to come" +
                (r && r->service_s ? " within the " + fixed(days(*r->service_s), 0) + "-day service period"
                                   : std::string(" to the end of primary consolidation")) +
                ".";
    }
    if (best->limited_by_maximum)
        text += " The criterion is met even at the largest spacing considered; a wider spacing may also work.";
    return text;
}

std::vector<std::string> assumptions(const Site& site) {
    std::vector<std::string> out;
    const Ground& g = site.ground;
    const bool numerical = site.method.method == CellMethod::numerical;
    const bool series = site.method.method == CellMethod::layered;
    const std::size_t layers = g.profile ? g.profile->layers.size() : 1;
    if (g.layered_flow())
        out.push_back("Consolidation coefficients layer by layer (" + std::to_string(layers) +
                      " layers; a layer without its own cv or ch takes the clay's).");
    else
        out.push_back("Uniform consolidation coefficients (cv, ch" + std::string(numerical || series ? "" : ", kh") +
                      ") over the clay" + (layers > 1 ? " (" + std::to_string(layers) + " layers for settlement only)." : "."));
    const double l = site.installation.drain_length_m, h = g.thickness_m;
    if (std::fabs(l - h) <= 1e-9 * h)
        out.push_back("Drains fully penetrating the clay (" + fixed(l, 2) + " m).");
    else
        out.push_back("Drains stopping " + fixed(h - l, 2) + " m short of the clay base (" + fixed(l, 2) + " m of " +
                      fixed(h, 2) + " m).");
    if (!site.loading) {
        out.push_back("The load is applied at once at day 0.");
    } else {
        if (!site.loading->stages.empty())
            out.push_back("Load applied in " + std::to_string(site.loading->stages.size()) +
                          " stage(s) as tabled in the inputs; degrees relative to the final permanent load.");
        else
            out.push_back("No fill: degrees relative to the steady state under the vacuum held.");
        if (const auto& v = site.loading->vacuum)
            out.push_back("Vacuum of " + fixed(v->pressure_kPa, 0) + " kPa through the drains from day " +
                          fixed(days(v->start_s), 0) + " to day " + fixed(days(v->end_s), 0) + ", falling linearly to " +
                          fixed(v->tip_ratio, 2) +
                          " of it at the drain tip; the clay's drainage faces stay at zero excess pore pressure (no "
                          "vacuum under the membrane in the model), so suction near them is understated." +
                          (numerical ? "" : " Settlement held at its value when the vacuum is released (rebound ignored)."));
        if (site.loading->surcharge)
            out.push_back(numerical ? "Surcharge removal unloads the numerical cell with the same mv (no separate "
                                      "rebound stiffness)."
                                    : "After the surcharge is removed the settlement is held at its value at removal "
                                      "until the permanent-load history catches up (rebound ignored).");
    }
    out.push_back(numerical ? "Numerical unit cell: coupled radial and vertical flow, free strain, the drain as a "
                              "conduit of capacity qw."
                  : series ? "Layered series: equal-strain radial flow to the drain folded into one-dimensional "
                             "consolidation layer by layer (no radial term below a drain's tip), solved as a series of " +
                                 std::to_string(site.method.series_terms) + " terms."
                           : "Closed form: equal-strain radial flow, vertical and radial flow combined by Carrillo's rule.");
    if (site.has_settlement()) {
        out.push_back(g.profile ? "Settlement by one-dimensional e–log σ' (or mv) per layer over " +
                                      std::to_string(g.profile->slices_per_layer) + " slices per layer."
                        : site.embankment ? "Settlement as mv × stress increase × thickness over " +
                                                std::to_string(defaults::slices_per_layer) + " slices."
                                          : "Settlement as mv × load × clay thickness.");
        if (site.embankment)
            out.push_back("The stress increase at each depth is that under the embankment's centre line (Osterberg's "
                          "influence for the section at the fill height of the load); consolidation itself is that of "
                          "the unit cell under the fill pressure.");
    }
    else
        out.push_back("No settlement model: degrees only.");
    const bool creep = secondary_per_cycle_m(site).has_value();
    if (creep) {
        std::string layers;
        const auto& p = *site.ground.profile;
        for (std::size_t i = 0; i < p.layers.size(); ++i)
            if (p.layers[i].c_alpha)
                layers += (layers.empty() ? "" : ", ") + std::string("layer ") + std::to_string(i + 1) + " Cα " +
                          fixed(*p.layers[i].c_alpha, 4);
        out.push_back("Secondary compression Σ Cα/(1 + e0)·H·log10(t/tp) from the end of primary tp (the time the unit "
                      "cell reaches an average degree of " + fixed(100.0 * defaults::end_of_primary_degree, 0) +
                      " %), counted in the residual settlement and shown apart from the primary part (" + layers + ").");
        if (site.loading && site.loading->surcharge)
            out.push_back("After the surcharge is removed, each layer creeps from the equivalent age tr·OCR^((Cc − Cr)/Cα) "
                          "that the over-consolidation left by the surcharge gives it (Bjerrum 1967's time lines; OCR at "
                          "mid-layer from the unit cell's degree at removal), not from the end of primary.");
    }
    if (const auto* r = site.criterion.residual())
        out.push_back(r->service_s ? "Residual settlement counted over the " + fixed(days(*r->service_s), 0) +
                                         "-day service period after the deadline only."
                                   : "Residual settlement counted to the end of primary consolidation.");
    out.push_back(creep ? "Linear, small-strain primary consolidation with constant coefficients; creep as stated above."
                        : "Linear, small-strain consolidation with constant coefficients; no secondary compression or creep.");
    return out;
}

std::vector<std::string> method_notes(const Site& site) {
    const bool numerical = site.method.method == CellMethod::numerical;
    const bool series = site.method.method == CellMethod::layered;
    std::vector<std::string> notes;
    if (series) {
        notes.push_back(
            "Method: the spectral method for stratified ground with vertical and radial drainage (Walker & Indraratna "
            "2009): mv·∂ū/∂t = ∂/∂z(kv/γw·∂ū/∂z) − η(z)(ū − w) + mv·∂σ/∂t with η = 2kh/(γw·re²·μ(z)) along the drain "
            "and 0 below its tip; ū as a series of " + std::to_string(site.method.series_terms) +
            " eigenfunctions of uniform consolidation, solved exactly in time (Galerkin, generalised eigenproblem). "
            "μ(z) is the smear μ plus the well resistance π·z(2l − z)·kh/qw of Hansbo (1981), with the kh of the "
            "layer at that depth; each layer's kv = cv·mv·γw and kh = ch·mv·γw. Uv is the same series without a drain; Ur is the "
            "radial degree that Carrillo's (1942) rule would need to give U.");
        if (site.ground.profile) notes.push_back("Storage mv of an e–log layer: the secant under the final permanent load.");
    } else if (numerical) {
        notes.push_back(
            "Method: numerical unit cell (axisymmetric finite volumes, coupled radial and vertical flow, the drain as a "
            "conduit of capacity qw, layered cv/ch/mv, drains that may stop short of the clay base; backward Euler). "
            "Uv is the same cell without a drain; Ur is the radial degree that Carrillo's (1942) rule would need to give U. "
            "μ is the depth mean of μ(z) of Hansbo (1981) with each layer's kh = ch·mv·γw.");
        if (site.ground.profile) {
            notes.push_back("Storage mv of an e–log layer: the secant under the final permanent load.");
            if (site.ground.kh_m_per_s)
                notes.push_back("With layers, each layer's kh is ch·mv·γw of that layer; the clay-wide kh_m_per_s "
                                "given in the scenario is not used.");
        }
    } else {
        notes = {
            "Vertical flow: Terzaghi (1925), average degree Uv(Tv), Tv = cv·t/d², d = H (one drained face) or H/2 (two).",
            "Radial flow: Hansbo (1981), Ur = 1 − exp(−8Th/μ), Th = ch·t/De², with smear (ln(n/s) + (kh/ks)·ln s − 0.75) "
            "and well resistance π·z(2l − z)·kh/qw; for other smear profiles the equal-strain integral (profile shapes "
            "after Walker & Indraratna 2006); Barron (1948) for the ideal drain.",
            "Well resistance: the radial degree is the mean of the local degree Ur(z) over the drain, with z from the "
            "nearest outlet (Gauss–Legendre quadrature); μ is the depth mean of μ(z).",
            "Combination: Carrillo (1942), 1 − U = (1 − Uv)(1 − Ur).",
        };
        if (site.ground.kh_source == KhSource::from_ch_and_mv) notes.push_back("kh = ch·mv·γw (γw = 9.81 kN/m³).");
    }
    notes.push_back("Equivalent drain diameter: Hansbo (1979) 2(a+b)/π, Rixner et al. (1986) (a+b)/2 or Long & Covo "
                    "(1994) 0.5a + 0.7b; mandrel by equal area; influence diameter 1.05 s (triangular) or 1.128 s "
                    "(square), Barron (1948).");
    notes.push_back(std::string("Limiting spacing: the largest spacing at which the criterion is met at the deadline, ") +
                    (site.criterion.residual() ? "by a scan of the spacing increments refined by bisection"
                                               : "solved with TOMS 748 (Alefeld, Potra & Shi 1995)") +
                    "; the chosen spacing is rounded down to the increment.");
    if (site.loading)
        notes.push_back("Staged loading: " +
                        std::string(numerical ? "the load history drives the numerical cell directly"
                                    : series  ? "each load increment and ramp enters the series exactly in time"
                                              : "linear superposition of the unit cell's response to each load increment, "
                                                "ramps integrated by adaptive Gauss–Kronrod quadrature (checked against "
                                                "Olson 1977)") +
                        "; degrees are relative to the final permanent load.");
    if (site.loading && site.loading->vacuum)
        notes.push_back("Vacuum through the drains: w(z) = −p·(1 − (1 − k1)·z/L) along the drain, the linear loss of "
                        "Indraratna et al. (2005); without fill the degrees are relative to the steady state under the "
                        "vacuum held, and the final settlement is that of the vacuum's mv-weighted mean steady suction.");
    if (site.has_settlement())
        notes.push_back("Settlement: one-dimensional e–log σ' (Cc above σ'p, Cr below) or mv per layer, summed over "
                        "slices; settlement at a time is U × the final primary settlement.");
    return notes;
}

const std::vector<std::string>& cautions() {
    static const std::vector<std::string> text{
        "Results are estimates from idealised theory (see the assumptions); real ground departs from it.",
        "Every parameter (cv, ch, kh, mv, smear extent and permeability, discharge capacity after installation) must "
        "come from site investigation and testing for this site.",
        "Settlement and pore pressure monitoring during construction is required to confirm the design and to adjust it.",
        "Local codes, standards and the judgement of a licensed engineer govern over this output.",
    };
    return text;
}

std::vector<std::string> reference_keys(const DesignRecord& record) {
    const Site& site = record.site();
    const bool closed_form = site.method.method == CellMethod::closed_form;
    std::vector<std::string> keys;
    auto add = [&](const std::string& key) {
        if (std::find(keys.begin(), keys.end(), key) == keys.end()) keys.push_back(key);
    };
    if (closed_form) add("terzaghi1925");  // the numerical cell solves the vertical flow itself
    if (site.method.method == CellMethod::layered) add("walker_indraratna2009");
    for (const char* key : {"barron1948", "hansbo1981", "carrillo1942"}) add(key);
    if (site.loading && site.loading->vacuum) add("indraratna2005");
    if (closed_form && site.installation.smear_shape != SmearShape::constant)
        add("walker_indraratna2006");
    for (const auto& d : record.scenario->drains)
        if (d.method) add(*d.method == EquivalentDiameterMethod::hansbo_1979 ? "hansbo1979"
                          : *d.method == EquivalentDiameterMethod::rixner_1986 ? "rixner1986"
                                                                                : "long_covo1994");
    if (!site.criterion.residual()) add("alefeld1995");  // the residual criterion scans and bisects
    if (site.loading && closed_form) add("olson1977");
    if (record.studies.monte_carlo) add("clopper_pearson1934");
    if (site.embankment) add("osterberg1957");
    if (secondary_per_cycle_m(site)) add("mesri_godlewski1977");
    if (secondary_per_cycle_m(site) && site.loading && site.loading->surcharge) add("bjerrum1967");
    if (record.stages) {
        for (const char* key : {"bishop1955", "ladd_foott1974", "whitman_bailey1967"}) add(key);
        if (site.embankment->reinforcement) add("jewell1996");
        for (const auto& layer : site.ground.profile->layers)
            if (layer.strength && layer.strength->su_top_kPa) add("mesri1975");  // the default gain ratio
    }
    return keys;
}

std::vector<TitleField> title_block(const scenario::Scenario& s) {
    std::vector<TitleField> out;
    const auto& p = s.project;
    const std::pair<const char*, const std::optional<std::string>*> fields[] = {
        {"name", &p.name}, {"number", &p.number}, {"revision", &p.revision},
        {"prepared_by", &p.prepared_by}, {"checked_by", &p.checked_by}, {"date", &p.date}};
    const char* labels[] = {"project", "project number", "revision", "prepared by", "checked by", "date"};
    for (std::size_t i = 0; i < std::size(fields); ++i)
        if (*fields[i].second) out.push_back({fields[i].first, labels[i], **fields[i].second, true});
    out.push_back({"scenario", "scenario file", s.file, false});
    out.push_back({"scenario_sha256", "scenario SHA-256", s.sha256, false});
    out.push_back({"wickgrid_version", "wickgrid version", version, false});
    return out;
}

std::string running_header(const scenario::Scenario& s) {
    std::string out;
    if (s.project.name) out += *s.project.name;
    if (s.project.number) out += (out.empty() ? "" : " ") + ("(" + *s.project.number + ")");
    out += (out.empty() ? "" : " — ") + s.title;
    if (s.project.revision) out += " — rev. " + *s.project.revision;
    return out;
}

std::string caution_block() {
    std::string out = "Cautions:\n";
    for (const auto& c : cautions()) out += "  - " + c + "\n";
    return out;
}

}  // namespace wickgrid::results
