// A unit cell: Terzaghi vertical flow, equal-strain radial flow (Hansbo 1981 or the general
// integral) averaged over the drain length, combined by Carrillo (1942).
#include <algorithm>
#include <boost/math/constants/constants.hpp>
#include <cmath>

#include "wickgrid/cell.hpp"
#include "wickgrid/combine.hpp"
#include "wickgrid/errors.hpp"

namespace wickgrid {

void validate_clay(const Clay& clay) {
    require_positive("clay thickness (m)", clay.thickness_m);
    require_positive("vertical coefficient of consolidation cv (m²/s)", clay.cv_m2_per_s);
    require_positive("horizontal coefficient of consolidation ch (m²/s)", clay.ch_m2_per_s);
    require_positive("horizontal permeability kh (m/s)", clay.kh_m_per_s);
}

void validate_drain(const DrainInstallation& drain, const Clay& clay) {
    require_positive("drain equivalent diameter dw (m)", drain.equivalent_diameter_m);
    require_positive("smear zone diameter ds (m)", drain.smear_diameter_m);
    if (drain.smear_diameter_m < drain.equivalent_diameter_m)
        throw InputError("smear zone diameter ds (m)", drain.smear_diameter_m,
                         "at least the drain equivalent diameter dw = " +
                             format_value(drain.equivalent_diameter_m) + " m");
    require_positive("smear permeability ratio kh/ks", drain.smear_permeability_ratio);
    if (!(drain.discharge_capacity_m3_per_s > 0.0))
        throw InputError("discharge capacity qw (m³/s)", drain.discharge_capacity_m3_per_s,
                         "greater than 0");
    require_positive("drain length (m)", drain.length_m);
    // Full penetration only: Carrillo's product needs the drain to span the layer.
    if (std::fabs(drain.length_m - clay.thickness_m) > 1e-9 * clay.thickness_m)
        throw InputError("drain length (m)", drain.length_m,
                         "equal to the clay thickness " + format_value(clay.thickness_m) +
                             " m with the closed form (drains that stop short of the clay base need the numerical method)");
    if (drain.theory == RadialTheory::hansbo_1981 && drain.smear_shape != SmearShape::constant)
        throw InputError("smear shape", static_cast<double>(drain.smear_shape),
                         "constant with the Hansbo (1981) closed form; use the equal-strain integral "
                         "for linear or parabolic smear");
}

double minimum_spacing_m(const DrainInstallation& drain, Pattern pattern) {
    return spacing_from_influence_diameter_m(pattern, drain.smear_diameter_m);
}

double smear_mu(const DrainInstallation& drain, double n, double spacing_m) {
    const double s = drain.smear_diameter_m / drain.equivalent_diameter_m;
    const SmearZone smear{drain.smear_shape, s, drain.smear_permeability_ratio};
    const double mu = drain.theory == RadialTheory::hansbo_1981
                          ? hansbo_mu_smear(n, s, drain.smear_permeability_ratio)
                          : equal_strain_mu(n, smear);
    // The closed form turns non-positive when n is close to s.
    if (!(mu > 0.0))
        throw InputError("drain spacing (m)", spacing_m,
                         "large enough for a positive radial flow factor (mu = " + format_value(mu) +
                             "; the closed form fails for n near s)");
    return mu;
}

double mu_at_depth(double mu_smear, double depth_m, double length_m, DrainOutlets outlets, double kh_m_per_s,
                   double qw_m3_per_s) {
    const bool two = outlets == DrainOutlets::top_and_bottom;
    const double l = two ? 0.5 * length_m : length_m;
    const double z = std::clamp(two ? std::min(depth_m, length_m - depth_m) : depth_m, 0.0, l);
    return mu_smear + hansbo_mu_well(z, l, kh_m_per_s, qw_m3_per_s);
}

namespace {
double outlet_length(const DrainInstallation& drain) {
    return drain.outlets == DrainOutlets::top ? drain.length_m : 0.5 * drain.length_m;
}

const CellSpec& validated(const CellSpec& spec) {
    validate_clay(spec.clay);
    validate_drain(spec.drain, spec.clay);
    return spec;
}
}  // namespace

UnitCell::UnitCell(const CellSpec& spec, DepthAverageRule::Accuracy accuracy)
    : spec_(validated(spec)),
      de_m_(wickgrid::influence_diameter_m(spec.pattern, spec.spacing_m)),
      n_(de_m_ / spec.drain.equivalent_diameter_m),
      s_(spec.drain.smear_diameter_m / spec.drain.equivalent_diameter_m),
      mu_smear_(n_ > 1.0 && s_ < n_ ? smear_mu(spec.drain, n_, spec.spacing_m) : 0.0),
      well_per_m2_(boost::math::double_constants::pi * spec.clay.kh_m_per_s /
                   spec.drain.discharge_capacity_m3_per_s),
      l_m_(outlet_length(spec.drain)),
      d_m_(wickgrid::drainage_path_m(spec.clay.thickness_m, spec.clay.drainage)),
      tv_per_s_(spec.clay.cv_m2_per_s / (d_m_ * d_m_)),
      th_per_s_(spec.clay.ch_m2_per_s / (de_m_ * de_m_)),
      depth_rule_(mu_smear_ > 0.0 ? mu_smear_ : 1.0, well_per_m2_, l_m_, accuracy) {
    if (!(n_ > 1.0))
        throw InputError("drain spacing (m)", spec.spacing_m,
                         "large enough that the influence diameter exceeds the drain diameter");
    if (!(s_ < n_))
        throw InputError("drain spacing (m)", spec.spacing_m,
                         "greater than " + format_value(minimum_spacing_m(spec.drain, spec.pattern)) +
                             " m so that the smear zone lies inside the unit cell");
}

Degrees UnitCell::at(double time_s) const {
    require_non_negative("time (s)", time_s);
    Degrees d;
    d.vertical = degree_vertical(tv_per_s_ * time_s);
    d.radial = depth_rule_.degree(th_per_s_ * time_s);
    d.combined = carrillo_combined(d.vertical, d.radial);
    return d;
}

double UnitCell::mu_depth_mean() const { return wickgrid::mu_depth_mean(mu_smear_, well_per_m2_, l_m_); }

}  // namespace wickgrid
