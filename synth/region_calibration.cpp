#include "synth/region_calibration.hpp"

#include "common/input_error.hpp"
#include "common/progress.hpp"
#include "synth/grid_planner.hpp"

#include <algorithm>
#include <cmath>
#include <limits>
#include <string>
#include <vector>

namespace ringroad::synth {

namespace {

// Share of candidate links given a cul-de-sac while the grid size is searched; the final plan
// moves it to hit the request, ideally staying within kLowestShare..kHighestShare.
constexpr double kDefaultShare = 0.24;
constexpr double kLowestShare = 0.12;
constexpr double kHighestShare = 0.50;
// Junctions per grid crossing, measured on seeds 1-3 (SYNTH.md); only the first guess uses it.
constexpr double kJunctionsPerCrossing = 1.7;
constexpr std::uint32_t kSmallestGrid = 6;

std::uint64_t threshold_for_share(double share) {
    return static_cast<std::uint64_t>(share * 18446744073709551616.0);
}

struct Trial {
    GridRequest request;
    std::uint64_t base_junctions;      // without any cul-de-sac
    std::uint64_t candidates;
};

// The smallest threshold that selects exactly `wanted` of the candidate hashes.
std::uint64_t threshold_selecting(std::vector<std::uint64_t>& hashes, std::uint64_t wanted) {
    if (wanted == 0) return 0;
    if (wanted >= hashes.size()) return std::numeric_limits<std::uint64_t>::max();
    std::nth_element(hashes.begin(), hashes.begin() + static_cast<std::ptrdiff_t>(wanted), hashes.end());
    return hashes[wanted];   // hashes below it: exactly `wanted` (ties have probability ~2^-64)
}

} // namespace

RegionPlan plan_region(std::uint64_t junctions, std::uint64_t seed, Progress* progress) {
    if (junctions < kMinJunctions || junctions > kMaxJunctions) {
        throw InputError("--junctions: " + std::to_string(junctions) + " is outside the allowed range " +
                             std::to_string(kMinJunctions) + " .. " + std::to_string(kMaxJunctions),
                         "junctions");
    }
    if (progress != nullptr) progress->phase("planning region");
    const double wanted = static_cast<double>(junctions);
    const auto side = std::max<std::uint32_t>(kSmallestGrid, static_cast<std::uint32_t>(std::lround(std::sqrt(wanted / kJunctionsPerCrossing))));
    GridRequest request{side, side, seed, threshold_for_share(kDefaultShare)};
    std::vector<std::uint64_t> hashes;
    Trial trial{};
    constexpr int kAttempts = 5;
    for (int attempt = 0; attempt < kAttempts; ++attempt) {
        hashes.clear();
        const RegionPlan plan = plan_street_grid(request, &hashes);
        trial = {request, plan.figures.junctions - 2 * plan.figures.cul_de_sacs, hashes.size()};
        if (progress != nullptr) progress->update(0.25 * (attempt + 1));
        const double low = static_cast<double>(trial.base_junctions) + 2 * kLowestShare * static_cast<double>(trial.candidates);
        const double high = static_cast<double>(trial.base_junctions) + 2 * kHighestShare * static_cast<double>(trial.candidates);
        if (wanted >= low && wanted <= high) break;
        // Rescale the crossings by the ratio of wanted to expected junctions at the default share.
        const double expected = static_cast<double>(plan.figures.junctions);
        const double scale = wanted / expected;
        const double rows = std::max<double>(kSmallestGrid, std::round(request.rows * std::sqrt(scale)));
        const double columns = std::max<double>(kSmallestGrid, std::round(request.rows * double(request.columns) * scale / rows));
        if (rows == request.rows && columns == request.columns) break;
        request.rows = static_cast<std::uint32_t>(rows);
        request.columns = static_cast<std::uint32_t>(columns);
        if (attempt + 1 == kAttempts) {
            hashes.clear();
            const RegionPlan last = plan_street_grid(request, &hashes);
            trial = {request, last.figures.junctions - 2 * last.figures.cul_de_sacs, hashes.size()};
        }
    }
    const double missing = (wanted - static_cast<double>(trial.base_junctions)) / 2;
    const auto cul_de_sacs = static_cast<std::uint64_t>(std::clamp(std::round(missing), 0.0, static_cast<double>(trial.candidates)));
    request = trial.request;
    request.cul_de_sac_threshold = threshold_selecting(hashes, cul_de_sacs);
    hashes = {};
    RegionPlan plan = plan_street_grid(request);
    if (progress != nullptr) progress->update(1.0);
    return plan;
}

} // namespace ringroad::synth
