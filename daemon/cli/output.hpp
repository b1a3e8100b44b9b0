#pragma once
// How every command hands over its result: to standard output, or with -o FILE written whole or
// not at all; JSON indented alike everywhere; and the road-safety caution on stderr for formats
// (CSV) that have no field to carry it. A failed write to standard output is an error (exit 1).

#include <string>
#include <string_view>
#include <utility>
#include <vector>

namespace ringroad::cli {

// Writes `text` to stdout when `path` is empty or "-", otherwise atomically to `path`.
void emit_output(const std::string& path, std::string_view text);

// Several outputs that appear together or not at all: every file is written and synced before
// any is put in place (or standard output written), so a full disk leaves none of them.
void emit_outputs(const std::vector<std::pair<std::string, std::string>>& path_and_text);

// The indentation of every JSON answer.
inline constexpr int kJsonIndent = 2;

// "ringroad: caution: ..." on stderr.
void print_caution();

} // namespace ringroad::cli
