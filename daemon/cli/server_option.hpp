#pragma once
// `--server URL` on matrix, route, tour and network: the command builds the same request body and
// sends it to a running `ringroad serve` instead of loading the region itself; the answer is
// printed exactly as if computed here (daemon/service/server_client.hpp).

#include <string>

namespace CLI { class App; }

namespace ringroad::cli {

void add_server_option(CLI::App& command, std::string& url);

} // namespace ringroad::cli
