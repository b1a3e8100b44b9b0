#include "daemon/service/region_holder.hpp"

#include "common/input_error.hpp"
#include "router/metric.hpp"

#include <nlohmann/json.hpp>

#include <ctime>
#include <exception>

namespace ringroad::service {

RegionHolder::RegionHolder(std::string path) : path_(std::move(path)), current_(answers::load_region(path_)) {}

std::shared_ptr<const answers::LoadedRegion> RegionHolder::current() const {
    std::lock_guard lock(current_mutex_);
    return current_;
}

ReloadOutcome RegionHolder::reload() {
    std::lock_guard one_at_a_time(reload_mutex_);
    const auto started = std::chrono::steady_clock::now();
    ReloadOutcome outcome;
    try {
        std::shared_ptr<const answers::LoadedRegion> fresh = answers::load_region(path_);
        {
            std::lock_guard lock(current_mutex_);
            current_.swap(fresh);
        }
        // `fresh` now holds the old region; it is freed here unless a request still uses it.
        outcome.loaded = true;
    } catch (const std::exception& error) {
        // Anything at all: a file being replaced can fail in ways the loader does not foresee,
        // and the service must keep answering from the old region.
        outcome.message = error.what();
    }
    outcome.seconds = std::chrono::duration<double>(std::chrono::steady_clock::now() - started).count();
    outcome.region = current();
    std::lock_guard lock(history_mutex_);
    if (outcome.loaded) {
        ++reloads_;
    } else {
        ++failed_reloads_;
        last_error_ = outcome.message;
    }
    return outcome;
}

nlohmann::json RegionHolder::history_json() const {
    std::lock_guard lock(history_mutex_);
    return {{"reloads", reloads_},
            {"failed_reloads", failed_reloads_},
            {"last_reload_error", last_error_.empty() ? nlohmann::json(nullptr) : nlohmann::json(last_error_)}};
}

namespace {

std::string utc_text(std::chrono::system_clock::time_point when) {
    const std::time_t seconds = std::chrono::system_clock::to_time_t(when);
    std::tm parts{};
    gmtime_r(&seconds, &parts);
    char text[32];
    std::strftime(text, sizeof text, "%Y-%m-%dT%H:%M:%SZ", &parts);
    return text;
}

} // namespace

nlohmann::json region_json(const answers::LoadedRegion& region) {
    const graph::RoadGraph& graph = region.router->road_graph();
    nlohmann::json hierarchies = nlohmann::json::array();
    for (const router::Metric metric : {router::Metric::time, router::Metric::distance}) {
        if (region.router->has_stored_hierarchy(metric)) hierarchies.push_back(std::string(router::metric_name(metric)));
    }
    return {{"file", region.path},
            {"source", graph.metadata_value("source")},
            {"source_timestamp", graph.metadata_value("source_timestamp")},
            {"built_at", graph.metadata_value("built_at")},
            {"profile", graph.metadata_value("profile")},
            {"junctions", graph.vertex_count()},
            {"edges", graph.edge_count()},
            {"components", graph.component_count()},
            {"turn_restrictions", graph.turn_restrictions().size()},
            {"hierarchy_metrics", hierarchies},
            {"loaded_at", utc_text(region.loaded_at)}};
}

} // namespace ringroad::service
