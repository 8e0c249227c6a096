// Barron (1948) equal-strain radial consolidation of an ideal drain: F(n).
#include <cmath>

#include "wickgrid/errors.hpp"
#include "wickgrid/radial.hpp"

namespace wickgrid {

double barron_F(double n) {
    require_greater("drain spacing ratio n = De/dw", n, 1.0, "a finite number greater than 1");
    const double n2 = n * n;
    return n2 / (n2 - 1.0) * std::log(n) - (3.0 * n2 - 1.0) / (4.0 * n2);
}

}  // namespace wickgrid
