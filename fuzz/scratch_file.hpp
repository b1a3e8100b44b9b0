#pragma once
// ScratchFile: one file per fuzzing process, rewritten with each input, for the loaders that read
// only from a path (the region file, OSM extracts). It lives in $RINGROAD_FUZZ_SCRATCH when set
// (scripts/fuzz.sh points it at a private folder in /dev/shm), else in /dev/shm, else /tmp, so
// inputs never touch a disk. The file name ends in the given suffix, which picks the OSM format.

#include <cstddef>
#include <cstdint>
#include <string>

namespace ringroad::fuzz {

class ScratchFile {
public:
    explicit ScratchFile(const std::string& suffix);
    ~ScratchFile();
    ScratchFile(const ScratchFile&) = delete;
    ScratchFile& operator=(const ScratchFile&) = delete;

    // Replaces the file's contents with `data`; aborts if it cannot (a harness fault, not a find).
    const std::string& write(const std::uint8_t* data, std::size_t size);
    const std::string& path() const noexcept { return path_; }

private:
    std::string path_;
};

} // namespace ringroad::fuzz
