// Parsing listen addresses with inet_pton, so the check needs no networking library.

#include "daemon/service/listen_address.hpp"

#include "common/input_error.hpp"

#include <arpa/inet.h>
#include <charconv>
#include <cstring>

namespace ringroad::service {

namespace {

bool is_ipv4(const std::string& host, in_addr* address = nullptr) {
    in_addr parsed{};
    const bool ok = inet_pton(AF_INET, host.c_str(), &parsed) == 1;
    if (ok && address) *address = parsed;
    return ok;
}

bool is_ipv6(const std::string& host, in6_addr* address = nullptr) {
    in6_addr parsed{};
    const bool ok = inet_pton(AF_INET6, host.c_str(), &parsed) == 1;
    if (ok && address) *address = parsed;
    return ok;
}

[[noreturn]] void refuse(std::string_view text, const std::string& why) {
    throw InputError("--listen " + std::string(text) + ": " + why, "--listen");
}

} // namespace

bool ListenAddress::is_local() const {
    if (kind == Kind::unix_socket) return true;
    in_addr v4{};
    if (is_ipv4(host, &v4)) return (ntohl(v4.s_addr) >> 24) == 127;   // 127.0.0.0/8 (RFC 1122)
    in6_addr v6{};
    if (is_ipv6(host, &v6)) return IN6_IS_ADDR_LOOPBACK(&v6);           // ::1 (RFC 4291)
    return false;
}

std::string ListenAddress::text() const {
    if (kind == Kind::unix_socket) return "unix:" + socket_path;
    const bool v6 = host.find(':') != std::string::npos;
    return (v6 ? "[" + host + "]" : host) + ":" + std::to_string(port);
}

ListenAddress parse_listen_address(std::string_view text) {
    ListenAddress address;
    if (text.substr(0, 5) == "unix:") {
        address.kind = ListenAddress::Kind::unix_socket;
        address.socket_path = std::string(text.substr(5));
        if (address.socket_path.empty()) refuse(text, "the Unix socket path is empty");
        // sun_path holds 108 bytes on Linux, the terminating zero included.
        if (address.socket_path.size() >= 108) refuse(text, "the Unix socket path is longer than 107 bytes");
        return address;
    }
    std::string host;
    std::string_view port_text;
    if (!text.empty() && text.front() == '[') {
        const auto close = text.find(']');
        if (close == std::string_view::npos || close + 1 >= text.size() || text[close + 1] != ':') {
            refuse(text, "expected [IPV6]:PORT");
        }
        host = std::string(text.substr(1, close - 1));
        port_text = text.substr(close + 2);
        if (!is_ipv6(host)) refuse(text, "'" + host + "' is not an IPv6 address");
    } else {
        const auto colon = text.rfind(':');
        if (colon == std::string_view::npos) refuse(text, "expected HOST:PORT, [IPV6]:PORT or unix:/PATH");
        host = std::string(text.substr(0, colon));
        port_text = text.substr(colon + 1);
        if (host == "localhost") host = "127.0.0.1";
        if (!is_ipv4(host)) {
            refuse(text, is_ipv6(host) ? "write an IPv6 address in brackets, as [" + host + "]:PORT"
                                       : "'" + host + "' is not an IP address (names are not looked up)");
        }
    }
    unsigned port = 0;
    const auto [end, error] = std::from_chars(port_text.data(), port_text.data() + port_text.size(), port);
    if (port_text.empty() || error != std::errc() || end != port_text.data() + port_text.size() || port > 65535) {
        refuse(text, "the port must be a number from 0 to 65535");
    }
    address.kind = ListenAddress::Kind::tcp;
    address.host = host;
    address.port = static_cast<std::uint16_t>(port);
    return address;
}

} // namespace ringroad::service
