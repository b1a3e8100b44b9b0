#include "common/utf8.hpp"

namespace ringroad {

Utf8Character next_utf8_character(std::string_view text, std::size_t position) {
    const auto byte = [&](std::size_t i) { return static_cast<unsigned char>(text[i]); };
    const unsigned char lead = byte(position);
    if (lead < 0x80) return {lead, 1, true};
    std::size_t length = 0;
    char32_t code = 0;
    // Allowed range of the second byte (RFC 3629, section 4), which rules out overlong forms,
    // surrogates and values above U+10FFFF.
    unsigned char low = 0x80, high = 0xBF;
    if (lead >= 0xC2 && lead <= 0xDF) {
        length = 2;
        code = lead & 0x1F;
    } else if (lead >= 0xE0 && lead <= 0xEF) {
        length = 3;
        code = lead & 0x0F;
        if (lead == 0xE0) low = 0xA0;
        if (lead == 0xED) high = 0x9F;
    } else if (lead >= 0xF0 && lead <= 0xF4) {
        length = 4;
        code = lead & 0x07;
        if (lead == 0xF0) low = 0x90;
        if (lead == 0xF4) high = 0x8F;
    } else {
        return {0, 1, false};
    }
    for (std::size_t i = 1; i < length; ++i) {
        if (position + i >= text.size()) return {0, i, false};
        const unsigned char next = byte(position + i);
        const unsigned char lowest = i == 1 ? low : 0x80, highest = i == 1 ? high : 0xBF;
        if (next < lowest || next > highest) return {0, i, false};
        code = (code << 6) | (next & 0x3F);
    }
    return {code, length, true};
}

std::optional<std::size_t> first_invalid_utf8(std::string_view text) {
    for (std::size_t position = 0; position < text.size();) {
        const Utf8Character character = next_utf8_character(text, position);
        if (!character.valid) return position;
        position += character.length;
    }
    return std::nullopt;
}

std::string repair_utf8(std::string_view text, std::size_t& replaced) {
    std::string out;
    out.reserve(text.size());
    for (std::size_t position = 0; position < text.size();) {
        const Utf8Character character = next_utf8_character(text, position);
        if (character.valid) {
            out += text.substr(position, character.length);
        } else {
            out += kReplacementCharacter;
            ++replaced;
        }
        position += character.length;
    }
    return out;
}

} // namespace ringroad
