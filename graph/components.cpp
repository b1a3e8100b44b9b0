#include "graph/components.hpp"

#include <algorithm>
#include <limits>
#include <numeric>

namespace ringroad::graph {

namespace {

constexpr std::uint32_t kUnvisited = std::numeric_limits<std::uint32_t>::max();

struct Frame {
    std::uint32_t vertex;
    std::uint32_t next_arc;
};

} // namespace

ComponentLabels strongly_connected_components(std::span<const std::uint32_t> first_out,
                                              std::span<const std::uint32_t> heads) {
    const std::uint32_t n = first_out.empty() ? 0 : static_cast<std::uint32_t>(first_out.size() - 1);
    std::vector<std::uint32_t> index(n, kUnvisited), lowlink(n, 0), raw_component(n, kUnvisited);
    std::vector<std::uint32_t> stack;
    std::vector<char> on_stack(n, 0);
    std::vector<Frame> call_stack;
    std::uint32_t next_index = 0;
    std::uint32_t component_count = 0;

    for (std::uint32_t root = 0; root < n; ++root) {
        if (index[root] != kUnvisited) continue;
        call_stack.push_back({root, first_out[root]});
        index[root] = lowlink[root] = next_index++;
        stack.push_back(root);
        on_stack[root] = 1;
        while (!call_stack.empty()) {
            Frame& frame = call_stack.back();
            const std::uint32_t v = frame.vertex;
            if (frame.next_arc < first_out[v + 1]) {
                const std::uint32_t w = heads[frame.next_arc++];
                if (index[w] == kUnvisited) {
                    index[w] = lowlink[w] = next_index++;
                    stack.push_back(w);
                    on_stack[w] = 1;
                    call_stack.push_back({w, first_out[w]});
                } else if (on_stack[w]) {
                    lowlink[v] = std::min(lowlink[v], index[w]);
                }
                continue;
            }
            if (lowlink[v] == index[v]) {  // v is the root of a component: pop it
                std::uint32_t w;
                do {
                    w = stack.back();
                    stack.pop_back();
                    on_stack[w] = 0;
                    raw_component[w] = component_count;
                } while (w != v);
                ++component_count;
            }
            call_stack.pop_back();
            if (!call_stack.empty()) {
                const std::uint32_t parent = call_stack.back().vertex;
                lowlink[parent] = std::min(lowlink[parent], lowlink[v]);
            }
        }
    }

    // Renumber by decreasing size so that 0 is the largest ("main") component.
    std::vector<std::uint32_t> sizes(component_count, 0);
    for (const auto c : raw_component) ++sizes[c];
    std::vector<std::uint32_t> by_size(component_count);
    std::iota(by_size.begin(), by_size.end(), 0u);
    std::stable_sort(by_size.begin(), by_size.end(),
                     [&](std::uint32_t a, std::uint32_t b) { return sizes[a] > sizes[b]; });
    std::vector<std::uint32_t> new_id(component_count);
    for (std::uint32_t rank = 0; rank < component_count; ++rank) new_id[by_size[rank]] = rank;

    ComponentLabels labels;
    labels.count = component_count;
    labels.component.resize(n);
    for (std::uint32_t v = 0; v < n; ++v) labels.component[v] = new_id[raw_component[v]];
    return labels;
}

} // namespace ringroad::graph
