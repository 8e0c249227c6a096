#pragma once
// Typed input errors: every physical check names the quantity, the value and what is allowed.
#include <stdexcept>
#include <cmath>
#include <string>
#include <string_view>

namespace wickgrid {

class InputError : public std::invalid_argument {
public:
    InputError(std::string quantity, double value, std::string allowed);
    // An input that is missing (or not a number at all): the message names no value.
    InputError(std::string quantity, std::string allowed);

    const std::string& quantity() const noexcept { return quantity_; }
    bool has_value() const noexcept { return has_value_; }
    double value() const noexcept { return value_; }  // meaningful only when has_value()
    const std::string& allowed() const noexcept { return allowed_; }

private:
    std::string quantity_;
    double value_;
    bool has_value_ = true;
    std::string allowed_;
};

// A criterion that cannot be evaluated or reached with valid inputs (a root finder that did not
// converge within its cap, a target beyond the search horizon, a method asked outside its validity).
// Distinct from InputError: the inputs are each allowed, the question has no answer here.
class EvaluationError : public std::runtime_error {
public:
    EvaluationError(std::string what_failed, std::string reason);
    const std::string& what_failed() const noexcept { return what_failed_; }
    const std::string& reason() const noexcept { return reason_; }

private:
    std::string what_failed_;
    std::string reason_;
};

// Throws EvaluationError when a root finder used up its iteration cap.
void require_converged(std::string_view what, unsigned long long iterations_used, unsigned long long cap);

// Formats a value the way the error messages show it: 6 significant digits, or up to 15 where fewer
// would not give the value back; "nan"/"inf" spelled.
std::string format_value(double value);

namespace detail {
// Builds and throws the InputError of a failed guard: out of line, so a passing check costs one
// comparison and builds no message (the guards run per Monte Carlo sample).
[[noreturn]] void fail_guard(std::string_view quantity, double value, std::string_view allowed);
}  // namespace detail

// Guards used at every engine entry point; each throws InputError and never clamps.
inline void require_finite(std::string_view quantity, double value) {
    if (!std::isfinite(value)) [[unlikely]] detail::fail_guard(quantity, value, "a finite number");
}
inline void require_positive(std::string_view quantity, double value) {  // finite, > 0
    if (!(std::isfinite(value) && value > 0.0)) [[unlikely]]
        detail::fail_guard(quantity, value, "a finite number greater than 0");
}
inline void require_non_negative(std::string_view quantity, double value) {  // finite, >= 0
    if (!(std::isfinite(value) && value >= 0.0)) [[unlikely]]
        detail::fail_guard(quantity, value, "a finite number of at least 0");
}
inline void require_open_unit(std::string_view quantity, double value) {  // 0 < value < 1
    if (!(value > 0.0 && value < 1.0)) [[unlikely]]
        detail::fail_guard(quantity, value, "between 0 and 1, both excluded");
}
void require_greater(std::string_view quantity, double value, double lower, std::string_view allowed);
void require_at_least(std::string_view quantity, double value, double lower, std::string_view allowed);
void require_less(std::string_view quantity, double value, double upper, std::string_view allowed);

}  // namespace wickgrid
