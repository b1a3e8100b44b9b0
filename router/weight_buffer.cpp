#include "router/weight_buffer.hpp"

#include <cstdint>

#ifdef __linux__
#include <sys/mman.h>
#endif

namespace ringroad::router {

namespace {
constexpr std::size_t kHugePage = std::size_t{2} << 20;
}

std::vector<PackedWeight> make_weight_buffer(std::size_t count, PackedWeight value) {
    std::vector<PackedWeight> buffer;
    buffer.reserve(count);   // allocated, not yet touched
#if defined(__linux__) && defined(MADV_HUGEPAGE)
    const std::size_t bytes = count * sizeof(PackedWeight);
    if (bytes >= 2 * kHugePage) {
        // The whole huge pages inside the allocation (madvise wants a page-aligned start).
        const auto begin = reinterpret_cast<std::uintptr_t>(buffer.data());
        const std::uintptr_t first = (begin + kHugePage - 1) & ~(kHugePage - 1);
        const std::uintptr_t last = (begin + bytes) & ~(kHugePage - 1);
        if (last > first) madvise(reinterpret_cast<void*>(first), last - first, MADV_HUGEPAGE);
    }
#endif
    buffer.resize(count, value);
    return buffer;
}

} // namespace ringroad::router
