#pragma once
// Internals: the implementations behind the method table (not part of the public headers).
#include <functional>
#include <memory>
#include <optional>
#include <string>

#include "wickgrid/cell_model.hpp"

namespace wickgrid::detail {

std::unique_ptr<CellModel> make_closed_form_model(const Site& site, const DrainProductSpec& product, Pattern pattern,
                                                  double spacing_m);
std::optional<MethodRefusal> closed_form_refusal(const Site& site);
// The exact fast search (SpacingSolver) where it applies: one instantaneous load, degree criterion.
std::optional<SpacingLimit> closed_form_fast_limit(const Site& site, const DrainProductSpec& product, Pattern pattern);

std::unique_ptr<CellModel> make_numerical_model(const Site& site, const DrainProductSpec& product, Pattern pattern,
                                                double spacing_m);
std::optional<MethodRefusal> numerical_refusal(const Site& site);

std::unique_ptr<CellModel> make_layered_model(const Site& site, const DrainProductSpec& product, Pattern pattern,
                                              double spacing_m);
// The criterion margin against spacing with what does not depend on spacing prepared once (layers,
// storage mv, final settlement): the searches' inner function.
std::function<double(double)> layered_margin_function(const Site& site, const DrainProductSpec& product, Pattern pattern);
// The layered series method takes what the numerical cell takes: cv/ch for every layer.
inline std::optional<MethodRefusal> layered_refusal(const Site& site) { return numerical_refusal(site); }

// The geometry figures of a cell given as a NumericalCellSpec (diameters, n, s, drain length); the
// method fills in its own μ figures.
inline CellFigures spec_geometry(const NumericalCellSpec& spec) {
    CellFigures f;
    f.equivalent_diameter_m = spec.drain_diameter_m;
    f.smear_diameter_m = spec.smear_diameter_m;
    f.influence_diameter_m = spec.influence_diameter_m;
    f.n = f.influence_diameter_m / f.equivalent_diameter_m;
    f.s = f.smear_diameter_m / f.equivalent_diameter_m;
    f.drain_length_m = spec.drain_length_m;
    return f;
}

// Ur that Carrillo's rule needs to give U with this Uv (1 where Uv is 1).
inline double carrillo_radial(double combined, double vertical) {
    return vertical < 1.0 ? 1.0 - (1.0 - combined) / (1.0 - vertical) : 1.0;
}

}  // namespace wickgrid::detail
