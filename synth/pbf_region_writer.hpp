#pragma once
// write_region_pbf: writes a RegionPlan as an uncompressed-header, zlib-blocked OSM PBF file:
// nodes by id, then ways, then relations, streamed to libosmium's writer in small buffers.
// The bytes depend only on the plan: no timestamps, no object metadata, a fixed generator
// string. The file appears under `path` only when complete (a temporary file beside it is
// renamed); on any failure nothing is left behind.

#include "synth/region_plan.hpp"

#include <cstdint>
#include <string>
#include <vector>

namespace ringroad { class Progress; }

namespace ringroad::synth {

inline constexpr const char* kGeneratorName = "ringroad synth";

// Throws InputError naming `path` when its folder is missing or not writable, or it is a folder.
void check_output_path(const std::string& path);

// Returns the size of the file written, in bytes. `progress` may be null.
std::uint64_t write_region_pbf(const RegionPlan& plan, const std::string& path, Progress* progress);

// The OSM tags of a planned way, in the order they are written (tests compare against them).
struct TagPair {
    std::string key;
    std::string value;
};
std::vector<TagPair> way_tags(const PlannedWay& way, std::uint64_t seed);

const char* restriction_tag_value(RestrictionValue value);

} // namespace ringroad::synth
