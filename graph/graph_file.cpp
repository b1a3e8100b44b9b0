#include "graph/graph_file.hpp"

#include "common/atomic_file.hpp"
#include "common/input_error.hpp"

#include <fcntl.h>
#include <sys/mman.h>
#include <sys/stat.h>
#include <unistd.h>
#include <zlib.h>

#include <algorithm>
#include <bit>
#include <charconv>
#include <cstddef>
#include <cerrno>
#include <cstring>
#include <limits>

namespace ringroad::graph {

static_assert(std::endian::native == std::endian::little,
              "the .rrg format is little-endian and mapped as is");

namespace {

// PNG-style magic: a high byte and line endings expose transfers that mangle binaries.
constexpr unsigned char kMagic[8] = {0x89, 'R', 'R', 'G', '\r', '\n', 0x1A, '\n'};
constexpr std::size_t kHeaderSize = 64;
constexpr std::size_t kTagSize = 16;
constexpr std::size_t kAlignment = 8;

struct FileHeader {
    unsigned char magic[8];
    std::uint32_t format_version;
    std::uint32_t section_count;
    std::uint64_t file_size;
    std::uint64_t section_table_offset;
    std::uint32_t section_table_crc;
    std::uint8_t reserved[24];
    std::uint32_t header_crc;     // CRC32 of the 60 bytes before it (offset 60)
};
static_assert(sizeof(FileHeader) == kHeaderSize && offsetof(FileHeader, header_crc) == 60);

struct SectionEntry {
    char tag[kTagSize];           // NUL-padded
    std::uint64_t offset;
    std::uint64_t size;           // bytes
    std::uint32_t crc;            // CRC32 of the section's bytes
    std::uint32_t element_size;   // bytes per element (1 for text and opaque sections)
};
static_assert(sizeof(SectionEntry) == 40);

std::uint32_t crc_of(const void* data, std::size_t size) {
    // zlib's crc32 takes a uInt length: feed large sections in chunks.
    uLong crc = crc32(0L, Z_NULL, 0);
    const auto* bytes = static_cast<const Bytef*>(data);
    while (size > 0) {
        const auto chunk = static_cast<uInt>(std::min<std::size_t>(size, 1u << 30));
        crc = crc32(crc, bytes, chunk);
        bytes += chunk;
        size -= chunk;
    }
    return static_cast<std::uint32_t>(crc);
}

struct PendingSection {
    std::string tag;
    const void* data;
    std::size_t size;
    std::uint32_t element_size;
};

template <typename T>
PendingSection pending(const char* tag, std::span<const T> values) {
    static_assert(std::is_trivially_copyable_v<T>, "sections hold plain data only");
    return {tag, values.data(), values.size_bytes(), static_cast<std::uint32_t>(sizeof(T))};
}

std::string sanitized(std::string text) {
    for (auto& c : text) {
        if (c == '\n' || c == '\t' || c == '\r') c = ' ';
    }
    return text;
}

std::string metadata_text(const Metadata& metadata) {
    std::string text;
    for (const auto& [key, value] : metadata) text += sanitized(key) + '\t' + sanitized(value) + '\n';
    return text;
}

Metadata parse_metadata(std::string_view text) {
    Metadata metadata;
    while (!text.empty()) {
        const auto end = text.find('\n');
        const auto line = text.substr(0, end);
        const auto tab = line.find('\t');
        if (tab != std::string_view::npos) metadata.emplace_back(line.substr(0, tab), line.substr(tab + 1));
        if (end == std::string_view::npos) break;
        text.remove_prefix(end + 1);
    }
    return metadata;
}

} // namespace

void write_road_graph(const RoadGraph& graph, const std::string& path) {
    const std::string meta = metadata_text(graph.metadata());
    std::vector<PendingSection> sections = {
        {"meta", meta.data(), meta.size(), 1},
        pending("coordinates", graph.coordinates()),
        pending("vertex_osm_ids", graph.vertex_osm_ids()),
        pending("first_out", graph.first_out()),
        pending("edges", graph.edges()),
        pending("segments", graph.segments()),
        pending("shape_points", graph.shape_points()),
        {"names", graph.names_blob().data(), graph.names_blob().size(), 1},
        pending("restrictions", graph.turn_restrictions()),
        pending("components", graph.components()),
    };
    for (const auto& [tag, bytes] : graph.extra_sections()) {
        if (tag.empty() || tag.size() >= kTagSize) {
            throw std::invalid_argument("section tag '" + tag + "' must have 1 to 15 bytes");
        }
        sections.push_back({tag, bytes.data(), bytes.size(), 1});
    }

    AtomicFile file(path);
    FileHeader header{};
    file.write(&header, sizeof header);  // rewritten at the end, when offsets are known
    std::vector<SectionEntry> table(sections.size());
    file.write(table.data(), table.size() * sizeof(SectionEntry));
    for (std::size_t i = 0; i < sections.size(); ++i) {
        file.align_to(kAlignment);
        SectionEntry& entry = table[i];
        std::memcpy(entry.tag, sections[i].tag.data(), sections[i].tag.size());
        entry.offset = file.position();
        entry.size = sections[i].size;
        entry.crc = crc_of(sections[i].data, sections[i].size);
        entry.element_size = sections[i].element_size;
        file.write(sections[i].data, sections[i].size);
    }
    file.align_to(kAlignment);

    std::memcpy(header.magic, kMagic, sizeof kMagic);
    header.format_version = kGraphFormatVersion;
    header.section_count = static_cast<std::uint32_t>(table.size());
    header.file_size = file.position();
    header.section_table_offset = kHeaderSize;
    header.section_table_crc = crc_of(table.data(), table.size() * sizeof(SectionEntry));
    header.header_crc = crc_of(&header, offsetof(FileHeader, header_crc));
    file.write_at(kHeaderSize, table.data(), table.size() * sizeof(SectionEntry));
    file.write_at(0, &header, sizeof header);
    file.commit();
}

// Maps a file and turns its sections into a RoadGraph; every failure names the file.
class GraphFileLoader {
public:
    explicit GraphFileLoader(std::string path) : path_(std::move(path)) {}

    RoadGraph load() {
        map_file();
        const FileHeader& header = check_header();
        read_table(header);
        return assemble();
    }

private:
    [[noreturn]] void fail(const std::string& problem) const { throw InputError(path_ + ": " + problem); }

    void map_file() {
        const int descriptor = ::open(path_.c_str(), O_RDONLY | O_CLOEXEC);
        if (descriptor < 0) fail(std::string("cannot open: ") + std::strerror(errno));
        struct stat status {};
        if (::fstat(descriptor, &status) != 0 || !S_ISREG(status.st_mode)) {
            ::close(descriptor);
            fail("not a regular file");
        }
        size_ = static_cast<std::size_t>(status.st_size);
        if (size_ < kHeaderSize) {
            ::close(descriptor);
            fail("not a ringroad region graph (too short for a header)");
        }
        void* address = ::mmap(nullptr, size_, PROT_READ, MAP_PRIVATE, descriptor, 0);
        ::close(descriptor);
        if (address == MAP_FAILED) fail(std::string("cannot map: ") + std::strerror(errno));
        const std::size_t mapped_size = size_;
        mapping_ = std::shared_ptr<const void>(address, [mapped_size](const void* p) {
            ::munmap(const_cast<void*>(p), mapped_size);
        });
        base_ = static_cast<const std::byte*>(address);
    }

    const FileHeader& check_header() {
        const auto& header = *reinterpret_cast<const FileHeader*>(base_);
        if (std::memcmp(header.magic, kMagic, sizeof kMagic) != 0) fail("not a ringroad region graph (bad magic)");
        if (header.header_crc != crc_of(&header, offsetof(FileHeader, header_crc))) {
            fail("corrupt header (checksum mismatch)");
        }
        if (header.format_version != kGraphFormatVersion) {
            fail("format version " + std::to_string(header.format_version) + " (this build reads version " +
                 std::to_string(kGraphFormatVersion) + "); rebuild it with `ringroad build`");
        }
        if (header.file_size != size_) {
            fail("truncated or extended: header says " + std::to_string(header.file_size) + " bytes, file has " +
                 std::to_string(size_));
        }
        const std::uint64_t table_bytes = std::uint64_t(header.section_count) * sizeof(SectionEntry);
        if (header.section_table_offset != kHeaderSize || kHeaderSize + table_bytes > size_) {
            fail("corrupt section table");
        }
        if (header.section_table_crc != crc_of(base_ + kHeaderSize, table_bytes)) {
            fail("corrupt section table (checksum mismatch)");
        }
        return header;
    }

    void read_table(const FileHeader& header) {
        const auto* entries = reinterpret_cast<const SectionEntry*>(base_ + kHeaderSize);
        for (std::uint32_t i = 0; i < header.section_count; ++i) {
            const SectionEntry& entry = entries[i];
            const std::string tag(entry.tag, strnlen(entry.tag, kTagSize));
            if (entry.offset % kAlignment != 0 || entry.offset > size_ || entry.size > size_ - entry.offset) {
                fail("section '" + tag + "' lies outside the file");
            }
            if (entry.element_size == 0 || entry.size % entry.element_size != 0) {
                fail("section '" + tag + "' has a size that is not a whole number of elements");
            }
            const std::span<const std::byte> bytes(base_ + entry.offset, entry.size);
            if (entry.crc != crc_of(bytes.data(), bytes.size())) fail("checksum mismatch in section '" + tag + "'");
            sections_.emplace_back(tag, bytes);
        }
    }

    std::span<const std::byte> required(std::string_view tag) const {
        for (const auto& [section_tag, bytes] : sections_) {
            if (section_tag == tag) return bytes;
        }
        fail("missing section '" + std::string(tag) + "'");
    }

    template <typename T>
    std::span<const T> typed(std::string_view tag) const {
        const auto bytes = required(tag);
        if (bytes.size() % sizeof(T) != 0) fail("section '" + std::string(tag) + "' has the wrong element size");
        return {reinterpret_cast<const T*>(bytes.data()), bytes.size() / sizeof(T)};
    }

    RoadGraph assemble() const {
        RoadGraph graph;
        graph.coordinates_ = typed<Coordinate>("coordinates");
        graph.vertex_osm_ids_ = typed<std::int64_t>("vertex_osm_ids");
        graph.first_out_ = typed<std::uint32_t>("first_out");
        graph.edges_ = typed<Edge>("edges");
        graph.segments_ = typed<Segment>("segments");
        graph.shape_points_ = typed<Coordinate>("shape_points");
        const auto names = required("names");
        graph.names_ = std::string_view(reinterpret_cast<const char*>(names.data()), names.size());
        graph.turn_restrictions_ = typed<TurnRestriction>("restrictions");
        graph.components_ = typed<std::uint32_t>("components");
        const auto meta = required("meta");
        graph.metadata_ = parse_metadata(std::string_view(reinterpret_cast<const char*>(meta.data()), meta.size()));

        const std::size_t n = graph.coordinates_.size();
        if (graph.vertex_osm_ids_.size() != n || graph.components_.size() != n || graph.first_out_.size() != n + 1 ||
            graph.first_out_.back() != graph.edges_.size()) {
            fail("inconsistent section sizes");
        }
        const std::string components = graph.metadata_value("components");
        std::from_chars(components.data(), components.data() + components.size(), graph.component_count_);

        static const std::string core[] = {"meta", "coordinates", "vertex_osm_ids", "first_out", "edges",
                                           "segments", "shape_points", "names", "restrictions", "components"};
        for (const auto& [tag, bytes] : sections_) {
            if (std::find(std::begin(core), std::end(core), tag) == std::end(core)) {
                graph.extra_sections_.emplace_back(tag, bytes);
            }
        }
        graph.storage_ = mapping_;
        return graph;
    }

    std::string path_;
    std::shared_ptr<const void> mapping_;
    const std::byte* base_ = nullptr;
    std::size_t size_ = 0;
    std::vector<std::pair<std::string, std::span<const std::byte>>> sections_;
};

RoadGraph load_road_graph(const std::string& path) { return GraphFileLoader(path).load(); }

} // namespace ringroad::graph
