#pragma once
// Reading and writing the .rrg region-graph file (layout in graph/FORMAT.md): magic, format
// version, a section table, one CRC32 per section, little-endian, 8-byte aligned sections so the
// loader maps the file and points spans into it without parsing.

#include "graph/road_graph.hpp"

#include <string>

namespace ringroad::graph {

inline constexpr std::uint32_t kGraphFormatVersion = 1;

// Writes through a temporary file and renames it at the end: an error or a kill never leaves a
// half-written file under `path`. Throws InputError when the folder is missing or unwritable.
// The graph's extra sections are written too.
void write_road_graph(const RoadGraph& graph, const std::string& path);

// Maps the file and checks magic, version, table, sizes and every section's CRC32. Throws
// InputError naming the file and the problem ("not a ringroad region graph", "truncated",
// "checksum mismatch in section 'edges'", ...).
RoadGraph load_road_graph(const std::string& path);

} // namespace ringroad::graph
