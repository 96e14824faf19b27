// SHA-256 digests (FIPS 180-4), used to identify the exact input file a report was made from.
#pragma once

#include <array>
#include <cstdint>
#include <string>
#include <string_view>

namespace edgeflux {

/// The 32-byte SHA-256 digest of `data` (any bytes, any length).
std::array<std::uint8_t, 32> sha256(std::string_view data);

/// The same digest as 64 lower-case hexadecimal digits.
std::string sha256_hex(std::string_view data);

}  // namespace edgeflux
