#pragma once
// Text from inputs made safe to print on a terminal: an error message may quote a file name, an
// id or a cell, and raw control characters there (escape sequences) could rewrite the screen.
// Printable characters, including valid non-ASCII UTF-8, pass unchanged; C0 and C1 controls, DEL,
// bytes that are not UTF-8 and the bidirectional overrides become visible escapes (\n, \t, \x1b,
// \u202e).

#include <string>
#include <string_view>

namespace ringroad {

std::string printable(std::string_view text);

} // namespace ringroad
