#include "daemon/cli/snap_radius_option.hpp"

#include "router/snapping.hpp"

#include <CLI/CLI.hpp>

#include <string>

namespace ringroad::cli {

void add_snap_radius_option(CLI::App& command, double& radius_meters) {
    radius_meters = router::kDefaultSnapRadiusMeters;
    command
        .add_option("--snap-radius", radius_meters,
                    "Farthest a stop may be from a road, metres (default " +
                        std::to_string(static_cast<int>(router::kDefaultSnapRadiusMeters)) + ")")
        ->check(CLI::PositiveNumber);
}

} // namespace ringroad::cli
