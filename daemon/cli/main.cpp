// The `ringroad` program: subcommands, and the one place that turns failures into exit codes:
// 0 success, 1 a problem with the input or the request, 2 usage, 3 internal error.

#include "common/input_error.hpp"
#include "daemon/cli/commands.hpp"

#include <CLI/CLI.hpp>

#include <exception>
#include <iostream>

int main(int argc, char** argv) {
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

    try {
        app.parse(argc, argv);
    } catch (const CLI::ParseError& error) {
        const int code = app.exit(error);   // prints help, or the usage error
        return code == 0 ? 0 : 2;
    } catch (const ringroad::InputError& error) {
        std::cerr << "ringroad: " << error.what() << '\n';
        return 1;
    } catch (const std::exception& error) {
        std::cerr << "ringroad: internal error: " << error.what() << '\n';
        return 3;
    }
    return 0;
}
