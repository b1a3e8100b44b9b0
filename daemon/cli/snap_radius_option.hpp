#pragma once
// --snap-radius, the same on every command that places stops on roads (matrix, route, tour,
// network): how far, in metres, a stop may lie from the nearest road before it is an error.

namespace CLI { class App; }

namespace ringroad::cli {

// Adds the option; a value that is not a number above 0 and at most kLargestSnapRadiusMeters is
// a usage error (exit 2).
void add_snap_radius_option(CLI::App& command, double& radius_meters);

} // namespace ringroad::cli
