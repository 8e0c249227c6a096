#pragma once
// The full references of the published methods (BIBLIOGRAPHY.yaml, built into the binary): code
// comments cite (author, year); notes and reports print the entries of the methods they used.
#include <string>
#include <vector>

namespace wickgrid::results {

struct Reference {
    std::string key;   // e.g. "hansbo1981"
    std::string cite;  // e.g. "Hansbo (1981)"
    std::string text;  // the full reference
    bool from_memory = false;  // recalled, not checked against the paper at hand
};

// Every entry, in the file's order; parsed once. Thread-safe.
const std::vector<Reference>& bibliography();
// One entry by key; std::logic_error for a key the file lacks (a defect, caught by the tests).
const Reference& reference(const std::string& key);

}  // namespace wickgrid::results
