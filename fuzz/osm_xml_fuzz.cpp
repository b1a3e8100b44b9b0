// Fuzz target: the extractor on OSM XML input (extract/road_extractor.hpp); see osm_extract_fuzz.hpp.

#include "fuzz/osm_extract_fuzz.hpp"

extern "C" int LLVMFuzzerTestOneInput(const std::uint8_t* data, std::size_t size) {
    ringroad::fuzz::fuzz_osm_extract(data, size, ".osm");
    return 0;
}
