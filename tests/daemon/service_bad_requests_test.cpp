// A corpus of bad requests against a running service: each gets the right status, a JSON error
// naming the field at fault, and the service still answers GET /v1/status afterwards.
// References: RFC 9112 (message framing: Content-Length, chunked coding, what a truncated message
// is), RFC 9110 (status codes 400, 408, 413, 431), RFC 8259 (JSON grammar; numbers), RFC 3629
// (UTF-8 well-formedness); the demo town is invented (fixtures/demo).
#include "tests/daemon/service_test_support.hpp"

using namespace ringroad::test;
using nlohmann::json;

namespace {

void check_error(const HttpAnswer& answer, int status, const std::string& code, const json& field) {
    INFO(answer.body);
    REQUIRE(answer.status == status);
    const json error = answer.json().at("error");
    CHECK(error.at("code") == code);
    CHECK(error.at("field") == field);
    CHECK_FALSE(error.at("message").get<std::string>().empty());
}

void check_still_serving(std::uint16_t port) { CHECK(http_exchange(port, "GET", "/v1/status").status == 200); }

std::string tour_body(const std::string& stops_tail) {
    return R"({"stops": [{"id": "a", "lat": -47.3499, "lon": -125.398}, )" + stops_tail + "]}";
}

} // namespace

TEST_CASE("malformed JSON is 400 invalid_json, naming where the parser stood") {
    RunningService running;
    check_error(http_exchange(running.port(), "POST", "/v1/tour", "{\"stops\": [1, 2"), 400, "invalid_json", "stops[2]");
    check_error(http_exchange(running.port(), "POST", "/v1/tour", "not json"), 400, "invalid_json", nullptr);
    check_error(http_exchange(running.port(), "POST", "/v1/tour", ""), 400, "invalid_json", nullptr);
    check_still_serving(running.port());
}

TEST_CASE("a number beyond a double (1e999) is 400 naming its field") {
    // RFC 8259 section 6 lets implementations limit the range of numbers; 1e999 overflows IEEE 754 binary64.
    RunningService running;
    check_error(http_exchange(running.port(), "POST", "/v1/tour", tour_body(R"({"id": "b", "lat": 1e999, "lon": 0})")),
                400, "invalid_json", "stops[1].lat");
    check_still_serving(running.port());
}

TEST_CASE("nesting 10,000 deep is 400 too_deep, without exhausting the stack") {
    RunningService running;
    const std::string deep = "{\"stops\": " + std::string(10000, '[') + std::string(10000, ']') + "}";
    const HttpAnswer answer = http_exchange(running.port(), "POST", "/v1/matrix", deep);
    REQUIRE(answer.status == 400);
    CHECK(answer.json().at("error").at("code") == "too_deep");
    CHECK(answer.json().at("error").at("field").get<std::string>().rfind("stops[0][0]", 0) == 0);
    check_still_serving(running.port());
}

TEST_CASE("invalid UTF-8 in a string is 400 naming its field") {
    // RFC 3629 section 3: 0xC3 must be followed by a continuation byte 0x80..0xBF; 0xFF never occurs.
    RunningService running;
    check_error(http_exchange(running.port(), "POST", "/v1/tour", tour_body("{\"id\": \"b\xC3\x28\", \"lat\": 0, \"lon\": 0}")),
                400, "invalid_json", "stops[1].id");
    check_error(http_exchange(running.port(), "POST", "/v1/tour", "{\"stops\": [], \"name\": \"\xFF\"}"), 400,
                "invalid_json", "name");
    check_still_serving(running.port());
}

TEST_CASE("a body over the limit is 413 before it is read, 100 MB announced or chunked") {
    ringroad::service::ServiceOptions options = test_service_options();
    options.limits.max_body_bytes = 64 * 1024;
    RunningService running(options);
    {
        RawConnection connection = RawConnection::tcp(running.port());
        connection.send("POST /v1/matrix HTTP/1.1\r\nHost: x\r\nContent-Type: application/json\r\nContent-Length: 100000000\r\n\r\n{\"stops\": [");
        const HttpAnswer answer = connection.read_answer();
        check_error(answer, 413, "body_too_large", nullptr);
        CHECK(connection.closed_by_peer());
    }
    {
        // 100 MB actually sent in chunks: the service stops reading at the limit.
        RawConnection connection = RawConnection::tcp(running.port());
        connection.send("POST /v1/matrix HTTP/1.1\r\nHost: x\r\nTransfer-Encoding: chunked\r\n\r\n");
        const std::string chunk(1 << 20, ' ');
        char size_line[32];
        std::snprintf(size_line, sizeof size_line, "%zx\r\n", chunk.size());
        for (int i = 0; i < 100; ++i) {
            if (!connection.send(size_line + chunk + "\r\n")) break;   // the service has closed: expected
        }
        check_error(connection.read_answer(), 413, "body_too_large", nullptr);
    }
    check_still_serving(running.port());
}

TEST_CASE("a truncated body is 400 truncated_body") {
    RunningService running;
    RawConnection connection = RawConnection::tcp(running.port());
    connection.send("POST /v1/tour HTTP/1.1\r\nHost: x\r\nContent-Length: 100\r\n\r\n{\"stops\": [");
    connection.shutdown_write();
    check_error(connection.read_answer(), 400, "truncated_body", nullptr);
    check_still_serving(running.port());
}

TEST_CASE("a Content-Length shorter than the body cuts the JSON; a malformed one is 400") {
    RunningService running;
    {
        RawConnection connection = RawConnection::tcp(running.port());
        const std::string body = R"({"stops": []})";
        connection.send("POST /v1/tour HTTP/1.1\r\nHost: x\r\nContent-Length: 5\r\n\r\n" + body);
        check_error(connection.read_answer(), 400, "invalid_json", nullptr);   // {"sto: cut inside a name
        // The rest of the body is then read as the next request line: not HTTP, 400, closed.
        check_error(connection.read_answer(), 400, "bad_http", nullptr);
        CHECK(connection.closed_by_peer());
    }
    for (const char* length : {"abc", "-1", "5, 6"}) {
        RawConnection connection = RawConnection::tcp(running.port());
        connection.send(std::string("POST /v1/tour HTTP/1.1\r\nHost: x\r\nContent-Length: ") + length + "\r\n\r\n{}");
        check_error(connection.read_answer(), 400, "bad_http", nullptr);
    }
    check_still_serving(running.port());
}

TEST_CASE("a chunked body is read (RFC 9112 section 7.1); a malformed chunk is 400") {
    RunningService running;
    {
        RawConnection connection = RawConnection::tcp(running.port());
        connection.send("POST /v1/tour HTTP/1.1\r\nHost: x\r\nTransfer-Encoding: chunked\r\n\r\n"
                        "5\r\n{\"sto\r\n0\r\n\r\n");
        // The five bytes arrived whole and are not JSON: the parser, not the framing, refuses them.
        check_error(connection.read_answer(), 400, "invalid_json", nullptr);
    }
    {
        RawConnection connection = RawConnection::tcp(running.port());
        connection.send("POST /v1/tour HTTP/1.1\r\nHost: x\r\nTransfer-Encoding: chunked\r\n\r\nzz\r\n{}\r\n0\r\n\r\n");
        check_error(connection.read_answer(), 400, "bad_http", nullptr);
    }
    check_still_serving(running.port());
}

TEST_CASE("a header flood is 431 headers_too_large") {
    RunningService running;
    std::string request = "GET /v1/status HTTP/1.1\r\nHost: x\r\n";
    for (int i = 0; i < 5000; ++i) request += "X-Flood-" + std::to_string(i) + ": " + std::string(20, 'f') + "\r\n";
    request += "\r\n";
    RawConnection connection = RawConnection::tcp(running.port());
    connection.send(request);
    check_error(connection.read_answer(), 431, "headers_too_large", nullptr);
    check_still_serving(running.port());
}

TEST_CASE("a client sending one byte a second is cut off by the header timeout (408)") {
    ringroad::service::ServiceOptions options = test_service_options();
    options.limits.header_timeout = std::chrono::milliseconds(1500);
    RunningService running(options);
    RawConnection connection = RawConnection::tcp(running.port());
    const std::string request = http_request_text("GET", "/v1/status", "");
    bool cut_off = false;
    for (std::size_t i = 0; i < 5 && !cut_off; ++i) {   // 5 s at most; the request needs 40
        cut_off = !connection.send(request.substr(i, 1));
        std::this_thread::sleep_for(std::chrono::seconds(1));
    }
    check_error(connection.read_answer(), 408, "timeout", nullptr);
    check_still_serving(running.port());
}

TEST_CASE("a slow body is cut off by the body timeout, a silent connection by the idle timeout") {
    ringroad::service::ServiceOptions options = test_service_options();
    options.limits.body_timeout = std::chrono::milliseconds(500);
    options.limits.idle_timeout = std::chrono::milliseconds(500);
    RunningService running(options);
    {
        RawConnection connection = RawConnection::tcp(running.port());
        connection.send("POST /v1/tour HTTP/1.1\r\nHost: x\r\nContent-Length: 50\r\n\r\n{");
        check_error(connection.read_answer(), 408, "timeout", nullptr);
    }
    {
        RawConnection connection = RawConnection::tcp(running.port());
        CHECK(connection.closed_by_peer());   // nothing sent: closed after 0.5 s, without an answer
    }
    check_still_serving(running.port());
}
