#pragma once
// One row of a checks table: where the value comes from, the inputs, what is expected and how
// close (in the quantity's own engineering units) the engine must come.
#include <string_view>

namespace wickgrid::checks {

struct Row {
    std::string_view source;
    double input;
    double expected;
    double tolerance;
};

struct Row2 {
    std::string_view source;
    double input_a;
    double input_b;
    double expected;
    double tolerance;
};

}  // namespace wickgrid::checks
