#pragma once
// Test helper: edits the bytes of a version-2 .rrg file as graph/FORMAT.md lays them out, written
// from that description rather than from graph/graph_file.cpp: finds a section by tag, overwrites
// one field of one record (or of a table entry), and re-seals the file, every section's checksum,
// then the table's, then the header's, with libxxhash's own XXH3_64bits. A re-sealed file passes
// every checksum, so only the loader's consistency checks stand between it and a command.

#include <xxhash.h>

#include <cstdint>
#include <cstring>
#include <stdexcept>
#include <string>
#include <string_view>
#include <vector>

namespace ringroad::test {

class RegionFileEditor {
public:
    // FORMAT.md, version 2.
    static constexpr std::size_t kHeaderSize = 64, kEntrySize = 48;
    static constexpr std::size_t kHeaderChecksumAt = 56, kTableChecksumAt = 32, kSectionCountAt = 12;
    static constexpr std::size_t kEntryOffsetAt = 16, kEntrySizeAt = 24, kEntryChecksumAt = 32,
                                 kEntryElementSizeAt = 40;

    explicit RegionFileEditor(std::vector<char> bytes) : bytes_(std::move(bytes)) {}

    const std::vector<char>& bytes() const noexcept { return bytes_; }
    char* bytes_for_edit() noexcept { return bytes_.data(); }
    std::uint32_t section_count() const { return get<std::uint32_t>(kSectionCountAt); }

    // Byte position of the table entry of `tag`.
    std::size_t entry_at(std::string_view tag) const {
        for (std::uint32_t i = 0; i < section_count(); ++i) {
            const std::size_t entry = kHeaderSize + i * kEntrySize;
            if (std::string_view(bytes_.data() + entry, ::strnlen(bytes_.data() + entry, 16)) == tag) return entry;
        }
        throw std::logic_error("no section '" + std::string(tag) + "'");
    }
    std::uint64_t section_offset(std::string_view tag) const { return get<std::uint64_t>(entry_at(tag) + kEntryOffsetAt); }
    std::uint64_t section_size(std::string_view tag) const { return get<std::uint64_t>(entry_at(tag) + kEntrySizeAt); }

    template <typename T>
    T get(std::size_t at) const {
        T value;
        std::memcpy(&value, bytes_.data() + at, sizeof value);
        return value;
    }
    template <typename T>
    void set(std::size_t at, T value) {
        std::memcpy(bytes_.data() + at, &value, sizeof value);
    }

    // Field at `field_at` bytes into record `record` of `tag`, whose records are `record_size` bytes.
    template <typename T>
    void set_field(std::string_view tag, std::size_t record_size, std::size_t record, std::size_t field_at, T value) {
        if ((record + 1) * record_size > section_size(tag)) throw std::logic_error("no such record");
        set(section_offset(tag) + record * record_size + field_at, value);
    }

    // Replaces text inside a text section by text of the same length.
    void replace_text(std::string_view tag, std::string_view from, std::string_view to) {
        if (from.size() != to.size()) throw std::logic_error("replacement must keep the length");
        const std::string_view text(bytes_.data() + section_offset(tag), section_size(tag));
        const auto found = text.find(from);
        if (found == std::string_view::npos) throw std::logic_error("'" + std::string(from) + "' not found");
        std::memcpy(bytes_.data() + section_offset(tag) + found, to.data(), to.size());
    }

    void reseal() {
        for (std::uint32_t i = 0; i < section_count(); ++i) {
            const std::size_t entry = kHeaderSize + i * kEntrySize;
            const auto offset = get<std::uint64_t>(entry + kEntryOffsetAt);
            const auto size = get<std::uint64_t>(entry + kEntrySizeAt);
            set<std::uint64_t>(entry + kEntryChecksumAt, XXH3_64bits(bytes_.data() + offset, size));
        }
        set<std::uint64_t>(kTableChecksumAt, XXH3_64bits(bytes_.data() + kHeaderSize, section_count() * kEntrySize));
        set<std::uint64_t>(kHeaderChecksumAt, XXH3_64bits(bytes_.data(), kHeaderChecksumAt));
    }

private:
    std::vector<char> bytes_;
};

} // namespace ringroad::test
