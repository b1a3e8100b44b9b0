#pragma once
// The consistency check a loaded region graph passes before anything reads it: every index and
// range in the core sections (graph/FORMAT.md, "Consistency") is in bounds and the sections agree
// with each other and with the counts in the metadata, so that no later lookup can read outside
// a section, whatever bytes a file with correct checksums holds. One linear pass per section.

#include "graph/road_graph.hpp"

#include <string>

namespace ringroad::graph {

// The first inconsistency found, as "section 'edges' record 1234: head 99999999 is out of range
// (n = 5000)"; an empty string when there is none.
std::string find_inconsistency(const RoadGraph& graph);

} // namespace ringroad::graph
