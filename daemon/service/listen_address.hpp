#pragma once
// Where the service listens: a TCP address (IPv4 or IPv6 literal, or "localhost") with a port,
// or a Unix socket path. parse_listen_address() accepts "127.0.0.1:PORT", "[::1]:PORT",
// "localhost:PORT", "HOST:PORT" for any other IP literal, and "unix:/path/to.sock"; it throws
// InputError naming the text otherwise. is_local() says whether only this machine can connect
// (loopback or a Unix socket); any other address needs a bearer token.

#include <cstdint>
#include <string>
#include <string_view>

namespace ringroad::service {

// Our own choice of default port (documented in the README).
inline constexpr std::uint16_t kDefaultPort = 7461;

struct ListenAddress {
    enum class Kind { tcp, unix_socket };
    Kind kind = Kind::tcp;
    std::string host = "127.0.0.1";  // an IP literal (brackets removed) when kind == tcp
    std::uint16_t port = kDefaultPort; // 0 = any free port (tests)
    std::string socket_path;           // when kind == unix_socket

    bool is_local() const;
    // "127.0.0.1:7461", "[::1]:7461", "unix:/run/ringroad.sock"
    std::string text() const;
};

ListenAddress parse_listen_address(std::string_view text);

} // namespace ringroad::service
