#pragma once
// Test helpers for the region-file tests: a file's bytes in and out, and the one-line error the
// loader gives for it (empty when it loads).

#include "common/input_error.hpp"
#include "graph/graph_file.hpp"

#include <fstream>
#include <iterator>
#include <string>
#include <vector>

namespace ringroad::test {

inline std::vector<char> read_bytes(const std::string& path) {
    std::ifstream in(path, std::ios::binary);
    return {std::istreambuf_iterator<char>(in), std::istreambuf_iterator<char>()};
}

inline void write_bytes(const std::string& path, const std::vector<char>& bytes) {
    std::ofstream out(path, std::ios::binary | std::ios::trunc);
    out.write(bytes.data(), static_cast<std::streamsize>(bytes.size()));
}

inline std::string load_error(const std::string& path) {
    try {
        graph::load_road_graph(path);
    } catch (const InputError& error) {
        return error.what();
    }
    return "";
}

} // namespace ringroad::test
