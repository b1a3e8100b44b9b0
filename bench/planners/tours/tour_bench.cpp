// Tour planner benchmark on the shipped TSPLIB instances (fixtures/tsplib, Reinelt 1991):
// for each instance the published optimum, our tour and its gap, our lower bound and its gap,
// the seconds taken, and the plain tree-doubling tour's gap for comparison; then mean gaps.
// Targets (issue 4), default 1 s limit, one core: mean tour gap <= 1.0 % symmetric (none above
// 3 %), <= 2.0 % asymmetric; symmetric lower bound within 1.5 % of the optimum on average.
// Usage: tour_bench [--time-limit S] [--seed N] [NAME ...]   (names select a subset)

#include "bench/peak_memory.hpp"
#include "planners/tours/tour_planner.hpp"
#include "tests/support/tsplib_reader.hpp"

#include <algorithm>
#include <chrono>
#include <ctime>
#include <tuple>
#include <cstdio>
#include <cstdlib>
#include <filesystem>
#include <map>
#include <string>
#include <vector>

namespace {

using ringroad::planners::tours::TourMethod;
using ringroad::planners::tours::TourRequest;

struct Totals {
    double tour_gap = 0, bound_gap = 0, doubling_gap = 0, worst_gap = 0, seconds = 0, cpu = 0;
    int count = 0;
};

double percent(double value, double optimum) { return 100.0 * (value - optimum) / optimum; }

// CPU seconds of this (single-threaded) process: the machine may be shared, so wall seconds
// overstate the cost of a run; both are printed.
double cpu_seconds() {
    timespec now{};
    clock_gettime(CLOCK_PROCESS_CPUTIME_ID, &now);
    return static_cast<double>(now.tv_sec) + 1e-9 * static_cast<double>(now.tv_nsec);
}

} // namespace

int main(int argc, char** argv) {
    TourRequest request;
    std::vector<std::string> wanted;
    for (int i = 1; i < argc; ++i) {
        const std::string argument = argv[i];
        if (argument == "--time-limit" && i + 1 < argc) request.time_limit_seconds = std::atof(argv[++i]);
        else if (argument == "--seed" && i + 1 < argc) request.seed = std::strtoull(argv[++i], nullptr, 10);
        else wanted.push_back(argument);
    }
    const std::string root = std::string(RINGROAD_FIXTURES_DIR) + "/tsplib/";
    std::printf("%-10s %5s %10s %10s %7s %10s %7s %7s %7s %8s %7s  %s\n", "instance", "n", "optimum", "tour", "gap%",
                "bound", "bound%", "seconds", "cpu s", "kicks", "tdbl%", "method");
    std::map<std::string, Totals> totals;
    for (const char* family : {"symmetric", "asymmetric"}) {
        const auto optima = ringroad::test::read_tsplib_optima(root + family + "/optimal.txt");
        std::vector<std::pair<int, std::string>> files;
        for (const auto& entry : std::filesystem::directory_iterator(root + family)) {
            const std::string name = entry.path().stem().string();
            if (!optima.count(name)) continue;
            if (!wanted.empty() && std::find(wanted.begin(), wanted.end(), name) == wanted.end()) continue;
            files.emplace_back(0, entry.path().string());
        }
        std::vector<std::tuple<std::size_t, std::string, std::string>> ordered;
        for (const auto& [unused, path] : files) {
            const auto instance = ringroad::test::read_tsplib_file(path);
            ordered.emplace_back(instance.costs.size(), std::filesystem::path(path).stem().string(), path);
        }
        std::sort(ordered.begin(), ordered.end());
        for (const auto& [size, name, path] : ordered) {
            const auto instance = ringroad::test::read_tsplib_file(path);
            const double optimum = static_cast<double>(optima.at(name));
            TourRequest automatic = request;
            automatic.exact_limit = 16;
            const double cpu_before = cpu_seconds();
            const auto result = ringroad::planners::tours::plan_tour(instance.costs, automatic);
            const double cpu = cpu_seconds() - cpu_before;
            TourRequest doubling = request;
            doubling.method = TourMethod::tree_doubling;
            const auto plain = ringroad::planners::tours::plan_tour(instance.costs, doubling);
            const double gap = percent(result.cost, optimum);
            const double bound_gap = -percent(result.lower_bound, optimum);
            std::printf("%-10s %5zu %10.0f %10.0f %7.2f %10.0f %7.2f %7.3f %7.3f %8llu %7.2f  %s\n", name.c_str(), size,
                        optimum, result.cost, gap, result.lower_bound, bound_gap, result.elapsed_seconds, cpu,
                        static_cast<unsigned long long>(result.kicks), percent(plain.cost, optimum), result.method.c_str());
            std::fflush(stdout);
            Totals& t = totals[family];
            t.tour_gap += gap;
            t.bound_gap += bound_gap;
            t.doubling_gap += percent(plain.cost, optimum);
            t.worst_gap = std::max(t.worst_gap, gap);
            t.seconds += result.elapsed_seconds;
            t.cpu += cpu;
            ++t.count;
        }
    }
    std::printf("\n%-10s %9s %9s %10s %10s %12s %12s\n", "family", "mean gap%", "max gap%", "bound gap%", "tdbl gap%",
                "mean seconds", "mean cpu s");
    for (const auto& [family, t] : totals)
        if (t.count > 0)
            std::printf("%-10s %9.3f %9.3f %10.3f %10.2f %12.3f %12.3f\n", family.c_str(), t.tour_gap / t.count,
                        t.worst_gap, t.bound_gap / t.count, t.doubling_gap / t.count, t.seconds / t.count, t.cpu / t.count);
    // The exact solver at its default limit (16 stops) and its maximum (20 stops: the first 20
    // cities of ulysses22), closed tours, against the published optimum where there is one.
    for (const std::size_t stops : {std::size_t{16}, std::size_t{20}}) {
        const auto instance = ringroad::test::read_tsplib_file(root + "symmetric/" + (stops == 16 ? "ulysses16" : "ulysses22") + ".tsp");
        ringroad::planners::matrices::CostMatrix part(stops, 0.0);
        for (std::size_t i = 0; i < stops; ++i)
            for (std::size_t j = 0; j < stops; ++j) part(i, j) = instance.costs(i, j);
        TourRequest exact = request;
        exact.exact_limit = stops;
        const double memory_before = ringroad::bench::peak_memory_mib();
        const auto result = ringroad::planners::tours::plan_tour(part, exact);
        std::printf("held-karp %2zu stops: cost %.0f%s in %.3f s, peak memory %.1f MiB (before: %.1f MiB)\n", stops,
                    result.cost, stops == 16 ? " (published optimum 6859)" : "", result.elapsed_seconds,
                    ringroad::bench::peak_memory_mib(), memory_before);
    }
    std::printf("peak memory: %.1f MiB\n", ringroad::bench::peak_memory_mib());
    return 0;
}
