#pragma once
// A unit-cell specification for tests: a 100 × 4 mm band drain in 14 m of clay (invented values
// of a typical order, for tests only).
#include "wickgrid/cell.hpp"
#include "wickgrid/design.hpp"
#include "wickgrid/geometry.hpp"
#include "wickgrid/permeability.hpp"
#include "wickgrid/units.hpp"

namespace wickgrid::fixtures {

inline CellSpec typical_cell(Pattern pattern = Pattern::triangular, double spacing_m = 1.5) {
    CellSpec spec;
    spec.clay.thickness_m = 14.0;
    spec.clay.cv_m2_per_s = units::per_year_to_per_second(1.2);
    spec.clay.ch_m2_per_s = units::per_year_to_per_second(2.4);
    spec.clay.kh_m_per_s = permeability_from_consolidation_m_per_s(spec.clay.ch_m2_per_s, 0.0008);
    spec.clay.drainage = VerticalDrainage::both_faces;
    spec.drain.equivalent_diameter_m =
        band_drain_equivalent_diameter_m(EquivalentDiameterMethod::hansbo_1979, 0.100, 0.004);
    spec.drain.smear_diameter_m = 3.0 * mandrel_equivalent_diameter_m(0.120, 0.060);
    spec.drain.smear_permeability_ratio = 3.0;
    spec.drain.discharge_capacity_m3_per_s = units::per_year_to_per_second(150.0);
    spec.drain.length_m = 14.0;
    spec.drain.outlets = DrainOutlets::top;
    spec.pattern = pattern;
    spec.spacing_m = spacing_m;
    return spec;
}

// A one-product design around typical_cell (invented values, tests and benchmarks only).
inline DesignInput typical_design(double deadline_days = 240.0, double cost_per_m = 1.1) {
    const CellSpec cell = typical_cell();
    DesignInput d;
    d.clay = cell.clay;
    d.mv_m2_per_kN = 0.0008;
    d.installation = cell.drain;
    d.mandrel_diameter_m = mandrel_equivalent_diameter_m(0.120, 0.060);
    d.smear_diameter_ratio = 2.0;
    d.products = {{"band-100x4", cell.drain.equivalent_diameter_m, cell.drain.discharge_capacity_m3_per_s, cost_per_m}};
    d.patterns = {Pattern::triangular, Pattern::square};
    d.target_degree = 0.9;
    d.deadline_s = units::days_to_seconds(deadline_days);
    d.bounds = {0.6, 4.0};
    d.increment_m = 0.05;
    return d;
}

}  // namespace wickgrid::fixtures
