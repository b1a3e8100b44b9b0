// Escaping for XML 1.0 character data and attribute values, used by the GPX renderings.
// Characters XML 1.0 cannot carry even escaped (most control characters, NUL, U+FFFE/U+FFFF) and
// bytes that are not UTF-8 become U+FFFD; tab, line feed and carriage return become character
// references.

#include "common/utf8.hpp"
#include "daemon/answers/renderings.hpp"

namespace ringroad::answers {

namespace {

// XML 1.0, section 2.2: Char ::= #x9 | #xA | #xD | [#x20-#xD7FF] | [#xE000-#xFFFD] | [#x10000-#x10FFFF]
bool allowed_in_xml(char32_t code) {
    return code == 0x9 || code == 0xA || code == 0xD || (code >= 0x20 && code <= 0xD7FF) ||
           (code >= 0xE000 && code <= 0xFFFD) || (code >= 0x10000 && code <= 0x10FFFF);
}

} // namespace

std::string xml_escape(std::string_view text) {
    std::string out;
    out.reserve(text.size());
    std::size_t position = 0;
    while (position < text.size()) {
        const Utf8Character character = next_utf8_character(text, position);
        const std::string_view bytes = text.substr(position, character.length);
        position += character.length;
        if (!character.valid || !allowed_in_xml(character.code)) {
            out += kReplacementCharacter;
            continue;
        }
        switch (character.code) {
        case '&': out += "&amp;"; break;
        case '<': out += "&lt;"; break;
        case '>': out += "&gt;"; break;
        case '"': out += "&quot;"; break;
        case '\'': out += "&apos;"; break;
        // Attribute values normalise raw white space; references keep it.
        case '\t': out += "&#9;"; break;
        case '\n': out += "&#10;"; break;
        case '\r': out += "&#13;"; break;
        default: out += bytes;
        }
    }
    return out;
}

} // namespace ringroad::answers
