#pragma once
// "Did you mean" for misspelt keys and names.
#include <optional>
#include <string>
#include <string_view>
#include <vector>

namespace wickgrid::scenario {

// Levenshtein (1966) edit distance.
std::size_t edit_distance(std::string_view a, std::string_view b);

// The closest candidate within a third of the word's length (at least 2 edits), if any.
std::optional<std::string> closest(std::string_view word, const std::vector<std::string>& candidates);

}  // namespace wickgrid::scenario
