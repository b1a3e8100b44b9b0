// build_bench: ringroad's build of each real extract (extract + build_road_graph + write, car
// profile) against a bare libosmium read of the same file (every object decoded, a handler that
// does nothing), side by side in one run. Target: our build <= 2x the bare read.
//
// Each measurement runs in its own child process so that its peak memory (VmHWM) is its own and
// the page cache is warm for both; the best of several runs is reported, since the machine is
// shared. Wall and CPU time (all threads) are both reported: on a busy machine the CPU ratio is the
// steadier one. "ours unsaved" is the build without writing the file, whose fsync waits for the
// disk. "with hierarchy" is the whole default `ringroad build`, contraction hierarchies (time and
// distance) included: the target applies to reading the map into a graph; the hierarchy is the
// routing preparation stored alongside, reported separately. Usage: build_bench [RUNS] (default 5)

#include "bench/peak_memory.hpp"
#include "extract/road_extractor.hpp"
#include "graph/graph_file.hpp"
#include "router/hierarchy/contraction_hierarchy.hpp"

#include <osmium/handler.hpp>
#include <osmium/io/pbf_input.hpp>
#include <osmium/visitor.hpp>

#include <sys/resource.h>
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
    double seconds = 0;       // wall time
    double cpu_seconds = 0;   // user + system time of all threads: steadier on a busy machine
    double peak_mib = 0;
};

double cpu_seconds_so_far() {
    rusage usage{};
    getrusage(RUSAGE_SELF, &usage);
    return static_cast<double>(usage.ru_utime.tv_sec + usage.ru_stime.tv_sec) +
           static_cast<double>(usage.ru_utime.tv_usec + usage.ru_stime.tv_usec) * 1e-6;
}

// Runs `work` in a child process; returns its wall time and the child's peak memory.
Measurement measure_in_child(const std::function<void()>& work) {
    int channel[2];
    if (pipe(channel) != 0) throw std::runtime_error("pipe failed");
    const pid_t child = fork();
    if (child < 0) throw std::runtime_error("fork failed");
    if (child == 0) {
        close(channel[0]);
        Measurement result;
        const double cpu_start = cpu_seconds_so_far();
        const auto start = std::chrono::steady_clock::now();
        work();
        result.seconds = std::chrono::duration<double>(std::chrono::steady_clock::now() - start).count();
        result.cpu_seconds = cpu_seconds_so_far() - cpu_start;
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
    Measurement best{1e300, 1e300, 0};
    for (int run = 0; run < runs; ++run) {
        const Measurement m = measure_in_child(work);
        best.seconds = std::min(best.seconds, m.seconds);
        best.cpu_seconds = std::min(best.cpu_seconds, m.cpu_seconds);
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

ringroad::graph::RoadGraph build_in_memory(const std::string& path) {
    return ringroad::extract::extract_and_build_road_graph({path, *ringroad::extract::profile_from_name("car")}, nullptr);
}

void ringroad_build(const std::string& path, const std::string& output) {
    ringroad::graph::write_road_graph(build_in_memory(path), output);
}

void ringroad_build_with_hierarchy(const std::string& path, const std::string& output) {
    const ringroad::graph::RoadGraph graph = build_in_memory(path);
    auto sections = ringroad::router::hierarchy::build_hierarchy_sections(graph);
    ringroad::graph::write_road_graph(ringroad::graph::attach_sections(graph, std::move(sections)), output);
}

} // namespace

int main(int argc, char** argv) {
    const int runs = argc > 1 ? std::max(1, std::atoi(argv[1])) : 5;
    const std::string output = (std::filesystem::temp_directory_path() /
                                ("build_bench-" + std::to_string(getpid()) + ".rrg")).string();
    std::printf("ringroad build (car profile: extract + graph + write) vs bare libosmium read; best of %d runs\n", runs);
    std::printf("%-16s %8s %8s %7s %10s %10s %7s %9s %9s %15s %21s\n", "file", "bare s", "ours s", "ratio", "bare cpu s",
                "ours cpu s", "ratio", "bare MiB", "ours MiB", "ours unsaved s", "with hierarchy s/MiB");
    bool within_target = true;
    for (const char* file : {"monaco.osm.pbf", "andorra.osm.pbf"}) {
        const std::string path = std::string(RINGROAD_FIXTURES_DIR) + "/osm/" + file;
        const Measurement bare = best_of(runs, [&] { bare_read(path); });
        const Measurement ours = best_of(runs, [&] { ringroad_build(path, output); });
        // The same without writing the file (whose fsync waits for the disk), for reference.
        const Measurement unsaved = best_of(runs, [&] { build_in_memory(path); });
        const Measurement full = best_of(runs, [&] { ringroad_build_with_hierarchy(path, output); });
        const double ratio = ours.seconds / bare.seconds;
        const double cpu_ratio = ours.cpu_seconds / bare.cpu_seconds;
        within_target = within_target && ratio <= 2.0;
        std::printf("%-16s %8.3f %8.3f %6.2fx %10.3f %10.3f %6.2fx %9.1f %9.1f %8.3f (%.2fx) %6.3f (%.2fx) %5.1f\n", file,
                    bare.seconds, ours.seconds, ratio, bare.cpu_seconds, ours.cpu_seconds, cpu_ratio, bare.peak_mib,
                    ours.peak_mib, unsaved.seconds, unsaved.seconds / bare.seconds, full.seconds,
                    full.seconds / bare.seconds, full.peak_mib);
    }
    std::filesystem::remove(output);
    std::printf("target wall-time ratio <= 2.00x: %s\n", within_target ? "met" : "NOT met");
    return 0;
}
