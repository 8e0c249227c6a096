#include "wickgrid/errors.hpp"

#include <cmath>
#include <cstdio>
#include <cstdlib>

namespace wickgrid {

namespace {
std::string message(const std::string& quantity, double value, const std::string& allowed) {
    return quantity + " = " + format_value(value) + " is not allowed: it must be " + allowed;
}
}  // namespace

InputError::InputError(std::string quantity, double value, std::string allowed)
    : std::invalid_argument(message(quantity, value, allowed)),
      quantity_(std::move(quantity)),
      value_(value),
      allowed_(std::move(allowed)) {}

InputError::InputError(std::string quantity, std::string allowed)
    : std::invalid_argument(quantity + " is not given: it must be " + allowed),
      quantity_(std::move(quantity)),
      value_(0.0),
      has_value_(false),
      allowed_(std::move(allowed)) {}

EvaluationError::EvaluationError(std::string what_failed, std::string reason)
    : std::runtime_error(what_failed + ": " + reason), what_failed_(std::move(what_failed)), reason_(std::move(reason)) {}

void require_converged(std::string_view what, unsigned long long iterations_used, unsigned long long cap) {
    if (iterations_used >= cap)
        throw EvaluationError(std::string(what), "the root finder did not converge in " + std::to_string(cap) + " iterations");
}

std::string format_value(double value) {
    if (std::isnan(value)) return "nan";
    if (std::isinf(value)) return value > 0 ? "inf" : "-inf";
    // Six significant digits when they give the value back, up to 15 when they do not: a message never
    // shows 100.0001 as "100" beside a limit of 100, nor the last-bit noise of a unit conversion.
    char buffer[40];
    for (const int digits : {6, 10, 15}) {
        std::snprintf(buffer, sizeof buffer, "%.*g", digits, value);
        if (std::strtod(buffer, nullptr) == value) break;
    }
    return buffer;
}

void detail::fail_guard(std::string_view quantity, double value, std::string_view allowed) {
    throw InputError(std::string(quantity), value, std::string(allowed));
}

void require_greater(std::string_view quantity, double value, double lower, std::string_view allowed) {
    if (!(std::isfinite(value) && value > lower))
        throw InputError(std::string(quantity), value, std::string(allowed));
}

void require_at_least(std::string_view quantity, double value, double lower, std::string_view allowed) {
    if (!(std::isfinite(value) && value >= lower))
        throw InputError(std::string(quantity), value, std::string(allowed));
}

void require_less(std::string_view quantity, double value, double upper, std::string_view allowed) {
    if (!(std::isfinite(value) && value < upper))
        throw InputError(std::string(quantity), value, std::string(allowed));
}

}  // namespace wickgrid
