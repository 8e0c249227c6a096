#include "report/format.hpp"

#include <algorithm>
#include <charconv>
#include <cstdio>
#include <sstream>

#include "wickgrid/errors.hpp"

namespace wickgrid::report {

std::string fixed(double value, int decimals) {
    // Room for any finite double at up to 16 decimals: a large value is written whole, never cut
    // at a buffer's end.
    char buffer[340];
    const auto r = decimals >= 0 && decimals <= 16
                       ? std::to_chars(buffer, buffer + sizeof buffer, value, std::chars_format::fixed, decimals)
                       : std::to_chars_result{buffer, std::errc::value_too_large};
    if (r.ec != std::errc()) return format_value(value);
    std::string text(buffer, r.ptr);
    // A value that rounds to zero is shown as 0, not -0.
    if (text[0] == '-' && text.find_first_not_of("-0.") == std::string::npos) text.erase(0, 1);
    return text;
}

std::string csv_number(std::optional<double> value) {
    if (!value) return {};
    std::ostringstream out;
    out.precision(10);
    out << *value;
    return out.str();
}

std::string csv_field(const std::string& text) {
    if (text.find_first_of(",\"\r\n") == std::string::npos) return text;
    std::string out = "\"";
    for (char c : text) out += c == '"' ? std::string("\"\"") : std::string(1, c);
    return out + "\"";
}

std::string csv_document(const std::vector<std::string>& header, const std::vector<std::vector<std::string>>& rows) {
    std::string out;
    auto line = [&](const std::vector<std::string>& fields) {
        for (std::size_t i = 0; i < fields.size(); ++i) out += (i ? "," : "") + csv_field(fields[i]);
        out += '\n';
    };
    line(header);
    for (const auto& r : rows) line(r);
    return out;
}

std::string markdown_text(const std::string& text) {
    std::string out;
    for (const char c : text) {
        switch (c) {
            case '|': out += "\\|"; break;
            case '\\': out += "\\\\"; break;
            case '`': out += "\\`"; break;
            case '<': out += "&lt;"; break;
            case '>': out += "&gt;"; break;
            case '&': out += "&amp;"; break;
            case '\n':
            case '\r': out += ' '; break;
            default: out += c;
        }
    }
    return out;
}

namespace {
std::size_t chars(const std::string& text) {
    std::size_t n = 0;
    for (unsigned char c : text) n += (c & 0xC0) != 0x80;  // count UTF-8 lead bytes only
    return n;
}
std::string pad(const std::string& text, std::size_t width, bool right) {
    const std::string fill(width > chars(text) ? width - chars(text) : 0, ' ');
    return right ? fill + text : text + fill;
}
}  // namespace

std::string text_table(const std::vector<std::string>& header, const std::vector<std::vector<std::string>>& rows,
                       std::size_t left_columns) {
    std::vector<std::size_t> widths(header.size(), 0);
    auto measure = [&](const std::vector<std::string>& r) {
        for (std::size_t i = 0; i < r.size() && i < widths.size(); ++i) widths[i] = std::max(widths[i], chars(r[i]));
    };
    measure(header);
    for (const auto& r : rows) measure(r);
    std::ostringstream out;
    auto line = [&](const std::vector<std::string>& r) {
        for (std::size_t i = 0; i < r.size(); ++i) out << (i ? "  " : "") << pad(r[i], widths[i], i >= left_columns);
        out << '\n';
    };
    line(header);
    std::size_t total = 0;
    for (auto w : widths) total += w + 2;
    out << std::string(total - 2, '-') << '\n';
    for (const auto& r : rows) line(r);
    return out.str();
}

}  // namespace wickgrid::report
