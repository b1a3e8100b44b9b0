// Who may use the service: loopback and Unix sockets without a token; any other address only with
// --token-file, and then every request needs "Authorization: Bearer <token>" (RFC 6750 section
// 2.1), 401 otherwise. Addresses follow RFC 1122 (127.0.0.0/8 is loopback) and RFC 4291 (::1).
#include "common/input_error.hpp"
#include "daemon/service/bearer_token.hpp"
#include "daemon/service/listen_address.hpp"
#include "tests/daemon/service_test_support.hpp"

using namespace ringroad::test;
using ringroad::service::parse_listen_address;

namespace {
const std::string kToken = "k5Zt8yQw2nR4pL7vX9cB";
}

TEST_CASE("listen addresses: loopback, IPv6 in brackets, Unix sockets; the rest is not local") {
    CHECK(parse_listen_address("127.0.0.1:7461").is_local());
    CHECK(parse_listen_address("127.8.9.1:80").is_local());
    CHECK(parse_listen_address("[::1]:7461").is_local());
    CHECK(parse_listen_address("localhost:7461").host == "127.0.0.1");
    CHECK(parse_listen_address("unix:/tmp/r.sock").is_local());
    CHECK(parse_listen_address("unix:/tmp/r.sock").socket_path == "/tmp/r.sock");
    CHECK_FALSE(parse_listen_address("0.0.0.0:7461").is_local());
    CHECK_FALSE(parse_listen_address("192.168.1.5:7461").is_local());
    CHECK_FALSE(parse_listen_address("[::]:7461").is_local());
    CHECK(parse_listen_address("[::1]:8080").text() == "[::1]:8080");
    for (const char* bad : {"7461", "example.org:80", "::1:80", "[::1]80", "127.0.0.1:", "127.0.0.1:70000",
                            "127.0.0.1:8x", "unix:", "[nonsense]:1"}) {
        INFO(bad);
        CHECK_THROWS_AS(parse_listen_address(bad), ringroad::InputError);
    }
}

TEST_CASE("any address beyond this machine is refused without a token") {
    ringroad::service::ServiceOptions options = test_service_options();
    options.listen = parse_listen_address("0.0.0.0:0");
    // Refused before anything is bound: tests never listen beyond loopback.
    CHECK_THROWS_WITH(ringroad::service::Service(options), Catch::Contains("--token-file"));
}

TEST_CASE("the token file: first line, at least 16 characters") {
    const std::string folder = make_scratch_dir("service-token");
    write_file(folder + "/good", "  " + kToken + "  \nsecond line ignored\n");
    CHECK(ringroad::service::read_token_file(folder + "/good") == kToken);
    write_file(folder + "/short", "abc\n");
    CHECK_THROWS_WITH(ringroad::service::read_token_file(folder + "/short"), Catch::Contains("at least 16"));
    CHECK_THROWS_WITH(ringroad::service::read_token_file(folder + "/missing"), Catch::Contains("cannot read"));
}

TEST_CASE("bearer tokens are compared exactly; the scheme name in any case") {
    using ringroad::service::bearer_token_matches;
    CHECK(bearer_token_matches("Bearer " + kToken, kToken));
    CHECK(bearer_token_matches("bearer " + kToken, kToken));
    CHECK_FALSE(bearer_token_matches("", kToken));
    CHECK_FALSE(bearer_token_matches("Bearer", kToken));
    CHECK_FALSE(bearer_token_matches("Bearer " + kToken + "x", kToken));
    CHECK_FALSE(bearer_token_matches("Bearer " + kToken.substr(1), kToken));
    CHECK_FALSE(bearer_token_matches("Basic " + kToken, kToken));
}

TEST_CASE("with a token, a request without it or with a wrong one gets 401 and nothing else") {
    ringroad::service::ServiceOptions options = test_service_options();
    options.token = kToken;
    RunningService running(options);
    for (const std::string& header : std::vector<std::string>{"", "Authorization: Bearer wrong-token-0000000\r\n",
                                      "Authorization: " + kToken + "\r\n", "Authorization: Bearer " + kToken + "0\r\n"}) {
        INFO(header);
        for (const auto& [method, path] : {std::pair{"GET", "/v1/status"}, {"POST", "/v1/reload"}, {"POST", "/v1/tour"},
                                           {"GET", "/v1/unknown"}}) {
            const HttpAnswer answer = http_exchange(running.port(), method, path, method == std::string("POST") ? "{}" : "", header);
            CHECK(answer.status == 401);
            CHECK(answer.headers.at("www-authenticate") == "Bearer");
            CHECK(answer.json().at("error").at("code") == "unauthorized");
            // Nothing else: no region, no counts.
            CHECK(answer.body.find("junctions") == std::string::npos);
        }
    }
    const HttpAnswer allowed = http_exchange(running.port(), "GET", "/v1/status", "", "Authorization: Bearer " + kToken + "\r\n");
    CHECK(allowed.status == 200);
    CHECK(allowed.json().at("authentication") == "bearer token");
}
