// Strongly connected components against the Boost Graph Library's strong_components on the
// same random directed graphs (BGL is the outside reference).

#include "graph/components.hpp"

#include <boost/graph/adjacency_list.hpp>
#include <boost/graph/strong_components.hpp>
#include <catch2/catch.hpp>

#include <map>
#include <random>

using namespace ringroad::graph;

TEST_CASE("strongly connected components match the Boost Graph Library") {
    std::mt19937 random(42);
    for (int trial = 0; trial < 40; ++trial) {
        const std::uint32_t n = 1 + random() % 400;
        const std::uint32_t m = random() % (3 * n);
        std::vector<std::pair<std::uint32_t, std::uint32_t>> arcs;
        for (std::uint32_t i = 0; i < m; ++i) arcs.emplace_back(random() % n, random() % n);
        std::sort(arcs.begin(), arcs.end());

        std::vector<std::uint32_t> first_out(n + 1, 0), heads;
        for (const auto& [tail, head] : arcs) {
            ++first_out[tail + 1];
            heads.push_back(head);
        }
        for (std::uint32_t v = 0; v < n; ++v) first_out[v + 1] += first_out[v];
        const auto ours = strongly_connected_components(first_out, heads);

        using BoostGraph = boost::adjacency_list<boost::vecS, boost::vecS, boost::directedS>;
        BoostGraph reference(n);
        for (const auto& [tail, head] : arcs) boost::add_edge(tail, head, reference);
        std::vector<int> boost_component(n);
        const int boost_count = boost::strong_components(reference, boost_component.data());

        REQUIRE(ours.count == static_cast<std::uint32_t>(boost_count));
        // Same partition: the label maps must be a bijection.
        std::map<std::uint32_t, int> ours_to_boost;
        std::map<int, std::uint32_t> boost_to_ours;
        for (std::uint32_t v = 0; v < n; ++v) {
            CHECK(ours_to_boost.emplace(ours.component[v], boost_component[v]).first->second == boost_component[v]);
            CHECK(boost_to_ours.emplace(boost_component[v], ours.component[v]).first->second == ours.component[v]);
        }
        // Component 0 is (one of) the largest.
        std::vector<std::uint32_t> sizes(ours.count, 0);
        for (const auto c : ours.component) ++sizes[c];
        CHECK(sizes[0] == *std::max_element(sizes.begin(), sizes.end()));
        CHECK(std::is_sorted(sizes.rbegin(), sizes.rend()));
    }
}
