#include "graph/graph_file.hpp"

#include "common/atomic_file.hpp"
#include "common/input_error.hpp"
#include "graph/checksum.hpp"
#include "graph/consistency_check.hpp"

#include <fcntl.h>
#include <sys/mman.h>
#include <sys/stat.h>
#include <unistd.h>

#include <algorithm>
#include <bit>
#include <charconv>
#include <cstddef>
#include <cerrno>
#include <cstring>
#include <future>
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
    std::uint64_t section_table_checksum;
    std::uint8_t reserved[16];
    std::uint64_t header_checksum;  // of the 56 bytes before it
};
static_assert(sizeof(FileHeader) == kHeaderSize && offsetof(FileHeader, header_checksum) == 56);

// Format version 1 kept the header's CRC32 at offset 60 and had 40-byte table entries; only its
// version field is read now, to say that the file must be rebuilt.
constexpr std::uint32_t kLastCrc32Version = 1;

struct SectionEntry {
    char tag[kTagSize];             // NUL-padded
    std::uint64_t offset;
    std::uint64_t size;             // bytes
    std::uint64_t checksum;         // of the section's bytes
    std::uint32_t element_size;     // bytes per element (1 for text and opaque sections)
    std::uint32_t reserved;
};
static_assert(sizeof(SectionEntry) == 48);

std::uint64_t checksum_of(const void* data, std::size_t size) { return section_checksum(data, size); }

const char* file_kind(mode_t mode) {
    if (S_ISDIR(mode)) return "a directory";
    if (S_ISFIFO(mode)) return "a named pipe (FIFO)";
    if (S_ISSOCK(mode)) return "a socket";
    if (S_ISCHR(mode) || S_ISBLK(mode)) return "a device";
    return "not a regular file";
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
        entry.checksum = checksum_of(sections[i].data, sections[i].size);
        entry.element_size = sections[i].element_size;
        file.write(sections[i].data, sections[i].size);
    }
    file.align_to(kAlignment);

    std::memcpy(header.magic, kMagic, sizeof kMagic);
    header.format_version = kGraphFormatVersion;
    header.section_count = static_cast<std::uint32_t>(table.size());
    header.file_size = file.position();
    header.section_table_offset = kHeaderSize;
    header.section_table_checksum = checksum_of(table.data(), table.size() * sizeof(SectionEntry));
    header.header_checksum = checksum_of(&header, offsetof(FileHeader, header_checksum));
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
        RoadGraph graph = assemble();
        // The consistency pass is safe on any bytes, so it runs beside the checksums on a second
        // thread (inline when no thread can be had); what it finds counts only once every
        // checksum is right, so damage is always reported as damage. Leaving by an exception
        // waits for the pass (the future's destructor).
        auto consistency = std::async([&graph] { return find_inconsistency(graph); });
        verify_checksums();
        if (const std::string problem = consistency.get(); !problem.empty()) fail(problem);
        return graph;
    }

private:
    [[noreturn]] void fail(const std::string& problem) const { throw InputError(path_ + ": " + problem); }

    void map_file() {
        // Refuse anything but a regular file before opening it (opening a FIFO for reading
        // waits for a writer); O_NONBLOCK and the second look close the gap between the two.
        struct stat status {};
        if (::stat(path_.c_str(), &status) == 0 && !S_ISREG(status.st_mode)) {
            fail(std::string("is ") + file_kind(status.st_mode) + ", not a region graph file");
        }
        const int descriptor = ::open(path_.c_str(), O_RDONLY | O_CLOEXEC | O_NONBLOCK);
        if (descriptor < 0) fail(std::string("cannot open: ") + std::strerror(errno));
        if (::fstat(descriptor, &status) != 0 || !S_ISREG(status.st_mode)) {
            ::close(descriptor);
            fail(std::string("is ") + file_kind(status.st_mode) + ", not a region graph file");
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
        const bool intact = header.header_checksum == checksum_of(&header, offsetof(FileHeader, header_checksum));
        // An older version's header is checksummed differently: its version field is believed
        // as long as it names a version that existed.
        if (header.format_version != kGraphFormatVersion &&
            (intact || (header.format_version >= 1 && header.format_version <= kLastCrc32Version))) {
            fail("region graph format version " + std::to_string(header.format_version) +
                 ", which this ringroad does not read (it reads version " + std::to_string(kGraphFormatVersion) +
                 "); rebuild the file from its extract with `ringroad build`");
        }
        if (!intact) fail("corrupt header (checksum mismatch)");
        if (header.file_size != size_) {
            fail("truncated or extended: header says " + std::to_string(header.file_size) + " bytes, file has " +
                 std::to_string(size_));
        }
        const std::uint64_t table_bytes = std::uint64_t(header.section_count) * sizeof(SectionEntry);
        if (header.section_table_offset != kHeaderSize || kHeaderSize + table_bytes > size_) {
            fail("corrupt section table");
        }
        if (header.section_table_checksum != checksum_of(base_ + kHeaderSize, table_bytes)) {
            fail("corrupt section table (checksum mismatch)");
        }
        return header;
    }

    void read_table(const FileHeader& header) {
        const auto* entries = reinterpret_cast<const SectionEntry*>(base_ + kHeaderSize);
        const std::uint64_t table_end = kHeaderSize + std::uint64_t(header.section_count) * sizeof(SectionEntry);
        for (std::uint32_t i = 0; i < header.section_count; ++i) {
            const SectionEntry& entry = entries[i];
            const std::size_t tag_length = strnlen(entry.tag, kTagSize);
            if (tag_length == 0 || tag_length == kTagSize) {
                fail("section table entry " + std::to_string(i) + " has no tag of 1 to 15 bytes");
            }
            const std::string tag(entry.tag, tag_length);
            if (std::any_of(sections_.begin(), sections_.end(), [&](const auto& s) { return s.first == tag; })) {
                fail("section '" + tag + "' appears twice");
            }
            if (entry.offset % kAlignment != 0 || entry.offset < table_end || entry.offset > size_ ||
                entry.size > size_ - entry.offset) {
                fail("section '" + tag + "' does not lie between the section table and the end of the file");
            }
            if (entry.element_size == 0 || entry.size % entry.element_size != 0) {
                fail("section '" + tag + "' has a size that is not a whole number of elements");
            }
            sections_.emplace_back(tag, std::span<const std::byte>(base_ + entry.offset, entry.size));
            element_sizes_.push_back(entry.element_size);
            checksums_.push_back(entry.checksum);
        }
    }

    void verify_checksums() const {
        for (std::size_t i = 0; i < sections_.size(); ++i) {
            const auto& [tag, bytes] = sections_[i];
            if (checksums_[i] != checksum_of(bytes.data(), bytes.size())) fail("checksum mismatch in section '" + tag + "'");
        }
    }

    // A core section whose table entry states `element_size` bytes per record.
    std::span<const std::byte> required(std::string_view tag, std::uint32_t element_size = 1) const {
        for (std::size_t i = 0; i < sections_.size(); ++i) {
            if (sections_[i].first != tag) continue;
            if (element_sizes_[i] != element_size) {
                fail("section '" + std::string(tag) + "' has records of " + std::to_string(element_sizes_[i]) +
                     " bytes, not " + std::to_string(element_size));
            }
            return sections_[i].second;
        }
        fail("missing section '" + std::string(tag) + "'");
    }

    template <typename T>
    std::span<const T> typed(std::string_view tag) const {
        const auto bytes = required(tag, sizeof(T));
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
    std::vector<std::uint32_t> element_sizes_;
    std::vector<std::uint64_t> checksums_;
};

RoadGraph load_road_graph(const std::string& path) { return GraphFileLoader(path).load(); }

} // namespace ringroad::graph
