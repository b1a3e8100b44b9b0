// Faults injected through ServiceOptions::answer (the function that answers the four questions):
// one that throws (500 with an incident id, also in the log; the service keeps serving), and one
// that holds its worker until the test lets it go (a full queue is 429, a request arriving while
// the service stops is 503, every request received before the stop completes). Status codes
// follow RFC 9110 (500) and RFC 6585 (429); the region is the invented demo town.
#include "tests/daemon/service_test_support.hpp"

#include <condition_variable>
#include <future>
#include <mutex>
#include <sstream>

using namespace ringroad::test;
using nlohmann::json;

namespace {

// A gate the injected answer waits at until the test opens it.
class Gate {
public:
    void open() {
        std::lock_guard lock(mutex_);
        open_ = true;
        opened_.notify_all();
    }
    void pass() {
        std::unique_lock lock(mutex_);
        opened_.wait(lock, [&] { return open_; });
    }

private:
    std::mutex mutex_;
    std::condition_variable opened_;
    bool open_ = false;
};

const std::string kBody = R"({"stops": []})";

json work(std::uint16_t port) { return http_exchange(port, "GET", "/v1/status").json().at("work"); }

void wait_for_work(std::uint16_t port, int running, int queued) {
    for (int wait = 0; wait < 2000; ++wait) {   // 10 s at most
        const json now = work(port);
        if (now.at("running") == running && now.at("queued") == queued) return;
        std::this_thread::sleep_for(std::chrono::milliseconds(5));
    }
    FAIL("the service never had " << running << " running and " << queued << " queued");
}

} // namespace

TEST_CASE("an unexpected failure is 500 with an incident id that is also in the log; the service keeps serving") {
    std::ostringstream log;
    ringroad::service::ServiceOptions options = test_service_options();
    std::atomic<int> calls{0};
    options.answer = [&](auto, const auto&, auto, auto) -> nlohmann::ordered_json {
        if (calls++ == 0) throw std::runtime_error("injected failure");
        return {{"fine", true}};
    };
    options.log = &log;
    auto running = std::make_unique<RunningService>(options);
    const HttpAnswer failed = http_exchange(running->port(), "POST", "/v1/tour", kBody);
    REQUIRE(failed.status == 500);
    const json error = failed.json().at("error");
    CHECK(error.at("code") == "internal_error");
    const std::string message = error.at("message");
    const auto at = message.find("incident ");
    REQUIRE(at != std::string::npos);
    const std::string incident = message.substr(at + 9, 16);
    CHECK(message.find("injected") == std::string::npos);   // internals stay in the log
    CHECK(http_exchange(running->port(), "POST", "/v1/tour", kBody).status == 200);
    CHECK(http_exchange(running->port(), "GET", "/v1/status").status == 200);
    running.reset();
    CHECK(log.str().find("incident " + incident) != std::string::npos);
    CHECK(log.str().find("injected failure") != std::string::npos);
    CHECK(log.str().find("POST /v1/tour 500 ") != std::string::npos);
}

TEST_CASE("requests share the workers: each learns its share of the cores and the time limits in force") {
    ringroad::service::ServiceOptions options = test_service_options();
    options.threads = 2;
    options.limits.default_time_limit_seconds = 0.5;
    options.limits.max_time_limit_seconds = 7.0;
    ringroad::answers::AnswerLimits seen;
    options.answer = [&](auto, const auto&, auto, const ringroad::answers::AnswerLimits& limits) -> nlohmann::ordered_json {
        seen = limits;
        return {};
    };
    RunningService running(options);
    REQUIRE(http_exchange(running.port(), "POST", "/v1/matrix", kBody).status == 200);
    CHECK(seen.matrix_threads == 2);   // alone: both workers' cores
    CHECK(seen.default_time_limit_seconds == 0.5);
    CHECK(seen.max_time_limit_seconds == 7.0);
    CHECK(seen.max_stops == options.limits.max_stops);
    CHECK(seen.max_matrix_cells == options.limits.max_matrix_cells);
}

TEST_CASE("a full queue is 429 busy; the requests already queued are answered") {
    ringroad::service::ServiceOptions options = test_service_options();
    options.threads = 1;
    options.limits.max_queued = 2;
    Gate gate;
    options.answer = [&](auto, const auto&, auto, auto) -> nlohmann::ordered_json {
        gate.pass();
        return {{"fine", true}};
    };
    RunningService running(options);
    std::vector<RawConnection> accepted;
    for (int i = 0; i < 3; ++i) {
        accepted.push_back(RawConnection::tcp(running.port()));
        accepted.back().send(http_request_text("POST", "/v1/matrix", kBody));
        wait_for_work(running.port(), 1, i);   // one on the worker, the others waiting
    }
    const HttpAnswer refused = http_exchange(running.port(), "POST", "/v1/matrix", kBody);
    CHECK(refused.status == 429);
    CHECK(refused.headers.at("retry-after") == "1");
    CHECK(refused.json().at("error").at("code") == "busy");
    gate.open();
    for (RawConnection& connection : accepted) CHECK(connection.read_answer().status == 200);
    const json requests = http_exchange(running.port(), "GET", "/v1/status").json().at("requests");
    CHECK(requests.at("matrix").at("served") == 3);
    CHECK(requests.at("matrix").at("failed") == 1);
}

TEST_CASE("stop with requests in flight: every one completes; one arriving during the stop gets 503") {
    ringroad::service::ServiceOptions options = test_service_options();
    options.threads = 1;
    Gate gate;
    options.answer = [&](auto, const auto&, auto, auto) -> nlohmann::ordered_json {
        gate.pass();
        return {{"fine", true}};
    };
    RunningService running(options);
    constexpr int kRequests = 6;
    std::vector<RawConnection> in_flight;
    for (int i = 0; i < kRequests; ++i) {
        in_flight.push_back(RawConnection::tcp(running.port()));
        in_flight.back().send(http_request_text("POST", "/v1/tour", kBody));
    }
    wait_for_work(running.port(), 1, kRequests - 1);
    // A request whose headers are still arriving when the stop begins.
    RawConnection late = RawConnection::tcp(running.port());
    late.send("POST /v1/tour HTTP/1.1\r\nHost: x\r\n");
    std::this_thread::sleep_for(std::chrono::milliseconds(50));
    std::thread stopper([&] { running.stop(); });
    // The stop has begun once new connections are refused.
    for (int wait = 0; wait < 2000; ++wait) {
        try {
            RawConnection::tcp(running.port());
        } catch (const std::exception&) {
            break;
        }
        std::this_thread::sleep_for(std::chrono::milliseconds(5));
    }
    late.send("Content-Length: " + std::to_string(kBody.size()) + "\r\n\r\n" + kBody);
    const HttpAnswer refused = late.read_answer();
    CHECK(refused.status == 503);
    CHECK(refused.json().at("error").at("code") == "stopping");
    gate.open();
    for (RawConnection& connection : in_flight) {
        const HttpAnswer answer = connection.read_answer();
        CHECK(answer.status == 200);
        CHECK(answer.headers.at("connection") == "close");
    }
    stopper.join();
}
