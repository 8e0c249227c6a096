#pragma once
// The site: what a scenario says, resolved once, in SI units, split by concern — the ground, the
// drain products, their installation, the load history, the design criterion, the method of the
// unit cell and the spacing range. Pure data; the scenario layer fills it, every command asks it
// through the cell-model factory (cell_model.hpp). No field has two meanings.
#include <functional>
#include <optional>
#include <string>
#include <variant>
#include <vector>

#include "wickgrid/cell.hpp"
#include "wickgrid/defaults.hpp"
#include "wickgrid/embankment.hpp"
#include "wickgrid/loading.hpp"
#include "wickgrid/numerical.hpp"
#include "wickgrid/search.hpp"
#include "wickgrid/settlement.hpp"

namespace wickgrid {

// How a design study ranks its feasible designs.
enum class RankingBasis { cost_per_hectare, drain_length_per_hectare };

// Where the clay's horizontal permeability comes from.
enum class KhSource {
    given,           // kh_m_per_s in the ground
    from_ch_and_mv,  // kh = ch·mv·γw, recomputed whenever ch or mv changes
};

// The compressible ground the drains are in.
struct Ground {
    double thickness_m = 0.0;
    VerticalDrainage drainage = VerticalDrainage::both_faces;
    // The clay taken as one layer (what the closed form uses). cv/ch may be absent where every layer
    // of the profile gives its own (numerical method).
    std::optional<double> cv_m2_per_s;
    std::optional<double> ch_m2_per_s;
    std::optional<double> kh_m_per_s;  // set when kh_source == given
    KhSource kh_source = KhSource::given;
    std::optional<double> mv_m2_per_kN;  // the clay's coefficient of volume compressibility, as one value
    // Layers (settlement by e–log or mv; optional per-layer cv/ch). Absent: one uniform clay.
    std::optional<SoilProfile> profile;

    // The clay as one uniform layer; throws InputError naming what is missing.
    Clay uniform_clay() const;
    // Whether the layers give their own cv or ch (then the clay is not uniform in consolidation).
    bool layered_flow() const;
};

struct DrainProductSpec {
    std::string name;
    double equivalent_diameter_m = 0.0;
    double discharge_capacity_m3_per_s = 0.0;
    std::optional<double> cost_per_m;
};

struct Installation {
    double mandrel_diameter_m = 0.0;
    double smear_diameter_ratio = 1.0;      // ds/dm
    double smear_permeability_ratio = 1.0;  // kh/ks
    SmearShape smear_shape = SmearShape::constant;
    RadialTheory theory = RadialTheory::hansbo_1981;
    double drain_length_m = 0.0;  // from the top of the clay; may stop short of the base
    DrainOutlets outlets = DrainOutlets::top;

    double smear_diameter_m() const noexcept { return smear_diameter_ratio * mandrel_diameter_m; }
};

// The design criterion: a typed choice.
struct DegreeTarget {
    double degree = 0.9;  // average degree of consolidation to reach by the deadline (0 < U < 1)
};
struct ResidualSettlementLimit {
    double limit_m = 0.0;              // settlement still to come after the deadline, at most
    std::optional<double> service_s;   // counted over this period after the deadline; absent: to the end
};
enum class CriterionKind { degree, residual_settlement };

struct Criterion {
    std::variant<DegreeTarget, ResidualSettlementLimit> rule;
    double deadline_s = 0.0;

    CriterionKind kind() const noexcept {
        return std::holds_alternative<DegreeTarget>(rule) ? CriterionKind::degree : CriterionKind::residual_settlement;
    }
    const DegreeTarget* degree() const noexcept { return std::get_if<DegreeTarget>(&rule); }
    const ResidualSettlementLimit* residual() const noexcept { return std::get_if<ResidualSettlementLimit>(&rule); }
};

// How a unit cell is computed (names in names.hpp; implementations in cell_model.hpp).
enum class CellMethod { closed_form, numerical, layered };

struct MethodChoice {
    CellMethod method = CellMethod::closed_form;
    NumericalMesh mesh{defaults::design_radial_cells, defaults::design_vertical_cells,
                       defaults::design_max_degree_step, 0.0};
    int series_terms = defaults::layered_terms;  // terms of the layered series method
};

struct SearchRange {
    SpacingBounds bounds;
    double increment_m = defaults::spacing_increment_m;
    std::vector<Pattern> patterns{Pattern::triangular, Pattern::square};
    // How feasible designs are ranked; absent: by cost per hectare when every product has a cost,
    // else by drain metres per hectare.
    std::optional<RankingBasis> rank_by;
};

struct Site {
    Ground ground;
    std::vector<DrainProductSpec> products;
    Installation installation;
    std::optional<LoadHistory> loading;  // absent: the load is applied at once at day 0
    Criterion criterion;
    MethodChoice method;
    SearchRange range;
    // The embankment's cross-section: the load spreads with depth under its centre line (Osterberg
    // 1957) for settlement and strength gain, and stages are checked for stability. Absent: a
    // uniform load of wide extent.
    std::optional<EmbankmentSection> embankment;

    // The product of that name (InputError naming it if there is none).
    const DrainProductSpec& product(const std::string& name) const;
    // Settlement is computed when there is a load and a compressibility (layers or mv).
    bool has_settlement() const noexcept;
    // The load history: the site's loading, or 1 kPa at day 0 for degree-only designs.
    LoadHistory load_history() const;
};

// Checks what joins several parts of the site (criterion against loading and settlement, bounds,
// drain length, a ranking by cost against the products' costs); throws InputError naming the quantity. Cost: O(layers).
void validate_site(const Site& site);

// The embankment's full fill height (m): the section's own height_m, else the permanent stages' total
// at the fill unit weight (a surcharge rises above it); nullopt without an embankment, or without
// either a height or permanent stages.
std::optional<double> final_fill_height_m(const Site& site);

// The vertical stress increase (kPa) at each depth (m below the top of the clay) under a surface
// load q (kPa): q itself, or under the embankment's centre line with the fill at height q/γ
// (Osterberg's influence over the section's slopes, embankment.hpp). Cost: O(depths × slopes).
std::vector<double> load_at_depths_kPa(const Site& site, double surface_load_kPa, const std::vector<double>& depths_m);

// One slice of the settlement sum under a surface load: its layer (0-based), centre depth,
// thickness, initial effective stress (absent for one uniform clay by mv), the load there and its
// final primary settlement. Layers: the profile's slices; one uniform clay by mv:
// defaults::slices_per_layer equal slices. Throws InputError without a settlement model.
struct SettlementSlice {
    std::size_t layer = 0;
    double depth_m = 0.0;
    double thickness_m = 0.0;
    std::optional<double> sigma_v0_kPa;
    double load_kPa = 0.0;
    double final_m = 0.0;
};
std::vector<SettlementSlice> settlement_slices(const Site& site, double surface_load_kPa);

// Secondary compression of the profile per log cycle of time (m): Σ Cα/(1 + e0)·H over the layers
// that give Cα; nullopt when none does. Secondary settlement after the end of primary tp is this
// times log10(t/tp) (the usual log-time law; Mesri & Godlewski 1977 for Cα/Cc).
std::optional<double> secondary_per_cycle_m(const Site& site);

// Ultimate primary settlement (m) under a total load q (kPa) on this site: the sum of its
// settlement slices; without a settlement model, q itself (so that settlement histories
// become load-weighted degrees).
std::function<double(double load_kPa)> ultimate_settlement_function(const Site& site);

// The closed-form unit cell of one product at one spacing (uniform clay, full drains).
CellSpec closed_form_cell(const Site& site, const DrainProductSpec& product, Pattern pattern, double spacing_m);

// The numerical unit cell of one product at one spacing: the layers with their own cv/ch (else the
// clay's) and storage mv (given, or the e–log secant under the final load), partial drains, loading.
NumericalCellSpec numerical_cell_spec(const Site& site, const DrainProductSpec& product, Pattern pattern,
                                      double spacing_m);

}  // namespace wickgrid
