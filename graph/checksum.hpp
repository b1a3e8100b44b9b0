#pragma once
// The checksum of a .rrg header, section table and section (graph/FORMAT.md, version 2): XXH3,
// 64-bit, seed 0, over the bytes as stored. The same bytes give the same value on every host;
// bench/graph/checksum_bench.cpp measures it against the CRCs it replaced.

#include <cstddef>
#include <cstdint>

namespace ringroad::graph {

std::uint64_t section_checksum(const void* data, std::size_t size) noexcept;

} // namespace ringroad::graph
