#pragma once
// The consistency check a loaded region graph passes before anything reads it: every index and
// range in the core sections (graph/FORMAT.md, "Consistency") is in bounds and the sections agree
// with each other and with the counts in the metadata, so that no later lookup can read outside
// a section, whatever bytes a file with correct checksums holds. One linear pass per section.

#include "graph/road_graph.hpp"

#include <string>

namespace ringroad::graph {

// The longest road piece and the slowest edge a file may hold: 10,000 km (longer than any ferry
// route, from memory) and about 116 days. Searches add weights packed in 64 bits with the
// secondary metric in the low 32 (router/metric.hpp), so one absurd edge must not be able to
// carry a path's sum into the other half.
inline constexpr std::uint32_t kLongestSegmentDm = 100'000'000;
inline constexpr std::uint32_t kSlowestEdgeDs = 100'000'000;

// The first inconsistency found, as "section 'edges' record 1234: head 99999999 is out of range
// (n = 5000)"; an empty string when there is none.
std::string find_inconsistency(const RoadGraph& graph);

} // namespace ringroad::graph
