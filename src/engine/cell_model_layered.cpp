// The layered series cell model: LayeredCell (layered_spectral.cpp) on the site's layers, partial
// drains, load history and vacuum. Uv is the same series without a drain; Ur follows from Carrillo's
// rule. Settlement is U × the final primary settlement of the settlement model.
#include <optional>

#include "cell_model_methods.hpp"
#include "wickgrid/errors.hpp"
#include "wickgrid/layered.hpp"
#include "wickgrid/units.hpp"

namespace wickgrid::detail {

namespace {
CellFigures figures_of(const NumericalCellSpec& spec, const LayeredCell& cell) {
    CellFigures f = spec_geometry(spec);
    f.mu_smear = cell.mu_smear();
    f.mu_depth_mean = cell.mu_depth_mean();
    return f;
}

// The vertical-flow-alone counterpart: no drain, no vacuum; absent when no fill is placed (vacuum
// alone acts only through the drains, so Uv is 0 there).
std::optional<LayeredCell> vertical_of(NumericalCellSpec spec, RadialTheory theory, int terms) {
    spec.has_drain = false;
    if (spec.loading) {
        spec.loading->vacuum.reset();
        if (spec.loading->stages.empty()) return std::nullopt;
    }
    return LayeredCell(spec, theory, terms);
}

class LayeredModel final : public CellModel {
public:
    LayeredModel(const NumericalCellSpec& spec, RadialTheory theory, int terms, LayeredCell cell,
                 std::optional<double> final_m, std::optional<SecondaryModel> secondary)
        : CellModel(figures_of(spec, cell), final_m, secondary), spec_(spec), theory_(theory), terms_(terms), cell_(std::move(cell)) {}

    // Uv needs the series without a drain: built here, when degrees are asked, so that the searches
    // (which ask U alone) do not pay for it.
    std::vector<Degrees> degrees(const std::vector<double>& times_s) const override {
        const std::optional<LayeredCell> vertical = vertical_of(spec_, theory_, terms_);
        std::vector<Degrees> out;
        out.reserve(times_s.size());
        for (const double t : times_s) {
            const double u = cell_.degree(t), uv = vertical ? vertical->degree(t) : 0.0;
            out.push_back({uv, carrillo_radial(u, uv), u});
        }
        return out;
    }

    std::vector<double> combined(const std::vector<double>& times_s) const override {
        std::vector<double> out;
        out.reserve(times_s.size());
        for (const double t : times_s) out.push_back(cell_.degree(t));
        return out;
    }

    double eventual_degree() const override { return cell_.eventual_degree(); }

    std::optional<std::vector<DepthPoint>> over_depth(const std::vector<double>& depths_m, double time_s) const override {
        std::vector<DepthPoint> out;
        out.reserve(depths_m.size());
        for (const double z : depths_m) out.push_back({z, cell_.pore_pressure_kPa(z, time_s), cell_.local_degree(z, time_s)});
        return out;
    }
    CellMethod method() const noexcept override { return CellMethod::layered; }

private:
    NumericalCellSpec spec_;
    RadialTheory theory_;
    int terms_;
    LayeredCell cell_;
};
}  // namespace

namespace {
// The final primary settlement of the settlement model (nullopt without one): the permanent fill's,
// or without fill that of the vacuum's mv-weighted mean steady suction.
std::optional<double> final_settlement(const Site& site, const std::function<double(double)>& ultimate,
                                       const LayeredCell& cell) {
    if (!site.has_settlement()) return std::nullopt;
    const double q = site.loading->permanent_kPa() > 0.0 ? site.loading->permanent_kPa() : cell.reference_load_kPa();
    return ultimate(q) - ultimate(0.0);
}
}  // namespace

std::function<double(double)> layered_margin_function(const Site& site, const DrainProductSpec& product, Pattern pattern) {
    if (auto why = layered_refusal(site)) throw why->error();
    // Only the influence diameter changes with spacing.
    const NumericalCellSpec base = numerical_cell_spec(site, product, pattern, site.range.bounds.min_m);
    const auto ultimate = ultimate_settlement_function(site);
    const RadialTheory theory = site.installation.theory;
    const int terms = site.method.series_terms;
    const Criterion criterion = site.criterion;
    const std::optional<SecondaryModel> secondary = wickgrid::secondary_model(site);
    // With a settlement model and fill the final settlement does not depend on spacing either.
    const bool settles = site.has_settlement();
    const bool fill = settles && site.loading->permanent_kPa() > 0.0;
    const std::optional<double> fill_final =
        fill ? std::optional<double>(ultimate(site.loading->permanent_kPa()) - ultimate(0.0)) : std::nullopt;
    return [=](double spacing_m) {
        NumericalCellSpec spec = base;
        spec.influence_diameter_m = influence_diameter_m(pattern, spacing_m);
        LayeredCell cell(spec, theory, terms);
        std::optional<double> final_m = fill_final;
        if (settles && !fill) final_m = ultimate(cell.reference_load_kPa()) - ultimate(0.0);
        return LayeredModel(spec, theory, terms, std::move(cell), final_m, secondary).margin(criterion);
    };
}

std::unique_ptr<CellModel> make_layered_model(const Site& site, const DrainProductSpec& product, Pattern pattern,
                                              double spacing_m) {
    const NumericalCellSpec spec = numerical_cell_spec(site, product, pattern, spacing_m);
    const RadialTheory theory = site.installation.theory;
    const int terms = site.method.series_terms;
    LayeredCell cell(spec, theory, terms);
    const auto final_m = final_settlement(site, ultimate_settlement_function(site), cell);
    return std::make_unique<LayeredModel>(spec, theory, terms, std::move(cell), final_m, wickgrid::secondary_model(site));
}

}  // namespace wickgrid::detail
