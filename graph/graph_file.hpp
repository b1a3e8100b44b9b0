#pragma once
// Reading and writing the .rrg region-graph file (layout in graph/FORMAT.md): magic, format
// version, a section table, one XXH3 checksum per section, little-endian, 8-byte aligned sections
// so the loader maps the file and points spans into it without parsing.

#include "graph/road_graph.hpp"

#include <string>

namespace ringroad::graph {

inline constexpr std::uint32_t kGraphFormatVersion = 2;

// Writes through a temporary file and renames it at the end: an error or a kill never leaves a
// half-written file under `path`. Throws InputError when the folder is missing or unwritable.
// The graph's extra sections are written too.
void write_road_graph(const RoadGraph& graph, const std::string& path);

// Maps the file and checks magic, version, table, sizes, every section's checksum and then every
// index and range of the core sections (graph/consistency_check.hpp, on a second thread beside the
// checksums; damage is reported before inconsistency). Throws InputError, one line
// naming the file and the problem ("is a named pipe (FIFO), not a region graph file", "truncated",
// "checksum mismatch in section 'edges'", "section 'edges' record 12: head 9 is out of range
// (n = 5)", a version-1 file's "rebuild ... with `ringroad build`", ...).
RoadGraph load_road_graph(const std::string& path);

} // namespace ringroad::graph
