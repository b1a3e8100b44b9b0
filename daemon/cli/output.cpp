#include "daemon/cli/output.hpp"

#include "common/atomic_file.hpp"
#include "common/safety_notice.hpp"
#include "common/standard_output.hpp"
#include "common/utf8.hpp"

#include <iostream>
#include <memory>

namespace ringroad::cli {

namespace {

bool is_standard_output(const std::string& path) { return path.empty() || path == "-"; }

} // namespace

void emit_output(const std::string& path, std::string_view text) {
    if (is_standard_output(path)) {
        write_standard_output(text);
    } else {
        write_file_atomically(path, text);
    }
}

void emit_outputs(const std::vector<std::pair<std::string, std::string>>& path_and_text) {
    std::vector<std::unique_ptr<AtomicFile>> files;
    for (const auto& [path, text] : path_and_text) {
        files.push_back(std::make_unique<AtomicFile>(is_standard_output(path) ? std::string("-") : path));
        files.back()->write(text);
    }
    for (auto& file : files) file->prepare();
    for (auto& file : files) file->publish();
}

void print_caution() { std::cerr << "ringroad: caution: " << kSafetyNotice << '\n'; }

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

} // namespace ringroad::cli
