// The HTTP side of the service on Boost.Asio and Boost.Beast: the listening socket (TCP or Unix),
// one session per connection with its read timeouts, the worker pool that computes, the request
// log, signals, reload and stop. The only server-side file that includes Asio and Beast.

#include "daemon/service/service.hpp"

#include "common/input_error.hpp"
#include "common/safety_notice.hpp"
#include "daemon/service/bearer_token.hpp"
#include "daemon/service/endpoints.hpp"
#include "daemon/service/reply.hpp"
#include "daemon/service/request_stats.hpp"

#include <boost/asio/bind_executor.hpp>
#include <boost/asio/io_context.hpp>
#include <boost/asio/ip/tcp.hpp>
#include <boost/asio/local/stream_protocol.hpp>
#include <boost/asio/post.hpp>
#include <boost/asio/signal_set.hpp>
#include <boost/asio/steady_timer.hpp>
#include <boost/asio/thread_pool.hpp>
#include <boost/asio/write.hpp>
#include <boost/beast/core/flat_buffer.hpp>
#include <boost/beast/http/error.hpp>
#include <boost/beast/http/parser.hpp>
#include <boost/beast/http/read.hpp>
#include <boost/beast/http/string_body.hpp>
#include <boost/beast/http/write.hpp>
#include <nlohmann/json.hpp>

#include <sys/socket.h>
#include <sys/stat.h>
#include <sys/un.h>
#include <unistd.h>

#include <atomic>
#include <cerrno>
#include <chrono>
#include <csignal>
#include <cstring>
#include <ctime>
#include <functional>
#include <list>
#include <mutex>
#include <optional>
#include <ostream>
#include <thread>

namespace ringroad::service {

namespace net = boost::asio;
namespace http = boost::beast::http;
using tcp = net::ip::tcp;
using unix_socket = net::local::stream_protocol;
using Clock = std::chrono::steady_clock;

namespace {

std::string utc_now_text() {
    const auto now = std::chrono::system_clock::now();
    const std::time_t seconds = std::chrono::system_clock::to_time_t(now);
    const auto millis = std::chrono::duration_cast<std::chrono::milliseconds>(now.time_since_epoch()).count() % 1000;
    std::tm parts{};
    gmtime_r(&seconds, &parts);
    char text[40];
    const std::size_t length = std::strftime(text, sizeof text, "%Y-%m-%dT%H:%M:%S", &parts);
    std::snprintf(text + length, sizeof text - length, ".%03dZ", static_cast<int>(millis));
    return text;
}

// A Unix socket path left behind by a service that is gone is removed; one that a running
// service still answers on, or a file that is not a socket, is refused.
void clear_stale_socket(const std::string& path) {
    struct stat info {};
    if (::lstat(path.c_str(), &info) != 0) return;
    if (!S_ISSOCK(info.st_mode)) throw InputError("--listen unix:" + path + ": the path exists and is not a socket", "--listen");
    const int probe = ::socket(AF_UNIX, SOCK_STREAM, 0);
    sockaddr_un address{};
    address.sun_family = AF_UNIX;
    std::strncpy(address.sun_path, path.c_str(), sizeof address.sun_path - 1);
    const bool answered = ::connect(probe, reinterpret_cast<sockaddr*>(&address), sizeof address) == 0;
    ::close(probe);
    if (answered) throw InputError("--listen unix:" + path + ": another service is listening there", "--listen");
    ::unlink(path.c_str());
}

} // namespace

// What every session shares: the options, the region, the counters, the pool.
struct Service::Impl {
    explicit Impl(ServiceOptions given);

    // Declared before the io_context and the pool: handlers and sessions they still hold when they
    // are destroyed may touch these.
    ServiceOptions options;
    unsigned workers_count;
    RegionHolder region;
    RequestStats stats;
    const Clock::time_point started = Clock::now();
    std::atomic<bool> stopping{false};
    std::atomic<std::size_t> queued{0};          // waiting for a worker
    std::atomic<std::size_t> running{0};         // on a worker
    std::atomic<std::size_t> in_flight{0};       // from the end of the headers to the end of the reply
    std::mutex log_mutex;

    // Sessions, touched only on the network thread; the stop closes the idle ones.
    struct SessionHandle {
        std::function<bool()> is_idle;
        std::function<void()> close;
    };
    std::list<SessionHandle> sessions;

    net::io_context io{1};
    net::thread_pool workers;
    std::optional<tcp::acceptor> tcp_acceptor;
    std::optional<unix_socket::acceptor> unix_acceptor;
    std::optional<net::signal_set> signals;
    std::thread background;

    void log_line(const std::string& line) {
        if (!options.log) return;
        std::lock_guard lock(log_mutex);
        *options.log << line << '\n' << std::flush;
    }

    void accept_tcp();
    void accept_unix();
    void begin_stop();
    void wait_for_in_flight(Clock::time_point deadline);
    void reload_in_background(std::function<void(Reply)> done);
    Reply status_reply() const;
    answers::AnswerLimits answer_limits() const;
};

namespace {

// One connection. Phases: waiting for the next request (idle timeout), reading the headers
// (header timeout), reading the body (body timeout), computing (no timeout: the work is ours and
// bounded by the request's time budget), writing (body timeout again, for clients that do not read).
template <class Socket>
class Session : public std::enable_shared_from_this<Session<Socket>> {
public:
    Session(Service::Impl& service, Socket socket, std::string client)
        : service_(service), socket_(std::move(socket)), timer_(socket_.get_executor()), client_(std::move(client)) {}

    ~Session() {
        if (counted_) service_.in_flight -= 1;
    }

    void start() {
        service_.sessions.push_back(Service::Impl::SessionHandle{
            [weak = this->weak_from_this()] {
                auto self = weak.lock();
                return !self || self->phase_ == Phase::idle;
            },
            [weak = this->weak_from_this()] {
                if (auto self = weak.lock()) self->close();
            }});
        handle_ = std::prev(service_.sessions.end());
        wait_for_request();
    }

private:
    enum class Phase { idle, header, body, computing, writing, closed };

    void arm_timer(std::chrono::milliseconds timeout) {
        timed_out_ = false;
        timer_.expires_after(timeout);
        timer_.async_wait([self = this->shared_from_this()](boost::system::error_code error) {
            if (error) return;   // cancelled or re-armed
            self->timed_out_ = true;
            boost::system::error_code ignored;
            self->socket_.cancel(ignored);
        });
    }

    void wait_for_request() {
        phase_ = Phase::idle;
        if (service_.stopping) return close();
        if (buffer_.size() > 0) return read_header();   // a pipelined request is already here
        arm_timer(service_.options.limits.idle_timeout);
        socket_.async_wait(Socket::wait_read, [self = this->shared_from_this()](boost::system::error_code error) {
            if (error || self->phase_ == Phase::closed) return self->close();
            self->read_header();
        });
    }

    void read_header() {
        phase_ = Phase::header;
        parser_.emplace();
        parser_->header_limit(static_cast<std::uint32_t>(service_.options.limits.max_header_bytes));
        parser_->body_limit(service_.options.limits.max_body_bytes);
        arm_timer(service_.options.limits.header_timeout);
        http::async_read_header(socket_, buffer_, *parser_,
                                [self = this->shared_from_this()](boost::system::error_code error, std::size_t) {
                                    self->on_header(error);
                                });
    }

    void begin_request() {
        if (counted_) return;
        counted_ = true;
        service_.in_flight += 1;
        request_started_ = Clock::now();
    }

    void on_header(boost::system::error_code error) {
        begin_request();
        if (timed_out_) {
            return reply_and_close(error_reply(408, "timeout", "the request headers did not arrive within " +
                                                                   std::to_string(service_.options.limits.header_timeout.count()) +
                                                                   " ms"));
        }
        if (error == http::error::end_of_stream || error == net::error::eof || error == net::error::connection_reset ||
            error == net::error::operation_aborted) {
            return close();   // the client went away between requests
        }
        if (error == http::error::header_limit) {
            return reply_and_close(error_reply(431, "headers_too_large",
                                               "the request headers exceed " +
                                                   std::to_string(service_.options.limits.max_header_bytes) + " bytes"));
        }
        if (error == http::error::body_limit) return reply_and_close(body_too_large());
        if (error) return reply_and_close(error_reply(400, "bad_http", "the request is not valid HTTP/1.1: " + error.message()));

        const auto& request = parser_->get();
        method_ = std::string(request.method_string());
        target_ = std::string(request.target());
        const auto authorization = request[http::field::authorization];
        if (!service_.options.token.empty() &&
            !bearer_token_matches(std::string_view(authorization.data(), authorization.size()), service_.options.token)) {
            endpoint_ = Endpoint::other;
            return reply_and_close(error_reply(401, "unauthorized", "send the service's token as \"Authorization: Bearer <token>\""));
        }
        route_ = route_request(method_, target_);
        endpoint_ = route_->endpoint;
        if (parser_->content_length() && *parser_->content_length() > service_.options.limits.max_body_bytes) {
            return reply_and_close(body_too_large());
        }
        if (route_->refusal) {
            // The body is not read: close after the reply, since its bytes would follow.
            if (!parser_->is_done()) return reply_and_close(*route_->refusal);
            return write_reply(*route_->refusal);
        }
        if (request[http::field::expect] == "100-continue" && !parser_->is_done()) {
            static const std::string kContinue = "HTTP/1.1 100 Continue\r\n\r\n";
            net::async_write(socket_, net::buffer(kContinue),
                             [self = this->shared_from_this()](boost::system::error_code error, std::size_t) {
                                 if (error) return self->close();
                                 self->read_body();
                             });
            return;
        }
        read_body();
    }

    Reply body_too_large() const {
        return error_reply(413, "body_too_large",
                           "the request body exceeds " + std::to_string(service_.options.limits.max_body_bytes) + " bytes");
    }

    void read_body() {
        phase_ = Phase::body;
        arm_timer(service_.options.limits.body_timeout);
        http::async_read(socket_, buffer_, *parser_, [self = this->shared_from_this()](boost::system::error_code error, std::size_t) {
            self->on_body(error);
        });
    }

    void on_body(boost::system::error_code error) {
        if (timed_out_) {
            return reply_and_close(error_reply(408, "timeout", "the request body did not arrive within " +
                                                                   std::to_string(service_.options.limits.body_timeout.count()) +
                                                                   " ms"));
        }
        if (error == http::error::body_limit) return reply_and_close(body_too_large());
        if (error == http::error::partial_message || error == net::error::eof) {
            return reply_and_close(error_reply(400, "truncated_body", "the connection ended before the whole body arrived"));
        }
        if (error) return reply_and_close(error_reply(400, "bad_http", "the request body is not valid HTTP/1.1: " + error.message()));
        timer_.cancel();
        dispatch();
    }

    void dispatch() {
        phase_ = Phase::computing;
        if (route_->endpoint == Endpoint::status) return write_reply(service_.status_reply());
        if (service_.stopping) {
            return reply_and_close(error_reply(503, "stopping", "the service is stopping; send the request again once it is back"));
        }
        if (route_->endpoint == Endpoint::reload) {
            service_.reload_in_background([self = this->shared_from_this()](Reply reply) {
                net::post(self->socket_.get_executor(), [self, reply = std::move(reply)]() mutable { self->write_reply(std::move(reply)); });
            });
            return;
        }
        if (service_.queued >= service_.options.limits.max_queued) {
            return write_reply(error_reply(429, "busy", "the service has " + std::to_string(service_.options.limits.max_queued) +
                                                            " requests waiting already; try again shortly"));
        }
        service_.queued += 1;
        net::post(service_.workers, [self = this->shared_from_this()] {
            Service::Impl& service = self->service_;
            service.queued -= 1;
            service.running += 1;
            answers::AnswerLimits limits = service.answer_limits();
            // Requests running together share the cores: each matrix gets its share of the workers.
            limits.matrix_threads = std::max(1u, service.workers_count / static_cast<unsigned>(std::max<std::size_t>(1, service.running)));
            const std::shared_ptr<const answers::LoadedRegion> region = service.region.current();
            Reply reply = answer_request(*self->route_->question, self->parser_->get().body(), region.get(), limits,
                                         service.options.limits.max_json_depth, service.options.answer);
            service.running -= 1;
            net::post(self->socket_.get_executor(), [self, reply = std::move(reply)]() mutable { self->write_reply(std::move(reply)); });
        });
    }

    void reply_and_close(Reply reply) {
        reply.close_connection = true;
        write_reply(std::move(reply));
    }

    void write_reply(Reply reply) {
        if (phase_ == Phase::closed) return;
        phase_ = Phase::writing;
        begin_request();
        if (!reply.incident.empty() || !reply.internal_message.empty()) {
            service_.log_line(utc_now_text() + " incident " + (reply.incident.empty() ? "-" : reply.incident) + " " +
                              method_ + " " + target_ + ": " + reply.internal_message);
        }
        const bool request_keep_alive = parser_ && parser_->is_header_done() && parser_->get().keep_alive();
        keep_alive_ = request_keep_alive && !reply.close_connection && !service_.stopping;
        response_.emplace(static_cast<http::status>(reply.status), 11);
        response_->set(http::field::server, "ringroad");
        response_->set(http::field::content_type, "application/json");
        response_->set(http::field::cache_control, "no-store");
        if (reply.status == 401) response_->set(http::field::www_authenticate, "Bearer");
        if (reply.status == 429 || reply.status == 503) response_->set(http::field::retry_after, "1");
        response_->keep_alive(keep_alive_);
        response_->body() = std::move(reply.body);
        response_->body() += '\n';
        response_->prepare_payload();
        status_ = reply.status;
        arm_timer(service_.options.limits.body_timeout);
        http::async_write(socket_, *response_, [self = this->shared_from_this()](boost::system::error_code error, std::size_t) {
            self->on_written(error);
        });
    }

    void on_written(boost::system::error_code error) {
        timer_.cancel();
        const double milliseconds = std::chrono::duration<double, std::milli>(Clock::now() - request_started_).count();
        service_.stats.record(endpoint_, status_, milliseconds);
        char figures[64];
        std::snprintf(figures, sizeof figures, " %d %.1fms %zuB", status_, milliseconds, response_->body().size());
        service_.log_line(utc_now_text() + " " + client_ + " " + (method_.empty() ? "-" : method_) + " " +
                          (target_.empty() ? "-" : target_) + figures + (error ? " (reply not delivered)" : ""));
        if (counted_) {
            counted_ = false;
            service_.in_flight -= 1;
        }
        response_.reset();
        method_.clear();
        target_.clear();
        endpoint_ = Endpoint::other;
        route_.reset();
        if (error || !keep_alive_) return close();
        parser_.reset();
        wait_for_request();
    }

    void close() {
        if (phase_ == Phase::closed) return;
        phase_ = Phase::closed;
        timer_.cancel();
        boost::system::error_code ignored;
        socket_.shutdown(Socket::shutdown_both, ignored);
        socket_.close(ignored);
        if (handle_) {
            service_.sessions.erase(*handle_);
            handle_.reset();
        }
    }

    Service::Impl& service_;
    Socket socket_;
    net::steady_timer timer_;
    std::string client_;
    boost::beast::flat_buffer buffer_;
    std::optional<http::request_parser<http::string_body>> parser_;
    std::optional<http::response<http::string_body>> response_;
    std::optional<RouteMatch> route_;
    std::optional<std::list<Service::Impl::SessionHandle>::iterator> handle_;
    Phase phase_ = Phase::idle;
    bool timed_out_ = false;
    bool counted_ = false;
    bool keep_alive_ = false;
    int status_ = 0;
    Endpoint endpoint_ = Endpoint::other;
    std::string method_;
    std::string target_;
    Clock::time_point request_started_ = Clock::now();
};

} // namespace

Service::Impl::Impl(ServiceOptions given)
    : options(std::move(given)),
      workers_count(options.threads > 0 ? options.threads : std::max(1u, std::thread::hardware_concurrency())),
      region(options.region_path),
      workers(workers_count) {
    if (!options.listen.is_local() && options.token.empty()) {
        throw InputError("--listen " + options.listen.text() +
                             ": only loopback addresses and Unix sockets are served without --token-file",
                         "--listen");
    }
    try {
        if (options.listen.kind == ListenAddress::Kind::unix_socket) {
            clear_stale_socket(options.listen.socket_path);
            unix_acceptor.emplace(io, unix_socket::endpoint(options.listen.socket_path));
            ::chmod(options.listen.socket_path.c_str(), 0660);
        } else {
            const tcp::endpoint endpoint(net::ip::make_address(options.listen.host), options.listen.port);
            tcp_acceptor.emplace(io);
            tcp_acceptor->open(endpoint.protocol());
            tcp_acceptor->set_option(tcp::acceptor::reuse_address(true));
            tcp_acceptor->bind(endpoint);
            tcp_acceptor->listen(net::socket_base::max_listen_connections);
        }
    } catch (const boost::system::system_error& error) {
        throw InputError("--listen " + options.listen.text() + ": " + error.code().message(), "--listen");
    }
}

void Service::Impl::accept_tcp() {
    tcp_acceptor->async_accept([this](boost::system::error_code error, tcp::socket socket) {
        if (error == net::error::operation_aborted || !tcp_acceptor->is_open()) return;
        if (!error) {
            boost::system::error_code ignored;
            socket.set_option(tcp::no_delay(true), ignored);
            const auto peer = socket.remote_endpoint(ignored);
            const std::string address = peer.address().to_string();
            std::string client = peer.address().is_v6() ? "[" + address + "]" : address;
            client += ":" + std::to_string(peer.port());
            std::make_shared<Session<tcp::socket>>(*this, std::move(socket), std::move(client))->start();
        }
        // Other errors (a file-descriptor limit, say) affect one connection; keep accepting.
        accept_tcp();
    });
}

void Service::Impl::accept_unix() {
    unix_acceptor->async_accept([this](boost::system::error_code error, unix_socket::socket socket) {
        if (error == net::error::operation_aborted || !unix_acceptor->is_open()) return;
        if (!error) std::make_shared<Session<unix_socket::socket>>(*this, std::move(socket), "unix")->start();
        accept_unix();
    });
}

answers::AnswerLimits Service::Impl::answer_limits() const {
    answers::AnswerLimits limits;
    limits.max_stops = options.limits.max_stops;
    limits.max_matrix_cells = options.limits.max_matrix_cells;
    limits.default_time_limit_seconds = options.limits.default_time_limit_seconds;
    limits.max_time_limit_seconds = options.limits.max_time_limit_seconds;
    return limits;
}

Reply Service::Impl::status_reply() const {
    const ServiceLimits& limits = options.limits;
    nlohmann::ordered_json status;
    status["service"] = "ringroad";
    status["version"] = "0.1.0";
    status["caution"] = kSafetyNotice;
    status["listen"] = options.listen.text();
    status["uptime_seconds"] = std::round(std::chrono::duration<double>(Clock::now() - started).count() * 10.0) / 10.0;
    status["stopping"] = stopping.load();
    status["region"] = region_json(*region.current());
    status["reloads"] = region.history_json();
    status["requests"] = stats.to_json();
    status["work"] = {{"workers", workers_count}, {"running", running.load()}, {"queued", queued.load()}};
    status["limits"] = {{"max_body_bytes", limits.max_body_bytes},
                        {"max_header_bytes", limits.max_header_bytes},
                        {"max_stops", limits.max_stops},
                        {"max_matrix_cells", limits.max_matrix_cells},
                        {"max_queued", limits.max_queued},
                        {"max_json_depth", limits.max_json_depth},
                        {"default_time_limit_seconds", limits.default_time_limit_seconds},
                        {"max_time_limit_seconds", limits.max_time_limit_seconds},
                        {"header_timeout_ms", limits.header_timeout.count()},
                        {"body_timeout_ms", limits.body_timeout.count()},
                        {"idle_timeout_ms", limits.idle_timeout.count()},
                        {"stop_wait_ms", limits.stop_wait.count()}};
    status["authentication"] = options.token.empty() ? "none" : "bearer token";
    Reply reply;
    reply.body = status.dump(-1, ' ', false, nlohmann::json::error_handler_t::replace);
    return reply;
}

void Service::Impl::reload_in_background(std::function<void(Reply)> done) {
    net::post(workers, [this, done = std::move(done)] {
        const ReloadOutcome outcome = region.reload();
        char seconds[32];
        std::snprintf(seconds, sizeof seconds, "%.2f", outcome.seconds);
        log_line(utc_now_text() + (outcome.loaded ? " reloaded " + options.region_path + " in " + seconds + " s"
                                                  : " reload failed, the previous region stays in force: " + outcome.message));
        Reply reply;
        if (outcome.loaded) {
            reply.body = nlohmann::ordered_json{{"reloaded", true}, {"seconds", std::round(outcome.seconds * 1000.0) / 1000.0},
                                                {"region", region_json(*outcome.region)}}
                             .dump(-1, ' ', false, nlohmann::json::error_handler_t::replace);
        } else {
            reply = error_reply(500, "reload_failed",
                                "the region file could not be loaded, the previous region stays in force: " + outcome.message);
        }
        if (done) done(std::move(reply));
    });
}

void Service::Impl::begin_stop() {
    if (stopping.exchange(true)) return;
    log_line(utc_now_text() + " stopping: no new connections; finishing the requests in flight");
    boost::system::error_code ignored;
    if (tcp_acceptor) tcp_acceptor->close(ignored);
    if (unix_acceptor) {
        unix_acceptor->close(ignored);
        ::unlink(options.listen.socket_path.c_str());
    }
    if (signals) signals->cancel(ignored);
    // Idle connections close now; the others close after their reply (keep-alive is off).
    std::vector<std::function<void()>> idle;
    for (const SessionHandle& session : sessions) {
        if (session.is_idle()) idle.push_back(session.close);
    }
    for (const auto& close : idle) close();
    wait_for_in_flight(Clock::now() + options.limits.stop_wait);
}

void Service::Impl::wait_for_in_flight(Clock::time_point deadline) {
    if (in_flight == 0 || Clock::now() >= deadline) {
        if (in_flight > 0) log_line(utc_now_text() + " stop: " + std::to_string(in_flight.load()) + " requests still running after the wait; closing");
        std::vector<std::function<void()>> all;
        for (const SessionHandle& session : sessions) all.push_back(session.close);
        for (const auto& close : all) close();
        io.stop();
        return;
    }
    auto timer = std::make_shared<net::steady_timer>(io, std::chrono::milliseconds(10));
    timer->async_wait([this, timer, deadline](boost::system::error_code) { wait_for_in_flight(deadline); });
}

Service::Service(ServiceOptions options) : impl_(std::make_unique<Impl>(std::move(options))) {}

Service::~Service() {
    if (impl_->background.joinable()) stop();
    impl_->workers.join();
    if (impl_->unix_acceptor && !impl_->stopping) ::unlink(impl_->options.listen.socket_path.c_str());
}

std::uint16_t Service::port() const { return impl_->tcp_acceptor ? impl_->tcp_acceptor->local_endpoint().port() : 0; }

std::string Service::listen_text() const {
    ListenAddress address = impl_->options.listen;
    if (address.kind == ListenAddress::Kind::tcp) address.port = port();
    return address.text();
}

void Service::run(bool handle_signals) {
    Impl& impl = *impl_;
    if (impl.tcp_acceptor) impl.accept_tcp();
    if (impl.unix_acceptor) impl.accept_unix();
    if (handle_signals) {
        impl.signals.emplace(impl.io, SIGINT, SIGTERM, SIGHUP);
        std::function<void(boost::system::error_code, int)> on_signal = [&impl, &on_signal](boost::system::error_code error, int number) {
            if (error) return;
            if (number == SIGHUP) {
                impl.log_line(utc_now_text() + " SIGHUP: reloading " + impl.options.region_path);
                impl.reload_in_background({});
                impl.signals->async_wait(on_signal);
            } else {
                impl.begin_stop();
            }
        };
        impl.signals->async_wait(on_signal);
        impl.io.run();
    } else {
        impl.io.run();
    }
    // Whatever the pool still holds finishes before run() returns.
    impl.workers.join();
}

void Service::start() {
    impl_->background = std::thread([this] { run(false); });
}

void Service::stop() {
    net::post(impl_->io, [this] { impl_->begin_stop(); });
    if (impl_->background.joinable()) impl_->background.join();
}

ReloadOutcome Service::reload() { return impl_->region.reload(); }

} // namespace ringroad::service
