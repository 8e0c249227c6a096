// Bishop's (1955) simplified method on circular slips and the critical-circle search; see
// stability.hpp for the assumptions and the search.
#include <algorithm>
#include <boost/math/constants/constants.hpp>
#include <cmath>
#include <limits>

#include "wickgrid/errors.hpp"
#include "wickgrid/stability.hpp"
#include "wickgrid/units.hpp"

namespace wickgrid {

namespace {
constexpr double deg = boost::math::double_constants::degree;
constexpr double min_m_alpha = 0.2;       // Whitman & Bailey (1967), from memory
constexpr double min_clay_depth_m = 0.1;  // a slip "through the clay" reaches at least this far down
constexpr int max_bishop_iterations = 100;

// Weight of the clay column (kN/m²) from the top of the clay down to depth d.
double clay_column_kPa(const std::vector<ClayBand>& bands, double depth_m) {
    double w = 0.0;
    for (const ClayBand& b : bands) {
        if (depth_m <= b.top_m) break;
        w += b.unit_weight_kN_per_m3 * (std::min(depth_m, b.bottom_m) - b.top_m);
    }
    return w;
}

// Points where the circle may change what it cuts: its ends, the surface's kinks, the circle's
// crossings of each surface segment, of the original ground and of each band boundary.
std::vector<double> breakpoints(const SlopeModel& m, const SlipCircle& c) {
    const FillProfile& p = m.profile;
    const double xa = c.centre_x_m - c.radius_m, xb = c.centre_x_m + c.radius_m;
    std::vector<double> xs{xa, xb};
    for (const double x : p.x_m) xs.push_back(x), xs.push_back(-x);
    // Crossings with the line y = y0 + k·(x − x0) on [lo, hi].
    const auto crossings = [&](double x0, double y0, double k, double lo, double hi) {
        // (x − xc)² + (y0 + k(x − x0) − yc)² = R², a quadratic in x.
        const double e = y0 - k * x0 - c.centre_y_m;
        const double qa = 1.0 + k * k, qb = 2.0 * (k * e - c.centre_x_m);
        const double qc = c.centre_x_m * c.centre_x_m + e * e - c.radius_m * c.radius_m;
        const double disc = qb * qb - 4.0 * qa * qc;
        if (disc < 0.0) return;
        for (const double sign : {-1.0, 1.0}) {
            const double x = (-qb + sign * std::sqrt(disc)) / (2.0 * qa);
            if (x >= lo && x <= hi) xs.push_back(x);
        }
    };
    const double big = std::numeric_limits<double>::max();
    crossings(0.0, 0.0, 0.0, -big, big);  // the original ground, and below the fill the fill/clay contact
    for (std::size_t i = 0; i + 1 < p.x_m.size(); ++i) {
        const double x1 = p.x_m[i], x2 = p.x_m[i + 1];
        if (!(x2 > x1)) continue;  // a vertical side: its ends are breakpoints already
        const double k = (p.y_m[i + 1] - p.y_m[i]) / (x2 - x1);
        crossings(x1, p.y_m[i], k, x1, x2);
        crossings(-x1, p.y_m[i], -k, -x2, -x1);
    }
    for (const ClayBand& band : m.bands) crossings(0.0, -band.bottom_m, 0.0, -big, big);
    std::sort(xs.begin(), xs.end());
    std::vector<double> inside;
    for (const double x : xs)
        if (x >= xa && x <= xb && (inside.empty() || x > inside.back() + 1e-12)) inside.push_back(x);
    return inside;
}

double arc_y(const SlipCircle& c, double x) {
    const double dx = x - c.centre_x_m;
    return c.centre_y_m - std::sqrt(std::max(0.0, c.radius_m * c.radius_m - dx * dx));
}

struct Slice {
    double width_m, weight_kN, sin_a, cos_a, cohesion_kPa, tan_phi;
    double base_m;  // the arc's length under the slice (exact, so steep ends are not under-counted)
    double x_m;     // the slice's middle
    double pore_kN = 0.0;  // pore pressure × width at the base (effective stress in the clay)
};

// The depth of the tension crack at this stage: the section's crack, no deeper than the fill.
double crack_depth_m(const SlopeModel& m) {
    if (!m.section.tension_crack) return 0.0;
    return std::min(m.section.tension_crack->depth_m, m.profile.height_m());
}

// Where the crack stands: walking from the slip's upslope end, the first slice whose base is zc below
// the fill surface or in the clay; the crack reaches down to the arc there, at most zc (less where
// the fill is thinner). Returns {x, depth}; the slices before it carry no shear.
struct CrackAt {
    double x_m = 0.0, depth_m = 0.0;
    std::size_t open_slices = 0;
};
CrackAt crack_at(const SlopeModel& m, const SlipCircle& c, const std::vector<Slice>& slices) {
    const double zc = crack_depth_m(m);
    CrackAt at;
    if (zc <= 0.0) return at;
    for (const Slice& s : slices) {
        const double surface = fill_surface_m(m.profile, s.x_m);
        const double depth = surface - std::max(arc_y(c, s.x_m), 0.0);
        at.x_m = s.x_m;
        at.depth_m = std::min(zc, depth);
        if (depth >= zc || arc_y(c, s.x_m) < 0.0) break;
        ++at.open_slices;
    }
    return at;
}

// The crack's water thrust about the centre (kN·m/m): P = γw·z²/2 for the crack's depth z at its
// place, horizontal, pushing the slip outwards, at z/3 above the crack's bottom. 0 for a dry crack.
double crack_thrust_moment(const SlopeModel& m, const SlipCircle& c, const CrackAt& at) {
    if (at.depth_m <= 0.0 || !m.section.tension_crack->water_filled) return 0.0;
    const double bottom_y = fill_surface_m(m.profile, at.x_m) - at.depth_m;
    const double thrust = 0.5 * units::gamma_w_kN_per_m3 * at.depth_m * at.depth_m;
    return thrust * (c.centre_y_m - (bottom_y + at.depth_m / 3.0));
}

// The basal reinforcement's restoring moment about the centre (kN·m/m): its design force T,
// horizontal at the base of the fill (y = 0) where the slip cuts it within the footprint, with the
// lever arm yc − 0 (Jewell 1996). Counted once per slip; 0 without reinforcement or a crossing.
double reinforcement_moment(const SlopeModel& m, const SlipCircle& c, double entry_x_m, double exit_x_m) {
    if (!m.section.reinforcement || !(c.centre_y_m > 0.0) || c.radius_m <= c.centre_y_m) return 0.0;
    const double half = std::sqrt(c.radius_m * c.radius_m - c.centre_y_m * c.centre_y_m);
    const double toe = m.profile.toe_m();
    for (const double x : {c.centre_x_m - half, c.centre_x_m + half})
        if (x >= entry_x_m && x <= exit_x_m && std::fabs(x) <= toe)
            return m.section.reinforcement->tensile_force_kN_per_m * c.centre_y_m;
    return 0.0;
}
}  // namespace

void validate_slope_model(const SlopeModel& m) {
    validate_section(m.section);
    const FillProfile& p = m.profile;
    if (p.x_m.size() < 2 || p.x_m.size() != p.y_m.size() || !(p.height_m() > 0.0) || p.y_m.back() != 0.0)
        throw InputError("fill profile vertices", static_cast<double>(p.x_m.size()),
                         "at least two, from the centre line at the fill height down to the toe on the ground");
    for (std::size_t i = 0; i + 1 < p.x_m.size(); ++i)
        if (!(p.x_m[i + 1] >= p.x_m[i]) || !(p.y_m[i + 1] <= p.y_m[i]))
            throw InputError("fill profile vertex x (m)", p.x_m[i + 1], "outwards and downwards from the one before");
    require_positive("clay thickness (m)", m.clay_thickness_m);
    double top = 0.0;
    for (const ClayBand& b : m.bands) {
        if (std::fabs(b.top_m - top) > 1e-9 || !(b.bottom_m > b.top_m))
            throw InputError("clay band top (m)", b.top_m, "the bands in order from the top of the clay, each of positive thickness");
        require_positive("clay unit weight (kN/m³)", b.unit_weight_kN_per_m3);
        top = b.bottom_m;
    }
    if (std::fabs(top - m.clay_thickness_m) > 1e-9 * std::max(1.0, m.clay_thickness_m))
        throw InputError("clay bands' base (m)", top, "equal to the clay thickness " + format_value(m.clay_thickness_m) + " m");
    if (!m.su_kPa) throw InputError("undrained strength", "a strength function of offset and depth");
}

std::optional<CircleResult> bishop_factor_of_safety(const SlopeModel& m, const SlipCircle& c, int slice_count) {
    if (!(c.radius_m > 0.0)) return std::nullopt;
    // The arc must leave the ground at both ends: a circle whose horizontal diameter ends inside the
    // section would cut a closed block, not a slip from the surface.
    if (fill_surface_m(m.profile, c.centre_x_m - c.radius_m) > c.centre_y_m ||
        fill_surface_m(m.profile, c.centre_x_m + c.radius_m) > c.centre_y_m)
        return std::nullopt;
    const double base_y = -m.clay_thickness_m;
    const double tan_fill = std::tan(m.section.fill_friction_angle_deg * deg);
    const std::vector<double> xs = breakpoints(m, c);
    if (xs.size() < 2) return std::nullopt;
    const double span = xs.back() - xs.front();
    std::vector<Slice> slices;
    slices.reserve(static_cast<std::size_t>(slice_count) + xs.size());
    double entry = 0.0, exit = 0.0, deepest = 0.0;
    bool any = false;
    for (std::size_t i = 0; i + 1 < xs.size(); ++i) {
        const double x0 = xs[i], x1 = xs[i + 1], mid = 0.5 * (x0 + x1);
        if (arc_y(c, mid) >= fill_surface_m(m.profile, mid)) continue;  // nothing above the arc here
        const int n = std::max(1, static_cast<int>(std::lround(slice_count * (x1 - x0) / span)));
        const double w = (x1 - x0) / n;
        const auto angle = [&](double x) { return std::asin(std::clamp((x - c.centre_x_m) / c.radius_m, -1.0, 1.0)); };
        double angle_before = angle(x0);  // each slice's far side is the next one's near side
        for (int k = 0; k < n; ++k) {
            const double xm = x0 + (k + 0.5) * w;
            const double yb = arc_y(c, xm), ys = fill_surface_m(m.profile, xm);
            if (yb < base_y - 1e-9) return std::nullopt;  // crosses the firm base
            const double fill_kPa = m.section.fill_unit_weight_kN_per_m3 * std::max(0.0, ys - std::max(yb, 0.0));
            const double clay_kPa = yb < 0.0 ? clay_column_kPa(m.bands, -yb) : 0.0;
            const double angle_after = angle(x0 + (k + 1) * w);
            Slice s{w, (fill_kPa + clay_kPa) * w, (c.centre_x_m - xm) / c.radius_m, (c.centre_y_m - yb) / c.radius_m, 0.0, 0.0,
                    c.radius_m * (angle_after - angle_before), xm};
            angle_before = angle_after;
            if (yb >= 0.0) {
                s.cohesion_kPa = m.section.fill_cohesion_kPa;
                s.tan_phi = tan_fill;
            } else if (m.effective) {
                const SlopeModel::ClayEffective e = m.effective(xm, -yb);
                s.cohesion_kPa = e.c_prime_kPa;
                s.tan_phi = e.tan_phi_prime;
                s.pore_kN = e.pore_pressure_kPa * w;
            } else {
                s.cohesion_kPa = m.su_kPa(xm, -yb);
            }
            slices.push_back(s);
            deepest = std::min(deepest, yb);
        }
        if (!any) entry = x0;
        exit = x1;
        any = true;
    }
    if (!any) return std::nullopt;
    // The lowest point of the arc, where it lies inside the slip, must stay above the base.
    if (c.centre_x_m > entry && c.centre_x_m < exit) deepest = std::min(deepest, c.centre_y_m - c.radius_m);
    if (deepest < base_y - 1e-9) return std::nullopt;
    // A tension crack: the slip's upslope end, in the fill above the crack's bottom, carries no shear
    // (the crack is open there); its weight still drives.
    const CrackAt crack = crack_at(m, c, slices);
    for (std::size_t i = 0; i < crack.open_slices; ++i) {
        slices[i].cohesion_kPa = 0.0;
        slices[i].tan_phi = 0.0;
    }
    // Moments about the centre, divided by R (forces): the weight drives; the crack's water thrust
    // drives; the reinforcement's force resists.
    double driving = 0.0, fellenius = 0.0;
    for (const Slice& s : slices) {
        if (!(s.cos_a > 0.0)) return std::nullopt;  // an arc above its centre: not a slip surface
        driving += s.weight_kN * s.sin_a;
        fellenius += s.cohesion_kPa * s.base_m + std::max(0.0, s.weight_kN * s.cos_a - s.pore_kN / s.cos_a) * s.tan_phi;
    }
    driving += crack_thrust_moment(m, c, crack) / c.radius_m;
    const double reinforcement = reinforcement_moment(m, c, entry, exit) / c.radius_m;
    if (!(driving > 0.0)) return std::nullopt;
    double f = (fellenius + reinforcement) / driving;
    // Slices without friction resist the same at every F: summed once, only the others iterate.
    double fixed_part = reinforcement;
    std::vector<const Slice*> frictional;
    for (const Slice& s : slices) {
        if (s.tan_phi == 0.0) fixed_part += s.cohesion_kPa * s.base_m;
        else frictional.push_back(&s);
    }
    for (int it = 0;; ++it) {
        if (it == max_bishop_iterations) return std::nullopt;
        double resisting = fixed_part;
        for (const Slice* s : frictional) {
            const double m_alpha = s->cos_a + s->sin_a * s->tan_phi / f;
            if (m_alpha < min_m_alpha) return std::nullopt;
            // The effective weight on the base; a pore pressure above it (a slice lifted) carries no friction.
            resisting += (s->cohesion_kPa * s->width_m + std::max(0.0, s->weight_kN - s->pore_kN) * s->tan_phi) / m_alpha;
        }
        const double next = resisting / driving;
        const bool done = std::fabs(next - f) <= 1e-7 * next;
        f = next;
        if (done) break;
    }
    return CircleResult{c, f, entry, exit};
}

namespace {
struct Window {
    double x0, x1, y0, y1;
};

std::optional<CircleResult> admissible(const SlopeModel& m, const CircleSearch& search, const SlipCircle& c) {
    auto r = bishop_factor_of_safety(m, c, search.slices);
    if (!r) return r;
    if (search.through_clay) {
        // The deepest point of the slip: the arc's bottom if it lies within the slip, else an end.
        const double lowest = (c.centre_x_m > r->entry_x_m && c.centre_x_m < r->exit_x_m)
                                  ? c.centre_y_m - c.radius_m
                                  : std::min(arc_y(c, r->entry_x_m), arc_y(c, r->exit_x_m));
        if (lowest > -min_clay_depth_m) return std::nullopt;
    }
    return r;
}

std::vector<CircleResult> coarse_grid(const SlopeModel& m, const CircleSearch& search, const Window& w) {
    const double b = m.profile.crest_edge_m(), toe = m.profile.toe_m();
    const double depth = m.profile.height_m() + m.clay_thickness_m;
    const int n = search.centre_steps;
    std::vector<CircleResult> found;
    for (int i = 0; i <= n; ++i)
        for (int j = 0; j <= n; ++j) {
            const double xc = w.x0 + (w.x1 - w.x0) * i / n, yc = w.y0 + (w.y1 - w.y0) * j / n;
            std::vector<double> radii;
            for (int k = 0; k <= search.exit_steps; ++k) {
                const double xe = b + (toe + depth - b) * k / search.exit_steps;
                radii.push_back(std::hypot(xe - xc, fill_surface_m(m.profile, xe) - yc));
            }
            radii.push_back(yc + m.clay_thickness_m);
            for (const ClayBand& band : m.bands) radii.push_back(yc + band.bottom_m);
            CircleResult best{{}, std::numeric_limits<double>::infinity(), 0.0, 0.0};
            for (const double r : radii)
                if (const auto res = admissible(m, search, {xc, yc, r}); res && res->factor_of_safety < best.factor_of_safety)
                    best = *res;
            if (std::isfinite(best.factor_of_safety)) found.push_back(best);
        }
    std::sort(found.begin(), found.end(),
              [](const CircleResult& a, const CircleResult& b2) { return a.factor_of_safety < b2.factor_of_safety; });
    return found;
}

CircleResult refine(const SlopeModel& m, const CircleSearch& search, CircleResult best, double step_x, double step_y,
                    double step_r) {
    for (int evaluations = 0; std::max({step_x, step_y, step_r}) > search.resolution_m && evaluations < 3000;) {
        bool moved = false;
        const SlipCircle c = best.circle;
        const SlipCircle trials[] = {{c.centre_x_m + step_x, c.centre_y_m, c.radius_m}, {c.centre_x_m - step_x, c.centre_y_m, c.radius_m},
                                     {c.centre_x_m, c.centre_y_m + step_y, c.radius_m}, {c.centre_x_m, c.centre_y_m - step_y, c.radius_m},
                                     {c.centre_x_m, c.centre_y_m, c.radius_m + step_r}, {c.centre_x_m, c.centre_y_m, c.radius_m - step_r}};
        for (const SlipCircle& t : trials) {
            ++evaluations;
            if (const auto r = admissible(m, search, t); r && r->factor_of_safety < best.factor_of_safety) {
                best = *r;
                moved = true;
            }
        }
        if (!moved) {
            step_x *= 0.5;
            step_y *= 0.5;
            step_r *= 0.5;
        }
    }
    return best;
}
}  // namespace

CircleResult critical_circle(const SlopeModel& m, const CircleSearch& search) {
    validate_slope_model(m);
    if (search.centre_steps < 2 || search.exit_steps < 1 || search.slices < 4 || !(search.resolution_m > 0.0))
        throw InputError("circle search grid", search.centre_steps, "at least 2 centre steps, 1 exit step, 4 slices");
    const double toe = m.profile.toe_m();
    const double depth = m.profile.height_m() + m.clay_thickness_m;
    Window w{-toe, toe + depth, 0.02 * depth, m.profile.height_m() + 2.0 * depth};
    std::vector<CircleResult> coarse;
    for (int moves = 0;; ++moves) {
        coarse = coarse_grid(m, search, w);
        if (coarse.empty()) throw EvaluationError("critical slip circle", "no circle through the section is admissible");
        const SlipCircle& c = coarse.front().circle;
        const double wx = w.x1 - w.x0, wy = w.y1 - w.y0, tol = 1e-9 * (wx + wy);
        const bool left = c.centre_x_m <= w.x0 + tol, right = c.centre_x_m >= w.x1 - tol, top = c.centre_y_m >= w.y1 - tol;
        if (moves == 4 || !(left || right || top)) break;
        // A minimum on the edge may lie beyond it: move the window half its size that way.
        if (left) w.x0 -= 0.5 * wx, w.x1 -= 0.5 * wx;
        if (right) w.x0 += 0.5 * wx, w.x1 += 0.5 * wx;
        if (top) w.y0 += 0.5 * wy, w.y1 += 0.5 * wy;
    }
    const double step_x = (w.x1 - w.x0) / search.centre_steps, step_y = (w.y1 - w.y0) / search.centre_steps;
    const double step_r = depth / search.exit_steps;
    CircleResult best = coarse.front();
    for (std::size_t i = 0; i < std::min<std::size_t>(5, coarse.size()); ++i) {
        const CircleResult r = refine(m, search, coarse[i], step_x, step_y, step_r);
        if (r.factor_of_safety < best.factor_of_safety) best = r;
    }
    return best;
}

}  // namespace wickgrid
