// checksum_bench: the candidates for the .rrg section checksum, side by side on the same bytes in
// one run: zlib's crc32 (format version 1, the reference), XXH3 64-bit from libxxhash (its
// portable SSE2 build and its run-time dispatch to AVX2), CRC32C with the SSE 4.2 instruction
// (one stream, and three interleaved streams as an upper bound: the combination of the three
// values is left out), CRC32C in software (slicing by 8, the fallback a CRC32C format would need
// on hosts without the instruction), and graph::section_checksum, what the loader calls. A plain
// 64-bit sum over the same bytes is the memory-bandwidth floor.
//
// Times are CPU time of the thread (the machine is shared: wall time measures the neighbours
// too), best and median of R runs; the wall-clock best is printed beside them.
//
// Usage: checksum_bench [--megabytes N] [--runs R] [FILE]
//   FILE (a region file, say) is mapped and read once before timing, so the page cache is warm;
//   without it, N MiB (default 400) of random bytes in memory.

#include "bench/peak_memory.hpp"
#include "graph/checksum.hpp"

#include <xxhash.h>
#define XXH_DISPATCH_DISABLE_REPLACE
#include <xxh_x86dispatch.h>
#include <zlib.h>

#include <fcntl.h>
#include <time.h>
#include <sys/mman.h>
#include <sys/stat.h>
#include <unistd.h>

#if defined(__x86_64__)
#include <nmmintrin.h>
#endif

#include <algorithm>
#include <array>
#include <chrono>
#include <cstdint>
#include <cstdio>
#include <cstdlib>
#include <cstring>
#include <functional>
#include <random>
#include <string>
#include <vector>

namespace {

std::uint64_t zlib_crc32(const unsigned char* data, std::size_t size) {
    uLong crc = crc32(0L, Z_NULL, 0);
    while (size > 0) {
        const auto chunk = static_cast<uInt>(std::min<std::size_t>(size, 1u << 30));
        crc = crc32(crc, data, chunk);
        data += chunk;
        size -= chunk;
    }
    return crc;
}

// CRC32C (Castagnoli, reflected polynomial 0x82F63B78), slicing by 8.
const std::array<std::array<std::uint32_t, 256>, 8>& crc32c_tables() {
    static const auto tables = [] {
        std::array<std::array<std::uint32_t, 256>, 8> t{};
        for (std::uint32_t i = 0; i < 256; ++i) {
            std::uint32_t crc = i;
            for (int bit = 0; bit < 8; ++bit) crc = (crc >> 1) ^ (0x82F63B78u & (0u - (crc & 1u)));
            t[0][i] = crc;
        }
        for (std::uint32_t i = 0; i < 256; ++i) {
            for (std::size_t k = 1; k < 8; ++k) t[k][i] = (t[k - 1][i] >> 8) ^ t[0][t[k - 1][i] & 0xFF];
        }
        return t;
    }();
    return tables;
}

std::uint64_t crc32c_software(const unsigned char* data, std::size_t size) {
    const auto& t = crc32c_tables();
    std::uint32_t crc = 0xFFFFFFFFu;
    while (size >= 8) {
        std::uint64_t word;
        std::memcpy(&word, data, 8);
        word ^= crc;
        crc = t[7][word & 0xFF] ^ t[6][(word >> 8) & 0xFF] ^ t[5][(word >> 16) & 0xFF] ^ t[4][(word >> 24) & 0xFF] ^
              t[3][(word >> 32) & 0xFF] ^ t[2][(word >> 40) & 0xFF] ^ t[1][(word >> 48) & 0xFF] ^ t[0][word >> 56];
        data += 8;
        size -= 8;
    }
    while (size-- > 0) crc = (crc >> 8) ^ t[0][(crc ^ *data++) & 0xFF];
    return crc ^ 0xFFFFFFFFu;
}

#if defined(__x86_64__)
__attribute__((target("sse4.2"))) std::uint64_t crc32c_hardware(const unsigned char* data, std::size_t size) {
    std::uint64_t crc = 0xFFFFFFFFu;
    while (size >= 8) {
        std::uint64_t word;
        std::memcpy(&word, data, 8);
        crc = _mm_crc32_u64(crc, word);
        data += 8;
        size -= 8;
    }
    auto crc32 = static_cast<std::uint32_t>(crc);
    while (size-- > 0) crc32 = _mm_crc32_u8(crc32, *data++);
    return crc32 ^ 0xFFFFFFFFu;
}

// Three independent streams over the three thirds hide the instruction's 3-cycle latency; a real
// CRC32C would then combine them (a carry-less multiplication per block), not timed here.
__attribute__((target("sse4.2"))) std::uint64_t crc32c_hardware_3way(const unsigned char* data, std::size_t size) {
    const std::size_t third = size / 24 * 8;
    const unsigned char* a = data;
    const unsigned char* b = data + third;
    const unsigned char* c = data + 2 * third;
    std::uint64_t ca = 0xFFFFFFFFu, cb = 0, cc = 0;
    for (std::size_t i = 0; i < third; i += 8) {
        std::uint64_t wa, wb, wc;
        std::memcpy(&wa, a + i, 8);
        std::memcpy(&wb, b + i, 8);
        std::memcpy(&wc, c + i, 8);
        ca = _mm_crc32_u64(ca, wa);
        cb = _mm_crc32_u64(cb, wb);
        cc = _mm_crc32_u64(cc, wc);
    }
    const std::uint64_t rest = crc32c_hardware(data + 3 * third, size - 3 * third);
    return ca ^ cb ^ cc ^ rest;
}
#endif

std::uint64_t word_sum(const unsigned char* data, std::size_t size) {
    std::uint64_t sum = 0;
    std::size_t i = 0;
    for (; i + 8 <= size; i += 8) {
        std::uint64_t word;
        std::memcpy(&word, data + i, 8);
        sum += word;
    }
    for (; i < size; ++i) sum += data[i];
    return sum;
}

double thread_cpu_milliseconds() {
    timespec now{};
    clock_gettime(CLOCK_THREAD_CPUTIME_ID, &now);
    return now.tv_sec * 1e3 + now.tv_nsec / 1e6;
}

struct Candidate {
    const char* name;
    std::function<std::uint64_t(const unsigned char*, std::size_t)> run;
};

} // namespace

int main(int argc, char** argv) {
    std::size_t megabytes = 400;
    int runs = 5;
    std::string file;
    for (int i = 1; i < argc; ++i) {
        const std::string argument = argv[i];
        if (argument == "--megabytes" && i + 1 < argc) {
            megabytes = std::strtoull(argv[++i], nullptr, 10);
        } else if (argument == "--runs" && i + 1 < argc) {
            runs = std::max(1, std::atoi(argv[++i]));
        } else if (!argument.empty() && argument[0] != '-') {
            file = argument;
        } else {
            std::fprintf(stderr, "usage: checksum_bench [--megabytes N] [--runs R] [FILE]\n");
            return 2;
        }
    }

    std::vector<unsigned char> buffer;
    const unsigned char* data = nullptr;
    std::size_t size = 0;
    if (!file.empty()) {
        const int descriptor = ::open(file.c_str(), O_RDONLY | O_CLOEXEC);
        struct stat status {};
        if (descriptor < 0 || ::fstat(descriptor, &status) != 0) {
            std::fprintf(stderr, "checksum_bench: cannot open %s\n", file.c_str());
            return 1;
        }
        size = static_cast<std::size_t>(status.st_size);
        void* address = ::mmap(nullptr, size, PROT_READ, MAP_PRIVATE, descriptor, 0);
        ::close(descriptor);
        if (address == MAP_FAILED) {
            std::fprintf(stderr, "checksum_bench: cannot map %s\n", file.c_str());
            return 1;
        }
        data = static_cast<const unsigned char*>(address);
        std::printf("checksum_bench: %s, %.1f MiB (mapped, page cache warmed by one read)\n", file.c_str(),
                    size / 1048576.0);
    } else {
        size = megabytes << 20;
        buffer.resize(size);
        std::mt19937_64 random(42);
        for (std::size_t i = 0; i + 8 <= size; i += 8) {
            const std::uint64_t word = random();
            std::memcpy(buffer.data() + i, &word, 8);
        }
        data = buffer.data();
        std::printf("checksum_bench: %zu MiB of random bytes in memory\n", megabytes);
    }
    volatile std::uint64_t sink = word_sum(data, size);  // warms the cache and the page tables

    std::vector<Candidate> candidates = {
        {"zlib crc32 (format 1)", zlib_crc32},
        {"XXH3-64, libxxhash SSE2", [](const unsigned char* d, std::size_t n) { return XXH3_64bits(d, n); }},
        {"XXH3-64, libxxhash dispatch", [](const unsigned char* d, std::size_t n) { return XXH3_64bits_dispatch(d, n); }},
        {"graph::section_checksum", [](const unsigned char* d, std::size_t n) { return ringroad::graph::section_checksum(d, n); }},
        {"CRC32C software (slicing-by-8)", crc32c_software},
    };
#if defined(__x86_64__)
    if (__builtin_cpu_supports("sse4.2")) {
        candidates.push_back({"CRC32C SSE4.2, 1 stream", crc32c_hardware});
        candidates.push_back({"CRC32C SSE4.2, 3 streams*", crc32c_hardware_3way});
    }
#endif
    candidates.push_back({"64-bit word sum (bandwidth)", word_sum});

    std::printf("%-32s %12s %12s %10s %12s %12s\n", "checksum", "best cpu ms", "median cpu", "GB/s", "zlib / this",
                "best wall ms");
    double zlib_best = 0;
    for (const auto& candidate : candidates) {
        std::vector<double> times;
        double best_wall = 1e300;
        for (int run = 0; run < runs; ++run) {
            const auto start = std::chrono::steady_clock::now();
            const double cpu_start = thread_cpu_milliseconds();
            sink = sink + candidate.run(data, size);
            times.push_back(thread_cpu_milliseconds() - cpu_start);
            best_wall = std::min(best_wall, std::chrono::duration<double, std::milli>(std::chrono::steady_clock::now() - start).count());
        }
        std::sort(times.begin(), times.end());
        const double best = times.front();
        if (zlib_best == 0) zlib_best = best;
        std::printf("%-32s %12.1f %12.1f %10.2f %12.1f %12.1f\n", candidate.name, best, times[times.size() / 2],
                    size / best / 1e6, zlib_best / best, best_wall);
    }
    std::printf("* three independent CRCs without the final combination: an upper bound for CRC32C\n");
    std::printf("peak resident memory: %.0f MiB\n", ringroad::bench::peak_memory_mib());
    return sink == 1 ? 1 : 0;  // keeps the sums alive
}
