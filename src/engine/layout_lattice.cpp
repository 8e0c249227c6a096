// The drain lattice laid over a treatment area. Polygon work (validity, differences, row–area
// intersections, distances to the edge, the boreholes' hull) goes through Boost.Geometry; this file
// only generates the lattice rows and orders the drains.
#include <boost/geometry.hpp>
#include <boost/geometry/geometries/multi_polygon.hpp>
#include <boost/geometry/geometries/point_xy.hpp>
#include <boost/geometry/geometries/polygon.hpp>
#include <boost/geometry/geometries/segment.hpp>
#include <boost/geometry/index/rtree.hpp>

#include <algorithm>
#include <cmath>
#include <limits>
#include <numbers>

#include "wickgrid/defaults.hpp"
#include "wickgrid/errors.hpp"
#include "wickgrid/layout.hpp"

namespace wickgrid::layout {

namespace {
namespace bg = boost::geometry;
namespace bgi = boost::geometry::index;
using BPoint = bg::model::d2::point_xy<double>;
using BPolygon = bg::model::polygon<BPoint, false, true>;  // anticlockwise outlines, closed rings
using BMulti = bg::model::multi_polygon<BPolygon>;
using BLine = bg::model::linestring<BPoint>;
using BMultiLine = bg::model::multi_linestring<BLine>;
using BSegment = bg::model::segment<BPoint>;

// A drain this close outside an edge counts as on it: rounding in the rotation must not decide
// whether a drain on the boundary is laid.
constexpr double boundary_tolerance_m = 1e-6;
using defaults::max_coordinate_m;

void append_ring(const Ring& ring, BPolygon::ring_type& out) {
    for (const auto& p : ring) out.emplace_back(p.x_m, p.y_m);
    if (!ring.empty()) out.emplace_back(ring.front().x_m, ring.front().y_m);
}

BPolygon to_boost(const Polygon& polygon) {
    BPolygon out;
    append_ring(polygon.outer, out.outer());
    for (const auto& hole : polygon.holes) {
        out.inners().emplace_back();
        append_ring(hole, out.inners().back());
    }
    bg::correct(out);
    return out;
}

BMulti to_boost(const Area& area) {
    BMulti out;
    for (const auto& part : area.parts) out.push_back(to_boost(part));
    return out;
}

std::size_t distinct_vertices(const Ring& ring) {
    std::size_t n = 0;
    for (std::size_t i = 0; i < ring.size(); ++i) {
        const Point& a = ring[i];
        const Point& b = ring[(i + 1) % ring.size()];
        if (a.x_m != b.x_m || a.y_m != b.y_m) ++n;
    }
    return n;
}

std::string validity_reason(bg::validity_failure_type failure) {
    switch (failure) {
        case bg::failure_few_points: return "has fewer than 3 distinct vertices";
        case bg::failure_spikes: return "turns back along itself (a spike)";
        case bg::failure_self_intersections: return "crosses or touches itself";
        // A ring that crosses itself into loops of opposite turn keeps a wrong orientation after
        // correction (a figure of eight).
        case bg::failure_wrong_orientation: return "crosses itself";
        case bg::failure_interior_rings_outside: return "has a hole outside its outline";
        case bg::failure_nested_interior_rings: return "has a hole inside another hole";
        case bg::failure_disconnected_interior: return "has holes that cut the polygon in pieces";
        case bg::failure_intersecting_interiors: return "has parts that overlap";
        case bg::failure_invalid_coordinate: return "has a coordinate that is not a finite number";
        default: return "is not a valid polygon (" + std::string(bg::validity_failure_type_message(failure)) + ")";
    }
}

// Whether every vertex lies on the line through the first vertex and the one farthest from it.
bool collinear(const Ring& ring) {
    const Point& a = ring.front();
    Point far = a;
    double far_d2 = 0.0;
    for (const auto& p : ring) {
        const double d2 = (p.x_m - a.x_m) * (p.x_m - a.x_m) + (p.y_m - a.y_m) * (p.y_m - a.y_m);
        if (d2 > far_d2) {
            far_d2 = d2;
            far = p;
        }
    }
    const double dx = far.x_m - a.x_m;
    const double dy = far.y_m - a.y_m;
    return std::all_of(ring.begin(), ring.end(), [&](const Point& p) {
        return std::abs(dx * (p.y_m - a.y_m) - dy * (p.x_m - a.x_m)) <= 1e-12 * far_d2;
    });
}

// Checks one ring on its own: enough vertices, finite, some area, not crossing itself.
std::optional<std::string> ring_problem(const Ring& ring) {
    for (const auto& p : ring) {
        if (!std::isfinite(p.x_m) || !std::isfinite(p.y_m)) return "has a coordinate that is not a finite number";
        if (std::abs(p.x_m) > max_coordinate_m || std::abs(p.y_m) > max_coordinate_m)
            return "has a coordinate beyond ±10⁹ m, which no projected system in metres has";
    }
    if (distinct_vertices(ring) < 3) return "has fewer than 3 distinct vertices";
    if (collinear(ring)) return "has zero area (its vertices lie on one line)";
    BPolygon alone;
    append_ring(ring, alone.outer());
    bg::correct(alone);
    bg::validity_failure_type failure{};
    if (!bg::is_valid(alone, failure)) return validity_reason(failure);
    if (bg::area(alone) <= 0.0) return "has zero area";
    return std::nullopt;
}

double row_pitch_m(Pattern pattern, double spacing_m) {
    return pattern == Pattern::triangular ? spacing_m * std::sqrt(3.0) / 2.0 : spacing_m;
}

// The longest edge of the outlines: its direction, and its first vertex moved in by the offset
// across the edge and along it (a right-angled corner's drain then sits at the offset from both).
void default_orientation(const BMulti& area, double offset_m, double& angle_rad, Point& origin) {
    double longest = -1.0;
    for (const auto& part : area) {
        const auto& ring = part.outer();
        for (std::size_t i = 0; i + 1 < ring.size(); ++i) {
            const double dx = ring[i + 1].x() - ring[i].x();
            const double dy = ring[i + 1].y() - ring[i].y();
            const double length = std::hypot(dx, dy);
            if (length <= longest) continue;
            longest = length;
            angle_rad = std::atan2(dy, dx);
            // Anticlockwise outline: the inside is on the left of the edge's direction.
            const double ex = dx / length;
            const double ey = dy / length;
            origin = {ring[i].x() + offset_m * (ex - ey), ring[i].y() + offset_m * (ey + ex)};
        }
    }
}

// The region in the lattice's own frame (u along the rows, v across), origin at the lattice origin.
BMulti to_lattice_frame(const BMulti& region, double angle_rad, Point origin) {
    const double c = std::cos(angle_rad);
    const double s = std::sin(angle_rad);
    BMulti out = region;
    bg::for_each_point(out, [&](BPoint& p) {
        const double x = p.x() - origin.x_m;
        const double y = p.y() - origin.y_m;
        p.x(c * x + s * y);
        p.y(-s * x + c * y);
    });
    return out;
}

[[noreturn]] void too_many(std::size_t max_drains) {
    throw EvaluationError("drain layout", "more than " + std::to_string(max_drains) +
                                              " drains at this spacing; lay out a smaller area or a wider spacing");
}

// Lattice indices from first to last (a lattice line through a span), refusing more than `room`.
std::pair<long long, long long> index_range(double first, double last, std::size_t room, std::size_t max_drains) {
    const double lo = std::ceil(first);
    const double hi = std::floor(last);
    if (!(hi - lo < static_cast<double>(room))) too_many(max_drains);
    constexpr double max_index = 1e15;  // far inside long long, and exact in a double
    if (!(std::abs(lo) < max_index && std::abs(hi) < max_index))
        throw EvaluationError("drain layout", "the lattice origin lies too far from the area for this spacing");
    return {static_cast<long long>(lo), static_cast<long long>(hi)};
}

// The region's parts with their extent across the rows: a row is cut only by the parts it crosses,
// so far-apart parts, one of them detailed, cost rows × (that part's vertices), not rows × all.
struct RowPart {
    BPolygon polygon;
    double v_min = 0.0, v_max = 0.0;
};

std::vector<RowPart> row_parts(const BMulti& region) {
    std::vector<RowPart> out;
    for (const auto& polygon : region) {
        bg::model::box<BPoint> box;
        bg::envelope(polygon, box);
        out.push_back({polygon, box.min_corner().y() - boundary_tolerance_m, box.max_corner().y() + boundary_tolerance_m});
    }
    return out;
}

// The spans of one row inside the region, in ascending order of their start. The row is cut at v
// and at v ± the boundary tolerance, so that a row lying along an edge, just outside it after
// rounding, still meets it, and each span reaches the tolerance beyond its ends, so that a drain on
// an edge across the row is kept too. Every point of these spans lies within about the tolerance
// of the region.
// (Growing the region by a buffer did the same, but Boost's buffer asserts on some valid thin
// polygons.)
std::vector<std::pair<double, double>> row_spans(const std::vector<RowPart>& parts, double u_low, double u_high, double v) {
    std::vector<std::pair<double, double>> spans;
    for (const double at : {v - boundary_tolerance_m, v, v + boundary_tolerance_m}) {
        const BLine line{{u_low, at}, {u_high, at}};
        BMultiLine pieces;
        for (const RowPart& part : parts)
            if (at >= part.v_min && at <= part.v_max) {
                BMultiLine cut;
                bg::intersection(line, part.polygon, cut);
                pieces.insert(pieces.end(), cut.begin(), cut.end());
            }
        for (const auto& piece : pieces) {
            if (piece.empty()) continue;
            double a = piece.front().x();
            double b = a;
            for (const auto& p : piece) {
                a = std::min(a, p.x());
                b = std::max(b, p.x());
            }
            spans.emplace_back(a - boundary_tolerance_m, b + boundary_tolerance_m);
        }
    }
    std::sort(spans.begin(), spans.end());
    return spans;
}

// The lattice points of one row inside the region, as u positions in ascending order; at most
// `room` of them.
void row_points(const std::vector<RowPart>& parts, double u_low, double u_high, double v, double shift_m, double spacing_m,
                std::size_t room, std::size_t max_drains, std::vector<double>& us) {
    double last = -std::numeric_limits<double>::infinity();
    for (const auto& [a, b] : row_spans(parts, u_low, u_high, v)) {
        // Overlapping spans (the three cuts, or pieces that share an end) give each point once.
        const double from = std::max(a, last);
        if (b < from) continue;
        const auto [k0, k1] = index_range((from - shift_m) / spacing_m, (b - shift_m) / spacing_m, room - us.size(), max_drains);
        for (long long k = k0; k <= k1; ++k) {
            const double u = shift_m + static_cast<double>(k) * spacing_m;
            if (u <= last) continue;
            us.push_back(u);
            last = u;
        }
    }
}

// The region's edges (outlines and holes) in an R-tree, for the distance of a drain to the edge.
using EdgeIndex = bgi::rtree<BSegment, bgi::quadratic<16>>;
EdgeIndex edge_index(const BMulti& region) {
    std::vector<BSegment> edges;
    auto add = [&](const auto& ring) {
        for (std::size_t i = 0; i + 1 < ring.size(); ++i) edges.emplace_back(ring[i], ring[i + 1]);
    };
    for (const auto& part : region) {
        add(part.outer());
        for (const auto& hole : part.inners()) add(hole);
    }
    return EdgeIndex(edges);
}

bool clear_of_edges(const EdgeIndex& edges, const BPoint& p, double offset_m) {
    if (offset_m <= 0.0) return true;
    for (auto it = edges.qbegin(bgi::nearest(p, 1)); it != edges.qend(); ++it)
        return bg::distance(p, *it) >= offset_m - boundary_tolerance_m;
    return false;
}

std::size_t count_outside_hull(const std::vector<BaseDepthPoint>& points, const std::vector<Drain>& drains) {
    if (points.empty()) return 0;
    bg::model::multi_point<BPoint> boreholes;
    for (const auto& p : points) boreholes.emplace_back(p.x_m, p.y_m);
    BPolygon hull;
    bg::convex_hull(boreholes, hull);
    if (points.size() < 3 || std::abs(bg::area(hull)) <= 0.0) return drains.size();
    return static_cast<std::size_t>(std::count_if(drains.begin(), drains.end(), [&](const Drain& d) {
        return !bg::covered_by(BPoint{d.x_m, d.y_m}, hull);
    }));
}

void require_valid(const Area& area, const std::string& what, PartOverlap overlap = PartOverlap::refused) {
    if (area.parts.empty()) throw InputError(what + " parts", 0.0, "at least one polygon");
    if (const auto problem = area_problem(area, overlap))
        throw InputError(what + " part " + std::to_string(problem->part + 1) + " (" + problem->reason + ")",
                         static_cast<double>(problem->part + 1), "a valid polygon");
}
}  // namespace

std::optional<AreaProblem> area_problem(const Area& area, PartOverlap overlap) {
    for (std::size_t i = 0; i < area.parts.size(); ++i) {
        const auto& part = area.parts[i];
        if (auto reason = ring_problem(part.outer)) return AreaProblem{i, 0, "outline " + *reason};
        for (std::size_t h = 0; h < part.holes.size(); ++h)
            if (auto reason = ring_problem(part.holes[h])) return AreaProblem{i, h + 1, "hole " + *reason};
        bg::validity_failure_type failure{};
        const BPolygon polygon = to_boost(part);
        if (bg::is_valid(polygon, failure)) continue;
        if (failure == bg::failure_interior_rings_outside) {  // name the hole, so the message points at it
            for (std::size_t h = 0; h < polygon.inners().size(); ++h) {
                BPolygon::ring_type hole = polygon.inners()[h];
                bg::correct(hole);  // a hole runs the other way round: as a ring of its own, turned
                if (!bg::covered_by(hole, polygon.outer())) return AreaProblem{i, h + 1, "hole lies outside its outline"};
            }
        }
        return AreaProblem{i, std::nullopt, "polygon " + validity_reason(failure)};
    }
    if (overlap == PartOverlap::merged) return std::nullopt;
    const BMulti all = to_boost(area);
    bg::validity_failure_type failure{};
    if (!bg::is_valid(all, failure))
        return AreaProblem{0, std::nullopt,
                           failure == bg::failure_self_intersections || failure == bg::failure_intersecting_interiors
                               ? "parts overlap or share an edge"
                               : "parts are not valid together (" +
                                     std::string(bg::validity_failure_type_message(failure)) + ")"};
    return std::nullopt;
}

double area_m2(const Area& area) { return bg::area(to_boost(area)); }

Layout lay_out(const Area& area, const Area& exclusions, const LatticeSpec& spec, const LengthRule& lengths,
               std::size_t max_drains) {
    require_positive("spacing_m", spec.spacing_m);
    require_non_negative("edge offset (m)", spec.edge_offset_m);
    if (spec.angle_deg) require_finite("angle (degrees)", *spec.angle_deg);
    if (spec.origin) {
        require_finite("origin x (m)", spec.origin->x_m);
        require_finite("origin y (m)", spec.origin->y_m);
    }
    require_positive("design drain length (m)", lengths.design_length_m);
    for (const auto& p : lengths.base_points) require_positive("base depth (m)", p.depth_m);
    require_valid(area, "treatment area");
    if (!exclusions.parts.empty()) require_valid(exclusions, "exclusion zones", PartOverlap::merged);

    const BMulti outline = to_boost(area);
    BMulti region = outline;
    if (!exclusions.parts.empty()) {
        // Zones may overlap: their union is what is excluded (a difference needs a valid multipolygon).
        BMulti excluded;
        for (const auto& part : exclusions.parts) {
            BMulti merged;
            bg::union_(excluded, to_boost(part), merged);
            excluded = std::move(merged);
        }
        region.clear();
        bg::difference(outline, excluded, region);
    }
    Layout out;
    out.area_m2 = bg::area(region);
    out.idealised_count = out.area_m2 / area_per_drain_m2(spec.pattern, spec.spacing_m);

    double angle_rad = 0.0;
    Point origin{};
    default_orientation(outline, spec.edge_offset_m, angle_rad, origin);
    if (spec.angle_deg) angle_rad = *spec.angle_deg * std::numbers::pi / 180.0;
    if (spec.origin) origin = *spec.origin;
    out.angle_deg = angle_rad * 180.0 / std::numbers::pi;
    out.origin = origin;
    if (region.empty()) throw EvaluationError("drain layout", "the exclusion zones cover the whole treatment area");
    // Refused before anything is laid when even a lower bound on the count is over the cap: the cells
    // of the lattice points that are laid cover the region shrunk by r = the offset plus a cell's
    // diameter (at most 2 × spacing), and shrinking removes at most the tube of radius r around the
    // boundary, at most 2r·P + πr² a ring (P its length; the area of a tube around a closed curve,
    // from memory).
    const double r = spec.edge_offset_m + 2.0 * spec.spacing_m;
    std::size_t rings = 0;
    for (const auto& part : region) rings += 1 + part.inners().size();
    const double sure_area_m2 = out.area_m2 - 2.0 * r * bg::perimeter(region) - std::numbers::pi * r * r * static_cast<double>(rings);
    if (sure_area_m2 / area_per_drain_m2(spec.pattern, spec.spacing_m) > static_cast<double>(max_drains)) too_many(max_drains);

    // Rows are cut by the region in the lattice's frame; the edge offset is then kept drain by drain
    // against the region's edges (exactly the points at least the offset inside).
    const BMulti local = to_lattice_frame(region, angle_rad, origin);
    const EdgeIndex edges = edge_index(local);
    const std::vector<RowPart> parts = row_parts(local);
    bg::model::box<BPoint> box;
    bg::envelope(local, box);
    // The rows reach the tolerance beyond the region (see row_spans).
    box.min_corner().y(box.min_corner().y() - boundary_tolerance_m);
    box.max_corner().y(box.max_corner().y() + boundary_tolerance_m);
    const double pitch = row_pitch_m(spec.pattern, spec.spacing_m);
    // A row holds at least one drain or none; rows beyond the cap cannot all be empty in a valid area
    // (a far origin or a tiny spacing is caught here, before any index overflows).
    const auto [j0, j1] = index_range(box.min_corner().y() / pitch, box.max_corner().y() / pitch, max_drains, max_drains);
    const double u_low = box.min_corner().x() - spec.spacing_m;
    const double u_high = box.max_corner().x() + spec.spacing_m;
    const double c = std::cos(angle_rad);
    const double s = std::sin(angle_rad);
    std::vector<double> us;
    for (long long j = j0; j <= j1; ++j) {
        const bool odd = (j % 2 + 2) % 2 == 1;
        const double shift = spec.pattern == Pattern::triangular && odd ? spec.spacing_m / 2.0 : 0.0;
        const double v = static_cast<double>(j) * pitch;
        us.clear();
        row_points(parts, u_low, u_high, v, shift, spec.spacing_m, max_drains - out.drains.size() + 1, max_drains, us);
        std::erase_if(us, [&](double u) { return !clear_of_edges(edges, BPoint{u, v}, spec.edge_offset_m); });
        if (us.empty()) continue;
        if (out.drains.size() + us.size() > max_drains) too_many(max_drains);
        if (out.rows % 2 == 1) std::reverse(us.begin(), us.end());
        ++out.rows;
        for (const double u : us) {
            const Point at{origin.x_m + c * u - s * v, origin.y_m + s * u + c * v};
            const double length = drain_length_m(lengths, at);
            // A set-out file never carries a number that is not one: exit 5 rather than write it.
            if (!std::isfinite(length) || !std::isfinite(at.x_m) || !std::isfinite(at.y_m))
                throw EvaluationError("drain layout", "drain " + std::to_string(out.drains.size() + 1) +
                                                          " has a position or length that is not a finite number");
            out.drains.push_back({static_cast<long>(out.drains.size() + 1), at.x_m, at.y_m, length});
            out.total_length_m += length;
        }
    }
    if (!std::isfinite(out.total_length_m))
        throw EvaluationError("drain layout", "the total drain length is not a finite number");
    if (out.drains.empty())
        throw EvaluationError("drain layout", "no lattice point of spacing " + format_value(spec.spacing_m) +
                                                  " m lies in the area at least " + format_value(spec.edge_offset_m) +
                                                  " m from its edge");
    out.drains_outside_base_points = count_outside_hull(lengths.base_points, out.drains);
    return out;
}

}  // namespace wickgrid::layout
