#pragma once
// A sketch of the unit cell drawn from the inputs: in plan the pattern around one drain with the
// spacing and the influence circle; in section the clay (layers to scale in depth), the drain to
// its length, the smear zone (widened to be seen), the outlets and the drained faces.
#include <string>

#include "results/design_record.hpp"

namespace wickgrid::report {

// For the recommended design (the first row when none meets the criterion); empty without rows.
std::string unit_cell_sketch(const results::DesignRecord& record);

}  // namespace wickgrid::report
