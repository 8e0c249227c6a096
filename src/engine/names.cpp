// Names of every choice, from the tables in names.hpp.
#include "wickgrid/names.hpp"

namespace wickgrid {

std::string_view to_string(Pattern pattern) { return name_of(pattern_names, pattern); }
std::string_view to_string(EquivalentDiameterMethod method) { return name_of(equivalent_diameter_names, method); }
std::string_view to_string(VerticalDrainage drainage) { return name_of(drainage_names, drainage); }
std::string_view to_string(DrainOutlets outlets) { return name_of(outlet_names, outlets); }
std::string_view to_string(SmearShape shape) { return name_of(smear_shape_names, shape); }
std::string_view to_string(RadialTheory theory) { return name_of(radial_theory_names, theory); }
std::string_view to_string(CellMethod method) { return name_of(cell_method_names, method); }
std::string_view to_string(CriterionKind kind) { return name_of(criterion_names, kind); }
std::string_view to_string(RankingBasis basis) { return name_of(ranking_names, basis); }
std::string_view to_string(TopUpRule rule) { return name_of(top_up_names, rule); }
std::string_view to_string(StudyInput input) { return name_of(study_input_names, input); }
std::string_view to_string(DistributionKind kind) { return name_of(distribution_names, kind); }

}  // namespace wickgrid
