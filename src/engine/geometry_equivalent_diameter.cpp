// Equivalent diameters: band drains by Hansbo (1979), Rixner et al. (1986), Long & Covo (1994);
// mandrels by equal cross-sectional area.
#include <boost/math/constants/constants.hpp>
#include <cmath>

#include "wickgrid/errors.hpp"
#include "wickgrid/geometry.hpp"

namespace wickgrid {

double band_drain_equivalent_diameter_m(EquivalentDiameterMethod method, double width_m,
                                        double thickness_m) {
    require_positive("drain width a (m)", width_m);
    require_positive("drain thickness b (m)", thickness_m);
    switch (method) {
        case EquivalentDiameterMethod::hansbo_1979:  // equal perimeter: 2(a + b)/π
            return 2.0 * (width_m + thickness_m) / boost::math::double_constants::pi;
        case EquivalentDiameterMethod::rixner_1986:  // (a + b)/2
            return 0.5 * (width_m + thickness_m);
        case EquivalentDiameterMethod::long_covo_1994:  // 0.5a + 0.7b
            return 0.5 * width_m + 0.7 * thickness_m;
    }
    throw InputError("equivalent diameter method", static_cast<double>(method),
                     "hansbo_1979, rixner_1986 or long_covo_1994");
}

double mandrel_equivalent_diameter_m(double width_m, double depth_m) {
    require_positive("mandrel width (m)", width_m);
    require_positive("mandrel depth (m)", depth_m);
    return std::sqrt(4.0 * width_m * depth_m / boost::math::double_constants::pi);
}

}  // namespace wickgrid
