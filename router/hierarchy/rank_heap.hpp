#pragma once
// RankHeap: the priority queue of a hierarchy search. A 4-ary min-heap of (weight, rank) with
// decrease-key, so every rank is queued at most once: with lazy deletion two thirds of the pops
// in a million-junction many-to-many were stale duplicates. A rank's position in the heap lives
// in a slot the caller owns (the search's label for that rank), so the heap needs no per-rank
// array of its own; `slot_of(rank)` must return a reference to that uint32.

#include "router/metric.hpp"

#include <cstdint>
#include <type_traits>
#include <utility>
#include <vector>

namespace ringroad::router::hierarchy {

class RankHeap {
public:
    static constexpr std::uint32_t kNotQueued = 0xFFFFFFFFu;

    bool empty() const { return entries_.empty(); }
    PackedWeight min_weight() const { return entries_.front().weight; }
    void clear() { entries_.clear(); }

    // Queues `rank` with `weight`, or lowers its weight if it is queued (slot != kNotQueued).
    template <typename SlotOf>
    void push_or_decrease(std::uint32_t rank, PackedWeight weight, SlotOf&& slot_of) {
        static_assert(std::is_same_v<decltype(slot_of(rank)), std::uint32_t&>);
        std::uint32_t position = slot_of(rank);
        if (position == kNotQueued) {
            position = static_cast<std::uint32_t>(entries_.size());
            entries_.push_back({weight, rank});
        } else {
            entries_[position].weight = weight;
        }
        sift_up(position, slot_of);
    }

    // Removes and returns the lightest entry; its slot becomes kNotQueued.
    template <typename SlotOf>
    std::pair<PackedWeight, std::uint32_t> pop(SlotOf&& slot_of) {
        const Entry top = entries_.front();
        slot_of(top.rank) = kNotQueued;
        const Entry last = entries_.back();
        entries_.pop_back();
        if (!entries_.empty()) {
            entries_.front() = last;
            sift_down(slot_of);
        }
        return {top.weight, top.rank};
    }

private:
    struct Entry {
        PackedWeight weight;
        std::uint32_t rank;
    };
    static constexpr std::uint32_t kArity = 4;

    template <typename SlotOf>
    void sift_up(std::uint32_t position, SlotOf& slot_of) {
        const Entry moving = entries_[position];
        while (position > 0) {
            const std::uint32_t parent = (position - 1) / kArity;
            if (entries_[parent].weight <= moving.weight) break;
            entries_[position] = entries_[parent];
            slot_of(entries_[position].rank) = position;
            position = parent;
        }
        entries_[position] = moving;
        slot_of(moving.rank) = position;
    }

    template <typename SlotOf>
    void sift_down(SlotOf& slot_of) {
        const Entry moving = entries_.front();
        const std::uint32_t size = static_cast<std::uint32_t>(entries_.size());
        std::uint32_t position = 0;
        for (;;) {
            const std::uint32_t first_child = position * kArity + 1;
            if (first_child >= size) break;
            std::uint32_t best = first_child;
            const std::uint32_t end = first_child + kArity < size ? first_child + kArity : size;
            for (std::uint32_t child = first_child + 1; child < end; ++child) {
                if (entries_[child].weight < entries_[best].weight) best = child;
            }
            if (moving.weight <= entries_[best].weight) break;
            entries_[position] = entries_[best];
            slot_of(entries_[position].rank) = position;
            position = best;
        }
        entries_[position] = moving;
        slot_of(moving.rank) = position;
    }

    std::vector<Entry> entries_;
};

} // namespace ringroad::router::hierarchy
