#pragma once
// Test helpers for the service: the demo town built once per test program, a Service run in the
// test process on an ephemeral loopback port or a Unix socket, and a plain-socket HTTP/1.1 client
// (no Beast here, so the tests can send anything at all: truncated bodies, floods, one byte at a
// time). Every socket has a receive timeout, so a test that goes wrong fails instead of hanging.

#include "daemon/service/service.hpp"
#include "tests/support/run_command.hpp"

#include <catch2/catch.hpp>
#include <nlohmann/json.hpp>

#include <arpa/inet.h>
#include <netinet/in.h>
#include <netinet/tcp.h>
#include <sys/socket.h>
#include <sys/un.h>
#include <unistd.h>

#include <algorithm>
#include <cctype>
#include <cerrno>
#include <chrono>
#include <cstring>
#include <map>
#include <memory>
#include <sstream>
#include <stdexcept>
#include <string>
#include <thread>
#include <vector>

namespace ringroad::test {

// The demo town of fixtures/demo (invented, see fixtures/demo/README.md), built with the real
// binary into a scratch folder once per test program.
inline const std::string& demo_region_path() {
    static const std::string path = [] {
        const std::string folder = make_scratch_dir("service-region");
        const std::string region = folder + "/port-ambrell.rrg";
        const CommandResult built = run_ringroad({"build", fixture_path("demo/port-ambrell.osm"), "-o", region});
        if (built.exit_code != 0) throw std::runtime_error("building the demo town failed: " + built.err);
        return region;
    }();
    return path;
}

// The stops of fixtures/demo/stops.csv as a JSON array [{"id","lat","lon","name"}].
inline nlohmann::json demo_stops_json(std::size_t count = 100) {
    std::istringstream csv(read_file(fixture_path("demo/stops.csv")));
    std::string line;
    std::getline(csv, line);   // header id,lat,lon,name
    nlohmann::json stops = nlohmann::json::array();
    while (std::getline(csv, line) && stops.size() < count) {
        std::vector<std::string> cells;
        std::stringstream row(line);
        for (std::string cell; std::getline(row, cell, ',');) cells.push_back(cell);
        if (cells.size() < 3) continue;
        nlohmann::json stop = {{"id", cells[0]}, {"lat", std::stod(cells[1])}, {"lon", std::stod(cells[2])}};
        if (cells.size() > 3) stop["name"] = cells[3];
        stops.push_back(stop);
    }
    return stops;
}

struct HttpAnswer {
    int status = 0;                               // 0: the connection closed without an answer
    std::map<std::string, std::string> headers;   // names in lower case
    std::string body;
    nlohmann::json json() const { return nlohmann::json::parse(body); }
};

// One client connection over a plain socket.
class RawConnection {
public:
    static RawConnection tcp(std::uint16_t port) {
        RawConnection connection(::socket(AF_INET, SOCK_STREAM, 0));
        sockaddr_in address{};
        address.sin_family = AF_INET;
        address.sin_port = htons(port);
        address.sin_addr.s_addr = htonl(INADDR_LOOPBACK);
        if (::connect(connection.fd_, reinterpret_cast<sockaddr*>(&address), sizeof address) != 0) {
            throw std::runtime_error("cannot connect to 127.0.0.1:" + std::to_string(port));
        }
        int one = 1;
        ::setsockopt(connection.fd_, IPPROTO_TCP, TCP_NODELAY, &one, sizeof one);
        return connection;
    }
    static RawConnection unix_socket(const std::string& path) {
        RawConnection connection(::socket(AF_UNIX, SOCK_STREAM, 0));
        sockaddr_un address{};
        address.sun_family = AF_UNIX;
        std::strncpy(address.sun_path, path.c_str(), sizeof address.sun_path - 1);
        if (::connect(connection.fd_, reinterpret_cast<sockaddr*>(&address), sizeof address) != 0) {
            throw std::runtime_error("cannot connect to " + path);
        }
        return connection;
    }

    RawConnection(RawConnection&& other) noexcept : fd_(other.fd_), pending_(std::move(other.pending_)) { other.fd_ = -1; }
    RawConnection(const RawConnection&) = delete;
    ~RawConnection() {
        if (fd_ >= 0) ::close(fd_);
    }

    // False when the peer has closed (the write failed).
    bool send(const std::string& bytes) {
        std::size_t sent = 0;
        while (sent < bytes.size()) {
            const ssize_t n = ::send(fd_, bytes.data() + sent, bytes.size() - sent, MSG_NOSIGNAL);
            if (n <= 0) return false;
            sent += static_cast<std::size_t>(n);
        }
        return true;
    }
    void shutdown_write() { ::shutdown(fd_, SHUT_WR); }

    // Reads one response (Content-Length framing, which is all the service sends).
    HttpAnswer read_answer() {
        HttpAnswer answer;
        std::size_t header_end;
        while ((header_end = pending_.find("\r\n\r\n")) == std::string::npos) {
            if (!fill()) return answer;
        }
        std::istringstream head(pending_.substr(0, header_end));
        std::string line;
        std::getline(head, line);
        answer.status = std::stoi(line.substr(9, 3));
        while (std::getline(head, line)) {
            if (!line.empty() && line.back() == '\r') line.pop_back();
            const auto colon = line.find(':');
            if (colon == std::string::npos) continue;
            std::string name = line.substr(0, colon);
            std::transform(name.begin(), name.end(), name.begin(), [](unsigned char c) { return std::tolower(c); });
            answer.headers[name] = line.substr(line.find_first_not_of(' ', colon + 1));
        }
        pending_.erase(0, header_end + 4);
        if (answer.status == 100) return read_answer();
        const std::size_t length = answer.headers.count("content-length") ? std::stoul(answer.headers["content-length"]) : 0;
        while (pending_.size() < length) {
            if (!fill()) break;
        }
        answer.body = pending_.substr(0, length);
        pending_.erase(0, std::min(length, pending_.size()));
        return answer;
    }

    // Whether the server closed the connection (reads end) within the receive timeout.
    bool closed_by_peer() {
        while (true) {
            char buffer[4096];
            const ssize_t n = ::recv(fd_, buffer, sizeof buffer, 0);
            if (n == 0) return true;
            if (n < 0) return errno == ECONNRESET;
        }
    }

private:
    explicit RawConnection(int fd) : fd_(fd) {
        timeval timeout{20, 0};   // a test that goes wrong fails instead of hanging
        ::setsockopt(fd_, SOL_SOCKET, SO_RCVTIMEO, &timeout, sizeof timeout);
        ::setsockopt(fd_, SOL_SOCKET, SO_SNDTIMEO, &timeout, sizeof timeout);
    }
    bool fill() {
        char buffer[65536];
        const ssize_t n = ::recv(fd_, buffer, sizeof buffer, 0);
        if (n <= 0) return false;
        pending_.append(buffer, static_cast<std::size_t>(n));
        return true;
    }

    int fd_ = -1;
    std::string pending_;
};

inline std::string http_request_text(const std::string& method, const std::string& path, const std::string& body,
                                     const std::string& extra_headers = {}) {
    std::string text = method + " " + path + " HTTP/1.1\r\nHost: localhost\r\n" + extra_headers;
    if (method != "GET" || !body.empty()) {
        text += "Content-Type: application/json\r\nContent-Length: " + std::to_string(body.size()) + "\r\n";
    }
    return text + "\r\n" + body;
}

// One request on a fresh connection.
inline HttpAnswer http_exchange(std::uint16_t port, const std::string& method, const std::string& path,
                                const std::string& body = {}, const std::string& extra_headers = {}) {
    RawConnection connection = RawConnection::tcp(port);
    connection.send(http_request_text(method, path, body, extra_headers));
    return connection.read_answer();
}

// Options for a service in a test: the demo town, an ephemeral loopback port, silent log.
inline service::ServiceOptions test_service_options() {
    service::ServiceOptions options;
    options.region_path = demo_region_path();
    options.listen = service::parse_listen_address("127.0.0.1:0");
    options.threads = 2;
    return options;
}

// A Service running on background threads for the length of a test.
class RunningService {
public:
    explicit RunningService(service::ServiceOptions options = test_service_options())
        : service_(std::make_unique<service::Service>(std::move(options))) {
        service_->start();
    }
    ~RunningService() { service_->stop(); }
    std::uint16_t port() const { return service_->port(); }
    service::Service& service() { return *service_; }
    void stop() { service_->stop(); }

private:
    std::unique_ptr<service::Service> service_;
};

} // namespace ringroad::test
