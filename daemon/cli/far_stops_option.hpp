#pragma once
// --far-stops error|skip, the same on every command that places several stops on roads (matrix,
// tour, network): whether one stop too far from every road refuses the whole request (error, the
// default) or is left out and listed with its distance (skip).

#include <string>

namespace CLI { class App; }

namespace ringroad::cli {

void add_far_stops_option(CLI::App& command, std::string& policy);

} // namespace ringroad::cli
