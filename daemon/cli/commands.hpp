#pragma once
// Each subcommand of `ringroad` registers itself on the application; its callback throws
// ringroad::InputError for bad input (exit 1) and lets anything else escape (exit 3).
// One file per subcommand: <name>_command.cpp.

namespace CLI { class App; }

namespace ringroad::cli {

void add_build_command(CLI::App& app);
void add_info_command(CLI::App& app);
void add_matrix_command(CLI::App& app);
void add_route_command(CLI::App& app);
void add_tour_command(CLI::App& app);
void add_network_command(CLI::App& app);
void add_synth_command(CLI::App& app);
void add_serve_command(CLI::App& app);

} // namespace ringroad::cli
