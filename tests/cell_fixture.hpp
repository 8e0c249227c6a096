#pragma once
// A unit-cell specification for tests: a 100 × 4 mm band drain in 14 m of clay (invented values
// of a typical order, for tests only).
#include "wickgrid/cell.hpp"
#include "wickgrid/design.hpp"
#include "wickgrid/site.hpp"
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

// A one-product site around typical_cell (invented values, tests and benchmarks only).
inline Site typical_design(double deadline_days = 240.0, double cost_per_m = 1.1) {
    const CellSpec cell = typical_cell();
    Site d;
    d.ground.thickness_m = cell.clay.thickness_m;
    d.ground.cv_m2_per_s = cell.clay.cv_m2_per_s;
    d.ground.ch_m2_per_s = cell.clay.ch_m2_per_s;
    d.ground.mv_m2_per_kN = 0.0008;
    d.ground.kh_source = KhSource::from_ch_and_mv;
    d.ground.drainage = cell.clay.drainage;
    d.installation.mandrel_diameter_m = mandrel_equivalent_diameter_m(0.120, 0.060);
    d.installation.smear_diameter_ratio = 2.0;
    d.installation.smear_permeability_ratio = cell.drain.smear_permeability_ratio;
    d.installation.drain_length_m = cell.drain.length_m;
    d.installation.outlets = cell.drain.outlets;
    d.products = {{"band-100x4", cell.drain.equivalent_diameter_m, cell.drain.discharge_capacity_m3_per_s, cost_per_m}};
    d.range.patterns = {Pattern::triangular, Pattern::square};
    d.criterion = {DegreeTarget{0.9}, units::days_to_seconds(deadline_days)};
    d.range.bounds = {0.6, 4.0};
    d.range.increment_m = 0.05;
    return d;
}

}  // namespace wickgrid::fixtures
