#include "daemon/cli/snap_radius_option.hpp"

#include "daemon/cli/numeric_options.hpp"
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
        ->check(number_between(0.0, kLargestSnapRadiusMeters, true));
}

} // namespace ringroad::cli
