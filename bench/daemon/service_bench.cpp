// service_bench [REGION.rrg] [--connections 1,8,64] [--scale X] [--seed N] [--rss-requests N]
//               [--threads N] [--only status,tour10,matrix100,matrix1000]
//
// A load generator of our own on Asio/Beast against `ringroad serve` running as a child process on
// a loopback port: a fixed number of requests over N kept-alive connections, for GET /v1/status,
// a 10-stop tour, a 100 x 100 matrix and a 1000 x 1000 matrix, with stops drawn (seeded) from the
// region's junctions. Prints requests per second, p50/p99/p99.9 latency and errors per scenario
// and connection count; beside each question, the same request answered in this process by
// answers::answer_json (the reference: what the service adds is the ratio); and the service's
// resident memory before and after --rss-requests requests (default 100,000).
// Without REGION it builds the demo town (fixtures/demo/port-ambrell.osm) into /tmp.

#include "daemon/answers/json_answer.hpp"
#include "graph/graph_file.hpp"

#include <boost/asio/connect.hpp>
#include <boost/asio/io_context.hpp>
#include <boost/asio/ip/tcp.hpp>
#include <boost/beast/core/flat_buffer.hpp>
#include <boost/beast/http/read.hpp>
#include <boost/beast/http/string_body.hpp>
#include <boost/beast/http/write.hpp>
#include <nlohmann/json.hpp>

#include <fcntl.h>
#include <signal.h>
#include <sys/wait.h>
#include <unistd.h>

#include <algorithm>
#include <atomic>
#include <chrono>
#include <cmath>
#include <cstdio>
#include <filesystem>
#include <fstream>
#include <iostream>
#include <memory>
#include <optional>
#include <random>
#include <sstream>
#include <string>
#include <thread>
#include <vector>

namespace net = boost::asio;
namespace http = boost::beast::http;
using tcp = net::ip::tcp;
using Clock = std::chrono::steady_clock;
using nlohmann::json;

namespace {

std::string program_folder() { return std::filesystem::canonical("/proc/self/exe").parent_path().string(); }
std::string ringroad_binary() { return program_folder() + "/../bin/ringroad"; }

struct ChildService {
    pid_t pid = -1;
    std::uint16_t port = 0;
};

// Starts `ringroad serve` on an ephemeral loopback port, its log to a file, and reads the port
// from the start-up line.
ChildService start_service(const std::string& region, unsigned threads, const std::string& log_path) {
    const int log_fd = ::open(log_path.c_str(), O_CREAT | O_TRUNC | O_WRONLY, 0644);
    ChildService child;
    child.pid = ::fork();
    if (child.pid == 0) {
        ::dup2(log_fd, 2);
        const std::string binary = ringroad_binary();
        std::vector<std::string> arguments{binary, "serve", region, "--listen", "127.0.0.1:0", "--max-queued", "256"};
        if (threads > 0) {
            arguments.push_back("--threads");
            arguments.push_back(std::to_string(threads));
        }
        std::vector<char*> argv;
        for (std::string& argument : arguments) argv.push_back(argument.data());
        argv.push_back(nullptr);
        ::execv(binary.c_str(), argv.data());
        ::_exit(127);
    }
    ::close(log_fd);
    for (int wait = 0; wait < 6000 && child.port == 0; ++wait) {   // a large region loads for a while
        std::ifstream log(log_path);
        std::stringstream text;
        text << log.rdbuf();
        const std::string content = text.str();
        const auto at = content.find(" on 127.0.0.1:");
        if (at != std::string::npos) child.port = static_cast<std::uint16_t>(std::stoi(content.substr(at + 14)));
        if (child.port == 0) std::this_thread::sleep_for(std::chrono::milliseconds(50));
    }
    if (child.port == 0) throw std::runtime_error("the service did not start; see " + log_path);
    return child;
}

double resident_mib(pid_t pid) {
    std::ifstream status("/proc/" + std::to_string(pid) + "/status");
    for (std::string line; std::getline(status, line);) {
        if (line.rfind("VmRSS:", 0) == 0) return std::stod(line.substr(6)) / 1024.0;
    }
    return 0.0;
}

struct Scenario {
    std::string name;
    http::verb method;
    std::string target;
    std::string body;
    std::optional<ringroad::answers::Question> question;
    json request;
    std::size_t requests;
};

struct Outcome {
    std::vector<double> latencies_ms;
    std::size_t errors = 0;
    std::string first_error;
    double seconds = 0.0;
};

// One kept-alive connection sending requests back to back until the shared count runs out.
class Client : public std::enable_shared_from_this<Client> {
public:
    Client(net::io_context& io, const Scenario& scenario, std::atomic<long>& remaining, Outcome& outcome)
        : socket_(io), scenario_(scenario), remaining_(remaining), outcome_(outcome) {
        request_.method(scenario.method);
        request_.target(scenario.target);
        request_.version(11);
        request_.set(http::field::host, "127.0.0.1");
        if (scenario.method == http::verb::post) {
            request_.set(http::field::content_type, "application/json");
            request_.body() = scenario.body;
        }
        request_.keep_alive(true);
        request_.prepare_payload();
    }

    void start(const tcp::endpoint& endpoint) {
        socket_.async_connect(endpoint, [self = shared_from_this()](boost::system::error_code error) {
            if (error) return self->fail("connect: " + error.message());
            self->socket_.set_option(tcp::no_delay(true));
            self->next();
        });
    }

private:
    void next() {
        if (remaining_.fetch_sub(1) <= 0) return;
        sent_ = Clock::now();
        http::async_write(socket_, request_, [self = shared_from_this()](boost::system::error_code error, std::size_t) {
            if (error) return self->fail("write: " + error.message());
            self->response_ = {};
            http::async_read(self->socket_, self->buffer_, self->response_,
                             [self](boost::system::error_code error, std::size_t) { self->on_response(error); });
        });
    }

    void on_response(boost::system::error_code error) {
        if (error) return fail("read: " + error.message());
        outcome_.latencies_ms.push_back(std::chrono::duration<double, std::milli>(Clock::now() - sent_).count());
        if (response_.result_int() != 200) {
            ++outcome_.errors;
            if (outcome_.first_error.empty()) outcome_.first_error = std::to_string(response_.result_int()) + " " + response_.body().substr(0, 200);
        }
        next();
    }

    void fail(const std::string& what) {
        ++outcome_.errors;
        if (outcome_.first_error.empty()) outcome_.first_error = what;
    }

    tcp::socket socket_;
    const Scenario& scenario_;
    std::atomic<long>& remaining_;
    Outcome& outcome_;
    http::request<http::string_body> request_;
    http::response<http::string_body> response_;
    boost::beast::flat_buffer buffer_;
    Clock::time_point sent_;
};

// All clients on one thread: the service has the other core.
Outcome run_load(std::uint16_t port, const Scenario& scenario, std::size_t connections, std::size_t requests) {
    net::io_context io{1};
    std::atomic<long> remaining{static_cast<long>(requests)};
    Outcome outcome;
    const tcp::endpoint endpoint(net::ip::make_address("127.0.0.1"), port);
    const auto started = Clock::now();
    for (std::size_t c = 0; c < connections; ++c) std::make_shared<Client>(io, scenario, remaining, outcome)->start(endpoint);
    io.run();
    outcome.seconds = std::chrono::duration<double>(Clock::now() - started).count();
    return outcome;
}

double percentile(std::vector<double> values, double p) {
    if (values.empty()) return 0.0;
    std::sort(values.begin(), values.end());
    const auto rank = static_cast<std::size_t>(std::ceil(p / 100.0 * static_cast<double>(values.size())));
    return values[std::clamp<std::size_t>(rank, 1, values.size()) - 1];
}

json stops_from_region(const ringroad::graph::RoadGraph& graph, std::size_t count, std::mt19937& random) {
    std::vector<std::uint32_t> main;
    for (std::uint32_t v = 0; v < graph.vertex_count(); ++v) {
        if (graph.in_main_component(v)) main.push_back(v);
    }
    std::uniform_int_distribution<std::size_t> pick(0, main.size() - 1);
    json stops = json::array();
    for (std::size_t i = 0; i < count; ++i) {
        const auto coordinate = graph.coordinate(main[pick(random)]);
        stops.push_back({{"id", "s" + std::to_string(i)}, {"lat", coordinate.lat()}, {"lon", coordinate.lon()}});
    }
    return stops;
}

std::vector<std::size_t> parse_list(const std::string& text) {
    std::vector<std::size_t> values;
    std::stringstream stream(text);
    for (std::string item; std::getline(stream, item, ',');) values.push_back(std::stoul(item));
    return values;
}

} // namespace

int main(int argc, char** argv) {
    std::string region;
    std::vector<std::size_t> connection_counts{1, 8, 64};
    double scale = 1.0;
    unsigned seed = 1;
    unsigned threads = 0;
    std::size_t rss_requests = 100000;
    std::string only;
    for (int i = 1; i < argc; ++i) {
        const std::string argument = argv[i];
        auto value = [&]() -> std::string {
            if (i + 1 >= argc) throw std::runtime_error(argument + " needs a value");
            return argv[++i];
        };
        if (argument == "--connections") connection_counts = parse_list(value());
        else if (argument == "--scale") scale = std::stod(value());
        else if (argument == "--seed") seed = static_cast<unsigned>(std::stoul(value()));
        else if (argument == "--threads") threads = static_cast<unsigned>(std::stoul(value()));
        else if (argument == "--rss-requests") rss_requests = std::stoul(value());
        else if (argument == "--only") only = value();
        else region = argument;
    }
    if (region.empty()) {
        std::filesystem::create_directories("/tmp/ringroad-service-bench");
        region = "/tmp/ringroad-service-bench/port-ambrell.rrg";
        const std::string command = ringroad_binary() + " build " RINGROAD_FIXTURES_DIR "/demo/port-ambrell.osm -o " + region + " 2>/dev/null";
        if (std::system(command.c_str()) != 0) throw std::runtime_error("building the demo town failed");
    }

    // The reference: the same questions answered in this process on the same region.
    const std::shared_ptr<const ringroad::answers::LoadedRegion> loaded = ringroad::answers::load_region(region);
    std::mt19937 random(seed);
    const ringroad::graph::RoadGraph& graph = loaded->router->road_graph();
    auto question_scenario = [&](std::string name, std::string target, ringroad::answers::Question question, std::size_t stops,
                                 std::size_t requests) {
        json request = {{"stops", stops_from_region(graph, stops, random)}};
        return Scenario{std::move(name), http::verb::post, std::move(target), request.dump(), question, request, requests};
    };
    auto scaled = [&](double count) { return static_cast<std::size_t>(std::max(1.0, std::round(count * scale))); };
    std::vector<Scenario> scenarios;
    scenarios.push_back(Scenario{"status", http::verb::get, "/v1/status", "", std::nullopt, json(), scaled(20000)});
    scenarios.push_back(question_scenario("tour10", "/v1/tour", ringroad::answers::Question::tour, 10, scaled(2000)));
    scenarios.push_back(question_scenario("matrix100", "/v1/matrix", ringroad::answers::Question::matrix, 100, scaled(500)));
    scenarios.push_back(question_scenario("matrix1000", "/v1/matrix", ringroad::answers::Question::matrix, 1000, scaled(16)));

    const std::string log_path = "/tmp/ringroad-service-bench/serve.log";
    std::filesystem::create_directories("/tmp/ringroad-service-bench");
    const ChildService service = start_service(region, threads, log_path);
    std::printf("service_bench: %s, %u junctions; service pid %d on 127.0.0.1:%u (log %s); %u cores\n", region.c_str(),
                graph.vertex_count(), service.pid, service.port, log_path.c_str(), std::thread::hardware_concurrency());
    std::printf("%-11s %5s %8s %6s %10s %9s %9s %9s %11s %8s\n", "scenario", "conns", "requests", "errors", "req/s", "p50 ms",
                "p99 ms", "p99.9 ms", "direct ms", "p50/dir");
    int status = 0;
    for (const Scenario& scenario : scenarios) {
        if (!only.empty() && ("," + only + ",").find("," + scenario.name + ",") == std::string::npos) continue;
        double direct_ms = 0.0;
        if (scenario.question) {
            // Best of three in-process answers on the same request.
            direct_ms = 1e300;
            for (int round = 0; round < 3; ++round) {
                const auto started = Clock::now();
                (void)ringroad::answers::answer_json(*scenario.question, scenario.request, loaded.get());
                direct_ms = std::min(direct_ms, std::chrono::duration<double, std::milli>(Clock::now() - started).count());
            }
        }
        for (const std::size_t connections : connection_counts) {
            const std::size_t requests = std::max(scenario.requests, connections);
            const Outcome outcome = run_load(service.port, scenario, connections, requests);
            const double p50 = percentile(outcome.latencies_ms, 50);
            std::printf("%-11s %5zu %8zu %6zu %10.1f %9.3f %9.3f %9.3f %11s %8s\n", scenario.name.c_str(), connections, requests,
                        outcome.errors, static_cast<double>(outcome.latencies_ms.size()) / outcome.seconds, p50,
                        percentile(outcome.latencies_ms, 99), percentile(outcome.latencies_ms, 99.9),
                        scenario.question ? std::to_string(direct_ms).substr(0, 8).c_str() : "-",
                        scenario.question ? std::to_string(p50 / direct_ms).substr(0, 6).c_str() : "-");
            if (outcome.errors > 0) {
                std::printf("  first error: %s\n", outcome.first_error.c_str());
                status = 1;
            }
            std::fflush(stdout);
        }
    }
    if (rss_requests > 0) {
        // Memory over many requests: a mix of status and 10-stop tours on 8 connections.
        const double before = resident_mib(service.pid);
        const Outcome statuses = run_load(service.port, scenarios[0], 8, rss_requests / 2);
        const Outcome tours = run_load(service.port, scenarios[1], 8, rss_requests - rss_requests / 2);
        const double after = resident_mib(service.pid);
        std::printf("service resident memory: %.1f MiB before, %.1f MiB after %zu requests (%+.1f %%), %zu errors\n", before,
                    after, rss_requests, 100.0 * (after - before) / before, statuses.errors + tours.errors);
        if (statuses.errors + tours.errors > 0) status = 1;
    }
    ::kill(service.pid, SIGTERM);
    int exit_status = 0;
    ::waitpid(service.pid, &exit_status, 0);
    std::printf("service stopped with exit code %d\n", WIFEXITED(exit_status) ? WEXITSTATUS(exit_status) : -1);
    return status;
}
