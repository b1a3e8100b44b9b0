#include "extract/road_scan.hpp"

#include "common/input_error.hpp"
#include "common/progress.hpp"
#include "common/utf8.hpp"
#include "extract/pbf_layout.hpp"
#include "extract/turn_restrictions.hpp"

#include <osmium/handler.hpp>
#include <osmium/io/bzip2_compression.hpp>
#include <osmium/io/gzip_compression.hpp>
#include <osmium/io/pbf_input.hpp>
#include <osmium/io/xml_input.hpp>
#include <osmium/visitor.hpp>
#include <protozero/exception.hpp>

#include <fcntl.h>
#include <sys/mman.h>
#include <sys/stat.h>
#include <unistd.h>

#include <algorithm>
#include <cstdio>
#include <filesystem>
#include <system_error>
#include <unordered_map>

namespace ringroad::extract {

namespace {

// A road node whose coordinates lie outside [-90, 90] x [-180, 180].
struct OutOfRangeNode {
    std::int64_t id;
    osmium::Location location;
};

// Pass 1: road ways (with their node ids, names and rules) and turn restrictions.
class RoadWayCollector : public osmium::handler::Handler {
public:
    RoadWayCollector(const Profile& profile, CollectedRoads& roads) : profile_(profile), roads_(roads) {}

    void way(const osmium::Way& way) {
        const WayRule rule = evaluate_way(way.tags(), profile_);
        if (!rule.is_road) return;
        CollectedWay collected;
        collected.way_id = way.id();
        collected.first_node = static_cast<std::uint32_t>(roads_.way_node_ids.size());
        for (const auto& node_ref : way.nodes()) roads_.way_node_ids.push_back(node_ref.ref());
        collected.node_count = static_cast<std::uint32_t>(way.nodes().size());
        collected.name = name_offset(way.tags());
        collected.rule = rule;
        roads_.ways.push_back(collected);
    }

    void relation(const osmium::Relation& relation) {
        if (auto restriction = read_turn_restriction(relation, profile_)) {
            roads_.restrictions.push_back(std::move(*restriction));
        }
    }

    // Reading only the blocks after the node blocks, a node here means the guessed layout was wrong.
    void node(const osmium::Node&) { saw_unexpected_ = true; }
    bool saw_unexpected() const noexcept { return saw_unexpected_; }

private:
    // Names are shared by many ways of one street: each distinct name is stored once.
    std::uint32_t name_offset(const osmium::TagList& tags) {
        const char* name = tags.get_value_by_key("name");
        if (name == nullptr) name = tags.get_value_by_key("ref");
        if (name == nullptr || *name == '\0') return graph::kNoName;
        // Every output is UTF-8 (JSON, XML): a name that is not is repaired, and counted.
        std::string text = name;
        if (first_invalid_utf8(text)) {
            std::size_t replaced = 0;
            text = repair_utf8(text, replaced);
            ++roads_.names_repaired;
        }
        const auto [position, inserted] =
            offsets_.try_emplace(text, static_cast<std::uint32_t>(roads_.names.size()));
        if (inserted) {
            roads_.names += text;
            roads_.names += '\0';
        }
        return position->second;
    }

    const Profile& profile_;
    CollectedRoads& roads_;
    std::unordered_map<std::string, std::uint32_t> offsets_;
    bool saw_unexpected_ = false;
};

// Pass 2: locations and barrier rules of the road nodes (road_node_ids), nothing else.
class RoadNodeCollector : public osmium::handler::Handler {
public:
    RoadNodeCollector(const Profile& profile, CollectedRoads& roads) : profile_(profile), roads_(roads) {}

    void node(const osmium::Node& node) {
        const auto& ids = roads_.road_node_ids;
        const auto found = ids.begin() + static_cast<std::ptrdiff_t>(find_from_cursor(node.id()));
        if (found == ids.end() || *found != node.id()) return;
        if (!node.location().valid()) {
            // Stated but impossible (lat 95) is not the same as missing: say which node.
            if (node.location().is_defined()) throw OutOfRangeNode{node.id(), node.location()};
            return;
        }
        RoadNode& road_node = roads_.road_nodes[cursor_];
        road_node.found = true;
        road_node.location = {node.location().y(), node.location().x()};
        if (node.tags().has_key("barrier")) road_node.barrier = evaluate_barrier(node.tags(), profile_);
    }

    // Reading only the node blocks, a way or relation here means the guessed layout was wrong.
    void way(const osmium::Way&) { saw_unexpected_ = true; }
    void relation(const osmium::Relation&) { saw_unexpected_ = true; }
    bool saw_unexpected() const noexcept { return saw_unexpected_; }

private:
    // Index of the first road node id >= `id`. Files list nodes by ascending id, and most nodes are
    // no road nodes: gallop forward from the last position (a merge of the two sorted lists)
    // instead of a full binary search per node; fall back to one for an out-of-order id.
    std::size_t find_from_cursor(std::int64_t id) {
        const auto& ids = roads_.road_node_ids;
        if (cursor_ > 0 && ids[cursor_ - 1] >= id) cursor_ = 0;   // out of order: search everything
        std::size_t low = cursor_, step = 1;
        while (low + step < ids.size() && ids[low + step] < id) {
            low += step;
            step *= 2;
        }
        const std::size_t high = std::min(ids.size(), low + step + 1);
        cursor_ = static_cast<std::size_t>(std::lower_bound(ids.begin() + static_cast<std::ptrdiff_t>(low),
                                                            ids.begin() + static_cast<std::ptrdiff_t>(high), id) - ids.begin());
        return cursor_;
    }

    const Profile& profile_;
    CollectedRoads& roads_;
    std::size_t cursor_ = 0;
    bool saw_unexpected_ = false;
};

// Reads every buffer of `reader` into `handler`. Progress: the share of the file read, or, for
// in-memory input (the file's own offsets do not apply), buffers decoded out of `expected_blocks`.
template <typename Handler>
void read_pass(osmium::io::Reader& reader, Handler& handler, Progress* progress, std::size_t expected_blocks) {
    const double size = static_cast<double>(reader.file_size());
    std::size_t buffers = 0;
    while (osmium::memory::Buffer buffer = reader.read()) {
        osmium::apply(buffer, handler);
        ++buffers;
        if (progress == nullptr) continue;
        if (expected_blocks > 0) progress->update(std::min(1.0, static_cast<double>(buffers) / static_cast<double>(expected_blocks)));
        else if (size > 0) progress->update(static_cast<double>(reader.offset()) / size);
    }
    reader.close();
}

void index_road_nodes(CollectedRoads& roads) {
    roads.road_node_ids = roads.way_node_ids;
    std::sort(roads.road_node_ids.begin(), roads.road_node_ids.end());
    roads.road_node_ids.erase(std::unique(roads.road_node_ids.begin(), roads.road_node_ids.end()),
                              roads.road_node_ids.end());
    roads.road_nodes.assign(roads.road_node_ids.size(), RoadNode{});
}

std::string one_line(std::string text) {
    std::replace(text.begin(), text.end(), '\n', ' ');
    while (!text.empty() && (text.back() == ' ' || text.back() == '.')) text.pop_back();
    return text;
}

osmium::io::File open_checked(const std::string& path) {
    std::error_code error;
    if (!std::filesystem::exists(path, error)) throw InputError(path + ": no such file");
    if (std::filesystem::is_directory(path, error)) throw InputError(path + ": is a folder, not an OSM file");
    osmium::io::File file{path};
    if (file.format() != osmium::io::file_format::pbf && file.format() != osmium::io::file_format::xml) {
        throw InputError(path + ": not an OSM file (expected .osm.pbf, .pbf, .osm, .osm.gz or .osm.bz2)");
    }
    return file;
}

// The plain way: each pass reads the whole file (decompressing every block twice in all).
void scan_whole_file(const osmium::io::File& file, const Profile& profile, Progress* progress, CollectedRoads& roads) {
    if (progress != nullptr) progress->phase("reading roads");
    RoadWayCollector way_collector{profile, roads};
    osmium::io::Reader way_reader{file, osmium::osm_entity_bits::way | osmium::osm_entity_bits::relation};
    roads.replication_timestamp = way_reader.header().get("osmosis_replication_timestamp");
    read_pass(way_reader, way_collector, progress, 0);
    index_road_nodes(roads);

    if (progress != nullptr) progress->phase("reading road node locations");
    RoadNodeCollector node_collector{profile, roads};
    osmium::io::Reader node_reader{file, osmium::osm_entity_bits::node};
    read_pass(node_reader, node_collector, progress, 0);
}

// A read-only memory map of a whole file.
class MappedFile {
public:
    explicit MappedFile(const std::string& path) {
        const int descriptor = ::open(path.c_str(), O_RDONLY | O_CLOEXEC);
        if (descriptor < 0) return;
        struct stat status {};
        if (::fstat(descriptor, &status) == 0 && status.st_size > 0) {
            // MAP_POPULATE: the whole file is read anyway; one bulk read beats a fault per page.
            void* mapping = ::mmap(nullptr, static_cast<std::size_t>(status.st_size), PROT_READ,
                                   MAP_PRIVATE | MAP_POPULATE, descriptor, 0);
            if (mapping != MAP_FAILED) {
                data_ = static_cast<const char*>(mapping);
                size_ = static_cast<std::size_t>(status.st_size);
            }
        }
        ::close(descriptor);
    }
    ~MappedFile() {
        if (data_ != nullptr) ::munmap(const_cast<char*>(data_), size_);
    }
    MappedFile(const MappedFile&) = delete;
    MappedFile& operator=(const MappedFile&) = delete;

    const char* data() const noexcept { return data_; }
    std::size_t size() const noexcept { return size_; }

private:
    const char* data_ = nullptr;
    std::size_t size_ = 0;
};

// A PBF sorted nodes-first: the way pass reads the header and the blocks after the node blocks,
// the node pass the header and the node blocks, so each block is decompressed once. Returns false
// (results to be discarded) if the passes find the layout guess wrong.
bool scan_split_file(const MappedFile& mapped, const PbfLayout& layout, const Profile& profile, Progress* progress,
                     CollectedRoads& roads) {
    if (progress != nullptr) progress->phase("reading roads");
    std::string header_and_rest(mapped.data(), layout.header_end);
    header_and_rest.append(mapped.data() + layout.first_non_node, mapped.size() - layout.first_non_node);
    RoadWayCollector way_collector{profile, roads};
    {
        osmium::io::Reader way_reader{osmium::io::File{header_and_rest.data(), header_and_rest.size(), "pbf"},
                                      osmium::osm_entity_bits::node | osmium::osm_entity_bits::way |
                                          osmium::osm_entity_bits::relation};
        roads.replication_timestamp = way_reader.header().get("osmosis_replication_timestamp");
        read_pass(way_reader, way_collector, progress, layout.other_blobs);
    }
    if (way_collector.saw_unexpected()) return false;
    header_and_rest = std::string{};
    index_road_nodes(roads);

    if (progress != nullptr) progress->phase("reading road node locations");
    RoadNodeCollector node_collector{profile, roads};
    osmium::io::Reader node_reader{osmium::io::File{mapped.data(), layout.first_non_node, "pbf"}, osmium::osm_entity_bits::all};
    read_pass(node_reader, node_collector, progress, layout.node_blobs);
    return !node_collector.saw_unexpected();
}

// libosmium copies an in-memory input whole before parsing it, so the split read costs memory in
// proportion to the file: above this size the plain read, whose memory does not grow with the
// file, is used instead.
constexpr std::size_t kLargestSplitFile = std::size_t{256} * 1024 * 1024;

void scan_passes(const osmium::io::File& file, const Profile& profile, Progress* progress, CollectedRoads& roads) {
    std::error_code error;
    const auto size = std::filesystem::file_size(file.filename(), error);
    if (!error && size <= kLargestSplitFile && file.format() == osmium::io::file_format::pbf &&
        file.compression() == osmium::io::file_compression::none) {
        const MappedFile mapped{file.filename()};
        if (mapped.data() != nullptr) {
            if (const auto layout = find_pbf_layout(mapped.data(), mapped.size())) {
                if (scan_split_file(mapped, *layout, profile, progress, roads)) return;
                roads = CollectedRoads{};   // not sorted after all: read it the plain way
            }
        }
    }
    scan_whole_file(file, profile, progress, roads);
}

} // namespace

CollectedRoads scan_osm_file(const std::string& path, const Profile& profile, Progress* progress) {
    const osmium::io::File file = open_checked(path);
    CollectedRoads roads;
    try {
        scan_passes(file, profile, progress, roads);
    } catch (const osmium::pbf_error& error) {
        throw InputError(path + ": truncated or corrupt PBF file (" + one_line(error.what()) + ")");
    } catch (const osmium::xml_error& error) {
        throw InputError(path + ": not valid OSM XML (" + one_line(error.what()) + ")");
    } catch (const osmium::gzip_error& error) {
        throw InputError(path + ": truncated or corrupt gzip data (" + one_line(error.what()) + ")");
    } catch (const osmium::bzip2_error& error) {
        throw InputError(path + ": truncated or corrupt bzip2 data (" + one_line(error.what()) + ")");
    } catch (const osmium::io_error& error) {
        // zlib failures inside PBF blobs land here too.
        throw InputError(path + ": cannot be read as OSM data, truncated or corrupt (" + one_line(error.what()) + ")");
    } catch (const protozero::exception& error) {
        throw InputError(path + ": truncated or corrupt PBF file (" + one_line(error.what()) + ")");
    } catch (const std::system_error& error) {
        throw InputError(path + ": cannot read (" + one_line(error.what()) + ")");
    } catch (const OutOfRangeNode& node) {
        char where[96];
        std::snprintf(where, sizeof where, "lat %.7g, lon %.7g", node.location.lat_without_check(),
                      node.location.lon_without_check());
        throw InputError(path + ": node " + std::to_string(node.id) + " has coordinates outside the valid range (" + where +
                         "; latitude must be within [-90, 90], longitude within [-180, 180])");
    } catch (const InputError&) {
        throw;
    } catch (const std::bad_alloc&) {
        throw;
    } catch (const std::exception& error) {
        // libosmium's own parsers: an id beyond the 64-bit range, a coordinate like "nan" or text.
        throw InputError(path + ": not valid OSM data (" + one_line(error.what()) + ")");
    }
    return roads;
}

} // namespace ringroad::extract
