#pragma once
// Output files are written whole or not at all. Temporaries are created exclusively (mkstemp /
// mkdtemp: a name planted in advance, symlink or not, is never followed) and removed on failure.
#include <stdexcept>
#include <string>
#include <utility>
#include <vector>

namespace wickgrid::report {

class OutputError : public std::runtime_error {
public:
    using std::runtime_error::runtime_error;
};

// One file: written to a fresh temporary beside it, then renamed over it.
void write_file_atomically(const std::string& path, const std::string& content);

// A set of files in one folder: all are written into a fresh temporary folder inside it first; only
// when every one is complete are they renamed into place (a failure leaves the old set untouched).
void write_files_atomically(const std::string& dir, const std::vector<std::pair<std::string, std::string>>& files);

// The start of this host's staging folder names, ".wickgrid-staging.HOST." (HOST with '/' and '.'
// made '_'): a folder of that name left in an output folder is a killed run's, removed by the next.
std::string staging_prefix_of_this_host();

// Creates the folder (and parents) if needed; throws OutputError naming it otherwise.
void ensure_directory(const std::string& path);

}  // namespace wickgrid::report
