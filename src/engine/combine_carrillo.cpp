// Carrillo (1942) combination of vertical and radial consolidation.
#include "wickgrid/combine.hpp"
#include "wickgrid/errors.hpp"

namespace wickgrid {

double carrillo(double uv, double ur) {
    if (!(uv >= 0.0 && uv <= 1.0))
        throw InputError("degree of vertical consolidation Uv", uv, "between 0 and 1");
    if (!(ur >= 0.0 && ur <= 1.0))
        throw InputError("degree of radial consolidation Ur", ur, "between 0 and 1");
    return carrillo_combined(uv, ur);
}

}  // namespace wickgrid
