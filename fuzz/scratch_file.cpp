#include "fuzz/scratch_file.hpp"

#include <fcntl.h>
#include <unistd.h>

#include <cstdio>
#include <cstdlib>
#include <filesystem>

namespace ringroad::fuzz {

namespace {

std::string scratch_folder() {
    if (const char* chosen = std::getenv("RINGROAD_FUZZ_SCRATCH"); chosen != nullptr && *chosen != '\0') return chosen;
    std::error_code error;
    if (std::filesystem::is_directory("/dev/shm", error)) return "/dev/shm";
    return std::filesystem::temp_directory_path().string();
}

} // namespace

ScratchFile::ScratchFile(const std::string& suffix)
    : path_(scratch_folder() + "/ringroad-fuzz-" + std::to_string(::getpid()) + suffix) {}

ScratchFile::~ScratchFile() { ::unlink(path_.c_str()); }

const std::string& ScratchFile::write(const std::uint8_t* data, std::size_t size) {
    const int descriptor = ::open(path_.c_str(), O_WRONLY | O_CREAT | O_TRUNC | O_CLOEXEC, 0600);
    if (descriptor < 0) {
        std::perror(path_.c_str());
        std::abort();
    }
    while (size > 0) {
        const ssize_t written = ::write(descriptor, data, size);
        if (written <= 0) {
            std::perror(path_.c_str());
            std::abort();
        }
        data += written;
        size -= static_cast<std::size_t>(written);
    }
    ::close(descriptor);
    return path_;
}

} // namespace ringroad::fuzz
