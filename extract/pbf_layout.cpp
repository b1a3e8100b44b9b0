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

// The raw PrimitiveBlock of a blob (uncompressed or zlib-compressed), or nullopt.
std::optional<std::string> block_bytes(const char* data, const BlobSpan& blob) {
    protozero::pbf_reader reader{data + blob.data_begin, blob.end - blob.data_begin};
    std::string_view raw, compressed;
    std::int64_t raw_size = -1;
    while (reader.next()) {
        switch (reader.tag()) {
            case 1: if (reader.wire_type() != protozero::pbf_wire_type::length_delimited) return std::nullopt;
                    raw = as_string_view(reader.get_view()); break;
            case 2: if (reader.wire_type() != protozero::pbf_wire_type::varint) return std::nullopt;
                    raw_size = reader.get_int32(); break;
            case 3: if (reader.wire_type() != protozero::pbf_wire_type::length_delimited) return std::nullopt;
                    compressed = as_string_view(reader.get_view()); break;
            default: reader.skip();
        }
    }
    if (!raw.empty()) return std::string(raw);
    if (compressed.empty() || raw_size < 0 || static_cast<std::size_t>(raw_size) > kMaxBlobSize) return std::nullopt;
    std::string block(static_cast<std::size_t>(raw_size), '\0');
    uLongf length = static_cast<uLongf>(block.size());
    if (uncompress(reinterpret_cast<Bytef*>(block.data()), &length, reinterpret_cast<const Bytef*>(compressed.data()),
                   static_cast<uLong>(compressed.size())) != Z_OK ||
        length != block.size()) {
        return std::nullopt;
    }
    return block;
}

// A PrimitiveBlock's kind from its first PrimitiveGroup: nodes (1) or dense nodes (2) versus
// ways (3), relations (4) or changesets (5).
BlockKind block_kind(const char* data, const BlobSpan& blob) {
    try {
        const auto block = block_bytes(data, blob);
        if (!block) return BlockKind::unknown;
        protozero::pbf_reader primitive_block{*block};
        while (primitive_block.next()) {
            if (primitive_block.tag() != 2 || primitive_block.wire_type() != protozero::pbf_wire_type::length_delimited) {
                primitive_block.skip();
                continue;
            }
            protozero::pbf_reader group = primitive_block.get_message();
            if (!group.next()) continue;   // an empty group says nothing
            return group.tag() <= 2 ? BlockKind::nodes : BlockKind::others;
        }
    } catch (const protozero::exception&) {
    }
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
