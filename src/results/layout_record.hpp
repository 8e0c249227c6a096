#pragma once
// The result of `wickgrid layout`: the drains laid over the treatment area, with the inputs they
// came from, warnings and assumptions derived from what was computed. Writers format it; they never
// call the engine.
#include <optional>
#include <string>
#include <vector>

#include "scenario/area_files.hpp"
#include "scenario/scenario.hpp"
#include "wickgrid/layout.hpp"

namespace wickgrid::results {

struct LayoutRequest {
    std::string drain;  // a product of the scenario
    Pattern pattern = Pattern::triangular;
    double spacing_m = 0.0;
    std::optional<double> angle_deg;
    std::optional<layout::Point> origin;
    double edge_offset_m = 0.0;
    scenario::AreaFile area;
    std::optional<scenario::AreaFile> exclusions;
    std::optional<std::string> base_file;
    std::vector<layout::BaseDepthPoint> base_points;
};

// The spacing laid against the design of the scenario for the same product and pattern (the row
// `design` shows), and what the laid spacing gives at the deadline.
struct LayoutDesignCheck {
    std::optional<double> spacing_limit_m;  // none: no spacing in the range meets the criterion
    bool limited_by_maximum = false;        // the criterion is met even at the range's largest spacing
    double spacing_m = 0.0;                 // laid
    bool within_limit = false;
    double degree_at_deadline = 0.0;        // U at the deadline at the laid spacing
    std::optional<double> residual_m;       // the residual settlement at the laid spacing (residual criterion)
    double designed_clay_m = 0.0;           // clay thickness of the scenario
    std::optional<double> deepest_base_m;   // the boreholes' deepest base, when given
};

struct LayoutRecord {
    const scenario::Scenario* scenario = nullptr;
    LayoutRequest request;
    std::string drain_name;
    double design_length_m = 0.0;
    layout::Layout layout;
    double shortest_m = 0.0;
    double longest_m = 0.0;
    std::optional<double> drain_cost;  // total length × the product's cost per metre
    LayoutDesignCheck design_check;
    std::vector<std::string> warnings;
    std::vector<std::string> assumptions;
};

// Lays out the drains (the engine's lay_out), checks the spacing against the scenario's design
// (design_row) and derives the record. Throws what lay_out and the design throw.
LayoutRecord layout_record(const scenario::Scenario& s, LayoutRequest request);

}  // namespace wickgrid::results
