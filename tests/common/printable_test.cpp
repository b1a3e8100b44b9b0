// Messages quote inputs; what a terminal would act on (ECMA-48 control functions: C0 and C1
// controls, ESC sequences), Unicode's bidirectional overrides (Unicode Standard Annex #9) and
// bytes that are not UTF-8 are shown escaped, everything printable as it is.

#include "common/printable.hpp"

#include <catch2/catch.hpp>

#include <string>

using namespace ringroad;

TEST_CASE("printable text passes unchanged, including non-ASCII UTF-8") {
    CHECK(printable("stops.csv:3: column 'id': duplicate id 'Bäckerei €'") ==
          "stops.csv:3: column 'id': duplicate id 'Bäckerei €'");
}

TEST_CASE("control characters, escape sequences, bidi overrides and stray bytes are escaped") {
    CHECK(printable("\x1b[2J\x1b[H") == "\\x1b[2J\\x1b[H");
    CHECK(printable(std::string("a\0b", 3)) == "a\\x00b");
    CHECK(printable("line\nbreak\r\ttab\x7f") == "line\\nbreak\\r\\ttab\\x7f");
    CHECK(printable("\xC2\x9B" "31m") == "\\u009b31m");            // C1 CSI
    CHECK(printable("abc\xE2\x80\xAE" "fed") == "abc\\u202efed");  // RIGHT-TO-LEFT OVERRIDE
    CHECK(printable("bad\xFF") == "bad\\xff");
}
