#include "bench/peak_memory.hpp"

#include <fstream>
#include <string>

namespace ringroad::bench {

double peak_memory_mib() {
    std::ifstream status("/proc/self/status");
    std::string line;
    while (std::getline(status, line)) {
        if (line.rfind("VmHWM:", 0) == 0) return std::stod(line.substr(6)) / 1024.0;  // kB
    }
    return 0.0;
}

} // namespace ringroad::bench
