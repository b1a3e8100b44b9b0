#include "synth/pbf_region_writer.hpp"

#include "common/input_error.hpp"
#include "common/progress.hpp"
#include "synth/street_names.hpp"

#include <osmium/builder/osm_object_builder.hpp>
#include <osmium/io/header.hpp>
#include <osmium/io/pbf_output.hpp>
#include <osmium/io/writer.hpp>
#include <osmium/osm/box.hpp>

#include <fcntl.h>
#include <sys/stat.h>
#include <unistd.h>

#include <cerrno>
#include <cstdlib>
#include <cstring>
#include <filesystem>
#include <system_error>

namespace ringroad::synth {

namespace {

const char* highway_value(RoadKind kind) {
    switch (kind) {
    case RoadKind::motorway: return "motorway";
    case RoadKind::motorway_link: return "motorway_link";
    case RoadKind::primary: return "primary";
    case RoadKind::secondary: return "secondary";
    case RoadKind::tertiary: return "tertiary";
    case RoadKind::roundabout: return "tertiary";
    case RoadKind::residential: return "residential";
    case RoadKind::cul_de_sac: return "residential";
    case RoadKind::driveway: return "service";
    case RoadKind::private_service: return "service";
    }
    return "road";
}

// Removes the temporary file unless the rename happened.
class TemporaryFile {
public:
    explicit TemporaryFile(const std::string& target) {
        std::string pattern = target + ".tmp-XXXXXX";
        const int descriptor = ::mkstemp(pattern.data());
        if (descriptor < 0) throw InputError(target + ": cannot create a file beside it (" + std::strerror(errno) + ")");
        // mkstemp makes the file private; a replaced file keeps its mode, a new one gets the usual.
        const mode_t mask = ::umask(0);
        ::umask(mask);
        struct stat existing {};
        ::fchmod(descriptor, ::stat(target.c_str(), &existing) == 0 ? (existing.st_mode & 07777) : (0666 & ~mask));
        ::close(descriptor);
        path_ = pattern;
    }
    ~TemporaryFile() {
        if (!path_.empty()) ::unlink(path_.c_str());
    }
    TemporaryFile(const TemporaryFile&) = delete;
    TemporaryFile& operator=(const TemporaryFile&) = delete;

    const std::string& path() const noexcept { return path_; }
    void rename_to(const std::string& target) {
        if (std::rename(path_.c_str(), target.c_str()) != 0) {
            throw InputError(target + ": cannot rename the finished file into place (" + std::strerror(errno) + ")");
        }
        path_.clear();
    }

private:
    std::string path_;
};

class StreamingWriter {
public:
    StreamingWriter(const RegionPlan& plan, const std::string& path)
        : plan_(plan), writer_(osmium::io::File{path, "pbf,add_metadata=false"}, header(plan), osmium::io::overwrite::allow,
                               osmium::io::fsync::yes) {}

    void write_all(Progress* progress) {
        const double total = static_cast<double>(plan_.nodes.size() + plan_.ways.size() + plan_.restrictions.size());
        std::size_t barrier = 0;
        if (progress != nullptr) progress->phase("writing nodes");
        for (std::size_t node = 0; node < plan_.nodes.size(); ++node) {
            const PlannedBarrier* tagged = nullptr;
            if (barrier < plan_.barriers.size() && plan_.barriers[barrier].node == node) tagged = &plan_.barriers[barrier++];
            add_node(node, tagged);
            if (progress != nullptr && (node & 0xFFFF) == 0) progress->update(static_cast<double>(node) / total);
        }
        if (progress != nullptr) progress->phase("writing ways");
        for (std::size_t way = 0; way < plan_.ways.size(); ++way) {
            add_way(way);
            if (progress != nullptr && (way & 0xFFFF) == 0) progress->update(static_cast<double>(plan_.nodes.size() + way) / total);
        }
        if (progress != nullptr) progress->phase("writing turn restrictions");
        for (std::size_t relation = 0; relation < plan_.restrictions.size(); ++relation) add_relation(relation);
        flush();
        if (progress != nullptr) progress->phase("compressing and syncing the file");
        writer_.close();
        if (progress != nullptr) progress->update(1.0);
    }

private:
    static osmium::io::Header header(const RegionPlan& plan) {
        osmium::io::Header header;
        header.set("generator", kGeneratorName);
        header.set("sorting", "Type_then_ID");
        const PlanFigures& figures = plan.figures;
        header.add_box(osmium::Box{figures.min_lon, figures.min_lat, figures.max_lon, figures.max_lat});
        return header;
    }

    void add_node(std::size_t index, const PlannedBarrier* barrier) {
        {
            osmium::builder::NodeBuilder builder{buffer_};
            builder.set_id(static_cast<osmium::object_id_type>(index + 1));
            builder.set_location(osmium::Location{plan_.nodes[index].lon, plan_.nodes[index].lat});
            if (barrier != nullptr) {
                osmium::builder::TagListBuilder tags{builder};
                tags.add_tag("barrier", barrier->kind == BarrierKind::bollard ? "bollard" : "gate");
            }
        }
        commit();
    }

    void add_way(std::size_t index) {
        const PlannedWay& way = plan_.ways[index];
        {
            osmium::builder::WayBuilder builder{buffer_};
            builder.set_id(static_cast<osmium::object_id_type>(index + 1));
            {
                osmium::builder::WayNodeListBuilder nodes{builder};
                for (std::uint32_t position = 0; position < way.node_count; ++position) {
                    nodes.add_node_ref(static_cast<osmium::object_id_type>(plan_.way_nodes[way.first_ref + position]) + 1);
                }
            }
            osmium::builder::TagListBuilder tags{builder};
            for (const TagPair& tag : way_tags(way, plan_.seed)) tags.add_tag(tag.key, tag.value);
        }
        commit();
    }

    void add_relation(std::size_t index) {
        const PlannedRestriction& restriction = plan_.restrictions[index];
        {
            osmium::builder::RelationBuilder builder{buffer_};
            builder.set_id(static_cast<osmium::object_id_type>(index + 1));
            {
                osmium::builder::RelationMemberListBuilder members{builder};
                members.add_member(osmium::item_type::way, restriction.from_way + 1, "from");
                members.add_member(osmium::item_type::node, restriction.via_node + 1, "via");
                members.add_member(osmium::item_type::way, restriction.to_way + 1, "to");
            }
            osmium::builder::TagListBuilder tags{builder};
            tags.add_tag("type", "restriction");
            tags.add_tag("restriction", restriction_tag_value(restriction.value));
        }
        commit();
    }

    // Small buffers handed over as they fill: memory stays flat whatever the region's size.
    void commit() {
        buffer_.commit();
        if (buffer_.committed() >= kFlushBytes) flush();
    }

    void flush() {
        if (buffer_.committed() == 0) return;
        writer_(std::move(buffer_));
        buffer_ = osmium::memory::Buffer{kBufferBytes, osmium::memory::Buffer::auto_grow::yes};
    }

    static constexpr std::size_t kBufferBytes = 4 * 1024 * 1024;
    static constexpr std::size_t kFlushBytes = 3 * 1024 * 1024;

    const RegionPlan& plan_;
    osmium::io::Writer writer_;
    osmium::memory::Buffer buffer_{kBufferBytes, osmium::memory::Buffer::auto_grow::yes};
};

} // namespace

const char* restriction_tag_value(RestrictionValue value) {
    switch (value) {
    case RestrictionValue::no_left_turn: return "no_left_turn";
    case RestrictionValue::no_right_turn: return "no_right_turn";
    case RestrictionValue::no_u_turn: return "no_u_turn";
    case RestrictionValue::only_straight_on: return "only_straight_on";
    }
    return "no_left_turn";
}

std::vector<TagPair> way_tags(const PlannedWay& way, std::uint64_t seed) {
    std::vector<TagPair> tags{{"highway", highway_value(way.kind)}};
    const std::string name = invented_road_name(way.kind, way.name_key, seed);
    if (!name.empty()) tags.push_back({"name", name});
    if (way.kind == RoadKind::motorway) tags.push_back({"ref", "M" + std::to_string(way.name_key)});
    if (way.oneway != 0) tags.push_back({"oneway", way.oneway > 0 ? "yes" : "-1"});
    if (way.maxspeed != 0) tags.push_back({"maxspeed", std::to_string(way.maxspeed)});
    switch (way.kind) {
    case RoadKind::motorway:
        tags.push_back({"bridge", "yes"});
        tags.push_back({"layer", "1"});
        break;
    case RoadKind::roundabout: tags.push_back({"junction", "roundabout"}); break;
    case RoadKind::driveway: tags.push_back({"service", "driveway"}); break;
    case RoadKind::private_service: tags.push_back({"access", "private"}); break;
    default: break;
    }
    return tags;
}

void check_output_path(const std::string& path) {
    namespace fs = std::filesystem;
    fs::path folder = fs::path(path).parent_path();
    if (folder.empty()) folder = ".";
    std::error_code error;
    if (!fs::is_directory(folder, error)) throw InputError(path + ": output folder '" + folder.string() + "' does not exist");
    if (fs::is_directory(path, error)) throw InputError(path + ": is a folder, not a file name");
    // Try it rather than ask access(): root passes access() even where nothing can be created.
    std::string probe = (folder / ".ringroad-write-check-XXXXXX").string();
    const int descriptor = ::mkstemp(probe.data());
    if (descriptor < 0) throw InputError(path + ": output folder '" + folder.string() + "' is not writable");
    ::close(descriptor);
    ::unlink(probe.c_str());
}

std::uint64_t write_region_pbf(const RegionPlan& plan, const std::string& path, Progress* progress) {
    check_output_path(path);
    TemporaryFile temporary{path};
    try {
        StreamingWriter writer{plan, temporary.path()};
        writer.write_all(progress);
    } catch (const osmium::io_error& error) {
        throw InputError(path + ": cannot write (" + error.what() + ")");
    } catch (const std::system_error& error) {
        throw InputError(path + ": cannot write (" + error.what() + ")");
    }
    std::error_code error;
    const auto bytes = std::filesystem::file_size(temporary.path(), error);
    temporary.rename_to(path);
    return error ? 0 : static_cast<std::uint64_t>(bytes);
}

} // namespace ringroad::synth
