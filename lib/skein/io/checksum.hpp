#pragma once
// Checksums: the sweep journal's lines (detecting a half-written or damaged line), the sweep fingerprint and
// the report's record of its design file.
#include <cstdint>
#include <string>
#include <string_view>

namespace skein {

// CRC-32 (reflected polynomial 0xEDB88320, initial and final XOR 0xFFFFFFFF), the CRC of ISO 3309 / ITU-T V.42
// (catalogued as CRC-32/ISO-HDLC; check value of "123456789" is 0xCBF43926).
std::uint32_t crc32(std::string_view data);

// 64-bit FNV-1a (offset basis 14695981039346656037, prime 1099511628211), from Fowler, Noll and Vo's
// published description of the FNV hash. Not cryptographic: it tells an edited input from the original.
std::uint64_t fnv1a64(std::string_view data, std::uint64_t seed = 14695981039346656037ULL);

// Lower-case hexadecimal with a fixed width (8 digits for 32 bits, 16 for 64).
std::string hex32(std::uint32_t v);
std::string hex64(std::uint64_t v);

}  // namespace skein
