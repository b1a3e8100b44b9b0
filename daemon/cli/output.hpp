#pragma once
// How every command hands over its result: to standard output, or with -o FILE written whole or
// not at all; JSON indented alike everywhere; and the road-safety caution on stderr for formats
// (CSV) that have no field to carry it.

#include <string>
#include <string_view>

namespace ringroad::cli {

// Writes `text` to stdout when `path` is empty or "-", otherwise atomically to `path`.
void emit_output(const std::string& path, std::string_view text);

// The indentation of every JSON answer.
inline constexpr int kJsonIndent = 2;

// "ringroad: caution: ..." on stderr.
void print_caution();

} // namespace ringroad::cli
