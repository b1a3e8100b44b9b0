// `ringroad serve` over real sockets: an ephemeral loopback port and a Unix socket, status,
// unknown endpoints and methods, keep-alive, pipelining, chunked bodies, Expect: 100-continue.
// References: RFC 9112 (HTTP/1.1 message framing, keep-alive, chunked transfer coding) and
// RFC 9110 (status codes 404, 405, 100 Continue); the demo town is invented (fixtures/demo).
#include "common/safety_notice.hpp"
#include "tests/daemon/service_test_support.hpp"

#include <sys/stat.h>

using namespace ringroad::test;
using nlohmann::json;

TEST_CASE("status on an ephemeral loopback port names the region, limits and the caution") {
    RunningService running;
    REQUIRE(running.port() != 0);
    const HttpAnswer answer = http_exchange(running.port(), "GET", "/v1/status");
    REQUIRE(answer.status == 200);
    CHECK(answer.headers.at("content-type") == "application/json");
    const json status = answer.json();
    CHECK(status.at("caution") == ringroad::kSafetyNotice);
    CHECK(status.at("region").at("file") == demo_region_path());
    CHECK(status.at("region").at("junctions").get<long>() > 0);
    CHECK(status.at("region").at("source").get<std::string>().find("port-ambrell") != std::string::npos);
    CHECK(status.at("region").contains("source_timestamp"));
    CHECK(status.at("region").at("profile") == "car");
    CHECK(status.at("limits").at("max_body_bytes") == ringroad::service::ServiceLimits{}.max_body_bytes);
    CHECK(status.at("limits").at("max_queued") == ringroad::service::ServiceLimits{}.max_queued);
    CHECK(status.at("work").at("workers") == 2);
    CHECK(status.at("uptime_seconds").get<double>() >= 0.0);
    for (const char* endpoint : {"matrix", "tour", "network", "route", "status", "reload"}) {
        CHECK(status.at("requests").contains(endpoint));
    }
}

TEST_CASE("status counts requests served and failed per endpoint, with latency percentiles") {
    RunningService running;
    for (int i = 0; i < 3; ++i) REQUIRE(http_exchange(running.port(), "GET", "/v1/status").status == 200);
    REQUIRE(http_exchange(running.port(), "GET", "/v1/nowhere").status == 404);
    const json requests = http_exchange(running.port(), "GET", "/v1/status").json().at("requests");
    CHECK(requests.at("status").at("served") == 3);
    CHECK(requests.at("other").at("failed") == 1);
    const json latency = requests.at("status").at("latency_ms");
    CHECK(latency.at("p50").get<double>() <= latency.at("p99").get<double>());
    CHECK(latency.at("p99").get<double>() <= latency.at("max").get<double>());
}

TEST_CASE("an unknown endpoint is 404 and a wrong method 405, with a JSON error") {
    RunningService running;
    const HttpAnswer unknown = http_exchange(running.port(), "POST", "/v1/teleport", "{}");
    CHECK(unknown.status == 404);
    CHECK(unknown.json().at("error").at("code") == "unknown_endpoint");
    const HttpAnswer wrong = http_exchange(running.port(), "GET", "/v1/tour");
    CHECK(wrong.status == 405);
    CHECK(wrong.json().at("error").at("code") == "method_not_allowed");
    CHECK(http_exchange(running.port(), "DELETE", "/v1/status").status == 405);
    CHECK(http_exchange(running.port(), "GET", "/v1/reload").status == 405);
}

TEST_CASE("one connection carries many requests (keep-alive), pipelined ones too") {
    RunningService running;
    RawConnection connection = RawConnection::tcp(running.port());
    for (int i = 0; i < 5; ++i) {
        REQUIRE(connection.send(http_request_text("GET", "/v1/status", "")));
        CHECK(connection.read_answer().status == 200);
    }
    // RFC 9112 section 9.3.2: answers to pipelined requests come in order.
    REQUIRE(connection.send(http_request_text("GET", "/v1/status", "") + http_request_text("GET", "/v1/nope", "") +
                            http_request_text("GET", "/v1/status", "")));
    CHECK(connection.read_answer().status == 200);
    CHECK(connection.read_answer().status == 404);
    CHECK(connection.read_answer().status == 200);
}

TEST_CASE("Connection: close is honoured") {
    RunningService running;
    RawConnection connection = RawConnection::tcp(running.port());
    REQUIRE(connection.send(http_request_text("GET", "/v1/status", "", "Connection: close\r\n")));
    const HttpAnswer answer = connection.read_answer();
    CHECK(answer.status == 200);
    CHECK(answer.headers.at("connection") == "close");
    CHECK(connection.closed_by_peer());
}

TEST_CASE("the service listens on a Unix socket created with mode 0660") {
    const std::string folder = make_scratch_dir("service-unix");
    const std::string socket_path = folder + "/ringroad.sock";
    ringroad::service::ServiceOptions options = test_service_options();
    options.listen = ringroad::service::parse_listen_address("unix:" + socket_path);
    {
        RunningService running(options);
        struct stat info {};
        REQUIRE(::stat(socket_path.c_str(), &info) == 0);
        CHECK(S_ISSOCK(info.st_mode));
        CHECK((info.st_mode & 0777) == 0660);
        RawConnection connection = RawConnection::unix_socket(socket_path);
        REQUIRE(connection.send(http_request_text("GET", "/v1/status", "")));
        const HttpAnswer answer = connection.read_answer();
        REQUIRE(answer.status == 200);
        CHECK(answer.json().at("listen") == "unix:" + socket_path);
    }
    CHECK_FALSE(file_exists(socket_path));   // removed on stop
}

TEST_CASE("a stale Unix socket file is replaced; a path that is not a socket is refused") {
    const std::string folder = make_scratch_dir("service-unix-stale");
    const std::string socket_path = folder + "/ringroad.sock";
    ringroad::service::ServiceOptions options = test_service_options();
    options.listen = ringroad::service::parse_listen_address("unix:" + socket_path);
    { RunningService first(options); }
    { RunningService second(options); }   // first removed its socket; a crash would leave it, see below
    write_file(socket_path, "not a socket");
    CHECK_THROWS_WITH(ringroad::service::Service(options), Catch::Contains("not a socket"));
}
