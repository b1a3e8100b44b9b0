// The `ringroad` program: subcommands, and the one place that turns failures into exit codes:
// 0 success, 1 a problem with the input or the request, 2 usage, 3 internal error. Every message
// is one line on stderr, with anything unprintable from the inputs escaped (common/printable.hpp).
// A failed write to standard output is a failure too (exit 1).

#include "common/input_error.hpp"
#include "common/printable.hpp"
#include "common/standard_output.hpp"
#include "daemon/cli/commands.hpp"
#include "daemon/cli/output_paths.hpp"

#include <CLI/CLI.hpp>

#include <exception>
#include <iostream>
#include <string>

namespace {

int fail(const std::string& message, int code) {
    std::cerr << "ringroad: " << ringroad::printable(message) << '\n';
    return code;
}

} // namespace

int main(int argc, char** argv) {
    ringroad::guard_standard_output();
    CLI::App app{"ringroad: road graphs from OpenStreetMap extracts; travel-time matrices, tours "
                 "and spanning networks over them.",
                 "ringroad"};
    app.require_subcommand(1);
    app.set_version_flag("--version", "ringroad 0.1.0");

    ringroad::cli::add_build_command(app);
    ringroad::cli::add_info_command(app);
    ringroad::cli::add_matrix_command(app);
    ringroad::cli::add_route_command(app);
    ringroad::cli::add_tour_command(app);
    ringroad::cli::add_network_command(app);
    ringroad::cli::add_synth_command(app);
    ringroad::cli::add_serve_command(app);

    // Output names are checked once a command line is parsed, before the command does any work.
    for (CLI::App* command : app.get_subcommands({})) {
        command->parse_complete_callback([command] { ringroad::cli::check_output_paths(*command); });
    }

    try {
        app.parse(argc, argv);
    } catch (const CLI::ParseError& error) {
        if (error.get_exit_code() == 0) return app.exit(error);   // --help, --version
        return fail(std::string(error.what()) + " (see ringroad --help)", 2);
    } catch (const ringroad::InputError& error) {
        return fail(error.what(), 1);
    } catch (const std::exception& error) {
        return fail(std::string("internal error: ") + error.what(), 3);
    }
    const std::string output_problem = ringroad::finish_standard_output();
    if (!output_problem.empty()) return fail(output_problem, 1);
    return 0;
}
