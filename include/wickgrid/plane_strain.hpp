#pragma once
// Plane-strain matching of a drain's axisymmetric unit cell with smear and well resistance
// (Indraratna & Redana 2000): the plane-strain cell of half-width B = re, drain and smear zone of
// half-widths bw = rw and bs = rs, with permeabilities chosen so that the average degree in plane
// strain equals the axisymmetric one at every time and depth:
//     μp(z) = α + β·(khp/k′hp) + θ·(2lz − z²),  θ = 2·khp²/(k′hp·qz·B)·(1 − bw/B),
//     α = 2/3 − (2bs/B)(1 − bs/B + bs²/(3B²)),  β = (bs − bw)²/B² + bs(3bw² − bs²)/(3B³),
// the undisturbed ratio from the ideal drain without smear, khp/kh = (2/3)/(ln n − 0.75), then k′hp
// from the smear term and qz from the well-resistance term (forms from memory, as the bibliography
// says; the test holds the matching property, μp(z) = (khp/kh)·μ(z) at every depth).
#include <optional>
#include <vector>

#include "wickgrid/numerical.hpp"

namespace wickgrid {

struct PlaneStrainMatch {
    double kh_ratio = 0.0;                          // khp/kh of the undisturbed clay
    std::optional<double> smear_ratio;              // k′hp/khp in the smear zone (absent without smear or when
                                                    // the smear term cannot be matched with a positive value)
    std::optional<double> discharge_m2_per_s;       // qz, the plane-strain drain's capacity per metre run
                                                    // (absent for an ideal drain)
    double alpha = 0.0, beta = 0.0;                 // the geometry factors above
};

// Geometry factors α and β for bw/B and bs/B (0 < bw <= bs < B). Throws InputError otherwise.
double plane_strain_alpha(double bw_over_b, double bs_over_b);
double plane_strain_beta(double bw_over_b, double bs_over_b);

// The match for a cell of influence radius re (m) = B, drain radius rw, smear radius rs (m), the
// axisymmetric smear μs (any smear theory) and discharge capacity qw (m³/s; ∞ for none). Throws
// InputError naming the quantity for n = re/rw with ln n <= 0.75 or radii out of order. Cost: O(1).
PlaneStrainMatch indraratna_redana_match(double re_m, double rw_m, double rs_m, double mu_smear, double qw_m3_per_s);

// μp(z) of the matched plane-strain cell at distance z (m) from the outlet of a drain drained over
// l (m), for undisturbed khp (m/s): the left-hand side of the matching, for checks and reports.
double plane_strain_mu(const PlaneStrainMatch& match, double b_m, double rw_m, double khp_m_per_s, double z_m, double l_m);

// Plane-strain parameters of one layer of a unit cell: Hird et al. (1992) khp = 2kh/(3μ) with the
// layer's depth-mean μ(z) (smear plus Hansbo's 1981 well resistance with the layer's kh), and the
// Indraratna & Redana (2000) match. A layer wholly below the drain tip has no drain (has_drain false).
struct PlaneStrainLayer {
    double top_m = 0.0, bottom_m = 0.0;
    double kh_m_per_s = 0.0;  // ch·mv·γw of the layer
    bool has_drain = false;
    double mu_mean = 0.0;
    double hird_khp_m_per_s = 0.0;
    double khp_m_per_s = 0.0;
    std::optional<double> smear_khp_m_per_s;
    std::optional<double> qz_m2_per_s;
};

// Every layer of the cell (top to bottom) for the smear μs of the cell's radial theory. Throws as
// indraratna_redana_match. Cost: O(layers × 200).
std::vector<PlaneStrainLayer> plane_strain_layers(const NumericalCellSpec& spec, double mu_smear);

}  // namespace wickgrid
