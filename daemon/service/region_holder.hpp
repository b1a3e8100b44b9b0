#pragma once
// RegionHolder: the region the service answers from, and its replacement on reload. current()
// hands out a shared pointer, so a request keeps the region it started with however many reloads
// happen meanwhile; reload() loads and verifies the file named at start-up (never a path from a
// request), then swaps it in under a lock held only for the pointer copy. A failed load leaves
// the current region in place and says why. Reloads run one at a time.

#include "daemon/answers/loaded_region.hpp"

#include <nlohmann/json_fwd.hpp>

#include <chrono>
#include <cstdint>
#include <memory>
#include <mutex>
#include <string>

namespace ringroad::service {

struct ReloadOutcome {
    bool loaded = false;
    std::string message;   // why the load failed, when it did
    std::shared_ptr<const answers::LoadedRegion> region;   // the region in force afterwards
    double seconds = 0.0;
};

class RegionHolder {
public:
    // Loads `path`; throws InputError naming the file when it cannot be used.
    explicit RegionHolder(std::string path);

    std::shared_ptr<const answers::LoadedRegion> current() const;
    ReloadOutcome reload();

    // {"reloads": n, "failed_reloads": n, "last_reload_error": "..." or null}
    nlohmann::json history_json() const;

private:
    const std::string path_;
    mutable std::mutex current_mutex_;
    std::shared_ptr<const answers::LoadedRegion> current_;
    std::mutex reload_mutex_;          // one reload at a time
    mutable std::mutex history_mutex_;
    std::uint64_t reloads_ = 0;
    std::uint64_t failed_reloads_ = 0;
    std::string last_error_;
};

// What GET /v1/status says about a region: file, provenance and map timestamp from the graph's
// metadata, counts, profile, usable hierarchies, when it was loaded.
nlohmann::json region_json(const answers::LoadedRegion& region);

} // namespace ringroad::service
