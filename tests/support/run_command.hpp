#pragma once
// Test helpers: run the real `ringroad` binary and find fixtures and scratch folders.

#include <string>
#include <vector>

namespace ringroad::test {

struct CommandResult {
    int exit_code = -1;
    std::string out;    // stdout
    std::string err;    // stderr
};

// Runs the built `ringroad` with the given arguments (no shell quoting needed), stdin empty.
CommandResult run_ringroad(const std::vector<std::string>& arguments);

// Absolute path of a file under fixtures/.
std::string fixture_path(const std::string& relative);

// A fresh empty folder under the system temp folder, unique per call.
std::string make_scratch_dir(const std::string& label);

bool file_exists(const std::string& path);
std::string read_file(const std::string& path);
void write_file(const std::string& path, const std::string& content);

} // namespace ringroad::test
