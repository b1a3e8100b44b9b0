#include "extract/pbf_layout.hpp"

#include <protozero/exception.hpp>
#include <protozero/pbf_reader.hpp>
#include <zlib.h>

#include <string>
#include <string_view>
#include <vector>

namespace ringroad::extract {

namespace {

// Limits of the PBF format (OSM wiki, PBF Format): blob headers below 64 KiB, blobs below 32 MiB.
constexpr std::size_t kMaxBlobHeaderSize = 64 * 1024;
constexpr std::size_t kMaxBlobSize = 32 * 1024 * 1024;

struct BlobSpan {
    std::size_t begin = 0;   // of the 4-byte length that frames the blob header
    std::size_t data_begin = 0;
    std::size_t end = 0;
};

enum class BlockKind { nodes, others, unknown };

std::string_view as_string_view(protozero::data_view view) { return {view.data(), view.size()}; }

std::optional<std::vector<BlobSpan>> read_framing(const char* data, std::size_t size, bool& header_first) {
    std::vector<BlobSpan> blobs;
    std::size_t position = 0;
    header_first = false;
    while (position < size) {
        if (size - position < 4) return std::nullopt;
        const auto* bytes = reinterpret_cast<const unsigned char*>(data + position);
        const std::size_t header_size = (std::size_t{bytes[0]} << 24) | (std::size_t{bytes[1]} << 16) |
                                        (std::size_t{bytes[2]} << 8) | std::size_t{bytes[3]};
        if (header_size > kMaxBlobHeaderSize || size - position - 4 < header_size) return std::nullopt;
        std::string_view type;
        std::int64_t data_size = -1;
        protozero::pbf_reader header{data + position + 4, header_size};
        while (header.next()) {
            const auto wire_type = header.wire_type();
            if (header.tag() == 1 && wire_type == protozero::pbf_wire_type::length_delimited) {
                type = as_string_view(header.get_view());
            } else if (header.tag() == 3 && wire_type == protozero::pbf_wire_type::varint) {
                data_size = header.get_int32();
            } else {
                header.skip();
            }
        }
        const std::size_t data_begin = position + 4 + header_size;
        if (data_size < 0 || static_cast<std::size_t>(data_size) > kMaxBlobSize ||
            size - data_begin < static_cast<std::size_t>(data_size)) {
            return std::nullopt;
        }
        if (blobs.empty()) header_first = type == "OSMHeader";
        else if (type != "OSMData") return std::nullopt;
        blobs.push_back({position, data_begin, data_begin + static_cast<std::size_t>(data_size)});
        position = blobs.back().end;
    }
    return blobs;
}

enum class Prefix { nodes, others, unknown, need_more };

// Reads a varint at `position`; false when the bytes end first (or it is malformed).
bool read_varint(std::string_view bytes, std::size_t& position, std::uint64_t& value) {
    value = 0;
    for (int shift = 0; shift < 64; shift += 7) {
        if (position >= bytes.size()) return false;
        const auto byte = static_cast<unsigned char>(bytes[position++]);
        value |= static_cast<std::uint64_t>(byte & 0x7fu) << shift;
        if ((byte & 0x80u) == 0) return true;
    }
    return false;
}

// A PrimitiveBlock's kind from the start of its bytes: the field number of the first field of its
// first PrimitiveGroup: nodes (1) or dense nodes (2) versus ways (3), relations (4) or
// changesets (5). The string table before it is skipped; need_more when the prefix is too short.
Prefix classify_block_prefix(std::string_view bytes) {
    std::size_t position = 0;
    while (true) {
        std::uint64_t key = 0;
        if (!read_varint(bytes, position, key)) return Prefix::need_more;
        const auto field = key >> 3;
        const auto wire_type = key & 7u;
        std::uint64_t length = 0;
        switch (wire_type) {
            case 0: if (!read_varint(bytes, position, length)) return Prefix::need_more; continue;
            case 1: position += 8; continue;
            case 5: position += 4; continue;
            case 2: if (!read_varint(bytes, position, length)) return Prefix::need_more; break;
            default: return Prefix::unknown;
        }
        if (field == 2) {                  // the first PrimitiveGroup
            if (length == 0) return Prefix::unknown;
            std::uint64_t group_key = 0;
            if (!read_varint(bytes, position, group_key)) return Prefix::need_more;
            return (group_key >> 3) <= 2 ? Prefix::nodes : Prefix::others;
        }
        position += length;                // the string table, or anything else
    }
}

// Classifies a zlib-compressed block by inflating only as much of it as needed (usually the
// string table and a few bytes more, a fraction of the block).
Prefix classify_compressed(std::string_view compressed) {
    z_stream stream{};
    if (inflateInit(&stream) != Z_OK) return Prefix::unknown;
    stream.next_in = reinterpret_cast<Bytef*>(const_cast<char*>(compressed.data()));
    stream.avail_in = static_cast<uInt>(compressed.size());
    std::string inflated;
    Prefix result = Prefix::need_more;
    std::size_t chunk = 16 * 1024;
    while (result == Prefix::need_more && inflated.size() < kMaxBlobSize) {
        const std::size_t before = inflated.size();
        inflated.resize(before + chunk);
        stream.next_out = reinterpret_cast<Bytef*>(inflated.data() + before);
        stream.avail_out = static_cast<uInt>(chunk);
        const int status = inflate(&stream, Z_NO_FLUSH);
        inflated.resize(before + chunk - stream.avail_out);
        result = classify_block_prefix(inflated);
        if (result == Prefix::need_more && status != Z_OK) result = Prefix::unknown;   // ended or failed
        chunk *= 2;
    }
    inflateEnd(&stream);
    return result;
}

BlockKind block_kind(const char* data, const BlobSpan& blob) {
    protozero::pbf_reader reader{data + blob.data_begin, blob.end - blob.data_begin};
    std::string_view raw, compressed;
    while (reader.next()) {
        const bool bytes_field = reader.wire_type() == protozero::pbf_wire_type::length_delimited;
        if (reader.tag() == 1 && bytes_field) raw = as_string_view(reader.get_view());
        else if (reader.tag() == 3 && bytes_field) compressed = as_string_view(reader.get_view());
        else reader.skip();
    }
    Prefix prefix = Prefix::unknown;
    if (!raw.empty()) prefix = classify_block_prefix(raw);
    else if (!compressed.empty()) prefix = classify_compressed(compressed);
    if (prefix == Prefix::nodes) return BlockKind::nodes;
    if (prefix == Prefix::others) return BlockKind::others;
    return BlockKind::unknown;
}

} // namespace

std::optional<PbfLayout> find_pbf_layout(const char* data, std::size_t size) try {
    bool header_first = false;
    const auto blobs = read_framing(data, size, header_first);
    if (!blobs || blobs->empty() || !header_first) return std::nullopt;

    // Binary search for the first data blob that is not a node block, assuming nodes come first.
    std::size_t low = 1, high = blobs->size();
    while (low < high) {
        const std::size_t middle = low + (high - low) / 2;
        const BlockKind kind = block_kind(data, (*blobs)[middle]);
        if (kind == BlockKind::unknown) return std::nullopt;
        if (kind == BlockKind::nodes) low = middle + 1;
        else high = middle;
    }
    PbfLayout layout;
    layout.header_end = (*blobs)[0].end;
    layout.first_non_node = low < blobs->size() ? (*blobs)[low].begin : size;
    layout.node_blobs = low - 1;
    layout.other_blobs = blobs->size() - low;
    return layout;
} catch (const protozero::exception&) {
    return std::nullopt;   // malformed framing: the reader will say what is wrong
}

} // namespace ringroad::extract
