#pragma once
// Permeability from a coefficient of consolidation.

namespace wickgrid {

// k = c·mv·γw with c in m²/s, mv in m²/kN, γw = 9.81 kN/m³; k in m/s.
double permeability_from_consolidation_m_per_s(double c_m2_per_s, double mv_m2_per_kN);

}  // namespace wickgrid
