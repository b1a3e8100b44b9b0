#include "tests/support/run_command.hpp"

#include <fcntl.h>
#include <sys/wait.h>
#include <unistd.h>

#include <atomic>
#include <cstdlib>
#include <filesystem>
#include <fstream>
#include <mutex>
#include <sstream>
#include <stdexcept>

namespace ringroad::test {

namespace {

// Every scratch folder handed out, removed when the test program exits so that repeated runs do
// not pile up folders in /tmp. Set RINGROAD_KEEP_SCRATCH=1 to keep them for a post-mortem.
class ScratchFolders {
public:
    ~ScratchFolders() {
        if (std::getenv("RINGROAD_KEEP_SCRATCH") != nullptr) return;
        std::error_code ignored;
        for (const auto& folder : folders_) std::filesystem::remove_all(folder, ignored);
    }
    void remember(const std::filesystem::path& folder) {
        const std::lock_guard lock(mutex_);
        folders_.push_back(folder);
    }

private:
    std::mutex mutex_;
    std::vector<std::filesystem::path> folders_;
};

ScratchFolders& scratch_folders() {
    static ScratchFolders folders;
    return folders;
}

std::string slurp(const std::string& path) {
    std::ifstream in(path, std::ios::binary);
    std::ostringstream text;
    text << in.rdbuf();
    return text.str();
}

} // namespace

CommandResult run_ringroad(const std::vector<std::string>& arguments) {
    const std::string scratch = make_scratch_dir("run");
    const std::string out_path = scratch + "/stdout";
    const std::string err_path = scratch + "/stderr";

    // fork/exec rather than system(): no shell, so arguments need no quoting.
    const pid_t child = fork();
    if (child < 0) throw std::runtime_error("fork failed");
    if (child == 0) {
        const int in = open("/dev/null", O_RDONLY);
        const int out = open(out_path.c_str(), O_WRONLY | O_CREAT | O_TRUNC, 0644);
        const int err = open(err_path.c_str(), O_WRONLY | O_CREAT | O_TRUNC, 0644);
        dup2(in, 0);
        dup2(out, 1);
        dup2(err, 2);
        std::vector<char*> argv;
        std::string binary = RINGROAD_BINARY;
        argv.push_back(binary.data());
        std::vector<std::string> copies = arguments;
        for (auto& argument : copies) argv.push_back(argument.data());
        argv.push_back(nullptr);
        execv(binary.c_str(), argv.data());
        _exit(127);
    }
    int status = 0;
    waitpid(child, &status, 0);
    CommandResult result;
    result.exit_code = WIFEXITED(status) ? WEXITSTATUS(status) : 128 + WTERMSIG(status);
    result.out = slurp(out_path);
    result.err = slurp(err_path);
    std::filesystem::remove_all(scratch);
    return result;
}

std::string fixture_path(const std::string& relative) {
    return std::string(RINGROAD_FIXTURES_DIR) + "/" + relative;
}

std::string make_scratch_dir(const std::string& label) {
    static std::atomic<int> counter{0};
    const auto path = std::filesystem::temp_directory_path() /
                      ("ringroad-test-" + label + "-" + std::to_string(getpid()) + "-" +
                       std::to_string(counter++));
    std::filesystem::remove_all(path);
    std::filesystem::create_directories(path);
    scratch_folders().remember(path);
    return path.string();
}

bool file_exists(const std::string& path) { return std::filesystem::exists(path); }

std::string read_file(const std::string& path) { return slurp(path); }

void write_file(const std::string& path, const std::string& content) {
    std::ofstream out(path, std::ios::binary);
    out << content;
}

} // namespace ringroad::test
