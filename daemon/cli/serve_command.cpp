// `ringroad serve REGION.rrg [--listen ADDRESS] [--threads N] [--token-file FILE] [limits...]`:
// loads the region once and answers matrices, tours, networks and routes over HTTP+JSON until
// SIGINT or SIGTERM (exit 0); SIGHUP reloads the same file. The service itself is in
// daemon/service/; this file only turns options into ServiceOptions.

#include "common/input_error.hpp"
#include "common/safety_notice.hpp"
#include "daemon/cli/commands.hpp"
#include "daemon/service/bearer_token.hpp"
#include "daemon/service/service.hpp"

#include <CLI/CLI.hpp>

#include <chrono>
#include <iostream>
#include <memory>
#include <string>
#include <thread>

namespace ringroad::cli {

namespace {

struct ServeSettings {
    std::string region;
    std::string listen = "127.0.0.1:" + std::to_string(service::kDefaultPort);
    unsigned threads = 0;
    std::string token_file;
    service::ServiceLimits limits;
    double header_timeout_seconds = 10.0;
    double body_timeout_seconds = 30.0;
    double idle_timeout_seconds = 60.0;
    double stop_wait_seconds = 30.0;
};

std::chrono::milliseconds milliseconds(double seconds) {
    return std::chrono::milliseconds(static_cast<long long>(seconds * 1000.0 + 0.5));
}

void serve(const ServeSettings& settings) {
    service::ServiceOptions options;
    options.region_path = settings.region;
    options.listen = service::parse_listen_address(settings.listen);
    options.threads = settings.threads;
    options.limits = settings.limits;
    options.limits.header_timeout = milliseconds(settings.header_timeout_seconds);
    options.limits.body_timeout = milliseconds(settings.body_timeout_seconds);
    options.limits.idle_timeout = milliseconds(settings.idle_timeout_seconds);
    options.limits.stop_wait = milliseconds(settings.stop_wait_seconds);
    if (options.limits.default_time_limit_seconds > options.limits.max_time_limit_seconds) {
        throw InputError("--default-time-limit must not exceed --max-time-limit", "--default-time-limit");
    }
    if (!settings.token_file.empty()) options.token = service::read_token_file(settings.token_file);
    options.log = &std::cerr;

    service::Service server(std::move(options));
    const unsigned workers = settings.threads > 0 ? settings.threads : std::max(1u, std::thread::hardware_concurrency());
    std::cerr << "ringroad: serving " << settings.region << " on " << server.listen_text() << " with " << workers
              << " worker threads; SIGHUP reloads the file, SIGINT or SIGTERM stops\n"
              << "ringroad: caution: " << kSafetyNotice << '\n';
    if (!service::parse_listen_address(settings.listen).is_local()) {
        std::cerr << "ringroad: warning: listening beyond this machine; the token guards access but the traffic "
                     "(token included) is not encrypted: put a TLS proxy in front or keep to a trusted network\n";
    }
    server.run(true);
    std::cerr << "ringroad: stopped\n";
}

} // namespace

void add_serve_command(CLI::App& app) {
    auto* command = app.add_subcommand("serve", "Answer matrices, tours, networks and routes over HTTP+JSON from one loaded region");
    auto settings = std::make_shared<ServeSettings>();
    command->add_option("region", settings->region, "Region graph file (.rrg), loaded at start and on every reload")->required();
    command->add_option("--listen", settings->listen,
                        "127.0.0.1:PORT, [::1]:PORT or unix:/path.sock; other addresses need --token-file")
        ->capture_default_str();
    command->add_option("--threads", settings->threads, "Worker threads that compute (default: one per core)");
    command->add_option("--token-file", settings->token_file,
                        "File whose first line is the token every request must send as \"Authorization: Bearer <token>\"");
    service::ServiceLimits& limits = settings->limits;
    command->add_option("--max-body-bytes", limits.max_body_bytes, "Largest request body")->capture_default_str();
    command->add_option("--max-stops", limits.max_stops, "Most stops in one request")->capture_default_str();
    command->add_option("--max-matrix-cells", limits.max_matrix_cells, "Most matrix cells in one request")->capture_default_str();
    command->add_option("--max-queued", limits.max_queued, "Most requests waiting for a worker (429 beyond)")->capture_default_str();
    command->add_option("--default-time-limit", limits.default_time_limit_seconds,
                        "A tour's time budget in seconds when the request names none")
        ->capture_default_str();
    command->add_option("--max-time-limit", limits.max_time_limit_seconds, "The cap on a request's time_limit, seconds")
        ->capture_default_str();
    command->add_option("--header-timeout", settings->header_timeout_seconds, "Seconds a client may take to send the headers")
        ->capture_default_str();
    command->add_option("--body-timeout", settings->body_timeout_seconds, "Seconds a client may take to send the body")
        ->capture_default_str();
    command->add_option("--idle-timeout", settings->idle_timeout_seconds, "Seconds a kept-alive connection may stay silent")
        ->capture_default_str();
    command->add_option("--stop-wait", settings->stop_wait_seconds, "Seconds a stop waits for requests in flight")
        ->capture_default_str();
    command->callback([settings] { serve(*settings); });
}

} // namespace ringroad::cli
