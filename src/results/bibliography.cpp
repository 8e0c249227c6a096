#include "bibliography.hpp"

#include <yaml-cpp/yaml.h>

#include <stdexcept>

#include "wickgrid/bibliography_text.hpp"

namespace wickgrid::results {

namespace {
std::vector<Reference> parse() {
    const YAML::Node root = YAML::Load(bibliography_yaml);
    std::vector<Reference> out;
    for (const auto& entry : root["references"]) {
        const YAML::Node& v = entry.second;
        out.push_back({entry.first.as<std::string>(), v["cite"].as<std::string>(), v["text"].as<std::string>(),
                       v["from_memory"] && v["from_memory"].as<bool>()});
    }
    return out;
}
}  // namespace

const std::vector<Reference>& bibliography() {
    static const std::vector<Reference> entries = parse();
    return entries;
}

const Reference& reference(const std::string& key) {
    for (const auto& r : bibliography())
        if (r.key == key) return r;
    throw std::logic_error("BIBLIOGRAPHY.yaml has no entry '" + key + "'");
}

}  // namespace wickgrid::results
