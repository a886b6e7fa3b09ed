// A 64-bit content hash of a file's bytes (FNV-1a: Fowler, Noll and Vo; constants as published in
// the FNV reference, draft-eastlake-fnv). Not cryptographic: it tells an edited n,k table or mesh
// from the one a checkpointed run was built with, which is all a checkpoint needs.
#pragma once

#include <cstdint>
#include <string>
#include <string_view>

namespace yeegap::io {

/// FNV-1a 64 of `bytes`.
std::uint64_t fnv1a_64(std::string_view bytes);

/// FNV-1a 64 of the whole file at `path`; throws std::runtime_error naming the file when it cannot
/// be read.
std::uint64_t file_hash(const std::string& path);

/// "fnv1a64:0123456789abcdef", the form stored in checkpoints and shown in messages.
std::string hash_text(std::uint64_t hash);

}  // namespace yeegap::io
