// Fuzz target: the extractor on OSM PBF input (extract/road_extractor.hpp), including the split
// read of nodes-first files (extract/pbf_layout.hpp); see osm_extract_fuzz.hpp.

#include "fuzz/osm_extract_fuzz.hpp"

extern "C" int LLVMFuzzerTestOneInput(const std::uint8_t* data, std::size_t size) {
    ringroad::fuzz::fuzz_osm_extract(data, size, ".osm.pbf");
    return 0;
}
