#pragma once
// Files the layout reads: the treatment area (or exclusion zones) as GeoJSON (RFC 7946) Polygon,
// MultiPolygon, Feature or FeatureCollection, or as a CSV of vertices; and the depth to the clay
// base at boreholes (CSV). Coordinates are metres of a projected system; every error is located.
#include <optional>
#include <string>
#include <vector>

#include "scenario.hpp"
#include "wickgrid/layout.hpp"

namespace wickgrid::scenario {

struct AreaFile {
    std::string file;
    layout::Area area;
    // The coordinate system the file names (a GeoJSON "crs" member, as GIS programs still write
    // for projected data); absent when it names none.
    std::optional<std::string> crs_name;
};

// Reads an area file: GeoJSON when its first non-blank character is '{', CSV otherwise (columns
// x_m, y_m and optionally part and ring: ring 0 the outline, 1, 2, … its holes; the first vertex
// need not be repeated). Refuses, with the place in the file: syntax, a geometry that is not a
// polygon, an open GeoJSON ring, fewer than 3 vertices, zero area, a ring crossing itself,
// overlapping parts, a coordinate system that is geographic, and coordinates that all fall within
// longitude/latitude ranges unless `projected_confirmed` (a local grid near its origin). Exclusion
// zones are read with PartOverlap::merged: their parts may overlap.
AreaFile read_area_file(const std::string& path, bool projected_confirmed,
                        layout::PartOverlap overlap = layout::PartOverlap::refused);
AreaFile parse_area(const std::string& text, const std::string& file, bool projected_confirmed,
                    layout::PartOverlap overlap = layout::PartOverlap::refused);

// Reads borehole base depths: CSV with columns x_m, y_m, base_depth_m (and optionally name).
// Depths must be positive; two rows at one position must not disagree.
std::vector<layout::BaseDepthPoint> read_base_depth_file(const std::string& path);
std::vector<layout::BaseDepthPoint> parse_base_depths(const std::string& text, const std::string& file);

}  // namespace wickgrid::scenario
