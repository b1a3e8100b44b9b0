#pragma once
// Makes bytes pass a region file's first line of defence: writes this build's format version and
// recomputes the checksums in place (layout in graph/FORMAT.md, version 2: XXH3 of the header,
// of the section table and of each section). The region-file target seals every input, so its
// mutants reach the loader's structural checks, as a file from a faulty builder would, and its
// findings stay meaningful when the checksum or the version changes: only this file has to follow
// FORMAT.md. Written from FORMAT.md, not from graph/graph_file.cpp, so it keeps the loader honest.
// Anything that does not parse as far as a checksum is left as it is.

#include <cstddef>
#include <cstdint>

namespace ringroad::fuzz {

void seal_region_file(std::uint8_t* data, std::size_t size);

} // namespace ringroad::fuzz
