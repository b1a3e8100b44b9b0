// Reload under load: clients send requests continuously while the region file is replaced (by
// rename, as DEVELOPERS.md asks of anyone updating a region a service has open) and reloaded
// several times, once with a corrupt file. No request fails; the corrupt file is refused with
// the reason and the previous region stays in force; status shows the new provenance after each
// good reload. The regions are the invented demo town built for three profiles (fixtures/demo).
#include "tests/daemon/service_test_support.hpp"

#include <atomic>
#include <cstdio>
#include <filesystem>
#include <mutex>

using namespace ringroad::test;
using nlohmann::json;

namespace {

std::string build_demo(const std::string& folder, const std::string& profile) {
    const std::string path = folder + "/" + profile + ".rrg";
    const CommandResult built = run_ringroad({"build", fixture_path("demo/port-ambrell.osm"), "-o", path, "--profile", profile});
    if (built.exit_code != 0) throw std::runtime_error(built.err);
    return path;
}

// Puts a copy of `source` at `target` by rename, so a reader never sees half a file.
void replace_file(const std::string& source, const std::string& target) {
    std::filesystem::copy_file(source, target + ".new", std::filesystem::copy_options::overwrite_existing);
    std::filesystem::rename(target + ".new", target);
}

} // namespace

TEST_CASE("reload under load: zero failed requests, a corrupt file refused, provenance follows") {
    const std::string folder = make_scratch_dir("service-reload");
    const std::string car = build_demo(folder, "car");
    const std::string bicycle = build_demo(folder, "bicycle");
    const std::string foot = build_demo(folder, "foot");
    // The corrupt file: the car region with bytes in the middle flipped (a section checksum fails).
    std::string damaged = read_file(car);
    for (std::size_t i = damaged.size() / 2; i < damaged.size() / 2 + 64; ++i) damaged[i] = static_cast<char>(~damaged[i]);
    write_file(folder + "/damaged.rrg", damaged);

    const std::string served = folder + "/served.rrg";
    replace_file(car, served);
    ringroad::service::ServiceOptions options = test_service_options();
    options.region_path = served;
    RunningService running(options);

    const std::string body = json{{"stops", demo_stops_json(6)}}.dump();
    std::atomic<bool> done{false};
    std::atomic<int> answered{0};
    std::mutex failures_mutex;
    std::vector<std::string> failures;
    std::vector<std::thread> clients;
    for (int c = 0; c < 3; ++c) {
        clients.emplace_back([&, c] {
            RawConnection connection = RawConnection::tcp(running.port());
            // Bounded: at most 20,000 requests per client, and the test stops them far sooner.
            for (int i = 0; i < 20000 && !done; ++i) {
                const bool question = (i + c) % 2 == 0;
                connection.send(question ? http_request_text("POST", "/v1/matrix", body) : http_request_text("GET", "/v1/status", ""));
                const HttpAnswer answer = connection.read_answer();
                if (answer.status != 200) {
                    std::lock_guard lock(failures_mutex);
                    failures.push_back(std::to_string(answer.status) + " " + answer.body);
                    return;
                }
                ++answered;
            }
        });
    }

    auto reload = [&] { return http_exchange(running.port(), "POST", "/v1/reload", ""); };
    auto profile = [&] { return http_exchange(running.port(), "GET", "/v1/status").json().at("region").at("profile"); };
    for (const auto& [source, expected] : {std::pair{bicycle, "bicycle"}, {foot, "foot"}, {car, "car"}, {bicycle, "bicycle"}}) {
        replace_file(source, served);
        const HttpAnswer answer = reload();
        INFO(answer.body);
        REQUIRE(answer.status == 200);
        CHECK(answer.json().at("region").at("profile") == expected);
        CHECK(profile() == expected);
        if (std::string(expected) == "foot") {
            replace_file(folder + "/damaged.rrg", served);
            const HttpAnswer refused = reload();
            CHECK(refused.status == 500);
            CHECK(refused.json().at("error").at("code") == "reload_failed");
            CHECK(refused.json().at("error").at("message").get<std::string>().find("served.rrg") != std::string::npos);
            CHECK(profile() == "foot");   // the previous region stays in force
            const json reloads = http_exchange(running.port(), "GET", "/v1/status").json().at("reloads");
            CHECK(reloads.at("failed_reloads") == 1);
            CHECK(reloads.at("last_reload_error").get<std::string>().find("served.rrg") != std::string::npos);
        }
    }
    // Let the clients run a moment after the last reload too.
    for (int wait = 0; wait < 200 && answered < 200; ++wait) std::this_thread::sleep_for(std::chrono::milliseconds(10));
    done = true;
    for (std::thread& client : clients) client.join();
    INFO((failures.empty() ? std::string() : failures.front()));
    CHECK(failures.empty());
    CHECK(answered > 0);
    const json reloads = http_exchange(running.port(), "GET", "/v1/status").json().at("reloads");
    CHECK(reloads.at("reloads") == 4);
}

TEST_CASE("a reload never takes a path from the request") {
    RunningService running;
    const HttpAnswer answer = http_exchange(running.port(), "POST", "/v1/reload", R"({"path": "/etc/passwd"})");
    REQUIRE(answer.status == 200);
    CHECK(answer.json().at("region").at("file") == demo_region_path());
}
