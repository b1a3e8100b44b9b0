#include "common/atomic_file.hpp"

#include "common/input_error.hpp"

#include <unistd.h>

#include <cerrno>
#include <cstring>
#include <filesystem>
#include <vector>

namespace ringroad {

namespace {

std::string folder_of(const std::string& path) {
    const auto parent = std::filesystem::path(path).parent_path();
    return parent.empty() ? std::string(".") : parent.string();
}

} // namespace

AtomicFile::AtomicFile(std::string target_path) : target_(std::move(target_path)) {
    const std::string folder = folder_of(target_);
    std::error_code error;
    if (!std::filesystem::is_directory(folder, error)) {
        throw InputError(target_ + ": output folder '" + folder + "' does not exist");
    }
    // The temporary lives beside the target so that rename() is atomic (same file system).
    std::string pattern = target_ + ".tmp-XXXXXX";
    std::vector<char> name(pattern.begin(), pattern.end());
    name.push_back('\0');
    const int descriptor = mkstemp(name.data());
    if (descriptor < 0) {
        throw InputError(target_ + ": cannot write in folder '" + folder + "': " + std::strerror(errno));
    }
    temporary_ = name.data();
    file_ = fdopen(descriptor, "wb");
    if (file_ == nullptr) {
        ::close(descriptor);
        std::remove(temporary_.c_str());
        throw InputError(target_ + ": cannot open temporary file: " + std::strerror(errno));
    }
}

AtomicFile::~AtomicFile() {
    if (file_ != nullptr) std::fclose(file_);
    if (!committed_ && !temporary_.empty()) std::remove(temporary_.c_str());
}

void AtomicFile::fail(const std::string& what) {
    throw InputError(target_ + ": " + what + ": " + std::strerror(errno));
}

void AtomicFile::write(const void* data, std::size_t size) {
    if (size == 0) return;
    if (std::fwrite(data, 1, size, file_) != size) fail("write failed");
    written_ += size;
}

void AtomicFile::align_to(std::size_t alignment) {
    static const char zeros[64] = {};
    const std::size_t remainder = written_ % alignment;
    if (remainder != 0) write(zeros, alignment - remainder);
}

void AtomicFile::write_at(std::size_t offset, const void* data, std::size_t size) {
    if (std::fflush(file_) != 0) fail("write failed");
    if (std::fseek(file_, static_cast<long>(offset), SEEK_SET) != 0) fail("seek failed");
    if (std::fwrite(data, 1, size, file_) != size) fail("write failed");
    if (std::fseek(file_, 0, SEEK_END) != 0) fail("seek failed");
}

void AtomicFile::commit() {
    if (std::fflush(file_) != 0) fail("write failed");
    if (::fsync(fileno(file_)) != 0) fail("sync failed");
    const int closed = std::fclose(file_);
    file_ = nullptr;
    if (closed != 0) fail("close failed");
    if (std::rename(temporary_.c_str(), target_.c_str()) != 0) fail("cannot rename temporary file into place");
    committed_ = true;
}

void write_file_atomically(const std::string& path, std::string_view content) {
    AtomicFile file(path);
    file.write(content);
    file.commit();
}

} // namespace ringroad
