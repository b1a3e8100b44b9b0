#include "graph/checksum.hpp"

#include <xxhash.h>

namespace ringroad::graph {

std::uint64_t section_checksum(const void* data, std::size_t size) noexcept { return XXH3_64bits(data, size); }

} // namespace ringroad::graph
