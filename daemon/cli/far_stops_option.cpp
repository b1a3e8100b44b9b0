#include "daemon/cli/far_stops_option.hpp"

#include <CLI/CLI.hpp>

namespace ringroad::cli {

void add_far_stops_option(CLI::App& command, std::string& policy) {
    policy = "error";
    command
        .add_option("--far-stops", policy,
                    "A stop farther than --snap-radius from every road: error (refuse, the default) or skip (answer "
                    "the rest and list it with its distance)")
        ->check(CLI::IsMember({"error", "skip"}));
}

} // namespace ringroad::cli
