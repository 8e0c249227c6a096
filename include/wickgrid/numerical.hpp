#pragma once
// An independent numerical solution of the unit cell: axisymmetric finite volumes in r and z with
// coupled radial and vertical flow of excess pore pressure, the drain as a one-dimensional conduit
// of discharge capacity qw (well resistance), any smear profile, layered cv/ch/mv, partially
// penetrating drains and time-varying load; backward Euler with an adaptive step, sparse LDLᵀ
// factorisations (Eigen).
#include <limits>
#include <memory>
#include <optional>
#include <vector>

#include "wickgrid/cell.hpp"
#include "wickgrid/defaults.hpp"
#include "wickgrid/loading.hpp"

namespace wickgrid {

struct NumericalLayer {
    double thickness_m = 0.0;
    double cv_m2_per_s = 0.0;
    double ch_m2_per_s = 0.0;
    double mv_m2_per_kN = 1e-3;  // weights storage; kv = cv·mv·γw, kh = ch·mv·γw
};

struct NumericalCellSpec {
    std::vector<NumericalLayer> layers;  // top to bottom
    VerticalDrainage drainage = VerticalDrainage::both_faces;
    bool has_drain = true;               // false: no drain (one-dimensional vertical check)
    double drain_diameter_m = 0.05;
    double smear_diameter_m = 0.05;
    SmearShape smear_shape = SmearShape::constant;
    double smear_permeability_ratio = 1.0;
    double discharge_capacity_m3_per_s = std::numeric_limits<double>::infinity();
    double drain_length_m = 0.0;  // from the top; may stop short of the clay base
    DrainOutlets outlets = DrainOutlets::top;
    double influence_diameter_m = 1.5;
    bool radial_flow_only = false;  // no vertical flow (checks against Barron's radial solution)
    std::optional<LoadHistory> loading;  // absent: a unit load applied at t = 0
};

struct NumericalMesh {
    int radial_cells = defaults::numerical_radial_cells;
    int vertical_cells = defaults::numerical_vertical_cells;
    double max_degree_step = defaults::numerical_max_degree_step;  // largest change of U in one time step
    double first_step_s = 0.0;       // 0: chosen from the cell's time scales
};

struct NumericalPoint {
    double time_s = 0.0;
    double degree_settlement = 0.0;     // from the strain integral, relative to the final permanent load
    double degree_pore_pressure = 0.0;  // 1 − mean excess pore pressure / mean applied load
};

// The unit cell of an analytical CellSpec (uniform clay) in numerical form.
NumericalCellSpec numerical_spec(const CellSpec& spec, std::optional<LoadHistory> loading = std::nullopt);

class NumericalCell {
public:
    explicit NumericalCell(const NumericalCellSpec& spec, const NumericalMesh& mesh = {});
    // Degrees at the given times (ascending, >= 0).
    std::vector<NumericalPoint> solve(const std::vector<double>& times_s) const;
    // First time at which the settlement degree reaches target (0 < target < 1).
    double time_to_degree_s(double target) const;
    // The state after every time step of the cell's own adaptive march (stops only at load events,
    // never at output times), from t = 0 until past until_s. At a load jump both the state before and
    // after it are listed (equal times). Degrees between the listed times follow by linear
    // interpolation, so that any set of output times gives the same values (see cell_model.hpp).
    std::vector<NumericalPoint> march(double until_s) const;
    std::size_t unknowns() const noexcept { return unknowns_; }
    // The uniform load (kPa) whose settlement on the cell's mv is the degrees' reference: the
    // permanent load, or under a vacuum alone the mv-weighted mean steady suction.
    double reference_load_kPa() const noexcept;
    std::size_t steps_taken() const noexcept { return steps_; }

    struct Impl;  // the assembled model (opaque)

private:
    std::shared_ptr<const Impl> impl_;
    std::size_t unknowns_ = 0;
    mutable std::size_t steps_ = 0;
};

// Equivalent parameters for other models, from the same inputs:
// plane-strain permeability matching the average degree at equal cell width B = R
// (Hird, Pyrah & Russell 1992): k_pl = 2·kh/(3·μ), μ including smear and well resistance.
double plane_strain_permeability_m_per_s(double kh_m_per_s, double mu);
// Equivalent vertical permeability of a drained layer for one-dimensional models
// (Chai, Shen, Miura & Bergado 2001): kve = (1 + 2.5·l²·kh/(μ·De²·kv))·kv.
double equivalent_vertical_permeability_m_per_s(double kv_m_per_s, double kh_m_per_s, double mu, double l_m,
                                                double de_m);

}  // namespace wickgrid
