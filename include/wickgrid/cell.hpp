#pragma once
// A unit cell: one drain product in one pattern at one spacing, in one clay layer. Built once
// (all validation and all spacing-dependent terms here), then evaluated many times cheaply.
#include <limits>

#include "wickgrid/combine.hpp"
#include "wickgrid/geometry.hpp"
#include "wickgrid/radial.hpp"
#include "wickgrid/vertical.hpp"

namespace wickgrid {

enum class DrainOutlets { top, top_and_bottom };

// How μ for the smear zone is obtained.
enum class RadialTheory {
    hansbo_1981,            // closed form ln(n/s) + (kh/ks) ln s − 0.75 (constant smear only)
    equal_strain_integral,  // the exact equal-strain integral for the smear profile, by quadrature
};

struct Clay {
    double thickness_m = 0.0;
    double cv_m2_per_s = 0.0;
    double ch_m2_per_s = 0.0;
    double kh_m_per_s = 0.0;
    VerticalDrainage drainage = VerticalDrainage::both_faces;
};

struct DrainInstallation {
    double equivalent_diameter_m = 0.0;  // dw
    double smear_diameter_m = 0.0;       // ds (= dw for no smear)
    SmearShape smear_shape = SmearShape::constant;
    double smear_permeability_ratio = 1.0;  // kh/ks
    double discharge_capacity_m3_per_s = std::numeric_limits<double>::infinity();  // qw; ∞: none
    double length_m = 0.0;  // drain length in the clay
    DrainOutlets outlets = DrainOutlets::top;
    RadialTheory theory = RadialTheory::hansbo_1981;
};

struct CellSpec {
    Clay clay;
    DrainInstallation drain;
    Pattern pattern = Pattern::triangular;
    double spacing_m = 0.0;
};

struct Degrees {
    double vertical = 0.0;
    double radial = 0.0;
    double combined = 0.0;
};

// Validation of the parts that do not depend on spacing (shared by UnitCell and the searches).
void validate_clay(const Clay& clay);
void validate_drain(const DrainInstallation& drain, const Clay& clay);

// μ(z) at a depth (m below the drain head, 0..length) of a drain of that length: the smear μs plus
// Hansbo's (1981) well resistance (hansbo_mu_well) with z from the nearest outlet (the head, or
// either end with two outlets) and l the length from the outlet. qw may be +∞ (no well resistance).
// A depth past the end by rounding is taken at the end. Cost: O(1).
double mu_at_depth(double mu_smear, double depth_m, double length_m, DrainOutlets outlets, double kh_m_per_s,
                   double qw_m3_per_s);

// Smallest spacing for which the smear zone still lies inside the unit cell.
double minimum_spacing_m(const DrainInstallation& drain, Pattern pattern);

// μs of the smear zone for a drain at spacing ratio n (closed form or integral, by drain.theory);
// throws InputError naming the spacing when it is not positive.
double smear_mu(const DrainInstallation& drain, double n, double spacing_m);

class UnitCell {
public:
    explicit UnitCell(const CellSpec& spec,
                      DepthAverageRule::Accuracy accuracy = DepthAverageRule::Accuracy::design);

    Degrees at(double time_s) const;

    const CellSpec& spec() const noexcept { return spec_; }
    double influence_diameter_m() const noexcept { return de_m_; }
    double n() const noexcept { return n_; }
    double s() const noexcept { return s_; }
    double mu_smear() const noexcept { return mu_smear_; }
    double mu_depth_mean() const;  // mean of μ(z) over the drain length
    double drainage_path_m() const noexcept { return d_m_; }
    double outlet_length_m() const noexcept { return l_m_; }  // l: from the nearest outlet

private:
    CellSpec spec_;
    double de_m_;
    double n_;
    double s_;
    double mu_smear_;
    double well_per_m2_;  // π·kh/qw
    double l_m_;
    double d_m_;
    double tv_per_s_;  // cv/d²
    double th_per_s_;  // ch/De²
    DepthAverageRule depth_rule_;
};

}  // namespace wickgrid
