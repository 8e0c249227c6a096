#pragma once
// The SHA-256 digest of an input's bytes (FIPS 180-4), through OpenSSL's libcrypto, so that a
// printed result can be traced to the exact file it came from.
#include <string>

namespace wickgrid::scenario {

// Lower-case hexadecimal SHA-256 of the bytes (64 characters). Throws std::runtime_error only if
// libcrypto fails, which it does not for in-memory input. Thread-safe.
std::string sha256_hex(const std::string& bytes);

}  // namespace wickgrid::scenario
