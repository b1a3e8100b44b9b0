#pragma once
// The router's stored sections (layouts in router/STORED.md): arrays copied into a
// graph::ExtraSection at build time, and viewed in place in the mapped file at load time. A
// stored array that is damaged or inconsistent is refused with one InputError line naming the
// section and the record, so no query ever reads out of bounds.

#include "graph/road_graph.hpp"

#include <cstddef>
#include <cstdint>
#include <cstring>
#include <span>
#include <string>
#include <string_view>
#include <type_traits>

namespace ringroad::router {

// Throws InputError: "stored section 'TAG' record N: PROBLEM; rebuild the region file with
// `ringroad build`".
[[noreturn]] void refuse_stored_record(std::string_view tag, std::size_t record, const std::string& problem);
// The same for the section as a whole ("stored section 'TAG': PROBLEM; ...").
[[noreturn]] void refuse_stored_section(std::string_view tag, const std::string& problem);

template <typename T>
graph::ExtraSection make_stored_section(std::string tag, std::span<const T> values) {
    static_assert(std::is_trivially_copyable_v<T>, "stored sections hold plain records only");
    graph::ExtraSection section;
    section.tag = std::move(tag);
    section.bytes.resize(values.size_bytes());
    if (!values.empty()) std::memcpy(section.bytes.data(), values.data(), values.size_bytes());
    return section;
}

// The section `tag` as `expected_count` records of T (any count when expected_count is
// kAnyCount); refuses a size or alignment that does not fit.
inline constexpr std::size_t kAnyCount = static_cast<std::size_t>(-1);
template <typename T>
std::span<const T> view_stored_section(const graph::RoadGraph& road_graph, std::string_view tag,
                                       std::size_t expected_count) {
    static_assert(std::is_trivially_copyable_v<T>);
    const std::span<const std::byte> bytes = road_graph.section(tag);
    if (bytes.size() % sizeof(T) != 0 || reinterpret_cast<std::uintptr_t>(bytes.data()) % alignof(T) != 0) {
        refuse_stored_section(tag, "size " + std::to_string(bytes.size()) + " is not a whole number of " +
                                       std::to_string(sizeof(T)) + "-byte records");
    }
    const std::size_t count = bytes.size() / sizeof(T);
    if (expected_count != kAnyCount && count != expected_count) {
        refuse_stored_section(tag, std::to_string(count) + " records, expected " + std::to_string(expected_count));
    }
    return {reinterpret_cast<const T*>(bytes.data()), count};
}

} // namespace ringroad::router
