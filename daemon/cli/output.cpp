#include "daemon/cli/output.hpp"

#include "common/atomic_file.hpp"
#include "common/safety_notice.hpp"
#include "common/standard_output.hpp"

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

} // namespace ringroad::cli
