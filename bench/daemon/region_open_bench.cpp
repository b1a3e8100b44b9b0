// region_open_bench: one-shot commands on a region file as a user runs them, whole processes of
// build/bin/ringroad, against reading the file once (`cat REGION > /dev/null`) measured in the
// same run. Rows: `ringroad info`, `matrix` with 10 stops, `route`, `matrix` with 1000 stops.
//
// Each row runs the command in a child (posix_spawn, output to /dev/null) several times and keeps
// the best wall time (the machine is shared); the page cache is warm for every row, the file
// having been read before the first. Per row: wall and CPU time (user + system, all threads),
// the ratio of the wall time to the cat's, the child's peak resident memory (ru_maxrss from
// wait4: mapped file pages count there; this process never maps the region, whose pages would
// otherwise be counted in every child's figure) and its peak private memory: the largest RssAnon (the
// anonymous pages: heap, stacks, anything not backed by the file) read from /proc/PID/status
// every millisecond while the child runs. Sampling may miss a peak shorter than a millisecond;
// at the sizes that matter (tens of MB, allocated over tens of milliseconds) it does not.
//
// Usage: region_open_bench [REGION.rrg] [--synth JUNCTIONS] [--runs N] [--ringroad PATH]
//   default region: the demo town (fixtures/demo), built into a scratch folder;
//   --synth N: make an invented region with `ringroad synth --junctions N` and build it first.
// Targets (issue 10, the 1,000,000-junction invented region on 2 cores): info <= 0.2 s, matrix of
// 10 stops <= 0.3 s, route <= 0.3 s, matrix of 1000 stops <= 1.0 s, private memory of the 10-stop
// matrix <= 100 MB.

#include "graph/graph_file.hpp"

#include <fcntl.h>
#include <spawn.h>
#include <sys/resource.h>
#include <sys/wait.h>
#include <unistd.h>

#include <algorithm>
#include <chrono>
#include <cstdio>
#include <cstdlib>
#include <cstring>
#include <filesystem>
#include <fstream>
#include <random>
#include <stdexcept>
#include <string>
#include <thread>
#include <vector>

extern char** environ;

namespace {

namespace fs = std::filesystem;

struct Measurement {
    double seconds = 1e300;      // wall
    double cpu_seconds = 0;
    double peak_rss_mib = 0;
    double peak_private_mib = 0;
};

// RssAnon of a running process in MiB, or a negative value once it is gone.
double private_mib(pid_t pid) {
    std::ifstream status("/proc/" + std::to_string(pid) + "/status");
    std::string line;
    while (std::getline(status, line)) {
        if (line.rfind("RssAnon:", 0) == 0) return std::strtod(line.c_str() + 8, nullptr) / 1024.0;
    }
    return -1.0;
}

// Runs `arguments` once with stdout to /dev/null and stderr to `error_path`.
Measurement run_once(const std::vector<std::string>& arguments, const std::string& error_path) {
    posix_spawn_file_actions_t actions;
    posix_spawn_file_actions_init(&actions);
    posix_spawn_file_actions_addopen(&actions, 1, "/dev/null", O_WRONLY, 0);
    posix_spawn_file_actions_addopen(&actions, 2, error_path.c_str(), O_WRONLY | O_CREAT | O_TRUNC, 0644);
    std::vector<char*> argv;
    for (const std::string& argument : arguments) argv.push_back(const_cast<char*>(argument.c_str()));
    argv.push_back(nullptr);
    const auto start = std::chrono::steady_clock::now();
    pid_t pid = 0;
    const int spawned = posix_spawn(&pid, argv[0], &actions, nullptr, argv.data(), environ);
    posix_spawn_file_actions_destroy(&actions);
    if (spawned != 0) throw std::runtime_error("cannot run " + arguments[0] + ": " + std::strerror(spawned));
    Measurement result;
    int status = 0;
    rusage usage{};
    for (;;) {
        const pid_t done = wait4(pid, &status, WNOHANG, &usage);
        if (done == pid) break;
        if (done < 0) throw std::runtime_error("wait4 failed");
        result.peak_private_mib = std::max(result.peak_private_mib, private_mib(pid));
        std::this_thread::sleep_for(std::chrono::milliseconds(1));
    }
    result.seconds = std::chrono::duration<double>(std::chrono::steady_clock::now() - start).count();
    if (!WIFEXITED(status) || WEXITSTATUS(status) != 0) {
        std::ifstream error(error_path);
        std::string text((std::istreambuf_iterator<char>(error)), std::istreambuf_iterator<char>());
        throw std::runtime_error("failed: " + arguments[0] + " " + (arguments.size() > 1 ? arguments[1] : "") + ": " + text);
    }
    result.cpu_seconds = static_cast<double>(usage.ru_utime.tv_sec + usage.ru_stime.tv_sec) +
                         static_cast<double>(usage.ru_utime.tv_usec + usage.ru_stime.tv_usec) * 1e-6;
    result.peak_rss_mib = static_cast<double>(usage.ru_maxrss) / 1024.0;
    return result;
}

// The best wall time of `runs`, with the figures of that run (peak private memory: the largest seen).
Measurement best_of(int runs, const std::vector<std::string>& arguments, const std::string& error_path) {
    Measurement best;
    double private_peak = 0;
    for (int run = 0; run < runs; ++run) {
        const Measurement one = run_once(arguments, error_path);
        private_peak = std::max(private_peak, one.peak_private_mib);
        if (one.seconds < best.seconds) best = one;
    }
    best.peak_private_mib = private_peak;
    return best;
}

std::string self_folder() { return fs::read_symlink("/proc/self/exe").parent_path().string(); }

// STOPS.csv with `count` stops near random junctions of the main component.
void write_stops(const ringroad::graph::RoadGraph& graph, std::size_t count, std::uint64_t seed, const std::string& path,
                 std::vector<std::pair<double, double>>* points = nullptr) {
    std::mt19937_64 random(seed);
    std::ofstream out(path);
    out << "id,lat,lon\n";
    std::size_t written = 0;
    while (written < count) {
        const auto vertex = static_cast<ringroad::graph::VertexId>(random() % graph.vertex_count());
        if (!graph.in_main_component(vertex)) continue;
        const auto at = graph.coordinate(vertex);
        const double lat = at.lat() + (static_cast<double>(random() % 200) - 100.0) * 1e-6;
        const double lon = at.lon() + (static_cast<double>(random() % 200) - 100.0) * 1e-6;
        char line[96];
        std::snprintf(line, sizeof line, "s%zu,%.7f,%.7f\n", written, lat, lon);
        out << line;
        if (points) points->emplace_back(lat, lon);
        ++written;
    }
}

void run_or_fail(const std::vector<std::string>& arguments, const std::string& error_path) {
    std::fprintf(stderr, "running:");
    for (const auto& argument : arguments) std::fprintf(stderr, " %s", argument.c_str());
    std::fprintf(stderr, "\n");
    run_once(arguments, error_path);
}

} // namespace

int main(int argc, char** argv) {
    std::string region;
    std::string ringroad = self_folder() + "/../bin/ringroad";
    long synth_junctions = 0;
    int runs = 3;
    for (int i = 1; i < argc; ++i) {
        const std::string argument = argv[i];
        if (argument == "--synth" && i + 1 < argc) {
            synth_junctions = std::atol(argv[++i]);
        } else if (argument == "--runs" && i + 1 < argc) {
            runs = std::max(1, std::atoi(argv[++i]));
        } else if (argument == "--ringroad" && i + 1 < argc) {
            ringroad = argv[++i];
        } else if (!argument.empty() && argument[0] != '-') {
            region = argument;
        } else {
            std::fprintf(stderr, "usage: region_open_bench [REGION.rrg] [--synth JUNCTIONS] [--runs N] [--ringroad PATH]\n");
            return 2;
        }
    }
    try {
        const fs::path scratch = fs::temp_directory_path() / ("region_open_bench-" + std::to_string(::getpid()));
        fs::create_directories(scratch);
        const std::string errors = (scratch / "stderr.txt").string();
        if (region.empty()) {
            region = (scratch / "region.rrg").string();
            std::string input = std::string(RINGROAD_FIXTURES_DIR) + "/demo/port-ambrell.osm";
            if (synth_junctions > 0) {
                input = (scratch / "region.osm.pbf").string();
                run_or_fail({ringroad, "synth", "--junctions", std::to_string(synth_junctions), "-o", input}, errors);
            }
            run_or_fail({ringroad, "build", input, "-o", region, "--quiet"}, errors);
        }
        const std::string stops10 = (scratch / "stops10.csv").string();
        const std::string stops1000 = (scratch / "stops1000.csv").string();
        // Stops are drawn in a child process: a spawned command's ru_maxrss starts from its
        // parent's peak (Linux carries the high-water mark across exec), so this process must
        // never map the region itself.
        std::vector<std::pair<double, double>> ends;
        std::uint32_t junctions = 0;
        const std::string ends_path = (scratch / "ends.txt").string();
        const pid_t child = fork();
        if (child == 0) {
            try {
                const ringroad::graph::RoadGraph graph = ringroad::graph::load_road_graph(region);
                std::vector<std::pair<double, double>> points;
                write_stops(graph, 10, 1, stops10, &points);
                write_stops(graph, 1000, 2, stops1000);
                std::ofstream out(ends_path);
                char line[128];
                std::snprintf(line, sizeof line, "%u %.7f %.7f %.7f %.7f\n", graph.vertex_count(), points[0].first,
                              points[0].second, points[1].first, points[1].second);
                out << line;
            } catch (const std::exception& error) {
                std::fprintf(stderr, "region_open_bench: %s\n", error.what());
                std::_Exit(1);
            }
            std::_Exit(0);
        }
        int status = 0;
        if (child < 0 || waitpid(child, &status, 0) != child || !WIFEXITED(status) || WEXITSTATUS(status) != 0) {
            throw std::runtime_error("cannot draw stops from " + region);
        }
        {
            std::ifstream in(ends_path);
            double a = 0, b = 0, c = 0, d = 0;
            in >> junctions >> a >> b >> c >> d;
            ends = {{a, b}, {c, d}};
        }
        char from[64], to[64];
        std::snprintf(from, sizeof from, "%.7f,%.7f", ends[0].first, ends[0].second);
        std::snprintf(to, sizeof to, "%.7f,%.7f", ends[1].first, ends[1].second);

        struct Row {
            const char* name;
            std::vector<std::string> arguments;
            const char* target;
        };
        const std::vector<Row> rows = {
            {"cat REGION > /dev/null", {"/bin/cat", region}, "(reference)"},
            {"ringroad info", {ringroad, "info", region}, "<= 0.2 s"},
            {"ringroad matrix, 10 stops", {ringroad, "matrix", region, "--stops", stops10}, "<= 0.3 s"},
            {"ringroad route", {ringroad, "route", region, "--from", from, "--to", to}, "<= 0.3 s"},
            {"ringroad matrix, 1000 stops", {ringroad, "matrix", region, "--stops", stops1000}, "<= 1.0 s"},
        };
        std::vector<Measurement> results;
        for (const Row& row : rows) results.push_back(best_of(runs, row.arguments, errors));
        const double reference = results[0].seconds;

        std::printf("region_open_bench: %s (%.1f MiB, %u junctions), best of %d runs, %u hardware threads\n",
                    region.c_str(), static_cast<double>(fs::file_size(region)) / (1024.0 * 1024.0), junctions, runs,
                    std::thread::hardware_concurrency());
        std::printf("| measurement | wall s | cpu s | wall / cat | peak RSS MiB | peak private MiB | target (1M junctions) |\n");
        std::printf("|---|---:|---:|---:|---:|---:|---|\n");
        for (std::size_t i = 0; i < rows.size(); ++i) {
            const Measurement& m = results[i];
            std::printf("| %s | %.3f | %.3f | %.2f | %.1f | %.1f | %s |\n", rows[i].name, m.seconds, m.cpu_seconds,
                        m.seconds / reference, m.peak_rss_mib, m.peak_private_mib, rows[i].target);
        }
        std::printf("| private memory, matrix of 10 stops | | | | | %.1f | <= 100 MB |\n", results[2].peak_private_mib);
        fs::remove_all(scratch);
    } catch (const std::exception& error) {
        std::fprintf(stderr, "region_open_bench: %s\n", error.what());
        return 1;
    }
    return 0;
}
