// PLACEHOLDER until its owner replaces this file: registers `ringroad build` as not yet available.
#include "common/input_error.hpp"
#include "daemon/cli/commands.hpp"

#include <CLI/CLI.hpp>

namespace ringroad::cli {

void add_build_command(CLI::App& app) {
    auto* command = app.add_subcommand("build", "(not yet available)");
    command->allow_extras();
    command->callback([] { throw InputError("'build' is not available in this build yet"); });
}

} // namespace ringroad::cli
