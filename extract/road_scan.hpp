#pragma once
// Reading an OSM file for one profile in two passes (the only place that includes libosmium's
// reader): pass 1 collects the road ways and turn restrictions, pass 2 the locations and barrier
// tags of the nodes those roads use and of no other node. An uncompressed PBF sorted nodes-first
// (as extracts are) is memory-mapped and split where its node blocks end (pbf_layout.hpp), so
// each pass decompresses only its own blocks; other files are read whole in both passes.
// Throws InputError naming the file for a missing, unreadable, truncated or corrupt file.

#include "extract/collected_roads.hpp"
#include "extract/profile.hpp"

#include <string>

namespace ringroad { class Progress; }

namespace ringroad::extract {

CollectedRoads scan_osm_file(const std::string& path, const Profile& profile, Progress* progress);

} // namespace ringroad::extract
