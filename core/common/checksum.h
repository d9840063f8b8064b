#pragma once
// 64-bit FNV-1a: the hash of a video's signature and the checksum in the headers of our
// self-checking files (index sidecars, autosave journals). Not cryptographic: it tells damage
// from a whole file, not tampering from honesty.
#include <cstdint>
#include <string>
#include <string_view>

namespace stridemark {

std::uint64_t fnv1a64(std::string_view bytes);

// The same as 16 lower-case hex digits, as the file headers write it.
std::string fnv1a64Hex(std::string_view bytes);

}  // namespace stridemark
