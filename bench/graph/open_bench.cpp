// open_bench: what opening a region file costs, and of what it is made, against reading the file
// once (read(2) into a reused buffer: what `cat FILE > /dev/null` does), all in one run on a warm
// page cache:
//   * load_road_graph: map, check every checksum, then the consistency pass (the whole open);
//   * the checksums alone: graph::section_checksum over the whole mapped file, freshly mapped;
//   * the consistency pass alone: graph::find_inconsistency on an already loaded graph.
// Each is repeated R times (default 7); best and median in milliseconds of CPU time of the
// process (the machine is shared: wall time measures the neighbours too; page faults and copies
// in the kernel count as system time), the best wall time beside them, and the ratio of best CPU
// times to the read.
//
// Usage: open_bench [--runs R] REGION.rrg

#include "bench/peak_memory.hpp"
#include "graph/checksum.hpp"
#include "graph/consistency_check.hpp"
#include "graph/graph_file.hpp"

#include <fcntl.h>
#include <time.h>
#include <sys/mman.h>
#include <sys/stat.h>
#include <unistd.h>

#include <algorithm>
#include <chrono>
#include <cstdio>
#include <cstdlib>
#include <functional>
#include <string>
#include <vector>

using namespace ringroad;

namespace {

struct Timing {
    double best = 0, median = 0, best_wall = 0;
};

double process_cpu_milliseconds() {
    timespec now{};
    clock_gettime(CLOCK_PROCESS_CPUTIME_ID, &now);
    return now.tv_sec * 1e3 + now.tv_nsec / 1e6;
}

Timing time_runs(int runs, const std::function<void()>& work) {
    std::vector<double> times;
    double best_wall = 1e300;
    for (int run = 0; run < runs; ++run) {
        const auto start = std::chrono::steady_clock::now();
        const double cpu_start = process_cpu_milliseconds();
        work();
        times.push_back(process_cpu_milliseconds() - cpu_start);
        best_wall = std::min(best_wall, std::chrono::duration<double, std::milli>(std::chrono::steady_clock::now() - start).count());
    }
    std::sort(times.begin(), times.end());
    return {times.front(), times[times.size() / 2], best_wall};
}

std::size_t file_size(const std::string& path) {
    struct stat status {};
    if (::stat(path.c_str(), &status) != 0) {
        std::fprintf(stderr, "open_bench: cannot read %s\n", path.c_str());
        std::exit(1);
    }
    return static_cast<std::size_t>(status.st_size);
}

} // namespace

int main(int argc, char** argv) {
    int runs = 7;
    std::string path;
    for (int i = 1; i < argc; ++i) {
        const std::string argument = argv[i];
        if (argument == "--runs" && i + 1 < argc) {
            runs = std::max(1, std::atoi(argv[++i]));
        } else if (!argument.empty() && argument[0] != '-' && path.empty()) {
            path = argument;
        } else {
            std::fprintf(stderr, "usage: open_bench [--runs R] REGION.rrg\n");
            return 2;
        }
    }
    if (path.empty()) {
        std::fprintf(stderr, "usage: open_bench [--runs R] REGION.rrg\n");
        return 2;
    }
    const std::size_t size = file_size(path);
    volatile std::uint64_t sink = 0;

    std::vector<char> buffer(1 << 20);
    const auto read_once = [&] {
        const int descriptor = ::open(path.c_str(), O_RDONLY | O_CLOEXEC);
        ssize_t got;
        while ((got = ::read(descriptor, buffer.data(), buffer.size())) > 0) sink = sink + static_cast<unsigned char>(buffer[0]);
        ::close(descriptor);
    };
    read_once();  // warms the page cache
    const Timing read = time_runs(runs, read_once);

    const Timing load = time_runs(runs, [&] { sink = sink + graph::load_road_graph(path).vertex_count(); });

    const Timing checksums = time_runs(runs, [&] {
        const int descriptor = ::open(path.c_str(), O_RDONLY | O_CLOEXEC);
        void* address = ::mmap(nullptr, size, PROT_READ, MAP_PRIVATE, descriptor, 0);
        ::close(descriptor);
        sink = sink + graph::section_checksum(address, size);
        ::munmap(address, size);
    });

    const graph::RoadGraph loaded = graph::load_road_graph(path);
    const Timing consistency = time_runs(runs, [&] { sink = sink + graph::find_inconsistency(loaded).size(); });

    std::printf("open_bench: %s, %.1f MiB, %u junctions, %u edges, %u segments, best of %d runs\n", path.c_str(),
                size / 1048576.0, loaded.vertex_count(), loaded.edge_count(), loaded.segment_count(), runs);
    std::printf("%-44s %12s %12s %12s %8s\n", "measurement", "best cpu ms", "median cpu", "best wall ms", "/ read");
    const auto row = [&](const char* name, const Timing& timing) {
        std::printf("%-44s %12.1f %12.1f %12.1f %8.2f\n", name, timing.best, timing.median, timing.best_wall,
                    timing.best / read.best);
    };
    row("read(2) of the whole file (reference)", read);
    row("load_road_graph (map + checksums + pass)", load);
    row("checksum of the whole file, freshly mapped", checksums);
    row("consistency pass alone (find_inconsistency)", consistency);
    std::printf("peak resident memory: %.0f MiB\n", bench::peak_memory_mib());
    return 0;
}
