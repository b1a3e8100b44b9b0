#include "fuzz/region_file_seal.hpp"

#include "graph/graph_file.hpp"

#include <zlib.h>

#include <cstring>

namespace ringroad::fuzz {

namespace {

// Offsets from graph/FORMAT.md, version 1.
constexpr std::size_t kHeaderSize = 64;
constexpr std::size_t kVersionAt = 8;
constexpr std::size_t kSectionCountAt = 12;
constexpr std::size_t kTableCrcAt = 32;
constexpr std::size_t kHeaderCrcAt = 60;
constexpr std::size_t kEntrySize = 40;
constexpr std::size_t kEntryOffsetAt = 16;
constexpr std::size_t kEntrySizeAt = 24;
constexpr std::size_t kEntryCrcAt = 32;

template <typename T>
T read_le(const std::uint8_t* at) {
    T value;
    std::memcpy(&value, at, sizeof value);   // the format is little-endian, like every host we build on
    return value;
}

void write_u32(std::uint8_t* at, std::uint32_t value) { std::memcpy(at, &value, sizeof value); }

std::uint32_t crc_of(const std::uint8_t* data, std::size_t size) {
    uLong crc = crc32(0L, Z_NULL, 0);
    while (size > 0) {
        const auto chunk = static_cast<uInt>(size < (1u << 30) ? size : (1u << 30));
        crc = crc32(crc, data, chunk);
        data += chunk;
        size -= chunk;
    }
    return static_cast<std::uint32_t>(crc);
}

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
            if (offset <= size && bytes <= size - offset) write_u32(entry + kEntryCrcAt, crc_of(data + offset, bytes));
        }
        write_u32(data + kTableCrcAt, crc_of(table, count * kEntrySize));
    }
    write_u32(data + kHeaderCrcAt, crc_of(data, kHeaderCrcAt));
}

} // namespace ringroad::fuzz
