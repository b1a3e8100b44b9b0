#include "router/contraction_witness_search.hpp"

namespace ringroad::router {

void WitnessSearch::start(NodeId source, std::span<const ContractionArc> targets, std::uint32_t& targets_left) {
    if (++query_ == 0) {   // stamps wrapped: forget every old label
        for (Label& label : labels_) label = Label{kUnreachableWeight, 0, 0};
        query_ = 1;
    }
    for (const ContractionArc& target : targets) {
        Label& label = labels_[target.other];
        if (target.other != source && label.target_stamp != query_) {
            label.target_stamp = query_;
            ++targets_left;
        }
    }
    heap_.clear();
    labels_[source].stamp = query_;
    labels_[source].distance = 0;
    heap_.push_back({0, source, 0});
}

} // namespace ringroad::router
