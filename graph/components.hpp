#pragma once
// Strongly connected components of a directed graph in adjacency-array form (iterative Tarjan,
// so deep roads cannot overflow the stack). Components are renumbered by decreasing size, so the
// largest is 0; ties keep the order of discovery.

#include <cstdint>
#include <span>
#include <vector>

namespace ringroad::graph {

struct ComponentLabels {
    std::vector<std::uint32_t> component;   // per vertex
    std::uint32_t count = 0;
};

// first_out has n + 1 entries; heads[first_out[v] .. first_out[v+1]) are v's successors.
ComponentLabels strongly_connected_components(std::span<const std::uint32_t> first_out,
                                              std::span<const std::uint32_t> heads);

} // namespace ringroad::graph
