#include "common/atomic_file.hpp"

#include "common/input_error.hpp"
#include "common/standard_output.hpp"

#include <fcntl.h>
#include <signal.h>
#include <sys/stat.h>
#include <unistd.h>

#include <atomic>
#include <cerrno>
#include <cstdlib>
#include <cstring>
#include <filesystem>
#include <vector>

namespace ringroad {

namespace {

namespace fs = std::filesystem;

// Temporary files to remove when a terminating signal arrives. The handler may only read the
// slots and call unlink(); the paths are copies owned by the slots while registered.
constexpr int kCleanupSlots = 16;
std::atomic<char*> cleanup_paths[kCleanupSlots];

extern "C" void remove_temporaries_and_die(int signal_number) {
    for (auto& slot : cleanup_paths) {
        if (char* path = slot.load()) ::unlink(path);
    }
    // Die by the same signal, so the parent sees what happened.
    ::signal(signal_number, SIG_DFL);
    ::raise(signal_number);
}

void install_cleanup_handlers() {
    for (const int signal_number : {SIGHUP, SIGINT, SIGTERM}) {
        struct sigaction current {};
        if (::sigaction(signal_number, nullptr, &current) != 0) continue;
        if (current.sa_handler == SIG_IGN) continue;          // e.g. under nohup: keep ignoring
        if (current.sa_handler != SIG_DFL) continue;          // someone else handles it
        struct sigaction handler {};
        handler.sa_handler = remove_temporaries_and_die;
        sigemptyset(&handler.sa_mask);
        ::sigaction(signal_number, &handler, nullptr);
    }
}

int register_temporary(const std::string& path) {
    install_cleanup_handlers();   // each time: cheap, and follows later changes of disposition
    char* copy = ::strdup(path.c_str());
    for (int i = 0; i < kCleanupSlots; ++i) {
        char* expected = nullptr;
        if (cleanup_paths[i].compare_exchange_strong(expected, copy)) return i;
    }
    std::free(copy);   // more than kCleanupSlots outputs at once: only the destructor cleans up
    return -1;
}

void unregister_temporary(int slot) {
    if (slot < 0) return;
    std::free(cleanup_paths[slot].exchange(nullptr));
}

// The file a path finally names: symbolic links followed (relative ones from their own folder),
// the last one possibly dangling. Loops end with ELOOP as the system would.
std::string resolve_links(const std::string& path) {
    fs::path current = path;
    for (int depth = 0; depth < 40; ++depth) {
        std::error_code error;
        if (!fs::is_symlink(fs::symlink_status(current, error))) return current.string();
        const fs::path target = fs::read_symlink(current, error);
        if (error) return current.string();
        current = target.is_absolute() ? target : current.parent_path() / target;
    }
    errno = ELOOP;
    throw InputError(path + ": too many levels of symbolic links");
}

std::string folder_of(const std::string& path) {
    const auto parent = fs::path(path).parent_path();
    return parent.empty() ? std::string(".") : parent.string();
}

// Names of standard output itself: replacing what they link to (a redirected file) would leave the
// shell's descriptor on the old, unlinked file and the output lost.
bool names_standard_output(const std::string& path) {
    return path == "-" || path == "/dev/stdout" || path == "/dev/fd/1" || path == "/proc/self/fd/1";
}

bool is_special(mode_t mode) { return S_ISCHR(mode) || S_ISBLK(mode) || S_ISFIFO(mode) || S_ISSOCK(mode); }

mode_t creation_mode() {
    const mode_t mask = ::umask(0);
    ::umask(mask);
    return 0666 & ~mask;
}

} // namespace

std::string final_link_target(const std::string& path) { return resolve_links(path); }

bool is_stream_output(const std::string& path) {
    if (names_standard_output(path)) return true;
    struct stat status {};
    return ::stat(resolve_links(path).c_str(), &status) == 0 && is_special(status.st_mode);
}

void check_output_writable(const std::string& path) {
    if (names_standard_output(path)) return;
    const std::string resolved = resolve_links(path);
    struct stat status {};
    if (::stat(resolved.c_str(), &status) == 0) {
        if (S_ISDIR(status.st_mode)) throw InputError(path + ": is a folder, not a file name");
        if (is_special(status.st_mode)) {
            if (::access(resolved.c_str(), W_OK) != 0) throw InputError(path + ": not writable: " + std::strerror(errno));
            return;
        }
    }
    const std::string folder = folder_of(resolved);
    std::error_code error;
    if (!fs::is_directory(folder, error)) throw InputError(path + ": output folder '" + folder + "' does not exist");
    // Try it rather than ask access(): root passes access() even where nothing can be created.
    std::string probe = (fs::path(folder) / ".ringroad-write-check-XXXXXX").string();
    const int descriptor = ::mkstemp(probe.data());
    if (descriptor < 0) throw InputError(path + ": output folder '" + folder + "' is not writable");
    ::close(descriptor);
    ::unlink(probe.c_str());
}

AtomicFile::AtomicFile(std::string target_path) : target_(std::move(target_path)) {
    if (target_.empty()) throw InputError("an empty output file name (use - for standard output)");
    if (names_standard_output(target_)) {
        kind_ = Kind::standard_output;
    } else {
        resolved_ = resolve_links(target_);
        struct stat status {};
        if (::stat(resolved_.c_str(), &status) == 0) {
            if (S_ISDIR(status.st_mode)) throw InputError(target_ + ": is a folder, not a file name");
            if (is_special(status.st_mode)) kind_ = Kind::special;
        }
    }
    if (kind_ != Kind::regular) {
        // An unnamed scratch file: nothing to clean up, whatever ends the process.
        file_ = std::tmpfile();
        if (file_ == nullptr) throw InputError(target_ + ": cannot create a scratch file: " + std::strerror(errno));
        return;
    }
    const std::string folder = folder_of(resolved_);
    std::error_code error;
    if (!fs::is_directory(folder, error)) {
        throw InputError(target_ + ": output folder '" + folder + "' does not exist");
    }
    // The existing file's mode, or what the umask allows for a new one (mkstemp makes 0600).
    struct stat existing {};
    const mode_t mode = ::stat(resolved_.c_str(), &existing) == 0 ? (existing.st_mode & 07777) : creation_mode();
    // The temporary lives beside the target so that rename() is atomic (same file system).
    std::string pattern = resolved_ + ".tmp-XXXXXX";
    std::vector<char> name(pattern.begin(), pattern.end());
    name.push_back('\0');
    const int descriptor = mkstemp(name.data());
    if (descriptor < 0) {
        throw InputError(target_ + ": cannot write in folder '" + folder + "': " + std::strerror(errno));
    }
    temporary_ = name.data();
    slot_ = register_temporary(temporary_);
    if (::fchmod(descriptor, mode) != 0) {
        // Not fatal: the file stays 0600, which is safe.
    }
    file_ = fdopen(descriptor, "w+b");
    if (file_ == nullptr) {
        ::close(descriptor);
        std::remove(temporary_.c_str());
        unregister_temporary(slot_);
        throw InputError(target_ + ": cannot open temporary file: " + std::strerror(errno));
    }
}

AtomicFile::~AtomicFile() {
    if (file_ != nullptr) std::fclose(file_);
    if (!committed_ && !temporary_.empty()) std::remove(temporary_.c_str());
    unregister_temporary(slot_);
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

void AtomicFile::prepare() {
    if (prepared_) return;
    if (std::fflush(file_) != 0) fail("write failed");
    if (kind_ == Kind::regular) {
        if (::fsync(fileno(file_)) != 0) fail("sync failed");
        const int closed = std::fclose(file_);
        file_ = nullptr;
        if (closed != 0) fail("close failed");
    }
    prepared_ = true;
}

void AtomicFile::publish_by_copy() {
    std::rewind(file_);
    int descriptor = -1;
    if (kind_ == Kind::special) {
        descriptor = ::open(resolved_.c_str(), O_WRONLY | O_NOCTTY);
        if (descriptor < 0) fail("cannot open for writing");
    }
    std::vector<char> buffer(1 << 16);
    std::size_t count = 0;
    while ((count = std::fread(buffer.data(), 1, buffer.size(), file_)) > 0) {
        if (kind_ == Kind::standard_output) {
            write_standard_output(std::string_view(buffer.data(), count));
            continue;
        }
        for (std::size_t done = 0; done < count;) {
            const ssize_t wrote = ::write(descriptor, buffer.data() + done, count - done);
            if (wrote < 0 && errno == EINTR) continue;
            if (wrote <= 0) {
                const int saved = errno;
                ::close(descriptor);
                errno = saved;
                fail("write failed");
            }
            done += static_cast<std::size_t>(wrote);
        }
    }
    if (std::ferror(file_)) fail("cannot read back the scratch file");
    if (descriptor >= 0 && ::close(descriptor) != 0) fail("close failed");
}

void AtomicFile::publish() {
    prepare();
    if (kind_ == Kind::regular) {
        if (std::rename(temporary_.c_str(), resolved_.c_str()) != 0) fail("cannot rename temporary file into place");
    } else {
        publish_by_copy();
    }
    committed_ = true;
}

void write_file_atomically(const std::string& path, std::string_view content) {
    AtomicFile file(path);
    file.write(content);
    file.commit();
}

} // namespace ringroad
