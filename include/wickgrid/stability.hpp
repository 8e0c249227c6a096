#pragma once
// Stability of an embankment stage on soft clay: limit equilibrium on circular slips by Bishop's
// (1955) simplified method, φ = 0 for the clay with the undrained strength it has at the time
// (strength.hpp), c′–φ′ for the dry fill; and a search for the critical circle.
//
// Coordinates: x across the section from the centre line (m), y upwards from the original ground
// (the top of the clay, m). Slips are sought on the side x > 0 (the section is symmetric). The clay
// rests at depth clay_thickness_m on a firm base that no circle may cross. Assumptions, stated:
// total stresses in the clay (no pore pressure term, the strength carries the drainage state),
// dry fill (no pore pressure); the settled shape is not followed (the fill is drawn on the original
// ground at its placed height). Circular slips only: non-circular and three-dimensional failure
// need a separate analysis.
//
// Two optional parts of the section (embankment.hpp) enter each circle's moment equilibrium:
// - basal reinforcement: its design force T, horizontal at the base of the fill where the slip cuts
//   it within the footprint, restores T·yc about the centre (yc the centre's height above the base
//   of the fill; Jewell 1996), added to the resisting moment: F = (R·Σ[(c·b + W·tanφ)/mα] + T·yc) /
//   (R·Σ W·sinα), iterated as Bishop's F;
// - a tension crack of depth zc (at most the fill at the stage): the slip's upslope end, in the fill
//   less than zc below its surface, carries no shear; filled with water, its thrust γw·zc²/2 pushes
//   the slip outwards at a third of the crack's depth above its bottom, added to the driving moment.
#include <functional>
#include <optional>
#include <vector>

#include "wickgrid/embankment.hpp"

namespace wickgrid {

struct SlipCircle {
    double centre_x_m = 0.0;
    double centre_y_m = 0.0;
    double radius_m = 0.0;
};

// A horizontal band of clay of one bulk unit weight (depths below the top of the clay).
struct ClayBand {
    double top_m = 0.0;
    double bottom_m = 0.0;
    double unit_weight_kN_per_m3 = 0.0;
};

// One stage as the stability check sees it. su(x, depth) gives the clay's undrained strength (kPa,
// >= 0) at offset x and depth below the top of the clay; it is called once per slice.
struct SlopeModel {
    EmbankmentSection section;             // the fill's strength and unit weight
    FillProfile profile;                   // the fill at this stage (embankment.hpp)
    double clay_thickness_m = 0.0;         // > 0; firm base below
    std::vector<ClayBand> bands;           // cover 0 .. clay_thickness_m, in order
    std::function<double(double x_m, double depth_m)> su_kPa;
    // Effective stress in the clay (optional): where given, the clay's slices take c′, φ′ and the
    // pore pressure u (hydrostatic plus excess, kPa) at their base instead of su, and Bishop's
    // resisting term is (c′·b + (W − u·b)·tanφ′)/mα (Bishop 1955).
    struct ClayEffective {
        double c_prime_kPa = 0.0;
        double tan_phi_prime = 0.0;
        double pore_pressure_kPa = 0.0;
    };
    std::function<ClayEffective(double x_m, double depth_m)> effective;
};

struct CircleResult {
    SlipCircle circle;
    double factor_of_safety = 0.0;
    double entry_x_m = 0.0;  // where the slip leaves the surface, upslope (m)
    double exit_x_m = 0.0;   // downslope (m)
};

// Bishop's simplified factor of safety of one circle (with the reinforcement and crack terms above):
// F = Σ[(c·b + W·tanφ)/mα]/Σ W·sinα with
// mα = cosα + sinα·tanφ/F, iterated from Fellenius' value to 1e-7. nullopt for a circle that does not
// cut the section, crosses the firm base, drives the wrong way (Σ W·sinα <= 0), or has a slice with
// mα < 0.2 (where the method's normal forces become unreliable, Whitman & Bailey 1967, from memory).
// slices: number of slices over the slip (>= 4). Cost: O(slices × iterations); thread-safe if su is.
std::optional<CircleResult> bishop_factor_of_safety(const SlopeModel& model, const SlipCircle& circle,
                                                    int slices = 60);

struct CircleSearch {
    bool through_clay = true;  // only circles that reach below the original ground (stage checks)
    int slices = 60;
    int centre_steps = 14;     // coarse centre grid: steps per axis
    int exit_steps = 14;       // exit points per centre on the surface beyond the crest edge
    double resolution_m = 0.005;  // refinement stops when its step is below this
};

// The critical circle: a coarse grid of centres over the region x in [−toe, toe + D], y in
// [0.02·D, h + 2·D] (D = fill height + clay thickness), each with radii to exit points on the surface
// from the crest edge to toe + D and radii tangent to the base and to each band boundary; the best
// five coarse circles are each refined by compass search in (x, y, R), halving the step from the grid
// spacing down to resolution_m; a best coarse centre on the grid's edge moves the grid outwards (up to
// four times). Throws EvaluationError when no admissible circle exists (a section that cannot slip).
// Cost: about centre_steps² × (exit_steps + bands + 1) + 5 × 300 circle evaluations.
CircleResult critical_circle(const SlopeModel& model, const CircleSearch& search = {});

// Checks a slope model (section, height, bands covering the clay, a strength function).
void validate_slope_model(const SlopeModel& model);

}  // namespace wickgrid
