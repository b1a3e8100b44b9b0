// build_bench: ringroad's build of each real extract (extract + build_road_graph + write, car
// profile) against a bare libosmium read of the same file (every object decoded, a handler that
// does nothing), side by side in one run. Target: our build <= 2x the bare read.
//
// Each measurement runs in its own child process so that its peak memory (VmHWM) is its own and
// the page cache is warm for both; the best of several runs is reported, since the machine is
// shared. Usage: build_bench [RUNS]   (default 5)

#include "bench/peak_memory.hpp"
#include "extract/road_extractor.hpp"
#include "graph/graph_file.hpp"

#include <osmium/handler.hpp>
#include <osmium/io/pbf_input.hpp>
#include <osmium/visitor.hpp>

#include <sys/wait.h>
#include <unistd.h>

#include <algorithm>
#include <chrono>
#include <cstdio>
#include <cstdlib>
#include <filesystem>
#include <functional>
#include <stdexcept>
#include <string>

namespace {

struct Measurement {
    double seconds = 0;
    double peak_mib = 0;
};

// Runs `work` in a child process; returns its wall time and the child's peak memory.
Measurement measure_in_child(const std::function<void()>& work) {
    int channel[2];
    if (pipe(channel) != 0) throw std::runtime_error("pipe failed");
    const pid_t child = fork();
    if (child < 0) throw std::runtime_error("fork failed");
    if (child == 0) {
        close(channel[0]);
        Measurement result;
        const auto start = std::chrono::steady_clock::now();
        work();
        result.seconds = std::chrono::duration<double>(std::chrono::steady_clock::now() - start).count();
        result.peak_mib = ringroad::bench::peak_memory_mib();
        const bool written = write(channel[1], &result, sizeof result) == static_cast<ssize_t>(sizeof result);
        _exit(written ? 0 : 1);
    }
    close(channel[1]);
    Measurement result;
    const bool complete = read(channel[0], &result, sizeof result) == static_cast<ssize_t>(sizeof result);
    close(channel[0]);
    int status = 0;
    waitpid(child, &status, 0);
    if (!complete || !WIFEXITED(status) || WEXITSTATUS(status) != 0) throw std::runtime_error("measurement failed");
    return result;
}

Measurement best_of(int runs, const std::function<void()>& work) {
    Measurement best{1e300, 0};
    for (int run = 0; run < runs; ++run) {
        const Measurement m = measure_in_child(work);
        best.seconds = std::min(best.seconds, m.seconds);
        best.peak_mib = std::max(best.peak_mib, m.peak_mib);
    }
    return best;
}

struct DoNothing : osmium::handler::Handler {};

void bare_read(const std::string& path) {
    osmium::io::Reader reader{path};   // all entity types: every object is decoded
    DoNothing handler;
    osmium::apply(reader, handler);
    reader.close();
}

void ringroad_build(const std::string& path, const std::string& output) {
    const auto graph = ringroad::extract::extract_and_build_road_graph(
        {path, *ringroad::extract::profile_from_name("car")}, nullptr);
    ringroad::graph::write_road_graph(graph, output);
}

} // namespace

int main(int argc, char** argv) {
    const int runs = argc > 1 ? std::max(1, std::atoi(argv[1])) : 5;
    const std::string output = (std::filesystem::temp_directory_path() /
                                ("build_bench-" + std::to_string(getpid()) + ".rrg")).string();
    std::printf("ringroad build (car profile, extract + graph + write) vs bare libosmium read; best of %d runs\n", runs);
    std::printf("%-18s %12s %14s %8s %14s %14s\n", "file", "bare read s", "our build s", "ratio", "bare peak MiB",
                "our peak MiB");
    bool within_target = true;
    for (const char* file : {"monaco.osm.pbf", "andorra.osm.pbf"}) {
        const std::string path = std::string(RINGROAD_FIXTURES_DIR) + "/osm/" + file;
        const Measurement bare = best_of(runs, [&] { bare_read(path); });
        const Measurement ours = best_of(runs, [&] { ringroad_build(path, output); });
        const double ratio = ours.seconds / bare.seconds;
        within_target = within_target && ratio <= 2.0;
        std::printf("%-18s %12.3f %14.3f %7.2fx %14.1f %14.1f\n", file, bare.seconds, ours.seconds, ratio,
                    bare.peak_mib, ours.peak_mib);
    }
    std::filesystem::remove(output);
    std::printf("target ratio <= 2.00x: %s\n", within_target ? "met" : "NOT met");
    return 0;
}
