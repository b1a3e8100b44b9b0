// PLACEHOLDER until its owner replaces this file: registers `ringroad route` as not yet available.
#include "common/input_error.hpp"
#include "daemon/cli/commands.hpp"

#include <CLI/CLI.hpp>

namespace ringroad::cli {

void add_route_command(CLI::App& app) {
    auto* command = app.add_subcommand("route", "(not yet available)");
    command->allow_extras();
    command->callback([] { throw InputError("'route' is not available in this build yet"); });
}

} // namespace ringroad::cli
