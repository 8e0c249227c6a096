#pragma once
// A symmetric embankment cross-section on the clay and the vertical stress it adds in the ground.
// Coordinates: x across the embankment from its centre line (m), depth z below the top of the clay
// (m). The fill is a trapezoid: crest of width crest_width_m at height h, side slopes of
// side_slope_h_per_v horizontal to one vertical down to the toes on the original ground.
//
// The stress is that of an elastic half-space under a strip load (Flamant's line load integrated
// over the section); on the centre line it equals Osterberg's (1957) influence for embankment
// loading, which the tests compare against.
#include <optional>

#include "wickgrid/defaults.hpp"

namespace wickgrid {

struct EmbankmentSection {
    double crest_width_m = 0.0;             // >= 0 (0: a triangular section)
    double side_slope_h_per_v = 0.0;        // >= 0 (0: vertical sides, a rectangular strip)
    double fill_unit_weight_kN_per_m3 = 0.0;
    double fill_friction_angle_deg = 0.0;   // 0 <= φ' < 90
    double fill_cohesion_kPa = 0.0;         // >= 0
    double target_factor_of_safety = defaults::target_factor_of_safety;  // >= 1
    // The fill surface's design level above the original ground once primary settlement is over
    // (optional; stages.hpp: fill to a finished level).
    std::optional<double> finished_height_m;
};

// Throws InputError naming the field: a negative crest width or slope (steeper than vertical), a
// section that does not close (no crest and vertical sides), a unit weight that is not positive, an
// angle outside [0, 90), a negative cohesion, a target factor of safety below 1.
void validate_section(const EmbankmentSection& section);

// Half the crest width and the toe's distance from the centre line (m) at fill height h.
inline double crest_half_width_m(const EmbankmentSection& s) noexcept { return 0.5 * s.crest_width_m; }
inline double toe_offset_m(const EmbankmentSection& s, double height_m) noexcept {
    return crest_half_width_m(s) + s.side_slope_h_per_v * height_m;
}

// Height of the fill surface above the original ground at offset x (m), for fill height h.
double fill_surface_m(const EmbankmentSection& section, double height_m, double x_m) noexcept;

// Osterberg's (1957) influence factor I for a half embankment (slope of horizontal length a_m,
// flat top of width b_m measured from the point) at depth z_m below the flat top's outer end:
// Δσz = I·q with q = γ·h. I = [((a + b)/a)(α1 + α2) − (b/a)·α2]/π, α1 = atan((a + b)/z) − atan(b/z),
// α2 = atan(b/z); the limit a → 0 is the strip load's. z = 0 gives 1/2 (b > 0) or 0 (b = 0).
// Requires a, b >= 0, z >= 0. Cost: a few atan calls; thread-safe.
double osterberg_influence(double a_m, double b_m, double z_m) noexcept;

// Vertical stress increase (kPa) at (x, z) under the section filled to height h: the closed-form
// integral of Flamant's line load over the crest and both slopes. z = 0 returns the fill pressure at
// x. Requires h >= 0, z >= 0. Cost: O(1); thread-safe.
double embankment_stress_kPa(const EmbankmentSection& section, double height_m, double x_m, double z_m) noexcept;

// The centre-line influence Δσz/(γh) at depth z (1 at the surface), for fill height h > 0.
double centreline_influence(const EmbankmentSection& section, double height_m, double z_m) noexcept;

}  // namespace wickgrid
