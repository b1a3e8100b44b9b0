#pragma once
// The body shared by osm_xml_fuzz and osm_pbf_fuzz: the input is written to a scratch file whose
// suffix picks libOSMium's reader, then extracted with the car profile as `ringroad build` does.
// InputError is the expected refusal. A graph extracted without error must also survive being
// written and loaded again (graph_file.hpp), since `build` would do just that.

#include <cstddef>
#include <cstdint>

namespace ringroad::fuzz {

void fuzz_osm_extract(const std::uint8_t* data, std::size_t size, const char* suffix);

} // namespace ringroad::fuzz
