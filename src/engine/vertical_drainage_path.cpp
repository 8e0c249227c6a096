// Drainage path and time factor of one-dimensional consolidation.
#include "wickgrid/errors.hpp"
#include "wickgrid/vertical.hpp"

namespace wickgrid {

double drainage_path_m(double thickness_m, VerticalDrainage drainage) {
    require_positive("clay thickness (m)", thickness_m);
    // Two drained faces halve the longest path to a drainage boundary (common practice).
    return drainage == VerticalDrainage::both_faces ? 0.5 * thickness_m : thickness_m;
}

double time_factor(double c_m2_per_s, double time_s, double length_m) {
    require_positive("coefficient of consolidation (m²/s)", c_m2_per_s);
    require_non_negative("time (s)", time_s);
    require_positive("drainage length (m)", length_m);
    return c_m2_per_s * time_s / (length_m * length_m);
}

}  // namespace wickgrid
