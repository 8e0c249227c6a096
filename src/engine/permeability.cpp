// Permeability from the coefficient of consolidation, k = c·mv·γw (Terzaghi 1925 definition of c).
#include "wickgrid/permeability.hpp"

#include "wickgrid/errors.hpp"
#include "wickgrid/units.hpp"

namespace wickgrid {

double permeability_from_consolidation_m_per_s(double c_m2_per_s, double mv_m2_per_kN) {
    require_positive("coefficient of consolidation (m²/s)", c_m2_per_s);
    require_positive("coefficient of volume compressibility mv (m²/kN)", mv_m2_per_kN);
    return c_m2_per_s * mv_m2_per_kN * units::gamma_w_kN_per_m3;
}

}  // namespace wickgrid
