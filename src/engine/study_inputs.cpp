// Inputs that studies vary: names, unit conversion, application to a design, physical ranges.
#include <algorithm>
#include <limits>

#include "wickgrid/errors.hpp"
#include "wickgrid/permeability.hpp"
#include "wickgrid/studies.hpp"
#include "wickgrid/units.hpp"

namespace wickgrid {

std::string_view to_string(StudyInput input) {
    switch (input) {
        case StudyInput::ch: return "ch_m2_per_year";
        case StudyInput::cv: return "cv_m2_per_year";
        case StudyInput::kh: return "kh_m_per_s";
        case StudyInput::smear_diameter_ratio: return "smear_diameter_ratio";
        case StudyInput::smear_permeability_ratio: return "smear_permeability_ratio";
        case StudyInput::discharge_capacity: return "discharge_capacity_m3_per_year";
    }
    return "unknown";
}

double study_value_from_si(StudyInput input, double si) {
    switch (input) {
        case StudyInput::ch:
        case StudyInput::cv:
        case StudyInput::discharge_capacity: return units::per_second_to_per_year(si);
        default: return si;
    }
}

double study_value_to_si(StudyInput input, double scenario_value) {
    switch (input) {
        case StudyInput::ch:
        case StudyInput::cv:
        case StudyInput::discharge_capacity: return units::per_year_to_per_second(scenario_value);
        default: return scenario_value;
    }
}

DesignInput with_input(const DesignInput& base, StudyInput input, double value_si) {
    DesignInput d = base;
    switch (input) {
        case StudyInput::ch:
            d.clay.ch_m2_per_s = value_si;
            if (d.mv_m2_per_kN) d.clay.kh_m_per_s = permeability_from_consolidation_m_per_s(value_si, *d.mv_m2_per_kN);
            break;
        case StudyInput::cv: d.clay.cv_m2_per_s = value_si; break;
        case StudyInput::kh:
            d.clay.kh_m_per_s = value_si;
            d.mv_m2_per_kN.reset();  // kh is now given, no longer tied to ch
            break;
        case StudyInput::smear_diameter_ratio: d.smear_diameter_ratio = value_si; break;
        case StudyInput::smear_permeability_ratio: d.installation.smear_permeability_ratio = value_si; break;
        case StudyInput::discharge_capacity:
            for (auto& p : d.products) p.discharge_capacity_m3_per_s = value_si;
            break;
    }
    return d;
}

InputRange physical_range(const DesignInput& base, StudyInput input) {
    constexpr double tiny = std::numeric_limits<double>::min();
    constexpr double inf = std::numeric_limits<double>::infinity();
    switch (input) {
        case StudyInput::smear_permeability_ratio: return {1.0, inf};
        case StudyInput::smear_diameter_ratio: {
            // ds must cover every drain and stay inside the smallest unit cell searched.
            double largest_dw = 0.0;
            for (const auto& p : base.products) largest_dw = std::max(largest_dw, p.equivalent_diameter_m);
            double smallest_de = inf;
            for (const Pattern p : base.patterns)
                smallest_de = std::min(smallest_de, influence_diameter_m(p, base.bounds.min_m));
            return {largest_dw / base.mandrel_diameter_m, smallest_de / base.mandrel_diameter_m};
        }
        default: return {tiny, inf};
    }
}

}  // namespace wickgrid
