#pragma once
// Typed input errors: every physical check names the quantity, the value and what is allowed.
#include <stdexcept>
#include <string>
#include <string_view>

namespace wickgrid {

class InputError : public std::invalid_argument {
public:
    InputError(std::string quantity, double value, std::string allowed);

    const std::string& quantity() const noexcept { return quantity_; }
    double value() const noexcept { return value_; }
    const std::string& allowed() const noexcept { return allowed_; }

private:
    std::string quantity_;
    double value_;
    std::string allowed_;
};

// Formats a value the way the error messages show it (6 significant digits, "nan"/"inf" spelled).
std::string format_value(double value);

// Guards used at every engine entry point; each throws InputError and never clamps.
void require_finite(std::string_view quantity, double value);
void require_positive(std::string_view quantity, double value);      // finite, > 0
void require_non_negative(std::string_view quantity, double value);  // finite, >= 0
void require_open_unit(std::string_view quantity, double value);     // 0 < value < 1
void require_greater(std::string_view quantity, double value, double lower, std::string_view allowed);
void require_at_least(std::string_view quantity, double value, double lower, std::string_view allowed);
void require_less(std::string_view quantity, double value, double upper, std::string_view allowed);

}  // namespace wickgrid
