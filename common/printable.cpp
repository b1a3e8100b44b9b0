#include "common/printable.hpp"

#include "common/utf8.hpp"

#include <cstdio>

namespace ringroad {

namespace {

std::string hex_escape(const char* format, unsigned value) {
    char buffer[16];
    std::snprintf(buffer, sizeof buffer, format, value);
    return buffer;
}

// C1 controls, and the characters that reorder text on screen (Unicode bidirectional overrides
// and isolates) or hide in it (line and paragraph separators).
bool hidden_or_reordering(char32_t code) {
    return (code >= 0x80 && code <= 0x9F) || (code >= 0x202A && code <= 0x202E) || (code >= 0x2066 && code <= 0x2069) ||
           code == 0x2028 || code == 0x2029;
}

} // namespace

std::string printable(std::string_view text) {
    std::string out;
    out.reserve(text.size());
    for (std::size_t position = 0; position < text.size();) {
        const Utf8Character character = next_utf8_character(text, position);
        if (!character.valid) {
            for (std::size_t i = 0; i < character.length; ++i) {
                out += hex_escape("\\x%02x", static_cast<unsigned char>(text[position + i]));
            }
        } else if (character.code == '\n') {
            out += "\\n";
        } else if (character.code == '\r') {
            out += "\\r";
        } else if (character.code == '\t') {
            out += "\\t";
        } else if (character.code < 0x20 || character.code == 0x7F) {
            out += hex_escape("\\x%02x", static_cast<unsigned>(character.code));
        } else if (hidden_or_reordering(character.code)) {
            out += hex_escape("\\u%04x", static_cast<unsigned>(character.code));
        } else {
            out += text.substr(position, character.length);
        }
        position += character.length;
    }
    return out;
}

} // namespace ringroad
