#include "design_report.hpp"

#include <cstdio>
#include <sstream>

#include "wickgrid/units.hpp"

namespace wickgrid::report {

const char* const cautions[4] = {
    "Results are estimates from idealised theory (uniform clay, equal-strain radial flow, linear "
    "consolidation, instantaneous loading); real ground departs from it.",
    "Every parameter (cv, ch, kh, mv, smear extent and permeability, discharge capacity after "
    "installation) must come from site investigation and testing for this site.",
    "Settlement and pore pressure monitoring during construction is required to confirm the "
    "design and to adjust it.",
    "Local codes, standards and the judgement of a licensed engineer govern over this output.",
};

std::string fixed(double value, int decimals) {
    char buffer[64];
    std::snprintf(buffer, sizeof buffer, "%.*f", decimals, value);
    return buffer;
}

namespace {
using nlohmann::json;

double days(double seconds) { return units::seconds_to_days(seconds); }

nlohmann::json mm_or_null(const std::optional<double>& m) {
    return m ? nlohmann::json(*m * 1000.0) : nlohmann::json(nullptr);
}

bool residual_criterion(const scenario::Scenario& s) { return s.residual_limit_m.has_value(); }

nlohmann::json target_json(const scenario::Scenario& s) {
    nlohmann::json t{{"deadline_days", s.deadline_days}};
    if (residual_criterion(s)) {
        t["criterion"] = "residual_settlement";
        t["residual_settlement_mm"] = *s.residual_limit_m * 1000.0;
        t["service_days"] = s.service_days ? nlohmann::json(*s.service_days) : nlohmann::json(nullptr);
    } else {
        t["criterion"] = "degree";
        t["degree"] = s.target_degree;
    }
    return t;
}

std::string ranking_name(RankingBasis basis) {
    return basis == RankingBasis::cost_per_hectare ? "cost_per_hectare" : "drain_length_per_hectare";
}

}  // namespace

const DesignRow* best_row(const DesignResult& result) {
    for (const auto& row : result.rows)
        if (row.rank && *row.rank == 1) return &row;
    return nullptr;
}

namespace {

std::string escape_csv(const std::string& text) {
    if (text.find_first_of(",\"\n") == std::string::npos) return text;
    std::string out = "\"";
    for (char c : text) out += c == '"' ? std::string("\"\"") : std::string(1, c);
    return out + "\"";
}

std::string pad(const std::string& text, std::size_t width, bool right) {
    // Width in characters, not bytes: count UTF-8 lead bytes only.
    std::size_t chars = 0;
    for (unsigned char c : text) chars += (c & 0xC0) != 0x80;
    const std::string fill(width > chars ? width - chars : 0, ' ');
    return right ? fill + text : text + fill;
}

std::string table(const std::vector<std::string>& header, const std::vector<std::vector<std::string>>& rows,
                  std::size_t left_columns = 2) {
    std::vector<std::size_t> widths(header.size(), 0);
    auto measure = [&](const std::vector<std::string>& r) {
        for (std::size_t i = 0; i < r.size(); ++i) {
            std::size_t chars = 0;
            for (unsigned char c : r[i]) chars += (c & 0xC0) != 0x80;
            widths[i] = std::max(widths[i], chars);
        }
    };
    measure(header);
    for (const auto& r : rows) measure(r);
    std::ostringstream out;
    auto line = [&](const std::vector<std::string>& r) {
        for (std::size_t i = 0; i < r.size(); ++i) out << (i ? "  " : "") << pad(r[i], widths[i], i >= left_columns);
        out << '\n';
    };
    line(header);
    std::size_t total = 0;
    for (auto w : widths) total += w + 2;
    out << std::string(total - 2, '-') << '\n';
    for (const auto& r : rows) line(r);
    return out.str();
}
}  // namespace

nlohmann::json design_json(const scenario::Scenario& s, const DesignResult& result) {
    json designs = json::array();
    for (const auto& r : result.rows) {
        json row{{"drain", r.drain},
                 {"pattern", std::string(to_string(r.pattern))},
                 {"feasible", r.feasible},
                 {"spacing_limit_m", r.feasible ? json(r.spacing_limit_m) : json(nullptr)},
                 {"spacing_m", r.feasible ? json(r.spacing_m) : json(nullptr)},
                 {"limited_by_max_spacing", r.limited_by_maximum},
                 {"evaluated_spacing_m", r.spacing_m},
                 {"equivalent_diameter_m", r.equivalent_diameter_m},
                 {"smear_diameter_m", r.smear_diameter_m},
                 {"influence_diameter_m", r.influence_diameter_m},
                 {"n", r.n},
                 {"s", r.s},
                 {"mu_smear", r.mu_smear},
                 {"mu", r.mu},
                 {"degree_vertical", r.at_deadline.vertical},
                 {"degree_radial", r.at_deadline.radial},
                 {"degree", r.at_deadline.combined},
                 {"time_to_target_days", days(r.time_to_target_s)},
                 {"drains_per_hectare", r.drains_per_hectare},
                 {"drain_length_per_hectare_m", r.drain_length_per_hectare_m},
                 {"cost_per_hectare", r.cost_per_hectare ? json(*r.cost_per_hectare) : json(nullptr)},
                 {"rank", r.rank ? json(*r.rank) : json(nullptr)},
                 {"ultimate_settlement_mm", mm_or_null(r.ultimate_settlement_m)},
                 {"settlement_at_deadline_mm", mm_or_null(r.settlement_at_deadline_m)},
                 {"residual_settlement_mm", mm_or_null(r.residual_settlement_m)}};
        designs.push_back(std::move(row));
    }
    return json{{"schema", 1},
                {"title", s.title},
                {"scenario", s.file},
                {"target", target_json(s)},
                {"loading", s.loading ? "staged" : "instantaneous"},
                {"method", s.numerical ? "numerical" : "analytical"},
                {"degree_basis", "relative to the final permanent load"},
                {"radial_theory", std::string(scenario::to_string(s.radial_theory))},
                {"smear_shape", std::string(scenario::to_string(s.smear_shape))},
                {"ranking", ranking_name(result.ranking)},
                {"any_feasible", result.any_feasible()},
                {"designs", designs}};
}

std::string design_csv(const DesignResult& result) {
    std::ostringstream out;
    out << "drain,pattern,feasible,rank,spacing_limit_m,spacing_m,influence_diameter_m,n,s,mu,"
           "degree_vertical,degree_radial,degree,time_to_target_days,drains_per_hectare,"
           "drain_length_per_hectare_m,cost_per_hectare,ultimate_settlement_mm,settlement_at_deadline_mm,"
           "residual_settlement_mm\n";
    out.precision(10);
    for (const auto& r : result.rows) {
        out << escape_csv(r.drain) << ',' << to_string(r.pattern) << ',' << (r.feasible ? "true" : "false") << ','
            << (r.rank ? std::to_string(*r.rank) : "") << ',';
        if (r.feasible) out << r.spacing_limit_m << ',' << r.spacing_m;
        else out << ',';
        out << ',' << r.influence_diameter_m << ',' << r.n << ',' << r.s << ',' << r.mu << ','
            << r.at_deadline.vertical << ',' << r.at_deadline.radial << ',' << r.at_deadline.combined << ','
            << days(r.time_to_target_s) << ',' << r.drains_per_hectare << ',' << r.drain_length_per_hectare_m << ',';
        if (r.cost_per_hectare) out << *r.cost_per_hectare;
        for (const auto& v : {r.ultimate_settlement_m, r.settlement_at_deadline_m, r.residual_settlement_m}) {
            out << ',';
            if (v) out << *v * 1000.0;
        }
        out << '\n';
    }
    return out.str();
}

namespace {
bool any_settlement(const DesignResult& result) {
    for (const auto& r : result.rows)
        if (r.ultimate_settlement_m) return true;
    return false;
}

std::vector<std::vector<std::string>> result_rows(const DesignResult& result, bool with_cost) {
    std::vector<std::vector<std::string>> rows;
    for (const auto& r : result.rows) {
        std::vector<std::string> row{
            r.drain,
            std::string(to_string(r.pattern)),
            r.rank ? std::to_string(*r.rank) : "-",
            r.feasible ? fixed(r.spacing_limit_m, 3) + (r.limited_by_maximum ? "+" : "") : "none",
            fixed(r.spacing_m, 2) + (r.feasible ? "" : "*"),
            fixed(r.influence_diameter_m, 3),
            fixed(r.n, 1),
            fixed(r.s, 2),
            fixed(r.mu, 2),
            fixed(100.0 * r.at_deadline.vertical, 1),
            fixed(100.0 * r.at_deadline.radial, 1),
            fixed(100.0 * r.at_deadline.combined, 1),
            fixed(days(r.time_to_target_s), 1),
            fixed(r.drains_per_hectare, 0),
            fixed(r.drain_length_per_hectare_m, 0),
        };
        if (with_cost) row.push_back(r.cost_per_hectare ? fixed(*r.cost_per_hectare, 0) : "-");
        if (any_settlement(result))
            for (const auto& v : {r.ultimate_settlement_m, r.settlement_at_deadline_m, r.residual_settlement_m})
                row.push_back(v ? fixed(*v * 1000.0, 0) : "-");
        rows.push_back(std::move(row));
    }
    return rows;
}

std::vector<std::string> result_header(const DesignResult& result, bool with_cost) {
    std::vector<std::string> h{"drain", "pattern", "rank", "limit m", "spacing m", "De m", "n", "s", "μ",
                               "Uv %", "Ur %", "U %", "t90 days", "drains/ha", "drain m/ha"};
    if (with_cost) h.push_back("cost/ha");
    if (any_settlement(result)) {
        h.push_back("s_final mm");
        h.push_back("s_deadline mm");
        h.push_back("residual mm");
    }
    return h;
}

bool any_cost(const DesignResult& result) {
    for (const auto& r : result.rows)
        if (r.cost_per_hectare) return true;
    return false;
}

std::string target_label(const scenario::Scenario& s) {
    return residual_criterion(s) ? std::string("t_residual") : "t" + fixed(100.0 * s.target_degree, 0);
}

}  // namespace

std::string criterion_text(const scenario::Scenario& s) {
    if (residual_criterion(s))
        return "residual settlement at most " + fixed(*s.residual_limit_m * 1000.0, 0) + " mm after day " +
               fixed(s.deadline_days, 0) +
               (s.service_days ? " over " + fixed(*s.service_days, 0) + " days of service" : std::string(" (to the end of primary consolidation)"));
    return "U = " + fixed(100.0 * s.target_degree, 1) + " % by day " + fixed(s.deadline_days, 0);
}


std::string recommendation(const scenario::Scenario& s, const DesignResult& result) {
    const DesignRow* best = best_row(result);
 if (!best && residual_criterion(s))
        return "No drain product and pattern meets the criterion (" + criterion_text(s) + ") within spacings of " +
               fixed(s.spacing.min_m, 2) + "–" + fixed(s.spacing.max_m, 2) + " m.";
    if (!best)
        return "No drain product and pattern reaches U = " + fixed(100.0 * s.target_degree, 0) + " % by day " +
               fixed(s.deadline_days, 0) + " within spacings of " + fixed(s.spacing.min_m, 2) + "–" +
               fixed(s.spacing.max_m, 2) + " m. Rows marked * give the degree reached at the minimum spacing "
               "and the time that spacing would need.";
    std::string text = "Recommended: drain " + best->drain + " in a " + std::string(to_string(best->pattern)) +
                       " pattern at " + fixed(best->spacing_m, 2) + " m spacing (" +
                       (result.ranking == RankingBasis::cost_per_hectare ? "lowest cost per hectare"
                                                                          : "fewest drain metres per hectare") +
                       "), reaching U = " + fixed(100.0 * best->at_deadline.combined, 1) + " % at day " +
                       fixed(s.deadline_days, 0) + " and the target at day " +
                       fixed(days(best->time_to_target_s), 1) + ".";
    if (best->residual_settlement_m)
        text += " Settlement: " + fixed(*best->settlement_at_deadline_m * 1000.0, 0) + " mm of " +
                fixed(*best->ultimate_settlement_m * 1000.0, 0) + " mm by the deadline, " +
                fixed(*best->residual_settlement_m * 1000.0, 0) + " mm still to come.";
    if (best->limited_by_maximum)
        text += " The target is met even at the largest spacing considered; a wider spacing may also work.";
    return text;
}

namespace {

}  // namespace

std::string design_table(const scenario::Scenario& s, const DesignResult& result) {
    std::ostringstream out;
    out << s.title << "\n";
    out << "criterion: " << criterion_text(s) << (s.loading ? "; staged loading" : "") << "; spacings " << fixed(s.spacing.min_m, 2) << "–" << fixed(s.spacing.max_m, 2) << " m in steps of "
        << fixed(s.increment_m, 2) << " m\n\n";
    auto header = result_header(result, any_cost(result));
    header[12] = target_label(s) + " days";
    out << table(header, result_rows(result, any_cost(result)));
    if (s.loading) out << "\nDegrees are relative to the final permanent load, under the load history.";
    out << "\nDegrees are at the deadline at the chosen spacing; " << target_label(s)
        << " is the time to the target there. '+' marks a limit capped at the largest spacing; '*' an "
           "infeasible row evaluated at the minimum spacing.\n";
    out << recommendation(s, result) << "\n";
    out << "Estimates from idealised theory: confirm parameters by site investigation and by monitoring.\n";
    return out.str();
}

std::vector<std::string> method_notes(const scenario::Scenario& s) {
    std::vector<std::string> notes{
        "Vertical flow: Terzaghi (1925), average degree Uv(Tv), Tv = cv·t/d², d = H (one drained face) or H/2 (two).",
        "Radial flow: Hansbo (1981), Ur = 1 − exp(−8Th/μ), Th = ch·t/De², with smear (ln(n/s) + (kh/ks)·ln s − 0.75) "
        "and well resistance π·z(2l − z)·kh/qw; for other smear profiles the equal-strain integral (profile shapes after "
        "Walker & Indraratna 2006); Barron (1948) for the ideal drain.",
        "Well resistance: the radial degree is the mean of the local degree Ur(z) over the drain, with z from the nearest "
        "outlet (Gauss–Legendre quadrature).",
        "Combination: Carrillo (1942), 1 − U = (1 − Uv)(1 − Ur).",
        "Equivalent drain diameter: Hansbo (1979) 2(a+b)/π, Rixner et al. (1986) (a+b)/2 or Long & Covo (1994) 0.5a + 0.7b; "
        "mandrel by equal area; influence diameter 1.05 s (triangular) or 1.128 s (square), Barron (1948).",
        "kh = ch·mv·γw (γw = 9.81 kN/m³) where kh is not given.",
        "Limiting spacing: the largest spacing at which the criterion is met at the deadline, solved with TOMS 748 "
        "(Alefeld, Potra & Shi 1995) or, under staged loading, a scan of the spacing increments refined by bisection; "
        "the chosen spacing is rounded down to the increment.",
    };
    if (s.numerical)
        notes.push_back(
            "Method: numerical unit cell (axisymmetric finite volumes, coupled radial and vertical flow, the drain as a "
            "conduit of capacity qw, layered cv/ch/mv, drains that may stop short of the clay base; backward Euler). "
            "Uv is the numerical cell without a drain; Ur is the radial degree that Carrillo's rule would need to give U.");
    if (s.loading || s.residual_limit_m)
        notes.push_back(
            "Staged loading: linear superposition of the unit cell's response to each load increment, ramps integrated "
            "by adaptive Gauss–Kronrod quadrature (checked against Olson 1977); degrees are relative to the final "
            "permanent load. Settlement: one-dimensional e–log σ' (compression index Cc above σ'p, recompression index "
            "Cr below) or mv per layer, summed over slices; each increment weighted by the ultimate settlement it adds. "
            "After a surcharge is removed the settlement is held until the permanent-load history catches up: rebound "
            "and secondary compression are ignored.");
    return notes;
}

std::string assumptions(const scenario::Scenario& s) {
    return std::string(s.loading ? "Loading as tabled in the inputs" : "Instantaneous loading at day 0") +
           "; uniform consolidation coefficients over the clay; drains fully penetrating the clay; equal-strain radial "
           "flow; linear, small-strain consolidation with constant coefficients; no secondary compression.";
}

std::string design_markdown(const scenario::Scenario& s, const DesignResult& result) {
    std::ostringstream out;
    const bool with_cost = any_cost(result);
    out << "# Vertical drain design note: " << s.title << "\n\n";
    out << "Scenario file: `" << s.file << "`. Produced by wickgrid " << "0.1.0" << ".\n\n";
    out << "## Result\n\n" << recommendation(s, result) << "\n\n";
    out << "## Inputs\n\n| quantity | value |\n|---|---|\n";
    out << "| design criterion | " << criterion_text(s) << " |\n";
    out << "| deadline from the start of loading | " << fixed(s.deadline_days, 0) << " days |\n";
    out << "| clay thickness | " << fixed(s.clay.thickness_m, 2) << " m |\n";
    out << "| vertical drainage | " << scenario::to_string(s.clay.drainage) << " |\n";
    out << "| cv | " << fixed(units::per_second_to_per_year(s.clay.cv_m2_per_s), 3) << " m²/year |\n";
    out << "| ch | " << fixed(units::per_second_to_per_year(s.clay.ch_m2_per_s), 3) << " m²/year |\n";
    char kh[32];
    std::snprintf(kh, sizeof kh, "%.3e", s.clay.kh_m_per_s);
    out << "| kh | " << kh << " m/s" << (s.kh_given ? "" : " (from ch·mv·γw)") << " |\n";
    out << "| drain length | " << fixed(s.drain_length_m, 2) << " m, outlets: " << scenario::to_string(s.outlets)
        << " |\n";
    out << "| mandrel equivalent diameter dm | " << fixed(s.mandrel_diameter_m * 1000.0, 1) << " mm |\n";
    out << "| smear zone | ds = " << fixed(s.smear_diameter_ratio, 2) << " × dm = "
        << fixed(s.smear_diameter_ratio * s.mandrel_diameter_m * 1000.0, 1) << " mm, kh/ks = "
        << fixed(s.smear_permeability_ratio, 2) << ", profile " << scenario::to_string(s.smear_shape) << " |\n";
    out << "| radial theory | " << scenario::to_string(s.radial_theory) << (s.numerical ? ", method numerical" : "") << " |\n";
    out << "| spacings considered | " << fixed(s.spacing.min_m, 2) << "–" << fixed(s.spacing.max_m, 2)
        << " m, rounded down to " << fixed(s.increment_m, 2) << " m |\n\n";
    out << "| drain | dw (mm) | from | qw (m³/year) | cost per m |\n|---|---|---|---|---|\n";
    for (const auto& d : s.drains)
        out << "| " << d.name << " | " << fixed(d.equivalent_diameter_m * 1000.0, 1) << " | "
            << (d.method ? std::string(to_string(*d.method)) : std::string("given")) << " | "
            << fixed(units::per_second_to_per_year(d.discharge_capacity_m3_per_s), 1) << " | "
            << (d.cost_per_m ? fixed(*d.cost_per_m, 2) : std::string("-")) << " |\n";
    if (s.loading) {
        out << "\n| load stage | start day | end day | pressure (kPa) |\n|---|---|---|---|\n";
        for (std::size_t i = 0; i < s.loading->stages.size(); ++i) {
            const auto& st = s.loading->stages[i];
            out << "| " << i + 1 << " | " << fixed(days(st.start_s), 0) << " | " << fixed(days(st.end_s), 0) << " | "
                << fixed(st.pressure_kPa, 1) << " |\n";
        }
        if (s.loading->surcharge) {
            const auto& su = *s.loading->surcharge;
            out << "| surcharge (removed day " << fixed(days(su.removal_s), 0) << ") | " << fixed(days(su.start_s), 0)
                << " | " << fixed(days(su.end_s), 0) << " | " << fixed(su.pressure_kPa, 1) << " |\n";
        }
    }
    if (s.profile) {
        out << "\n| clay layer | thickness (m) | γ (kN/m³) | compressibility |\n|---|---|---|---|\n";
        for (std::size_t i = 0; i < s.profile->layers.size(); ++i) {
            const auto& l = s.profile->layers[i];
            out << "| " << i + 1 << " | " << fixed(l.thickness_m, 2) << " | " << fixed(l.unit_weight_kN_per_m3, 1) << " | ";
            if (l.mv_m2_per_kN) out << "mv = " << *l.mv_m2_per_kN << " m²/kN";
            else
                out << "e0 = " << fixed(*l.e0, 2) << ", Cc = " << fixed(*l.cc, 3) << ", Cr = " << fixed(*l.cr, 3) << ", "
                    << (l.ocr ? "OCR = " + fixed(*l.ocr, 2) : "σ'p = " + fixed(*l.preconsolidation_kPa, 1) + " kPa");
            out << " |\n";
        }
        out << "\nGroundwater " << fixed(s.profile->groundwater_depth_m, 2) << " m below the top of the clay; "
            << s.profile->slices_per_layer << " slices per layer.\n";
    }
    out << "\n## Results\n\n";
    auto header = result_header(result, with_cost);
    header[12] = target_label(s) + " days";
    out << "|";
    for (const auto& h : header) out << ' ' << h << " |";
    out << "\n|";
    for (std::size_t i = 0; i < header.size(); ++i) out << "---|";
    out << '\n';
    for (const auto& row : result_rows(result, with_cost)) {
        out << "|";
        for (const auto& cell : row) out << ' ' << cell << " |";
        out << '\n';
    }
    out << "\nDegrees (Uv vertical, Ur radial, U combined) are at the deadline at the chosen spacing. "
           "Ranked by "
        << (result.ranking == RankingBasis::cost_per_hectare ? "cost per hectare" : "drain metres per hectare")
        << ". '+' marks a limit capped at the largest spacing considered; '*' an infeasible row, evaluated at "
           "the minimum spacing.\n\n";
    out << "## Method and sources\n\n";
    for (const auto& line : method_notes(s)) out << "- " << line << "\n";
    out << "\n## Assumptions\n\n" << assumptions(s) << "\n\n";
    out << "## Cautions\n\n";
    for (const char* c : cautions) out << "- " << c << "\n";
    return out.str();
}

nlohmann::json curve_json(const CurveReport& curve) {
    json points = json::array();
    for (const auto& p : curve.points)
        points.push_back({{"time_days", days(p.time_s)},
                          {"degree_vertical", p.degrees.vertical},
                          {"degree_radial", p.degrees.radial},
                          {"degree", p.degrees.combined},
                          {"settlement_mm", mm_or_null(p.settlement_m)}});
    return json{{"drain", curve.drain},
                {"pattern", std::string(to_string(curve.pattern))},
                {"spacing_m", curve.spacing_m},
                {"points", points}};
}

std::string curve_csv(const CurveReport& curve) {
    std::ostringstream out;
    out.precision(10);
    const bool settle = !curve.points.empty() && curve.points.front().settlement_m.has_value();
    out << "time_days,degree_vertical,degree_radial,degree" << (settle ? ",settlement_mm" : "") << "\n";
    for (const auto& p : curve.points) {
        out << days(p.time_s) << ',' << p.degrees.vertical << ',' << p.degrees.radial << ',' << p.degrees.combined;
        if (settle) out << ',' << *p.settlement_m * 1000.0;
        out << '\n';
    }
    return out.str();
}

std::string curve_table(const CurveReport& curve) {
    std::vector<std::vector<std::string>> rows;
    const bool settle = !curve.points.empty() && curve.points.front().settlement_m.has_value();
    for (const auto& p : curve.points) {
        rows.push_back({fixed(days(p.time_s), 1), fixed(100.0 * p.degrees.vertical, 2),
                        fixed(100.0 * p.degrees.radial, 2), fixed(100.0 * p.degrees.combined, 2)});
        if (settle) rows.back().push_back(fixed(*p.settlement_m * 1000.0, 1));
    }
    std::ostringstream out;
    out << "drain " << curve.drain << ", " << to_string(curve.pattern) << " pattern at " << fixed(curve.spacing_m, 3)
        << " m\n\n";
    std::vector<std::string> header{"day", "Uv %", "Ur %", "U %"};
    if (settle) header.push_back("settlement mm");
    out << table(header, rows, 0);
    return out.str();
}

}  // namespace wickgrid::report
