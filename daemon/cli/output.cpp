#include "daemon/cli/output.hpp"

#include "common/atomic_file.hpp"
#include "common/safety_notice.hpp"

#include <iostream>

namespace ringroad::cli {

void emit_output(const std::string& path, std::string_view text) {
    if (path.empty() || path == "-") {
        std::cout << text << std::flush;
    } else {
        write_file_atomically(path, text);
    }
}

void print_caution() { std::cerr << "ringroad: caution: " << kSafetyNotice << '\n'; }

} // namespace ringroad::cli
