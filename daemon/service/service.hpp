#pragma once
// Service: `ringroad serve` as an object. The constructor loads the region and binds the listening
// socket (InputError when either fails); run() serves on the calling thread until stop() or, with
// signals on, SIGINT/SIGTERM (stop) and SIGHUP (reload). One network thread reads and writes
// HTTP/1.1 and answers status and refusals itself; every question runs on a pool of worker
// threads (one per core by default), so a long computation never holds up the network.
//
// stop() stops accepting, lets every request already received finish (bounded by
// limits.stop_wait), answers requests that arrive meanwhile with 503, and returns when run() has
// returned. All of it is in daemon/service/service.cpp, the one file that includes Boost.Asio and
// Boost.Beast for the server side.

#include "daemon/service/region_holder.hpp"
#include "daemon/service/service_options.hpp"

#include <cstdint>
#include <memory>
#include <string>

namespace ringroad::service {

class Service {
public:
    explicit Service(ServiceOptions options);
    ~Service();
    Service(const Service&) = delete;
    Service& operator=(const Service&) = delete;

    // The bound TCP port (the ephemeral one when the options asked for port 0); 0 on a Unix socket.
    std::uint16_t port() const;
    std::string listen_text() const;

    void run(bool handle_signals);
    // run(false) on a background thread, for tests and benchmarks; stop() joins it.
    void start();
    void stop();

    // What POST /v1/reload and SIGHUP do.
    ReloadOutcome reload();

    struct Impl;   // opaque: defined in service.cpp

private:
    std::unique_ptr<Impl> impl_;
};

} // namespace ringroad::service
