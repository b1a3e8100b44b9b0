// A synchronous Beast client: one connection, one request. The second file that includes Beast.

#include "daemon/service/server_client.hpp"

#include "common/input_error.hpp"
#include "daemon/service/listen_address.hpp"

#include <boost/asio/connect.hpp>
#include <boost/asio/io_context.hpp>
#include <boost/asio/ip/tcp.hpp>
#include <boost/asio/local/stream_protocol.hpp>
#include <boost/beast/core/flat_buffer.hpp>
#include <boost/beast/http/read.hpp>
#include <boost/beast/http/string_body.hpp>
#include <boost/beast/http/write.hpp>

#include <cstdlib>

namespace ringroad::service {

namespace {

namespace net = boost::asio;
namespace http = boost::beast::http;

const char* question_path(answers::Question question) {
    switch (question) {
    case answers::Question::matrix: return "/v1/matrix";
    case answers::Question::tour: return "/v1/tour";
    case answers::Question::network: return "/v1/network";
    case answers::Question::route: return "/v1/route";
    }
    return "/v1/status";
}

template <class Socket>
http::response<http::string_body> post_and_read(Socket& socket, const http::request<http::string_body>& request) {
    http::write(socket, request);
    boost::beast::flat_buffer buffer;
    http::response_parser<http::string_body> parser;
    parser.body_limit(std::uint64_t{1} << 32);   // answers can be large (a 2000 x 2000 matrix)
    http::read(socket, buffer, parser);
    return parser.release();
}

} // namespace

nlohmann::ordered_json answer_from_server(const std::string& url, answers::Question question,
                                          const nlohmann::ordered_json& body) {
    std::string address_text = url;
    if (address_text.rfind("http://", 0) == 0) {
        address_text.erase(0, 7);
        while (!address_text.empty() && address_text.back() == '/') address_text.pop_back();
    } else if (address_text.rfind("unix:", 0) != 0) {
        throw InputError("--server " + url + ": expected http://HOST:PORT or unix:/path.sock (https is not spoken; "
                         "put a TLS proxy on the service side)",
                         "--server");
    }
    ListenAddress address;
    try {
        address = parse_listen_address(address_text);
    } catch (const InputError& error) {
        throw InputError("--server " + url + ": not a service address (" + error.what() + ")", "--server");
    }
    http::request<http::string_body> request{http::verb::post, question_path(question), 11};
    request.set(http::field::host, address.kind == ListenAddress::Kind::tcp ? address.text() : "localhost");
    request.set(http::field::content_type, "application/json");
    request.set(http::field::user_agent, "ringroad");
    if (const char* token = std::getenv("RINGROAD_TOKEN"); token && *token) {
        request.set(http::field::authorization, std::string("Bearer ") + token);
    }
    request.body() = body.dump();
    request.keep_alive(false);
    request.prepare_payload();

    http::response<http::string_body> response;
    try {
        net::io_context io;
        if (address.kind == ListenAddress::Kind::unix_socket) {
            net::local::stream_protocol::socket socket(io);
            socket.connect(net::local::stream_protocol::endpoint(address.socket_path));
            response = post_and_read(socket, request);
        } else {
            net::ip::tcp::socket socket(io);
            socket.connect(net::ip::tcp::endpoint(net::ip::make_address(address.host), address.port));
            response = post_and_read(socket, request);
        }
    } catch (const boost::system::system_error& error) {
        throw InputError("--server " + url + ": " + error.code().message(), "--server");
    }

    nlohmann::ordered_json document;
    try {
        document = nlohmann::ordered_json::parse(response.body());
    } catch (const nlohmann::json::exception&) {
        throw InputError("--server " + url + ": the reply (HTTP " + std::to_string(response.result_int()) + ") is not JSON",
                         "--server");
    }
    if (response.result_int() == 200) return document;
    const auto error = document.value("error", nlohmann::ordered_json::object());
    const std::string message = error.value("message", "no message");
    const std::string field = error.contains("field") && error["field"].is_string() ? error["field"].get<std::string>() : "";
    if (response.result_int() >= 500 || response.result_int() == 401 || response.result_int() == 429) {
        throw InputError("--server " + url + ": HTTP " + std::to_string(response.result_int()) + ": " + message, "--server");
    }
    throw answers::RequestError(response.result_int(), error.value("code", "refused"), message, field);
}

} // namespace ringroad::service
