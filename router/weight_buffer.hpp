#pragma once
// make_weight_buffer: a vector of `count` packed weights, all `value`, whose memory the kernel is
// asked to back with transparent huge pages when it is large. An N x N matrix is written once
// and big (8 MB at N = 1000): with 4 KiB pages, zero-filling it on first touch costs one page
// fault per 4 KiB, which on the benchmark machine took longer than computing the matrix with
// the hierarchy (40 ms of 55 ms at N = 1000). Only a hint: where huge pages are unavailable the
// vector is the same, just slower to fill.

#include "router/metric.hpp"

#include <cstddef>
#include <vector>

namespace ringroad::router {

std::vector<PackedWeight> make_weight_buffer(std::size_t count, PackedWeight value);

} // namespace ringroad::router
