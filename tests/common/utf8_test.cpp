// UTF-8 checking and repair. References: RFC 3629 (the well-formed byte sequences, section 4)
// and the Unicode Standard's practice for U+FFFD substitution (maximal subparts, chapter 3,
// "U+FFFD Substitution of Maximal Subparts"), whose expected outputs below were confirmed with
// Python 3's decoder (bytes.decode("utf-8", "replace")), which follows that practice.

#include "common/utf8.hpp"

#include <catch2/catch.hpp>

#include <string>

using namespace ringroad;

namespace {

const std::string fffd = "\xEF\xBF\xBD";

std::string repaired(const std::string& text, std::size_t expected_replacements) {
    std::size_t replaced = 0;
    std::string out = repair_utf8(text, replaced);
    CHECK(replaced == expected_replacements);
    CHECK_FALSE(first_invalid_utf8(out).has_value());
    return out;
}

} // namespace

TEST_CASE("well-formed UTF-8 passes unchanged") {
    for (const std::string text : {"", "Harbour depot", "Ré\xC3\xA9", "\xE2\x82\xAC 5", "\xF0\x9F\x9A\x97 car",
                                   "\xED\x9F\xBF", "\xEE\x80\x80", "\xF4\x8F\xBF\xBF"}) {
        CHECK_FALSE(first_invalid_utf8(text).has_value());
        CHECK(repaired(text, 0) == text);
    }
}

TEST_CASE("ill-formed sequences are found and each maximal subpart becomes one U+FFFD") {
    CHECK(first_invalid_utf8("ab\xFF" "cd") == std::optional<std::size_t>(2));
    // The Unicode Standard's example: 61 F1 80 80 E1 80 C2 62 80 63 80 BF 64.
    CHECK(repaired("a\xF1\x80\x80\xE1\x80\xC2" "b\x80" "c\x80\xBF" "d", 6) ==
          "a" + fffd + fffd + fffd + "b" + fffd + "c" + fffd + fffd + "d");
    CHECK(repaired("\xC0\xAF", 2) == fffd + fffd);                    // overlong "/"
    CHECK(repaired("\xE0\x80\xAF", 3) == fffd + fffd + fffd);         // overlong, three bytes
    CHECK(repaired("\xED\xA0\x80", 3) == fffd + fffd + fffd);         // a UTF-16 surrogate
    CHECK(repaired("\xF4\x90\x80\x80", 4) == fffd + fffd + fffd + fffd);   // above U+10FFFF
    CHECK(repaired("x\xE2\x82", 1) == "x" + fffd);                    // truncated at the end
    CHECK(repaired("\xF0\x9F\x98", 1) == fffd);
}
