// Plane-strain matching with smear and well resistance (Indraratna & Redana 2000); see
// plane_strain.hpp for the equations and what is from memory.
#include <boost/math/constants/constants.hpp>
#include <cmath>
#include <limits>

#include <algorithm>

#include "wickgrid/errors.hpp"
#include "wickgrid/permeability.hpp"
#include "wickgrid/plane_strain.hpp"

namespace wickgrid {

namespace {
constexpr double pi = boost::math::double_constants::pi;

void check_widths(double bw, double bs) {
    if (!(bw > 0.0 && bw < 1.0)) throw InputError("drain half-width / cell half-width", bw, "between 0 and 1, both excluded");
    if (!(bs >= bw && bs < 1.0))
        throw InputError("smear half-width / cell half-width", bs, "at least the drain's and less than 1");
}
}  // namespace

double plane_strain_alpha(double bw, double bs) {
    check_widths(bw, bs);
    return 2.0 / 3.0 - 2.0 * bs * (1.0 - bs + bs * bs / 3.0);
}

double plane_strain_beta(double bw, double bs) {
    check_widths(bw, bs);
    return (bs - bw) * (bs - bw) + bs * (3.0 * bw * bw - bs * bs) / 3.0;
}

PlaneStrainMatch indraratna_redana_match(double re_m, double rw_m, double rs_m, double mu_smear, double qw_m3_per_s) {
    require_positive("influence radius (m)", re_m);
    require_positive("drain radius (m)", rw_m);
    require_at_least("smear radius (m)", rs_m, rw_m, "at least the drain radius");
    require_positive("smear mu", mu_smear);
    if (!(qw_m3_per_s > 0.0)) throw InputError("discharge capacity qw (m³/s)", qw_m3_per_s, "greater than 0");
    const double n = re_m / rw_m;
    if (!(std::log(n) > 0.75))
        throw InputError("spacing ratio n = De/dw", n, "large enough that ln n exceeds 0.75 (n > 2.12)");
    PlaneStrainMatch m;
    const double bw = rw_m / re_m, bs = rs_m / re_m;
    m.alpha = plane_strain_alpha(bw, bs);
    m.beta = plane_strain_beta(bw, bs);
    m.kh_ratio = (2.0 / 3.0) / (std::log(n) - 0.75);
    // Smear term: (khp/kh)·μs = α + β·khp/k′hp.
    const double rest = m.kh_ratio * mu_smear - m.alpha;
    if (rs_m > rw_m * (1 + 1e-12) && m.beta > 0.0 && rest > 0.0) m.smear_ratio = m.beta / rest;
    // Well term: θ(2lz − z²) = (khp/kh)·π·kh·z(2l − z)/qw = π·khp·z(2l − z)/qw, so
    // qz = 2·(khp/k′hp)(1 − bw/B)·qw/(π·B).
    if (std::isfinite(qw_m3_per_s)) {
        const double khp_over_smear = m.smear_ratio ? 1.0 / *m.smear_ratio : 1.0;
        m.discharge_m2_per_s = 2.0 * khp_over_smear * (1.0 - bw) * qw_m3_per_s / (pi * re_m);
    }
    return m;
}

double plane_strain_mu(const PlaneStrainMatch& match, double b_m, double rw_m, double khp_m_per_s, double z_m, double l_m) {
    const double smear = match.smear_ratio ? match.beta / *match.smear_ratio : 0.0;
    if (!match.discharge_m2_per_s) return match.alpha + smear;
    const double khp_over_smear = match.smear_ratio ? 1.0 / *match.smear_ratio : 1.0;
    const double theta = 2.0 * khp_m_per_s * khp_over_smear / (*match.discharge_m2_per_s * b_m) * (1.0 - rw_m / b_m);
    return match.alpha + smear + theta * (2.0 * l_m * z_m - z_m * z_m);
}

std::vector<PlaneStrainLayer> plane_strain_layers(const NumericalCellSpec& spec, double mu_smear) {
    const double re = 0.5 * spec.influence_diameter_m, rw = 0.5 * spec.drain_diameter_m, rs = 0.5 * spec.smear_diameter_m;
    const double length = spec.has_drain ? spec.drain_length_m : 0.0, qw = spec.discharge_capacity_m3_per_s;
    const PlaneStrainMatch match = indraratna_redana_match(re, rw, rs, mu_smear, qw);
    std::vector<PlaneStrainLayer> out;
    double top = 0.0;
    for (const NumericalLayer& layer : spec.layers) {
        PlaneStrainLayer p;
        p.top_m = top;
        p.bottom_m = top + layer.thickness_m;
        p.kh_m_per_s = permeability_from_consolidation_m_per_s(layer.ch_m2_per_s, layer.mv_m2_per_kN);
        p.has_drain = top < length;
        if (p.has_drain) {
            // Depth mean of μ(z) over the layer's drained part (midpoint rule; μ is quadratic in z).
            const double end = std::min(p.bottom_m, length);
            constexpr int points = 200;
            double sum = 0.0;
            for (int k = 0; k < points; ++k) {
                const double depth = top + (k + 0.5) * (end - top) / points;
                sum += mu_at_depth(mu_smear, depth, length, spec.outlets, p.kh_m_per_s, qw);
            }
            p.mu_mean = sum / points;
            p.hird_khp_m_per_s = plane_strain_permeability_m_per_s(p.kh_m_per_s, p.mu_mean);
            p.khp_m_per_s = match.kh_ratio * p.kh_m_per_s;
            if (match.smear_ratio) p.smear_khp_m_per_s = p.khp_m_per_s * *match.smear_ratio;
            p.qz_m2_per_s = match.discharge_m2_per_s;
        }
        out.push_back(p);
        top = p.bottom_m;
    }
    return out;
}

}  // namespace wickgrid
