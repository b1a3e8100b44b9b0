#include "fuzz/region_file_seal.hpp"

#include "graph/checksum.hpp"
#include "graph/graph_file.hpp"

#include <cstring>

namespace ringroad::fuzz {

namespace {

// Offsets from graph/FORMAT.md, version 2 (64-bit XXH3 checksums).
constexpr std::size_t kHeaderSize = 64;
constexpr std::size_t kVersionAt = 8;
constexpr std::size_t kSectionCountAt = 12;
constexpr std::size_t kTableChecksumAt = 32;
constexpr std::size_t kHeaderChecksumAt = 56;
constexpr std::size_t kEntrySize = 48;
constexpr std::size_t kEntryOffsetAt = 16;
constexpr std::size_t kEntrySizeAt = 24;
constexpr std::size_t kEntryChecksumAt = 32;

template <typename T>
T read_le(const std::uint8_t* at) {
    T value;
    std::memcpy(&value, at, sizeof value);   // the format is little-endian, like every host we build on
    return value;
}

void write_u32(std::uint8_t* at, std::uint32_t value) { std::memcpy(at, &value, sizeof value); }
void write_u64(std::uint8_t* at, std::uint64_t value) { std::memcpy(at, &value, sizeof value); }

std::uint64_t checksum_of(const std::uint8_t* data, std::size_t size) { return graph::section_checksum(data, size); }

} // namespace

void seal_region_file(std::uint8_t* data, std::size_t size) {
    if (size < kHeaderSize) return;
    write_u32(data + kVersionAt, graph::kGraphFormatVersion);
    const std::uint64_t count = read_le<std::uint32_t>(data + kSectionCountAt);
    if (count <= (size - kHeaderSize) / kEntrySize) {
        std::uint8_t* table = data + kHeaderSize;
        for (std::uint64_t i = 0; i < count; ++i) {
            std::uint8_t* entry = table + i * kEntrySize;
            const auto offset = read_le<std::uint64_t>(entry + kEntryOffsetAt);
            const auto bytes = read_le<std::uint64_t>(entry + kEntrySizeAt);
            if (offset <= size && bytes <= size - offset) write_u64(entry + kEntryChecksumAt, checksum_of(data + offset, bytes));
        }
        write_u64(data + kTableChecksumAt, checksum_of(table, count * kEntrySize));
    }
    write_u64(data + kHeaderChecksumAt, checksum_of(data, kHeaderChecksumAt));
}

} // namespace ringroad::fuzz
