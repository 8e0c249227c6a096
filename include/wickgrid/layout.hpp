#pragma once
// From a spacing to drain positions on site: the pattern's lattice laid over a treatment area in a
// projected coordinate system (metres), drain lengths from a depth-to-base surface, counts and
// lengths for the bill of quantities. Geometry only; no files (the readers and writers live in
// src/scenario and src/report).
#include <optional>
#include <string>
#include <vector>

#include "wickgrid/geometry.hpp"

namespace wickgrid::layout {

struct Point {
    double x_m = 0.0;
    double y_m = 0.0;
};

// A ring of vertices in order, not repeating the first vertex at the end (the ring closes itself).
using Ring = std::vector<Point>;

struct Polygon {
    Ring outer;
    std::vector<Ring> holes;
};

// A treatment area (or a set of exclusion zones): one or more polygons with holes, in metres of a
// projected coordinate system. Either ring orientation is accepted.
struct Area {
    std::vector<Polygon> parts;
};

// What is wrong with an area, located by part and ring (ring 0 is the outline, k ≥ 1 the k-th hole)
// so that a reader can point at the place in its file.
struct AreaProblem {
    std::size_t part = 0;
    std::optional<std::size_t> ring;  // absent when the problem is between parts or rings
    std::string reason;
};

// Whether an area's parts may overlap: a treatment area's may not (its drains would be counted
// twice); exclusion zones drawn on site often do, and are merged (their union is excluded).
enum class PartOverlap { refused, merged };

// The first problem with an area, or nothing when it is a valid area: fewer than 3 distinct vertices
// in a ring, a ring of zero area, a ring that crosses itself, holes outside their outline or
// crossing it, parts that overlap (unless merged), a coordinate that is not finite. Cost O(V log V)
// for V vertices.
std::optional<AreaProblem> area_problem(const Area& area, PartOverlap overlap = PartOverlap::refused);

// Plan area (m²) of a valid area, holes removed.
double area_m2(const Area& area);

// How the lattice is laid.
struct LatticeSpec {
    Pattern pattern = Pattern::triangular;
    double spacing_m = 0.0;
    // Direction of the rows, degrees anticlockwise from the x axis. Absent: along the longest edge of
    // the outlines.
    std::optional<double> angle_deg;
    // A lattice point. Absent: the first vertex of the longest edge moved inwards by the edge offset,
    // so that the first row runs along that edge.
    std::optional<Point> origin;
    // No drain nearer than this to the area's edge (outlines, holes and exclusion zones), m ≥ 0.
    double edge_offset_m = 0.0;
};

// One borehole or CPT: the depth from the top of the clay to its base.
struct BaseDepthPoint {
    double x_m = 0.0;
    double y_m = 0.0;
    double depth_m = 0.0;
};

// Depth to the clay base at (x, y), interpolated by inverse-distance weighting with power 2
// (Shepard 1968): exact at each point, never outside the range of the points' depths.
// Requires at least one point. Cost O(number of points). Thread-safe.
double base_depth_m(const std::vector<BaseDepthPoint>& points, Point at);

// How long each drain is.
struct LengthRule {
    double design_length_m = 0.0;  // the scenario's drain length from the top of the clay
    double clay_thickness_m = 0.0;  // the scenario's clay thickness
    // Boreholes giving the depth to the base; empty: every drain has the design length.
    std::vector<BaseDepthPoint> base_points;
};
// With a base surface, a drain that reaches the base in the design (design length = clay thickness)
// follows the base at its position; a drain that stops short keeps its design length where the clay
// is deeper and is cut at the base where it is shallower. Never longer than the clay there.
double drain_length_m(const LengthRule& rule, Point at);

struct Drain {
    long id = 0;  // 1, 2, … row by row, each row in the opposite direction to the last (as a rig walks)
    double x_m = 0.0;
    double y_m = 0.0;
    double length_m = 0.0;
};

struct Layout {
    std::vector<Drain> drains;
    double area_m2 = 0.0;              // treatment area less holes and exclusion zones
    double idealised_count = 0.0;      // area_m2 / area served by one drain of the pattern
    double total_length_m = 0.0;
    double angle_deg = 0.0;            // the angle used
    Point origin;                      // the origin used
    std::size_t rows = 0;
    // Drains outside the convex hull of the base points (their lengths are extrapolated).
    std::size_t drains_outside_base_points = 0;
};

// Lays the lattice over the area less the exclusion zones, keeping points at least the edge offset
// inside. Throws InputError for a spacing or offset out of range and for an invalid area (the
// reader should have located it with area_problem first); EvaluationError when the offset leaves no
// area or more than max_drains drains would be laid. Cost O(rows × V log V + drains). Thread-safe.
Layout lay_out(const Area& area, const Area& exclusions, const LatticeSpec& spec, const LengthRule& lengths,
               std::size_t max_drains);

}  // namespace wickgrid::layout
