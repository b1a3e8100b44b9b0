#pragma once
// AtomicFile: an output written whole or not at all. Where the target is (or will be) a regular
// file, writes go to a temporary file beside it and commit() flushes and renames it into place;
// if commit() is never reached (an exception, a kill, SIGHUP/SIGINT/SIGTERM) the target is
// untouched and the temporary is removed. Other targets:
//  * "-" (and /dev/stdout) is standard output; a device node, FIFO or socket is written into directly. Both get
//    the whole content at commit(), from an unnamed scratch file, so a failure before it writes
//    nothing.
//  * a symbolic link: its final target is replaced, the link stays.
// A new file gets the mode the umask allows (0666 & ~umask); a replaced file keeps its mode.

#include <cstddef>
#include <cstdio>
#include <string>
#include <string_view>

namespace ringroad {

class AtomicFile {
public:
    // Throws InputError naming the path when it is a folder, or its folder is missing or not
    // writable.
    explicit AtomicFile(std::string target_path);
    ~AtomicFile();
    AtomicFile(const AtomicFile&) = delete;
    AtomicFile& operator=(const AtomicFile&) = delete;

    void write(const void* data, std::size_t size);
    void write(std::string_view text) { write(text.data(), text.size()); }
    // Bytes written so far (the offset of the next write).
    std::size_t position() const noexcept { return written_; }
    // Pads with zero bytes up to a multiple of `alignment`.
    void align_to(std::size_t alignment);
    // Overwrites bytes already written (used for headers whose content is known only at the end).
    void write_at(std::size_t offset, const void* data, std::size_t size);

    // prepare() makes the content durable without showing it (flush, sync); publish() shows it
    // (rename, or the copy into a special file or standard output). commit() is both. Several
    // outputs that must appear together are all prepared before any is published.
    void prepare();
    void publish();
    void commit() {
        prepare();
        publish();
    }

    const std::string& target_path() const noexcept { return target_; }
    const std::string& temporary_path() const noexcept { return temporary_; }

private:
    enum class Kind { regular, special, standard_output };
    [[noreturn]] void fail(const std::string& what);
    void publish_by_copy();

    std::string target_;      // as given (messages)
    std::string resolved_;    // the file actually replaced (a symbolic link's final target)
    std::string temporary_;
    Kind kind_ = Kind::regular;
    std::FILE* file_ = nullptr;
    std::size_t written_ = 0;
    int slot_ = -1;           // entry in the signal-time clean-up list
    bool prepared_ = false;
    bool committed_ = false;
};

// Fails early (before long work) when `path` could not be written: a folder, a missing or
// unwritable folder. "-" and existing special files pass.
void check_output_writable(const std::string& path);

// The file an output path finally names: symbolic links followed, the last one possibly dangling.
std::string final_link_target(const std::string& path);

// True for "-" and for an existing device node, FIFO or socket (written into, not replaced).
bool is_stream_output(const std::string& path);

// Writes a whole text file atomically (CSV, JSON, GeoJSON, GPX outputs); "-" is standard output.
void write_file_atomically(const std::string& path, std::string_view content);

} // namespace ringroad
