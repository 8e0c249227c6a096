#pragma once
// Output files are written whole or not at all: to a temporary file beside the target, then
// renamed over it.
#include <stdexcept>
#include <string>

namespace wickgrid::report {

class OutputError : public std::runtime_error {
public:
    using std::runtime_error::runtime_error;
};

void write_file_atomically(const std::string& path, const std::string& content);

// Creates the folder (and parents) if needed; throws OutputError naming it otherwise.
void ensure_directory(const std::string& path);

}  // namespace wickgrid::report
