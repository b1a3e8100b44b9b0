// PLACEHOLDER until its owner replaces this file: registers `ringroad tour` as not yet available.
#include "common/input_error.hpp"
#include "daemon/cli/commands.hpp"

#include <CLI/CLI.hpp>

namespace ringroad::cli {

void add_tour_command(CLI::App& app) {
    auto* command = app.add_subcommand("tour", "(not yet available)");
    command->allow_extras();
    command->callback([] { throw InputError("'tour' is not available in this build yet"); });
}

} // namespace ringroad::cli
