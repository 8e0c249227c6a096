#pragma once
// Text that reaches JSON, HTML, SVG, CSV and the terminal must be UTF-8 (RFC 3629): the readers
// refuse a file that is not, at its line and column, and a path (any bytes on Linux) is shown with
// its other bytes escaped, so that a name saved by an old spreadsheet or a Latin-1 folder never
// stops a run after its work is done.
#include <cstddef>
#include <string>

#include "scenario.hpp"

namespace wickgrid::scenario {

// Offset of the first byte that is not well-formed UTF-8 (RFC 3629: no overlong forms, no
// surrogates, nothing above U+10FFFF), or npos. Cost O(size).
std::size_t first_bad_utf8(const std::string& text);

// Line and column (1-based, in characters) of a byte offset of UTF-8 text. Cost O(offset).
Mark char_mark_at(const std::string& text, std::size_t offset);

// Throws ScenarioError at the first byte that is not UTF-8, naming the byte; `what` names the
// file's role ("file", "readings file"). Cost O(size).
void require_utf8(const std::string& text, const std::string& file_label, const std::string& what);

// A path as text that is safe to print and to put in JSON: well-formed UTF-8 kept, every other byte
// and every control character written as \xHH (a backslash is kept as it is). Cost O(size).
std::string display_path(const std::string& path);

// The first control character (C0 or DEL) in a name, or npos: such a byte in a plate or piezometer
// name could rewrite an engineer's terminal or break a CSV row.
std::size_t first_control_char(const std::string& text);

}  // namespace wickgrid::scenario
