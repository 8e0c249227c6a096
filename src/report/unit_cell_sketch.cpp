#include "unit_cell_sketch.hpp"

#include <cmath>
#include <sstream>

#include "format.hpp"
#include "svg_chart.hpp"
#include "wickgrid/names.hpp"

namespace wickgrid::report {

namespace {
constexpr double width = 900.0, height = 420.0;

std::string n(double v) { return fixed(v, 1); }

// Plan: the lattice around the drain at the centre, the spacing and the influence circle.
void plan(std::ostringstream& o, const DesignRow& row) {
    const double cx = 220.0, cy = 215.0;
    const double k = 95.0 / row.spacing_m;  // pixels per metre: one spacing is 95 px
    const double pitch = row.pattern == Pattern::triangular ? row.spacing_m * std::sqrt(3.0) / 2.0 : row.spacing_m;
    o << "<text x=\"30\" y=\"30\" font-weight=\"bold\">Plan (" << to_string(row.pattern) << " pattern)</text>\n";
    o << "<circle cx=\"" << n(cx) << "\" cy=\"" << n(cy) << "\" r=\"" << n(row.figures.influence_diameter_m / 2.0 * k)
      << "\" fill=\"#eef4ec\" stroke=\"#2f5d3a\" stroke-dasharray=\"6 3\"/>\n";
    for (int j = -2; j <= 2; ++j)
        for (int i = -3; i <= 3; ++i) {
            const double shift = row.pattern == Pattern::triangular && (j % 2 != 0) ? 0.5 : 0.0;
            const double x = cx + (i + shift) * row.spacing_m * k, y = cy + j * pitch * k;
            if (x < 40 || x > 400 || y < 50 || y > 390) continue;
            o << "<rect x=\"" << n(x - 6) << "\" y=\"" << n(y - 1.5) << "\" width=\"12\" height=\"3\" fill=\"#1d4f91\"/>\n";
        }
    const double x2 = cx + row.spacing_m * k;
    o << "<path d=\"M" << n(cx) << ' ' << n(cy + 22) << "H" << n(x2) << "M" << n(cx) << ' ' << n(cy + 16) << "v12M" << n(x2) << ' '
      << n(cy + 16) << "v12\" stroke=\"#222\"/>\n<text x=\"" << n((cx + x2) / 2) << "\" y=\"" << n(cy + 40)
      << "\" text-anchor=\"middle\">s = " << fixed(row.spacing_m, 2) << " m</text>\n";
    o << "<text x=\"" << n(cx) << "\" y=\"" << n(cy - row.figures.influence_diameter_m / 2.0 * k - 8)
      << "\" text-anchor=\"middle\">influence circle De = " << fixed(row.figures.influence_diameter_m, 3) << " m</text>\n";
}

// Section: depth to scale, radius widened so that the drain and the smear zone can be seen.
void section(std::ostringstream& o, const Site& site, const DesignRow& row) {
    const double left = 470.0, right = 770.0, top = 70.0, bottom = 380.0, axis = (left + right) / 2.0;
    const double H = site.ground.thickness_m, k = (bottom - top) / H;
    o << "<text x=\"" << n(left - 40) << "\" y=\"30\" font-weight=\"bold\">Section (depth to scale, radius not)</text>\n";
    // Layers, alternating shades, with their thickness.
    std::vector<double> layers;
    if (site.ground.profile)
        for (const auto& l : site.ground.profile->layers) layers.push_back(l.thickness_m);
    else layers.push_back(H);
    double z = 0.0;
    for (std::size_t i = 0; i < layers.size(); ++i) {
        o << "<rect x=\"" << n(left) << "\" y=\"" << n(top + z * k) << "\" width=\"" << n(right - left) << "\" height=\""
          << n(layers[i] * k) << "\" fill=\"" << (i % 2 ? "#e9e1d3" : "#f3ede2") << "\" stroke=\"#8a7f6a\"/>\n<text x=\""
          << n(right + 6) << "\" y=\"" << n(top + (z + layers[i] / 2) * k + 4) << "\" font-size=\"11\">"
          << (layers.size() > 1 ? "layer " + std::to_string(i + 1) + ", " : std::string("clay, ")) << fixed(layers[i], 1)
          << " m</text>\n";
        z += layers[i];
    }
    const bool top_drained = site.ground.drainage != VerticalDrainage::bottom_only;
    const bool bottom_drained = site.ground.drainage != VerticalDrainage::top_only;
    o << "<text x=\"" << n(left) << "\" y=\"" << n(top - 8) << "\" font-size=\"11\">top: "
      << (top_drained ? "drained (drainage blanket)" : "not drained") << "</text>\n<text x=\"" << n(left) << "\" y=\""
      << n(bottom + 16) << "\" font-size=\"11\">base: " << (bottom_drained ? "drained" : "not drained") << "</text>\n";
    // Smear zone and drain: the drain 8 px wide, the smear zone scaled from it by ds/dw.
    const double drain_w = 8.0, smear_w = drain_w * row.figures.s;
    const double l = site.installation.drain_length_m;
    o << "<rect x=\"" << n(axis - smear_w / 2) << "\" y=\"" << n(top) << "\" width=\"" << n(smear_w) << "\" height=\""
      << n(l * k) << "\" fill=\"#f6d9c2\" stroke=\"#c4621d\" stroke-dasharray=\"3 2\"/>\n<rect x=\"" << n(axis - drain_w / 2)
      << "\" y=\"" << n(top) << "\" width=\"" << n(drain_w) << "\" height=\"" << n(l * k) << "\" fill=\"#1d4f91\"/>\n";
    o << "<path d=\"M" << n(axis) << ' ' << n(top - 4) << "l-5 8h10z\" fill=\"#1d4f91\"/>\n";  // outlet at the top
    if (site.installation.outlets == DrainOutlets::top_and_bottom)
        o << "<path d=\"M" << n(axis) << ' ' << n(top + l * k + 4) << "l-5 -8h10z\" fill=\"#1d4f91\"/>\n";
    o << "<path d=\"M" << n(left + 20) << ' ' << n(top) << "V" << n(top + l * k) << "M" << n(left + 14) << ' ' << n(top) << "h12M"
      << n(left + 14) << ' ' << n(top + l * k) << "h12\" stroke=\"#222\"/>\n<text x=\"" << n(left + 26) << "\" y=\""
      << n(top + l * k / 2) << "\" font-size=\"11\">drain length " << fixed(l, 1) << " m</text>\n";
    o << "<text x=\"" << n(axis + smear_w / 2 + 6) << "\" y=\"" << n(top + 16) << "\" font-size=\"11\">smear zone ds = "
      << fixed(row.figures.smear_diameter_m * 1000.0, 0) << " mm</text>\n<text x=\"" << n(axis + smear_w / 2 + 6) << "\" y=\""
      << n(top + 30) << "\" font-size=\"11\">drain dw = " << fixed(row.figures.equivalent_diameter_m * 1000.0, 0)
      << " mm</text>\n";
}
}  // namespace

std::string unit_cell_sketch(const results::DesignRecord& record) {
    const DesignRow* row = record.result.best();
    if (!row && !record.result.rows.empty()) row = &record.result.rows.front();
    if (!row) return "";
    std::ostringstream o;
    o << "<svg xmlns=\"http://www.w3.org/2000/svg\" viewBox=\"0 0 " << width << ' ' << height << "\" width=\"" << width
      << "\" height=\"" << height << "\" font-family=\"sans-serif\" font-size=\"12\" fill=\"#1d2a33\">\n<title>Unit cell: "
      << escape_xml(row->drain) << ", " << to_string(row->pattern) << " at " << fixed(row->spacing_m, 2) << " m</title>\n";
    plan(o, *row);
    section(o, record.site(), *row);
    o << "</svg>\n";
    return o.str();
}

}  // namespace wickgrid::report
