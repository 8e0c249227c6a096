#pragma once
// A symmetric embankment cross-section on the clay and the vertical stress it adds in the ground.
// Coordinates: x across the embankment from its centre line (m), y up from the original ground, z
// depth below the top of the clay (m). The final section has a crest of width crest_width_m at the
// final fill height H, side slopes of side_slope_h_per_v horizontal to one vertical, and optional
// berms (flat steps of given width at given heights) on the way down to the toes. Fill goes up in
// layers across the footprint, so the fill at height h <= H is the part of the final section
// below level h.
//
// The stress is that of an elastic half-space under the strip load the fill makes: on the centre
// line, Osterberg's (1957) influence for embankment loading summed over the slopes (superposition
// of half embankments); elsewhere, Flamant's line load integrated in closed form over the section.
// The tests hold the two equal on the centre line.
#include <optional>
#include <vector>

#include "wickgrid/defaults.hpp"

namespace wickgrid {

// A flat step in the side slope: its width (m) at its height above the original ground (m).
struct Berm {
    double width_m = 0.0;
    double height_m = 0.0;
};

// When the finished-level top-up goes on (stages.hpp: fill to a finished level): as a lift of its own
// right after the last scheduled lift, or once the surcharge is removed (it then takes the
// surcharge's place on the section). Either way at the last lift's rate of placing.
enum class TopUpRule { with_last_lift, after_surcharge_removal };

// A geosynthetic laid at the base of the fill across the whole footprint (stability.hpp): its design
// tensile force per metre run of embankment, the force the designer allows after creep, damage,
// durability and pull-out (anchorage beyond the slip) have been taken off.
struct BasalReinforcement {
    double tensile_force_kN_per_m = 0.0;  // > 0
};

// A tension crack down from the fill surface at the upslope end of a slip (stability.hpp).
struct TensionCrack {
    double depth_m = 0.0;      // > 0, at most the fill height (checked against each stage's fill)
    bool water_filled = false; // a crack full of water pushes the slip with its hydrostatic thrust
};

struct EmbankmentSection {
    double crest_width_m = 0.0;             // >= 0 (0: a pointed crest)
    double side_slope_h_per_v = 0.0;        // >= 0 (0: vertical sides)
    double fill_unit_weight_kN_per_m3 = 0.0;
    double fill_friction_angle_deg = 0.0;   // 0 <= φ' < 90
    double fill_cohesion_kPa = 0.0;         // >= 0
    double target_factor_of_safety = defaults::target_factor_of_safety;  // >= 1
    // The fill surface's design level above the original ground once primary settlement is over
    // (optional; stages.hpp: fill to a finished level).
    std::optional<double> finished_height_m;
    TopUpRule top_up = TopUpRule::with_last_lift;
    // The day the top-up starts (s) when the scenario fixes it (a planned schedule); absent: by the rule.
    std::optional<double> top_up_start_s;
    // The section's full fill height (its crest level above the original ground); absent: the
    // permanent stages' total (site.hpp: final_fill_height_m). A surcharge rises above it with the
    // same slopes.
    std::optional<double> height_m;
    std::vector<Berm> berms;  // outwards from the crest: heights falling, each above 0
    std::optional<BasalReinforcement> reinforcement;
    std::optional<TensionCrack> tension_crack;
};

// Throws InputError naming the field: a negative crest width or slope (steeper than vertical), a
// section that does not close (no crest and vertical sides), a unit weight that is not positive, an
// angle outside [0, 90), a negative cohesion, a target factor of safety below 1, a berm whose width
// is not positive or whose height is not below the one before it (and above 0), a reinforcement
// force or a crack depth that is not positive.
void validate_section(const EmbankmentSection& section);

// The right half of the fill at one moment: vertices from the centre line (0, h) out to the toe
// (x, 0), x never falling, y never rising (a vertical side is two vertices at one x).
struct FillProfile {
    std::vector<double> x_m, y_m;
    double height_m() const { return y_m.front(); }
    double toe_m() const { return x_m.back(); }
    double crest_edge_m() const { return x_m.size() > 1 ? x_m[1] : 0.0; }
};

// The section filled to height h (0 < h <= H, the final height): the final section cut at level h.
// Throws InputError for h outside (0, H] or a berm not below H. Cost: O(berms).
FillProfile fill_profile(const EmbankmentSection& section, double final_height_m, double height_m);

// Height of the fill surface above the original ground at offset x (either side; 0 beyond the toes).
double fill_surface_m(const FillProfile& profile, double x_m) noexcept;

// Osterberg's (1957) influence factor I for a half embankment (slope of horizontal length a_m,
// flat top of width b_m measured from the point) at depth z_m below the flat top's outer end:
// Δσz = I·q with q = γ·h. I = [((a + b)/a)(α1 + α2) − (b/a)·α2]/π, α1 = atan((a + b)/z) − atan(b/z),
// α2 = atan(b/z); the limit a → 0 is the strip load's. z = 0 gives 1/2 (b > 0) or 0 (b = 0).
// Requires a, b >= 0, z >= 0. Cost: a few atan calls; thread-safe.
double osterberg_influence(double a_m, double b_m, double z_m) noexcept;

// Vertical stress increase (kPa) on the centre line at depth z under the fill: each drop d of the
// profile over a slope from x to x + a adds γ·d·2·I(a, x, z) (Osterberg's half embankments
// superposed). z = 0 gives γ·h.
double centreline_stress_kPa(const FillProfile& profile, double unit_weight_kN_per_m3, double z_m) noexcept;

// Vertical stress increase (kPa) at (x, z) under the fill: the closed-form integral of Flamant's line
// load over each linear piece of the load, both halves. z = 0 returns the fill pressure at x.
// Requires z >= 0. Cost: O(vertices); thread-safe.
double embankment_stress_kPa(const FillProfile& profile, double unit_weight_kN_per_m3, double x_m, double z_m) noexcept;

}  // namespace wickgrid
