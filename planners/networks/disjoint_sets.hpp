#pragma once
// DisjointSets: union–find over 0..count-1 with union by size and path halving, so any sequence
// of m operations costs O(m α(n)). unite() says whether it joined two different sets, which is
// what Kruskal's algorithm and fragment-joining constructions ask.

#include <cstddef>
#include <numeric>
#include <utility>
#include <vector>

namespace ringroad::planners::networks {

class DisjointSets {
public:
    explicit DisjointSets(std::size_t count) : parent_(count), size_(count, 1) {
        std::iota(parent_.begin(), parent_.end(), std::size_t{0});
    }

    std::size_t find(std::size_t item) {
        while (parent_[item] != item) {
            parent_[item] = parent_[parent_[item]];
            item = parent_[item];
        }
        return item;
    }

    // Joins the sets of a and b; false when they were already one set.
    bool unite(std::size_t a, std::size_t b) {
        a = find(a);
        b = find(b);
        if (a == b) return false;
        if (size_[a] < size_[b]) std::swap(a, b);
        parent_[b] = a;
        size_[a] += size_[b];
        return true;
    }

private:
    std::vector<std::size_t> parent_;
    std::vector<std::size_t> size_;
};

} // namespace ringroad::planners::networks
