#pragma once
// One {value, name} table per choice. The scenario reader, the command line and the writers all take
// names from these tables (names are a contract of the scenario schema and the JSON output: extend,
// never rename).
#include <array>
#include <optional>
#include <string>
#include <string_view>
#include <vector>

#include "wickgrid/design.hpp"
#include "wickgrid/embankment.hpp"
#include "wickgrid/schedule.hpp"
#include "wickgrid/studies.hpp"

namespace wickgrid {

template <class E>
struct Named {
    E value;
    std::string_view name;
};

inline constexpr std::array pattern_names{Named<Pattern>{Pattern::triangular, "triangular"},
                                          Named<Pattern>{Pattern::square, "square"}};
inline constexpr std::array drainage_names{Named<VerticalDrainage>{VerticalDrainage::both_faces, "both_faces"},
                                           Named<VerticalDrainage>{VerticalDrainage::top_only, "top_only"},
                                           Named<VerticalDrainage>{VerticalDrainage::bottom_only, "bottom_only"}};
inline constexpr std::array outlet_names{Named<DrainOutlets>{DrainOutlets::top, "top"},
                                         Named<DrainOutlets>{DrainOutlets::top_and_bottom, "top_and_bottom"}};
inline constexpr std::array equivalent_diameter_names{
    Named<EquivalentDiameterMethod>{EquivalentDiameterMethod::hansbo_1979, "hansbo_1979"},
    Named<EquivalentDiameterMethod>{EquivalentDiameterMethod::rixner_1986, "rixner_1986"},
    Named<EquivalentDiameterMethod>{EquivalentDiameterMethod::long_covo_1994, "long_covo_1994"}};
inline constexpr std::array smear_shape_names{Named<SmearShape>{SmearShape::constant, "constant"},
                                              Named<SmearShape>{SmearShape::linear, "linear"},
                                              Named<SmearShape>{SmearShape::parabolic, "parabolic"}};
inline constexpr std::array radial_theory_names{
    Named<RadialTheory>{RadialTheory::hansbo_1981, "hansbo_1981"},
    Named<RadialTheory>{RadialTheory::equal_strain_integral, "equal_strain_integral"}};
// `method:` in a scenario and in JSON: the closed form is called "analytical" there.
inline constexpr std::array cell_method_names{Named<CellMethod>{CellMethod::closed_form, "analytical"},
                                              Named<CellMethod>{CellMethod::numerical, "numerical"},
                                              Named<CellMethod>{CellMethod::layered, "layered_series"}};
inline constexpr std::array criterion_names{
    Named<CriterionKind>{CriterionKind::degree, "degree"},
    Named<CriterionKind>{CriterionKind::residual_settlement, "residual_settlement"}};
inline constexpr std::array ranking_names{
    Named<RankingBasis>{RankingBasis::cost_per_hectare, "cost_per_hectare"},
    Named<RankingBasis>{RankingBasis::drain_length_per_hectare, "drain_length_per_hectare"}};
// The scenario's `rank_by` key (shorter words for the same choice).
inline constexpr std::array rank_by_names{Named<RankingBasis>{RankingBasis::cost_per_hectare, "cost"},
                                          Named<RankingBasis>{RankingBasis::drain_length_per_hectare, "drain_length"}};
inline constexpr std::array study_input_names{
    Named<StudyInput>{StudyInput::ch, "ch_m2_per_year"},
    Named<StudyInput>{StudyInput::cv, "cv_m2_per_year"},
    Named<StudyInput>{StudyInput::kh, "kh_m_per_s"},
    Named<StudyInput>{StudyInput::smear_diameter_ratio, "smear_diameter_ratio"},
    Named<StudyInput>{StudyInput::smear_permeability_ratio, "smear_permeability_ratio"},
    Named<StudyInput>{StudyInput::discharge_capacity, "discharge_capacity_m3_per_year"},
    Named<StudyInput>{StudyInput::discharge_capacity_factor, "discharge_capacity_factor"},
    Named<StudyInput>{StudyInput::ch_factor, "ch_factor"},
    Named<StudyInput>{StudyInput::cv_factor, "cv_factor"}};
// What a chart or a printed table calls each study input (the scenario keys above stay the names).
inline constexpr std::array study_input_labels{
    Named<StudyInput>{StudyInput::ch, "ch, horizontal coefficient of consolidation (m²/year)"},
    Named<StudyInput>{StudyInput::cv, "cv, vertical coefficient of consolidation (m²/year)"},
    Named<StudyInput>{StudyInput::kh, "kh, horizontal permeability (m/s)"},
    Named<StudyInput>{StudyInput::smear_diameter_ratio, "ds/dm, smear zone over mandrel diameter"},
    Named<StudyInput>{StudyInput::smear_permeability_ratio, "kh/ks, undisturbed over smeared permeability"},
    Named<StudyInput>{StudyInput::discharge_capacity, "qw, drain discharge capacity (m³/year)"},
    Named<StudyInput>{StudyInput::discharge_capacity_factor, "factor on each product's qw"},
    Named<StudyInput>{StudyInput::ch_factor, "factor on the ch of every clay layer"},
    Named<StudyInput>{StudyInput::cv_factor, "factor on the cv of every clay layer"}};

inline constexpr std::array top_up_names{Named<TopUpRule>{TopUpRule::with_last_lift, "with_last_lift"},
                                          Named<TopUpRule>{TopUpRule::after_surcharge_removal, "after_surcharge_removal"}};
// Why a scheme of `schedule` is not on the cost–finish front (JSON `excluded_because`).
inline constexpr std::array scheme_exclusion_names{
    Named<SchemeExclusion>{SchemeExclusion::stage_below_target, "stage_below_target"},
    Named<SchemeExclusion>{SchemeExclusion::criterion_missed, "criterion_missed"},
    Named<SchemeExclusion>{SchemeExclusion::beaten, "beaten"}};

inline constexpr std::array distribution_names{Named<DistributionKind>{DistributionKind::normal, "normal"},
                                               Named<DistributionKind>{DistributionKind::lognormal, "lognormal"},
                                               Named<DistributionKind>{DistributionKind::uniform, "uniform"},
                                               Named<DistributionKind>{DistributionKind::triangular, "triangular"}};

// The name of a value (every enumerator is in its table; a test holds them complete).
template <class E, std::size_t N>
constexpr std::string_view name_of(const std::array<Named<E>, N>& table, E value) {
    for (const auto& row : table)
        if (row.value == value) return row.name;
    return {};
}

// The value of a name, or nullopt.
template <class E, std::size_t N>
constexpr std::optional<E> value_of(const std::array<Named<E>, N>& table, std::string_view name) {
    for (const auto& row : table)
        if (row.name == name) return row.value;
    return std::nullopt;
}

// Every name, in table order (for messages and command-line checks).
template <class E, std::size_t N>
std::vector<std::string> names_of(const std::array<Named<E>, N>& table) {
    std::vector<std::string> out;
    for (const auto& row : table) out.emplace_back(row.name);
    return out;
}

std::string_view to_string(VerticalDrainage drainage);
std::string_view to_string(DrainOutlets outlets);
std::string_view to_string(SmearShape shape);
std::string_view to_string(RadialTheory theory);
std::string_view to_string(CellMethod method);
std::string_view to_string(CriterionKind kind);
std::string_view to_string(RankingBasis basis);
std::string_view to_string(TopUpRule rule);

// A study input as charts and printed tables call it.
constexpr std::string_view study_input_label(StudyInput input) { return name_of(study_input_labels, input); }

}  // namespace wickgrid
