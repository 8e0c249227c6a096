#pragma once
// Radial consolidation towards a vertical drain, in the unit cell of influence diameter De
// around a drain of equivalent diameter dw (n = De/dw), smear zone of diameter ds (s = ds/dw).
#include <functional>
#include <vector>

namespace wickgrid {

// Barron's (1948) equal-strain factor for an ideal drain (no smear, no well resistance).
double barron_F(double n);

// Hansbo's (1981) smear term of μ: ln(n/s) + (kh/ks)·ln s − 0.75 (valid for n ≫ s).
double hansbo_mu_smear(double n, double s, double kh_over_ks);

// Hansbo's (1981) well-resistance term of μ at depth z from the nearest outlet: π·z·(2l − z)·kh/qw.
double hansbo_mu_well(double z_m, double l_m, double kh_m_per_s, double qw_m3_per_s);

// Hansbo's (1981) local μ(z) = smear term + well-resistance term.
double hansbo_mu(double n, double s, double kh_over_ks, double z_m, double l_m, double kh_m_per_s,
                 double qw_m3_per_s);

// Equal-strain radial degree Ur = 1 − exp(−8·Th/μ) with Th = ch·t/De², and its inverse in Th.
double degree_radial_equal_strain(double th, double mu);
double time_factor_radial_equal_strain(double ur, double mu);

// Permeability in the disturbed zone around the drain.
enum class SmearShape {
    constant,   // two zones: ks in the smear zone, kh outside (Hansbo 1981)
    linear,     // k rises linearly from ks at the drain to kh at the smear boundary
    parabolic,  // k rises along a parabola from ks at the drain to kh, flat at the smear boundary
                // (the shape of Walker & Indraratna 2006)
};

struct SmearZone {
    SmearShape shape = SmearShape::constant;
    double diameter_ratio = 1.0;      // s = ds/dw, >= 1; 1 means no smear
    double permeability_ratio = 1.0;  // kh/ks at the drain wall, >= 1 in practice, > 0 allowed
};

// Validates a smear zone against the unit cell: s >= 1, s < n, kh/ks > 0.
void validate_smear_zone(const SmearZone& smear, double n);

// k(r)/kh at radius ratio x = r/rw (1 <= x <= n); 1 outside the smear zone.
double smear_permeability_fraction(const SmearZone& smear, double x);

// General equal-strain μ for a radial permeability profile, by quadrature of
// μ = 1/(n²(n²−1)) ∫₁ⁿ (n² − x²)² / (x·k(x)/kh) dx, the equal-strain unit-cell integral
// (Hansbo 1981 derivation with k = k(r)). Reduces to barron_F for k ≡ kh.
double equal_strain_mu(double n, const SmearZone& smear);

// Same integral for any profile k(x)/kh > 0 given as a function of x = r/rw; breaks lists radius
// ratios where the profile has a kink (integration is split there).
double equal_strain_mu(double n, const std::function<double(double)>& k_fraction,
                       const std::vector<double>& breaks);

// Barron's (1948) free-strain solution for an ideal drain: Ur(Th) by a Bessel eigen-expansion,
// with the short-time expansion of radial flow into a cylinder where the series would need too
// many terms. Built once per n (eigenvalues cached), then evaluated cheaply.
class BarronFreeStrain {
public:
    explicit BarronFreeStrain(double n);

    double n() const noexcept { return n_; }
    double degree(double th) const;  // Th = ch·t/De² >= 0
    const std::vector<double>& eigenvalues() const noexcept { return beta_; }  // β = α·re
    double short_time_limit() const noexcept { return th_switch_; }

    // Pieces exposed for checks: the eigen series (truncated to the cached roots) and the
    // short-time expansion, each valid on its own side of short_time_limit().
    double degree_series(double th) const;
    double degree_short_time(double th) const;

private:
    double n_;
    double th_switch_;
    std::vector<double> beta_;
    std::vector<double> weight_;
};

}  // namespace wickgrid
