#pragma once
// UTF-8 (RFC 3629) checking and repair. Well-formed means: shortest encodings only, no UTF-16
// surrogates (U+D800..U+DFFF), nothing above U+10FFFF. Every JSON and XML output must be valid
// UTF-8, so text from files is checked (stops, matrices: an input error) or repaired (OSM names:
// each maximal ill-formed subsequence becomes U+FFFD, as Unicode 15, section 3.9, recommends).

#include <cstddef>
#include <optional>
#include <string>
#include <string_view>

namespace ringroad {

inline constexpr std::string_view kReplacementCharacter = "\xEF\xBF\xBD";   // U+FFFD

struct Utf8Character {
    char32_t code = 0;         // meaningful when valid
    std::size_t length = 1;    // bytes consumed (at least 1)
    bool valid = false;
};

// Decodes the character at `position` (< text.size()); an ill-formed sequence is reported with
// the length of its maximal ill-formed prefix.
Utf8Character next_utf8_character(std::string_view text, std::size_t position);

// Byte offset of the first ill-formed sequence, or nothing when `text` is valid UTF-8.
std::optional<std::size_t> first_invalid_utf8(std::string_view text);

// `text` with each ill-formed sequence replaced by U+FFFD; `replaced` counts the replacements.
std::string repair_utf8(std::string_view text, std::size_t& replaced);

} // namespace ringroad
