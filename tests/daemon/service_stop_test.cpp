// Stopping: every request already received completes; requests after the stop began get 503 or
// find the door shut; the real `ringroad serve` exits 0 on SIGTERM and reloads on SIGHUP
// (signal(7) semantics). The region is the invented demo town (fixtures/demo).
#include "tests/daemon/service_test_support.hpp"

#include <fcntl.h>
#include <signal.h>
#include <sys/wait.h>

#include <atomic>
#include <mutex>
#include <random>

using namespace ringroad::test;
using nlohmann::json;

namespace {

// `count` stops at seeded random points inside the demo town's box (from fixtures/demo/stops.csv),
// for matrices that keep the workers busy for a while.
json random_demo_stops(std::size_t count, unsigned seed) {
    const json known = demo_stops_json();
    double south = 90, north = -90, west = 180, east = -180;
    for (const json& stop : known) {
        south = std::min(south, stop["lat"].get<double>());
        north = std::max(north, stop["lat"].get<double>());
        west = std::min(west, stop["lon"].get<double>());
        east = std::max(east, stop["lon"].get<double>());
    }
    std::mt19937 random(seed);
    std::uniform_real_distribution<double> lat(south, north), lon(west, east);
    json stops = json::array();
    for (std::size_t i = 0; i < count; ++i) stops.push_back({{"id", "p" + std::to_string(i)}, {"lat", lat(random)}, {"lon", lon(random)}});
    return stops;
}

} // namespace

TEST_CASE("stop with requests in flight: every one of them completes") {
    ringroad::service::ServiceOptions options = test_service_options();
    options.threads = 1;   // one worker, so most of the requests wait in the queue when the stop comes
    RunningService running(options);
    const std::string body = json{{"stops", random_demo_stops(600, 7)}}.dump();
    constexpr int kRequests = 8;
    std::vector<RawConnection> connections;
    for (int i = 0; i < kRequests; ++i) connections.push_back(RawConnection::tcp(running.port()));
    for (RawConnection& connection : connections) REQUIRE(connection.send(http_request_text("POST", "/v1/matrix", body)));
    // Wait until the service holds them all (status answers on the network thread even when busy).
    for (int wait = 0; wait < 500; ++wait) {
        const json work = http_exchange(running.port(), "GET", "/v1/status").json().at("work");
        if (work.at("running").get<int>() + work.at("queued").get<int>() == kRequests) break;
        std::this_thread::sleep_for(std::chrono::milliseconds(5));
    }
    std::thread stopper([&] { running.stop(); });
    int completed = 0;
    for (RawConnection& connection : connections) {
        const HttpAnswer answer = connection.read_answer();
        INFO(answer.body.substr(0, 300));
        CHECK(answer.status == 200);
        CHECK(answer.headers.at("connection") == "close");
        completed += answer.status == 200;
    }
    stopper.join();
    CHECK(completed == kRequests);
    CHECK_THROWS(RawConnection::tcp(running.port()));   // no longer accepting
}

namespace {

struct ChildService {
    pid_t pid = -1;
    int stderr_fd = -1;
    std::string log;

    // Reads stderr until `text` appears (or 20 s pass); returns whether it did.
    bool wait_for(const std::string& text) {
        const auto deadline = std::chrono::steady_clock::now() + std::chrono::seconds(20);
        while (log.find(text) == std::string::npos && std::chrono::steady_clock::now() < deadline) {
            char buffer[4096];
            const ssize_t n = ::read(stderr_fd, buffer, sizeof buffer);
            if (n > 0) {
                log.append(buffer, static_cast<std::size_t>(n));
            } else if (n == 0) {
                return log.find(text) != std::string::npos;
            } else {
                std::this_thread::sleep_for(std::chrono::milliseconds(10));
            }
        }
        return log.find(text) != std::string::npos;
    }
};

ChildService start_serve(const std::vector<std::string>& arguments) {
    int pipe_fds[2];
    REQUIRE(::pipe(pipe_fds) == 0);
    ChildService child;
    child.pid = ::fork();
    if (child.pid == 0) {
        ::dup2(pipe_fds[1], 2);
        ::close(pipe_fds[0]);
        std::vector<char*> argv{const_cast<char*>(RINGROAD_BINARY), const_cast<char*>("serve")};
        for (const std::string& argument : arguments) argv.push_back(const_cast<char*>(argument.c_str()));
        argv.push_back(nullptr);
        ::execv(RINGROAD_BINARY, argv.data());
        ::_exit(127);
    }
    ::close(pipe_fds[1]);
    child.stderr_fd = pipe_fds[0];
    ::fcntl(child.stderr_fd, F_SETFL, O_NONBLOCK);
    return child;
}

int wait_exit_code(pid_t pid) {
    for (int wait = 0; wait < 2000; ++wait) {   // 20 s at most
        int status = 0;
        if (::waitpid(pid, &status, WNOHANG) == pid) return WIFEXITED(status) ? WEXITSTATUS(status) : 128 + WTERMSIG(status);
        std::this_thread::sleep_for(std::chrono::milliseconds(10));
    }
    ::kill(pid, SIGKILL);
    ::waitpid(pid, nullptr, 0);
    return -1;
}

} // namespace

TEST_CASE("`ringroad serve`: SIGHUP reloads, SIGTERM stops with exit 0, one log line per request") {
    const std::string folder = make_scratch_dir("service-signals");
    const std::string socket_path = folder + "/serve.sock";
    ChildService child = start_serve({demo_region_path(), "--listen", "unix:" + socket_path, "--threads", "1"});
    REQUIRE(child.wait_for("SIGINT or SIGTERM stops"));
    CHECK(child.log.find("caution") != std::string::npos);
    {
        RawConnection connection = RawConnection::unix_socket(socket_path);
        connection.send(http_request_text("GET", "/v1/status", ""));
        CHECK(connection.read_answer().status == 200);
    }
    // time, client, method, path, status, milliseconds, bytes
    CHECK(child.wait_for(" unix GET /v1/status 200 "));
    ::kill(child.pid, SIGHUP);
    CHECK(child.wait_for("reloaded " + demo_region_path()));
    ::kill(child.pid, SIGTERM);
    CHECK(wait_exit_code(child.pid) == 0);
    child.wait_for("stopped");
    CHECK(child.log.find("ringroad: stopped") != std::string::npos);
    CHECK_FALSE(file_exists(socket_path));
    ::close(child.stderr_fd);
}

TEST_CASE("`ringroad serve` refuses an address beyond this machine without --token-file (exit 1)") {
    const CommandResult result = run_ringroad({"serve", demo_region_path(), "--listen", "0.0.0.0:0"});
    CHECK(result.exit_code == 1);
    CHECK(result.err.find("--token-file") != std::string::npos);
    const CommandResult missing = run_ringroad({"serve", "/nonexistent/region.rrg", "--listen", "127.0.0.1:0"});
    CHECK(missing.exit_code == 1);
    CHECK(missing.err.find("/nonexistent/region.rrg") != std::string::npos);
}
