#include "daemon/cli/server_option.hpp"

#include <CLI/CLI.hpp>

namespace ringroad::cli {

void add_server_option(CLI::App& command, std::string& url) {
    command.add_option("--server", url,
                       "Ask a running `ringroad serve` (http://HOST:PORT or unix:/path.sock) instead of loading a region; "
                       "same options, same output. RINGROAD_TOKEN is sent as its bearer token when set");
}

} // namespace ringroad::cli
