#pragma once
// Checks on a command's output names, made once its command line is parsed and before any work:
// `-o ""` is refused (`-` is standard output); two outputs (-o and --second-table) may not name
// the same file or both be standard output; and no output may be the same file as an input
// (compared by device and inode, so a symbolic link or another relative path is caught too).
// Outputs are the options --output and --second-table; every other option naming an existing
// file is an input. Violations are usage errors (exit 2).

namespace CLI { class App; }

namespace ringroad::cli {

void check_output_paths(const CLI::App& command);

} // namespace ringroad::cli
