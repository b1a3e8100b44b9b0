// PLACEHOLDER until its owner replaces this file: registers `ringroad matrix` as not yet available.
#include "common/input_error.hpp"
#include "daemon/cli/commands.hpp"

#include <CLI/CLI.hpp>

namespace ringroad::cli {

void add_matrix_command(CLI::App& app) {
    auto* command = app.add_subcommand("matrix", "(not yet available)");
    command->allow_extras();
    command->callback([] { throw InputError("'matrix' is not available in this build yet"); });
}

} // namespace ringroad::cli
