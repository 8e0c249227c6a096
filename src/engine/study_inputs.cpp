// Inputs that studies vary: names, unit conversion, application to a design, physical ranges.
#include <algorithm>
#include <limits>

#include "wickgrid/errors.hpp"
#include "wickgrid/permeability.hpp"
#include "wickgrid/studies.hpp"
#include "wickgrid/units.hpp"

namespace wickgrid {

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

Site with_input(const Site& base, StudyInput input, double value_si) {
    Site d = base;
    Ground& g = d.ground;
    if ((input == StudyInput::ch || input == StudyInput::cv) && g.layered_flow())
        throw InputError(std::string(to_string(input)), study_value_from_si(input, value_si),
                         "varied on a clay taken as one layer; this site's layers give their own cv/ch");
    switch (input) {
        case StudyInput::ch: g.ch_m2_per_s = value_si; break;  // a derived kh follows (Ground::uniform_clay)
        case StudyInput::cv: g.cv_m2_per_s = value_si; break;
        case StudyInput::kh:
            g.kh_m_per_s = value_si;
            g.kh_source = KhSource::given;  // kh is now given, no longer tied to ch
            break;
        case StudyInput::smear_diameter_ratio: d.installation.smear_diameter_ratio = value_si; break;
        case StudyInput::smear_permeability_ratio: d.installation.smear_permeability_ratio = value_si; break;
        case StudyInput::discharge_capacity:
            if (d.products.size() != 1)
                throw InputError(std::string(to_string(input)), study_value_from_si(input, value_si),
                                 "varied on a site with one drain product; with " + std::to_string(d.products.size()) +
                                     " products vary discharge_capacity_factor (a factor on each product's qw)");
            d.products.front().discharge_capacity_m3_per_s = value_si;
            break;
        case StudyInput::discharge_capacity_factor:
            for (auto& p : d.products) p.discharge_capacity_m3_per_s *= value_si;
            break;
        case StudyInput::ch_factor:
        case StudyInput::cv_factor: {
            const bool ch = input == StudyInput::ch_factor;
            auto scale = [&](std::optional<double>& c) {
                if (c) *c *= value_si;
            };
            scale(ch ? g.ch_m2_per_s : g.cv_m2_per_s);
            if (g.profile)
                for (auto& layer : g.profile->layers) scale(ch ? layer.ch_m2_per_s : layer.cv_m2_per_s);
            break;
        }
    }
    return d;
}

InputRange physical_range(const Site& base, StudyInput input) {
    constexpr double tiny = std::numeric_limits<double>::min();
    constexpr double inf = std::numeric_limits<double>::infinity();
    switch (input) {
        case StudyInput::smear_permeability_ratio: return {1.0, inf};
        case StudyInput::smear_diameter_ratio: {
            // ds must cover every drain and stay inside the smallest unit cell searched.
            double largest_dw = 0.0;
            for (const auto& p : base.products) largest_dw = std::max(largest_dw, p.equivalent_diameter_m);
            double smallest_de = inf;
            for (const Pattern p : base.range.patterns)
                smallest_de = std::min(smallest_de, influence_diameter_m(p, base.range.bounds.min_m));
            const double dm = base.installation.mandrel_diameter_m;
            return {largest_dw / dm, smallest_de / dm};
        }
        default: return {tiny, inf};
    }
}

}  // namespace wickgrid
