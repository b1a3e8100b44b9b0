#include "router/hierarchy/contraction_witness_search.hpp"

namespace ringroad::router::hierarchy {

PackedWeight WitnessSearch::start(NodeId source, PackedWeight source_weight, std::span<const ContractionArc> targets,
                                  std::uint32_t& targets_left) {
    if (++query_ == 0) {   // stamps wrapped: forget every old label
        for (Label& label : labels_) label = Label{kUnreachableWeight, 0, 0, 0};
        query_ = 1;
    }
    PackedWeight bound = 0;
    for (const ContractionArc& target : targets) {
        const PackedWeight through = source_weight + target.weight;
        // A sum past 2^64 is never a shortcut (router/metric.hpp): nothing to decide.
        if (target.other == source || through < source_weight) continue;
        Label& label = labels_[target.other];
        if (label.target_stamp != query_) {
            label.target_stamp = query_;
            label.target_bound = through;
            bound = std::max(bound, through);
            ++targets_left;
        }
    }
    heap_.clear();
    labels_[source].stamp = query_;
    labels_[source].distance = 0;
    heap_.push_back({0, source, 0});
    return bound;
}

} // namespace ringroad::router::hierarchy
