#include "layout_record.hpp"

#include <algorithm>
#include <cmath>

#include "report/format.hpp"
#include "wickgrid/cell_model.hpp"
#include "wickgrid/defaults.hpp"
#include "wickgrid/design.hpp"
#include "wickgrid/names.hpp"

namespace wickgrid::results {

namespace {
using report::fixed;

// Drain lengths that depart from the design's by more than this are worth a second design check.
constexpr double length_spread_to_warn = 0.10;
// A borehole base deeper than the designed clay by more than this is named (survey precision).
constexpr double length_tolerance_m = 0.01;

std::vector<std::string> layout_assumptions(const LayoutRecord& r) {
    const auto& q = r.request;
    std::vector<std::string> out;
    out.push_back("Coordinates are metres of a projected system (" +
                  (q.area.crs_name ? "the area file names " + *q.area.crs_name : std::string("the area file names none")) +
                  "); drains are set out in that system.");
    out.push_back("Rows run at " + fixed(r.layout.angle_deg, 3) + "° anticlockwise from the x axis through the lattice origin (" +
                  fixed(r.layout.origin.x_m, 3) + ", " + fixed(r.layout.origin.y_m, 3) + ") m" +
                  (q.angle_deg || q.origin ? "" : ", along the longest edge of the outline") +
                  "; drain ids follow the rows, each row in the opposite direction to the last.");
    out.push_back("No drain stands nearer than " + fixed(q.edge_offset_m, 2) +
                  " m to an edge of the area, its holes or the exclusion zones; the idealised count is the area less "
                  "holes and exclusion zones divided by the area one drain serves.");
    if (q.base_points.empty())
        out.push_back("Every drain has the scenario's length, " + fixed(r.design_length_m, 2) + " m from the top of the clay.");
    else
        out.push_back("Depth to the clay base interpolated between " + std::to_string(q.base_points.size()) +
                      " borehole(s) by inverse-distance weighting, power 2 (Shepard 1968); drains that reach the base in "
                      "the design follow it, shorter ones keep their length and are cut where the base is higher.");
    out.push_back("Lengths are measured from the top of the clay; add the working platform and any length left above "
                  "it when ordering drain.");
    return out;
}

LayoutDesignCheck check_design(const scenario::Scenario& s, const DrainProductSpec& product, const LayoutRequest& q) {
    const Site& site = s.site;
    LayoutDesignCheck c;
    const DesignRow row = design_row(site, product, q.pattern);
    if (row.feasible) c.spacing_limit_m = row.spacing_limit_m;
    c.limited_by_maximum = row.limited_by_maximum;
    c.spacing_m = q.spacing_m;
    // Within the limit up to the search tolerance; beyond the range's maximum the design says nothing.
    c.within_limit = row.feasible && (row.limited_by_maximum ? q.spacing_m <= site.range.bounds.max_m
                                                             : q.spacing_m <= row.spacing_limit_m + defaults::spacing_tolerance_m);
    const auto model = make_cell_model(site, product, q.pattern, q.spacing_m);
    c.degree_at_deadline = model->degree(site.criterion.deadline_s);
    if (const auto* r = site.criterion.residual()) c.residual_m = model->residual_m(site.criterion.deadline_s, r->service_s);
    c.designed_clay_m = site.ground.thickness_m;
    for (const auto& b : q.base_points) c.deepest_base_m = std::max(c.deepest_base_m.value_or(0.0), b.depth_m);
    return c;
}

std::vector<std::string> layout_warnings(const LayoutRecord& r) {
    std::vector<std::string> out;
    const auto& c = r.design_check;
    if (!c.within_limit)
        out.push_back(c.spacing_limit_m
                          ? "The laid spacing, " + fixed(c.spacing_m, 3) + " m, exceeds the design's limit for " + r.drain_name +
                                " in a " + std::string(to_string(r.request.pattern)) + " pattern, " +
                                fixed(*c.spacing_limit_m, 3) + " m: the criterion is not met at the deadline."
                          : "No spacing in the scenario's range meets the criterion for " + r.drain_name + " in a " +
                                std::string(to_string(r.request.pattern)) + " pattern; the laid spacing does not either.");
    if (c.deepest_base_m && *c.deepest_base_m > c.designed_clay_m + length_tolerance_m)
        out.push_back("The boreholes show the clay base down to " + fixed(*c.deepest_base_m, 2) + " m, " +
                      fixed(*c.deepest_base_m - c.designed_clay_m, 2) + " m deeper than the " + fixed(c.designed_clay_m, 2) +
                      " m designed: drain lengths and the degree at the deadline there differ from the design; design "
                      "for the thickest clay.");
    const auto& l = r.layout;
    if (l.drains_outside_base_points > 0)
        out.push_back(std::to_string(l.drains_outside_base_points) + " of " + std::to_string(l.drains.size()) +
                      " drains lie outside the boreholes' hull: their lengths are extrapolated; add boreholes there.");
    if (r.shortest_m < r.design_length_m * (1.0 - length_spread_to_warn) ||
        r.longest_m > r.design_length_m * (1.0 + length_spread_to_warn))
        out.push_back("Drain lengths range " + fixed(r.shortest_m, 2) + "–" + fixed(r.longest_m, 2) +
                      " m against the design's " + fixed(r.design_length_m, 2) +
                      " m; check the design for the thinnest and thickest clay.");
    return out;
}
}  // namespace

LayoutRecord layout_record(const scenario::Scenario& s, LayoutRequest request) {
    LayoutRecord r;
    r.scenario = &s;
    const auto& product = s.site.product(request.drain);
    r.drain_name = product.name;
    r.design_length_m = s.site.installation.drain_length_m;
    const layout::LatticeSpec spec{request.pattern, request.spacing_m, request.angle_deg, request.origin,
                                   request.edge_offset_m};
    const layout::LengthRule lengths{r.design_length_m, s.site.ground.thickness_m, request.base_points};
    r.layout = layout::lay_out(request.area.area, request.exclusions ? request.exclusions->area : layout::Area{}, spec,
                               lengths, defaults::max_layout_drains);
    const auto [lo, hi] = std::minmax_element(r.layout.drains.begin(), r.layout.drains.end(),
                                              [](const auto& a, const auto& b) { return a.length_m < b.length_m; });
    r.shortest_m = lo->length_m;
    r.longest_m = hi->length_m;
    if (product.cost_per_m) r.drain_cost = *product.cost_per_m * r.layout.total_length_m;
    r.design_check = check_design(s, product, request);
    r.request = std::move(request);
    r.assumptions = layout_assumptions(r);
    r.warnings = s.input_warnings;
    for (auto& w : layout_warnings(r)) r.warnings.push_back(std::move(w));
    return r;
}

}  // namespace wickgrid::results
