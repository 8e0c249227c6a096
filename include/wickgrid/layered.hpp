#pragma once
// Layered ground at closed-form speed: the spectral method for a stratified unit cell with vertical
// flow and equal-strain radial flow to the drain (Walker & Indraratna 2009), with vacuum applied
// through the drains (the linear loss along the drain of Indraratna et al. 2005).
//
// The cell-averaged excess pore pressure ū(z, t) obeys, layer by layer,
//     mv ∂ū/∂t = ∂/∂z(kv/γw ∂ū/∂z) − η(z)(ū − w(z, t)) + mv ∂σ/∂t,
//     η(z) = 2·kh/(γw·re²·μ(z)) along the drain (0 below its tip or without a drain),
// with μ(z) the smear μ plus Hansbo's (1981) well resistance π·z(2l − z)·kh/qw (kh of the layer at
// that depth), w the vacuum at the drain (≤ 0) and σ the applied load. ū is expanded in the
// eigenfunctions of uniform Terzaghi consolidation for the drainage faces (sin or cos of m·z/H);
// Galerkin's method gives Γ·A′ + Ψ·A = F(t) with Γ = ∫mv·φiφj, Ψ = ∫kv/γw·φi′φj′ + ∫η·φiφj, solved
// exactly in time through the generalised eigenproblem Ψv = λΓv (Eigen). Departures from the paper:
// the weak form (∫kv·φi′φj′) replaces the paper's piecewise-linear property integrals; properties are
// constant within a layer; integrals by Gauss–Legendre quadrature; the vacuum acts through the drains
// only (the clay's drainage faces stay at zero excess pore pressure); the strain of the modes beyond
// the last kept one (M − Σβ², so that a load jump is undrained at its instant and the final
// settlement is exact) decays as those modes would in uniform ground, with rates from the Rayleigh
// quotients of the last basis function. The series converges as about 1/terms where kv jumps
// between layers (the kinks of ū there); README gives the measured errors.
//
// Degree by settlement: ∫mv(σ − ū)dz relative to the reference ∫mv·q dz of the final permanent load
// (without fill: the steady state under the vacuum). After a surcharge or the vacuum is removed the
// settlement is held at its value then until the remaining loads' response passes it (rebound
// ignored), the rule of SettlementHistory (settlement.hpp).
#include <memory>
#include <vector>

#include "wickgrid/cell.hpp"
#include "wickgrid/defaults.hpp"
#include "wickgrid/numerical.hpp"

namespace wickgrid {

class LayeredCell {
public:
    // Builds the cell: the layers, drain, smear and load history of the numerical cell spec (the same
    // inputs the independent check takes), the radial theory for the smear μ and the number of terms
    // (defaults::layered_terms). Throws InputError naming the quantity for inputs outside the method
    // (terms from 2 to defaults::max_layered_terms, positive layer properties, drain length within the
    // clay, a spacing that leaves room for the smear zone). Cost: O(terms² × quadrature points) to
    // assemble plus one dense generalised eigenproblem (O(terms³)); about 0.1 ms at 24 terms, 0.6 ms at 48
    // (five layers, 2 GHz core).
    LayeredCell(const NumericalCellSpec& spec, RadialTheory theory, int terms = defaults::layered_terms);

    // Degree by settlement at time t (s, >= 0), relative to the reference; may exceed 1 while a
    // surcharge or vacuum acts. Cost: one exp per term per load event. Thread-safe (const).
    double degree(double time_s) const;
    // The degree the settlement tends to in the long run (above 1 when a temporary load
    // over-compressed).
    double eventual_degree() const;
    // Degree by pore pressure: 1 − (mean ū)/(applied load), 0 while no fill is applied.
    double degree_pore_pressure(double time_s) const;
    // Excess pore pressure ū (kPa) at depth z (m from the top of the clay, 0..H) and time t, of the
    // linear model (no hold rule). Cost: O(terms²).
    double pore_pressure_kPa(double depth_m, double time_s) const;
    // Local degree at depth z: the strain there relative to its reference (the final permanent load,
    // or the steady vacuum), 0 where the reference is 0.
    double local_degree(double depth_m, double time_s) const;
    // The reference the degrees are relative to: ∫mv·(final effective stress increase)dz (m), and the
    // uniform load (kPa) that would give it on the cell's mv (the permanent fill, or the vacuum's
    // mv-weighted mean steady suction).
    double reference_strain_integral_m() const noexcept;
    double reference_load_kPa() const noexcept;

    int terms() const noexcept;
    double mu_smear() const noexcept;
    double mu_depth_mean() const noexcept;  // mean of μ(z) over the drain length (0 without a drain)

    struct Model;  // the solved eigen-system and the load events (opaque)

private:
    std::shared_ptr<const Model> model_;
};

}  // namespace wickgrid
