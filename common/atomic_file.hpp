#pragma once
// AtomicFile: writes go to a temporary file beside the target; commit() flushes and renames it
// over the target. If commit() is never reached (an exception, a kill) the target is untouched
// and the destructor removes the temporary, so nobody ever sees a half-written output.

#include <cstddef>
#include <cstdio>
#include <string>
#include <string_view>

namespace ringroad {

class AtomicFile {
public:
    // Throws InputError naming the path when its folder is missing or not writable.
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

    void commit();

    const std::string& target_path() const noexcept { return target_; }
    const std::string& temporary_path() const noexcept { return temporary_; }

private:
    void fail(const std::string& what);

    std::string target_;
    std::string temporary_;
    std::FILE* file_ = nullptr;
    std::size_t written_ = 0;
    bool committed_ = false;
};

// Writes a whole text file atomically (CSV, JSON, GeoJSON, GPX outputs).
void write_file_atomically(const std::string& path, std::string_view content);

} // namespace ringroad
