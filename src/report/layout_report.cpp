#include "layout_report.hpp"

#include <algorithm>
#include <vector>
#include <charconv>
#include <cmath>
#include <sstream>

#include "design_report.hpp"
#include "format.hpp"
#include "html_report.hpp"
#include "results/bibliography.hpp"
#include "results/design_record.hpp"
#include "svg_chart.hpp"
#include "wickgrid/errors.hpp"
#include "wickgrid/version.hpp"

namespace wickgrid::report {

namespace {
using nlohmann::json;

// Appends a fixed-point number without a locale or a temporary string (100,000 drains per file).
// The buffer holds any finite double at up to 8 decimals (309 integer digits); a value that is not
// finite, or a failed conversion, is an error, never bytes of the buffer (files go to contractors).
void append_fixed(std::string& out, double value, int decimals) {
    char buffer[330];
    if (!std::isfinite(value) || decimals < 0 || decimals > 8)
        throw EvaluationError("a set-out file", "a coordinate or length is " + format_value(value) + ", not a finite number");
    const auto result = std::to_chars(buffer, buffer + sizeof buffer, value, std::chars_format::fixed, decimals);
    if (result.ec != std::errc())
        throw EvaluationError("a set-out file", "the number " + format_value(value) + " could not be written");
    std::string_view text(buffer, static_cast<std::size_t>(result.ptr - buffer));
    if (text.front() == '-' && text.find_first_not_of("-0.") == std::string_view::npos) text.remove_prefix(1);
    out.append(text);
}

double rounded(double value, int decimals) {
    const double scale = std::pow(10.0, decimals);
    const double r = std::round(value * scale) / scale;
    return r == 0.0 ? 0.0 : r;
}

json string_list(const std::vector<std::string>& lines) {
    json out = json::array();
    for (const auto& l : lines) out.push_back(l);
    return out;
}

std::string length_source(const results::LayoutRecord& r) {
    return r.request.base_points.empty() ? "scenario drain length" : "base depth surface (inverse distance, Shepard 1968)";
}

std::vector<std::pair<std::string, std::string>> summary_rows(const results::LayoutRecord& r) {
    const auto& l = r.layout;
    std::vector<std::pair<std::string, std::string>> rows{
        {"drain", r.drain_name},
        {"pattern", std::string(to_string(r.request.pattern))},
        {"spacing (m)", fixed(r.request.spacing_m, 3)},
        {"drains", std::to_string(l.drains.size())},
        {"idealised count (area / cell area)", fixed(l.idealised_count, 1)},
        {"treated area (m²)", fixed(l.area_m2, 1)},
        {"total drain length (m)", fixed(l.total_length_m, 1)},
        {"drain length, shortest–longest (m)", fixed(r.shortest_m, 2) + "–" + fixed(r.longest_m, 2)},
        {"drain length from", length_source(r)},
        {"rows", std::to_string(l.rows)},
        {"row angle (° from x axis)", fixed(l.angle_deg, 3)},
        {"lattice origin x, y (m)", fixed(l.origin.x_m, 3) + ", " + fixed(l.origin.y_m, 3)},
        {"edge offset (m)", fixed(r.request.edge_offset_m, 2)},
        {"coordinate system", r.request.area.crs_name.value_or("not named in the area file")},
    };
    if (r.drain_cost) rows.emplace_back("drain cost (length × cost per m)", fixed(*r.drain_cost, 0));
    const auto& c = r.design_check;
    rows.emplace_back("design's spacing limit (m)",
                      c.spacing_limit_m ? fixed(*c.spacing_limit_m, 3) + (c.limited_by_maximum ? " (range maximum)" : "")
                                        : std::string("none in range"));
    rows.emplace_back("laid spacing within the design's limit", c.within_limit ? "yes" : "NO");
    rows.emplace_back("U at the deadline at the laid spacing (%)", fixed(100.0 * c.degree_at_deadline, 1));
    if (c.residual_m) rows.emplace_back("residual settlement at the laid spacing (mm)", fixed(*c.residual_m * 1000.0, 0));
    return rows;
}

// A round length (1, 2 or 5 × 10ⁿ m) at most `most_m`.
double scale_bar_m(double most_m) {
    const double decade = std::pow(10.0, std::floor(std::log10(most_m)));
    for (const double f : {5.0, 2.0, 1.0})
        if (f * decade <= most_m) return f * decade;
    return decade;
}

struct PlanFrame {
    double x0, y1, k, pad;
    double sx(double x) const { return pad + (x - x0) * k; }
    double sy(double y) const { return pad + (y1 - y) * k; }
};

void append_ring_path(std::string& d, const layout::Ring& ring, const PlanFrame& f) {
    for (std::size_t i = 0; i < ring.size(); ++i) {
        d += i == 0 ? "M" : "L";
        append_fixed(d, f.sx(ring[i].x_m), 2);
        d += ' ';
        append_fixed(d, f.sy(ring[i].y_m), 2);
    }
    d += "Z";
}

std::string area_path(const layout::Area& area, const PlanFrame& f) {
    std::string d;
    for (const auto& part : area.parts) {
        append_ring_path(d, part.outer, f);
        for (const auto& h : part.holes) append_ring_path(d, h, f);
    }
    return d;
}
}  // namespace

std::string layout_table(const results::LayoutRecord& r) {
    std::vector<std::vector<std::string>> rows;
    for (const auto& [k, v] : summary_rows(r)) rows.push_back({k, v});
    std::ostringstream o;
    o << "Drain layout: " << r.scenario->title << "\n\n" << text_table({"quantity", "value"}, rows, 2);
    o << "\nAssumptions:\n";
    for (const auto& a : r.assumptions) o << "  - " << a << "\n";
    for (const auto& w : r.warnings) o << "Warning: " << w << "\n";
    o << "\n" << results::caution_block();
    return o.str();
}

json layout_json(const results::LayoutRecord& r) {
    const auto& l = r.layout;
    json out{{"schema", 1},
             {"wickgrid_version", version},
             {"title", r.scenario->title},
             {"drain", r.drain_name},
             {"pattern", to_string(r.request.pattern)},
             {"spacing_m", r.request.spacing_m},
             {"count", l.drains.size()},
             {"total_length_m", rounded(l.total_length_m, 2)},
             {"area_m2", rounded(l.area_m2, 2)},
             {"idealised_count", rounded(l.idealised_count, 2)},
             {"rows", l.rows},
             {"angle_deg", l.angle_deg},
             {"origin", {{"x", l.origin.x_m}, {"y", l.origin.y_m}}},
             {"edge_offset_m", r.request.edge_offset_m},
             {"shortest_m", rounded(r.shortest_m, 2)},
             {"longest_m", rounded(r.longest_m, 2)},
             {"length_source", length_source(r)},
             {"drains_outside_boreholes", l.drains_outside_base_points},
             {"crs", r.request.area.crs_name ? json(*r.request.area.crs_name) : json(nullptr)},
             {"drain_cost", r.drain_cost ? json(*r.drain_cost) : json(nullptr)},
             {"warnings", string_list(r.warnings)},
             {"design_check", {{"spacing_limit_m", r.design_check.spacing_limit_m ? json(*r.design_check.spacing_limit_m) : json(nullptr)},
                               {"limited_by_max_spacing", r.design_check.limited_by_maximum},
                               {"spacing_m", r.design_check.spacing_m},
                               {"within_limit", r.design_check.within_limit},
                               {"degree_at_deadline", r.design_check.degree_at_deadline},
                               {"residual_settlement_mm", r.design_check.residual_m ? json(*r.design_check.residual_m * 1000.0) : json(nullptr)},
                               {"designed_clay_thickness_m", r.design_check.designed_clay_m},
                               {"deepest_borehole_base_m", r.design_check.deepest_base_m ? json(*r.design_check.deepest_base_m) : json(nullptr)}}},
             {"assumptions", string_list(r.assumptions)},
             {"cautions", string_list(results::cautions())}};
    add_title_block(out, *r.scenario);
    return out;
}

namespace {
// One drain as the set-out files give it: {"id":…,"x":…,"y":…,"length_m":…}, coordinates to the
// millimetre, lengths to the centimetre (the JSON drain list and the GeoJSON properties alike).
void append_drain_object(std::string& out, const layout::Drain& d) {
    out += "{\"id\":";
    out += std::to_string(d.id);
    out += ",\"x\":";
    append_fixed(out, d.x_m, 3);
    out += ",\"y\":";
    append_fixed(out, d.y_m, 3);
    out += ",\"length_m\":";
    append_fixed(out, d.length_m, 2);
    out += '}';
}
}  // namespace

std::string layout_json_text(const results::LayoutRecord& r) {
    std::string out = layout_json(r).dump(1);
    out.pop_back();  // the closing brace: the drains go last
    out += ",\n \"drains\": [";
    out.reserve(out.size() + r.layout.drains.size() * 64 + 8);
    bool first = true;
    for (const auto& d : r.layout.drains) {
        out += first ? "\n  " : ",\n  ";
        first = false;
        append_drain_object(out, d);
    }
    out += "\n ]\n}\n";
    return out;
}

std::string layout_csv(const results::LayoutRecord& r) {
    std::string out = "id,x_m,y_m,length_m\n";
    out.reserve(out.size() + r.layout.drains.size() * 40);
    for (const auto& d : r.layout.drains) {
        out += std::to_string(d.id);
        out += ',';
        append_fixed(out, d.x_m, 3);
        out += ',';
        append_fixed(out, d.y_m, 3);
        out += ',';
        append_fixed(out, d.length_m, 2);
        out += '\n';
    }
    return out;
}

std::string layout_geojson(const results::LayoutRecord& r) {
    std::string out = "{\"type\":\"FeatureCollection\",";
    if (r.request.area.crs_name)
        out += "\"crs\":{\"type\":\"name\",\"properties\":{\"name\":" + json(*r.request.area.crs_name).dump() + "}},";
    out += "\"features\":[\n";
    out.reserve(out.size() + r.layout.drains.size() * 110);
    bool first = true;
    for (const auto& d : r.layout.drains) {
        if (!first) out += ",\n";
        first = false;
        out += "{\"type\":\"Feature\",\"geometry\":{\"type\":\"Point\",\"coordinates\":[";
        append_fixed(out, d.x_m, 3);
        out += ',';
        append_fixed(out, d.y_m, 3);
        out += "]},\"properties\":";
        append_drain_object(out, d);
        out += '}';
    }
    out += "\n]}\n";
    return out;
}

std::string layout_svg(const results::LayoutRecord& r) {
    constexpr double width = 900.0;
    constexpr double pad = 30.0;
    constexpr double legend_h = 60.0;
    double x0 = INFINITY, x1 = -INFINITY, y0 = INFINITY, y1 = -INFINITY;
    for (const auto& part : r.request.area.area.parts)
        for (const auto& p : part.outer) {
            x0 = std::min(x0, p.x_m);
            x1 = std::max(x1, p.x_m);
            y0 = std::min(y0, p.y_m);
            y1 = std::max(y1, p.y_m);
        }
    const double span = std::max(x1 - x0, (y1 - y0) * 1.2);
    const double k = (width - 2 * pad) / span;
    const double plan_h = (y1 - y0) * k + 2 * pad;
    const double height = plan_h + legend_h;
    const PlanFrame f{x0, y1, k, pad};
    std::ostringstream o;
    o << "<svg xmlns=\"http://www.w3.org/2000/svg\" viewBox=\"0 0 " << width << ' ' << fixed(height, 1)
      << "\" width=\"" << width << "\" height=\"" << fixed(height, 1) << "\" font-family=\"sans-serif\" font-size=\"12\">\n";
    o << "<title>Drain layout plan: " << escape_xml(r.scenario->title) << "</title>\n";
    o << "<defs><pattern id=\"excluded\" width=\"6\" height=\"6\" patternUnits=\"userSpaceOnUse\">"
         "<path d=\"M0 6L6 0\" stroke=\"#8a8f94\" stroke-width=\"1\"/></pattern></defs>\n";
    o << "<path d=\"" << area_path(r.request.area.area, f)
      << "\" fill=\"#eef4ec\" fill-rule=\"evenodd\" stroke=\"#2f5d3a\" stroke-width=\"1.5\"/>\n";
    if (r.request.exclusions)
        o << "<path d=\"" << area_path(r.request.exclusions->area, f)
          << "\" fill=\"url(#excluded)\" fill-rule=\"evenodd\" stroke=\"#5b6066\" stroke-width=\"1\"/>\n";
    // Drains as round-capped zero-length strokes: one path, a dot per drain.
    std::string dots;
    constexpr std::size_t drawn_one_by_one = 100000;
    const bool thinned = r.layout.drains.size() > drawn_one_by_one;
    // Thinned: one dot per half-pixel cell of the plan (a bitmap of the cells already drawn).
    const auto cells_x = static_cast<std::size_t>(2.0 * width) + 2;
    const auto cells_y = static_cast<std::size_t>(2.0 * plan_h) + 2;
    std::vector<bool> drawn(thinned ? cells_x * cells_y : 0);
    dots.reserve(std::min(r.layout.drains.size(), thinned ? cells_x * cells_y : r.layout.drains.size()) * 18);
    for (const auto& d : r.layout.drains) {
        if (thinned) {
            const double cx = std::clamp(2.0 * f.sx(d.x_m), 0.0, static_cast<double>(cells_x - 1));
            const double cy = std::clamp(2.0 * f.sy(d.y_m), 0.0, static_cast<double>(cells_y - 1));
            const std::size_t cell = static_cast<std::size_t>(cy) * cells_x + static_cast<std::size_t>(cx);
            if (drawn[cell]) continue;
            drawn[cell] = true;
        }
        dots += 'M';
        append_fixed(dots, f.sx(d.x_m), 1);
        dots += ' ';
        append_fixed(dots, f.sy(d.y_m), 1);
        dots += "h0";
    }
    const double dot = std::clamp(r.request.spacing_m * k * 0.4, 0.8, 6.0);
    o << "<path d=\"" << dots << "\" stroke=\"#1d4f91\" stroke-width=\"" << fixed(dot, 2)
      << "\" stroke-linecap=\"round\" fill=\"none\"/>\n";
    // Scale bar, bottom left.
    const double bar_m = scale_bar_m((width - 2 * pad) / k / 4.0);
    const double by = plan_h + 12.0;
    o << "<g stroke=\"#222\" stroke-width=\"2\"><path d=\"M" << pad << ' ' << fixed(by, 1) << "h" << fixed(bar_m * k, 2)
      << "M" << pad << ' ' << fixed(by - 5, 1) << "v10M" << fixed(pad + bar_m * k, 2) << ' ' << fixed(by - 5, 1)
      << "v10\"/></g>\n<text x=\"" << pad << "\" y=\"" << fixed(by + 20, 1) << "\">" << tick_text(bar_m) << " m</text>\n";
    o << "<text x=\"" << fixed(width / 2 - 120, 1) << "\" y=\"" << fixed(by + 5, 1) << "\">" << r.layout.drains.size() << " drains, "
      << to_string(r.request.pattern) << " " << fixed(r.request.spacing_m, 2) << " m</text>\n";
    if (r.request.area.crs_name) {
        const double ax = width - pad - 10.0;
        o << "<g><path d=\"M" << ax << " 10l8 24h-16z\" fill=\"#222\"/><text x=\"" << ax << "\" y=\"48\" text-anchor=\"middle\">N</text>"
          << "<text x=\"" << ax << "\" y=\"62\" text-anchor=\"middle\" font-size=\"9\">grid</text></g>\n";
    }
    o << "</svg>\n";
    return o.str();
}

std::string layout_html(const results::LayoutRecord& r) {
    std::ostringstream o;
    o << "<!DOCTYPE html>\n<html lang=\"en\">\n<head>\n<meta charset=\"utf-8\"/>\n<title>Drain layout: "
      << escape_xml(r.scenario->title) << "</title>\n<style>\n"
      << "body { font-family: sans-serif; max-width: 60rem; margin: auto; padding: 1rem; color: #1d2731; }\n"
         "table { border-collapse: collapse; } th, td { border: 1px solid #c9d2d8; padding: .25rem .5rem; text-align: left; }\n"
         "th { background: #e8f1f0; } .warning { color: #8a3b00; font-weight: bold; }\n"
         ".cautions { border: 2px solid #c4621d; padding: .4rem 1rem; } figure svg { max-width: 100%; height: auto; }\n"
         "@page { size: A4; margin: 15mm; }\n" << print_page_css(*r.scenario) << "</style>\n</head>\n<body>\n";
    o << "<h1>Drain layout: " << escape_xml(r.scenario->title) << "</h1>\n" << title_block_html(*r.scenario) << "<h2>Layout</h2>\n<table>\n";
    for (const auto& [k, v] : summary_rows(r)) o << "<tr><th>" << escape_xml(k) << "</th><td>" << escape_xml(v) << "</td></tr>\n";
    o << "</table>\n";
    for (const auto& w : r.warnings) o << "<p class=\"warning\">Warning: " << escape_xml(w) << "</p>\n";
    o << "<figure>" << layout_svg(r) << "<figcaption>Plan view: treatment area (green), holes (white), exclusion zones "
         "(hatched), drains (blue dots).</figcaption></figure>\n<h2>Assumptions</h2>\n<ul>\n";
    for (const auto& a : r.assumptions) o << "<li>" << escape_xml(a) << "</li>\n";
    o << "</ul>\n";
    if (!r.request.base_points.empty())
        o << "<h2>References</h2>\n<p>" << escape_xml(results::reference("shepard1968").text) << "</p>\n";
    o << "<section class=\"cautions\"><h2>Cautions</h2>\n<ul>\n";
    for (const auto& c : results::cautions()) o << "<li>" << escape_xml(c) << "</li>\n";
    o << "</ul></section>\n<footer>wickgrid " << version << "</footer>\n</body>\n</html>\n";
    return o.str();
}

}  // namespace wickgrid::report
