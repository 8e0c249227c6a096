#include "text_encoding.hpp"

namespace wickgrid::scenario {

namespace {
// Length of the well-formed UTF-8 sequence at p[i], or 0 when the byte there starts none.
std::size_t utf8_length(const unsigned char* p, std::size_t n, std::size_t i) {
    const unsigned char c = p[i];
    std::size_t len = 0;
    unsigned int min = 0, code = 0;
    if (c < 0x80) return 1;
    if ((c & 0xE0) == 0xC0) len = 2, min = 0x80, code = c & 0x1F;
    else if ((c & 0xF0) == 0xE0) len = 3, min = 0x800, code = c & 0x0F;
    else if ((c & 0xF8) == 0xF0) len = 4, min = 0x10000, code = c & 0x07;
    else return 0;
    if (i + len > n) return 0;
    for (std::size_t k = 1; k < len; ++k) {
        if ((p[i + k] & 0xC0) != 0x80) return 0;
        code = (code << 6) | (p[i + k] & 0x3F);
    }
    if (code < min || code > 0x10FFFF || (code >= 0xD800 && code <= 0xDFFF)) return 0;
    return len;
}

std::string hex_byte(unsigned char b) {
    static constexpr char digits[] = "0123456789abcdef";
    return std::string{digits[b >> 4], digits[b & 15]};
}
}  // namespace

std::size_t first_bad_utf8(const std::string& text) {
    const auto* p = reinterpret_cast<const unsigned char*>(text.data());
    for (std::size_t i = 0; i < text.size();) {
        const std::size_t len = utf8_length(p, text.size(), i);
        if (len == 0) return i;
        i += len;
    }
    return std::string::npos;
}

Mark char_mark_at(const std::string& text, std::size_t offset) {
    Mark m{1, 1};
    for (std::size_t i = 0; i < offset && i < text.size(); ++i) {
        const auto c = static_cast<unsigned char>(text[i]);
        if (c == '\n') m.line++, m.column = 1;
        else if ((c & 0xC0) != 0x80) m.column++;
    }
    return m;
}

void require_utf8(const std::string& text, const std::string& file_label, const std::string& what) {
    const std::size_t bad = first_bad_utf8(text);
    if (bad == std::string::npos) return;
    throw ScenarioError(file_label, char_mark_at(text, bad), "",
                        "the " + what + " is not valid UTF-8 here (byte 0x" +
                            hex_byte(static_cast<unsigned char>(text[bad])) + "); save it as UTF-8");
}

std::string display_path(const std::string& path) {
    const auto* p = reinterpret_cast<const unsigned char*>(path.data());
    std::string out;
    out.reserve(path.size());
    for (std::size_t i = 0; i < path.size();) {
        const std::size_t len = utf8_length(p, path.size(), i);
        if (len == 0 || (len == 1 && (p[i] < 0x20 || p[i] == 0x7F))) {
            out += "\\x" + hex_byte(p[i]);
            ++i;
        } else {
            out.append(path, i, len);
            i += len;
        }
    }
    return out;
}

std::size_t first_control_char(const std::string& text) {
    for (std::size_t i = 0; i < text.size(); ++i) {
        const auto c = static_cast<unsigned char>(text[i]);
        if (c < 0x20 || c == 0x7F) return i;
    }
    return std::string::npos;
}

}  // namespace wickgrid::scenario
