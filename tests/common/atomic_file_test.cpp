// Outputs are all-or-nothing: until commit() the target is untouched, and an abandoned write
// leaves neither the target nor a temporary behind.

#include "common/atomic_file.hpp"
#include "common/input_error.hpp"
#include "tests/support/run_command.hpp"

#include <catch2/catch.hpp>

#include <fcntl.h>
#include <signal.h>
#include <sys/stat.h>
#include <sys/sysmacros.h>
#include <sys/wait.h>
#include <unistd.h>

#include <filesystem>

using namespace ringroad;

namespace {

bool usable_device(const std::string& path) {
    const int descriptor = ::open(path.c_str(), O_WRONLY);
    if (descriptor < 0) return false;
    ::close(descriptor);
    return true;
}

} // namespace

TEST_CASE("an atomic file appears only on commit") {
    const std::string folder = test::make_scratch_dir("atomic");
    const std::string target = folder + "/out.txt";
    test::write_file(target, "old");
    {
        AtomicFile file(target);
        file.write("new content");
        CHECK(test::read_file(target) == "old");
        file.commit();
    }
    CHECK(test::read_file(target) == "new content");
    {
        AtomicFile file(target);
        file.write("abandoned");
    }
    CHECK(test::read_file(target) == "new content");
    std::size_t entries = 0;
    for ([[maybe_unused]] const auto& entry : std::filesystem::directory_iterator(folder)) ++entries;
    CHECK(entries == 1);
    std::filesystem::remove_all(folder);
}

TEST_CASE("a missing output folder is a one-line input error naming the path") {
    CHECK_THROWS_WITH(AtomicFile("/nonexistent-folder/x/out.csv"),
                      "/nonexistent-folder/x/out.csv: output folder '/nonexistent-folder/x' does not exist");
}

TEST_CASE("a signal while writing removes the temporary, then the process dies by that signal") {
    for (const int signal_number : {SIGHUP, SIGINT, SIGTERM}) {
        CAPTURE(signal_number);
        const std::string folder = test::make_scratch_dir("atomic-signal");
        const pid_t child = ::fork();
        REQUIRE(child >= 0);
        if (child == 0) {
            ::signal(signal_number, SIG_DFL);   // the test framework's own handler set aside
            AtomicFile file(folder + "/region.rrg");
            file.write("half a region");
            ::raise(signal_number);
            ::_exit(0);   // not reached
        }
        int status = 0;
        ::waitpid(child, &status, 0);
        CHECK(WIFSIGNALED(status));
        CHECK(WTERMSIG(status) == signal_number);
        std::size_t entries = 0;
        for ([[maybe_unused]] const auto& entry : std::filesystem::directory_iterator(folder)) ++entries;
        CHECK(entries == 0);
    }
}

TEST_CASE("a symbolic link keeps pointing at its target, which is replaced") {
    const std::string folder = test::make_scratch_dir("atomic-link");
    test::write_file(folder + "/target.csv", "old");
    std::filesystem::create_symlink("target.csv", folder + "/link.csv");
    write_file_atomically(folder + "/link.csv", "new");
    CHECK(std::filesystem::is_symlink(folder + "/link.csv"));
    CHECK(test::read_file(folder + "/target.csv") == "new");
    // A dangling link: its target is created.
    std::filesystem::create_symlink("later.csv", folder + "/dangling.csv");
    write_file_atomically(folder + "/dangling.csv", "made");
    CHECK(std::filesystem::is_symlink(folder + "/dangling.csv"));
    CHECK(test::read_file(folder + "/later.csv") == "made");
}

TEST_CASE("file modes: a new file gets 0666 less the umask, a replaced file keeps its mode") {
    const std::string folder = test::make_scratch_dir("atomic-mode");
    const mode_t previous = ::umask(027);
    write_file_atomically(folder + "/new.csv", "x");
    ::umask(previous);
    struct stat status {};
    REQUIRE(::stat((folder + "/new.csv").c_str(), &status) == 0);
    CHECK((status.st_mode & 0777) == 0640);
    test::write_file(folder + "/kept.csv", "old");
    ::chmod((folder + "/kept.csv").c_str(), 0604);
    write_file_atomically(folder + "/kept.csv", "new");
    REQUIRE(::stat((folder + "/kept.csv").c_str(), &status) == 0);
    CHECK((status.st_mode & 0777) == 0604);
}

TEST_CASE("a device node is written into, not replaced") {
    // Copies of the null and full devices (Linux: 1,3 and 1,7) in a scratch folder, never the
    // system's own: a regression would replace the node with a file, under root too.
    const std::string folder = test::make_scratch_dir("atomic-device");
    const std::string null_device = folder + "/null", full_device = folder + "/full";
    if (::mknod(null_device.c_str(), S_IFCHR | 0666, makedev(1, 3)) != 0 ||
        ::mknod(full_device.c_str(), S_IFCHR | 0666, makedev(1, 7)) != 0 || !usable_device(null_device)) {
        WARN("cannot make device nodes here (not root, or a nodev file system): skipped");
        return;
    }
    write_file_atomically(null_device, "discarded");
    struct stat status {};
    REQUIRE(::stat(null_device.c_str(), &status) == 0);
    CHECK(S_ISCHR(status.st_mode));
    CHECK_THROWS_WITH(write_file_atomically(full_device, "no room"), Catch::Contains("No space left on device"));
    REQUIRE(::stat(full_device.c_str(), &status) == 0);
    CHECK(S_ISCHR(status.st_mode));
}

TEST_CASE("outputs prepared together appear together or not at all") {
    const std::string folder = test::make_scratch_dir("atomic-pair");
    {
        AtomicFile first(folder + "/a.csv");
        AtomicFile second(folder + "/b.csv");
        first.write("a");
        second.write("b");
        first.prepare();
        second.prepare();
        CHECK_FALSE(test::file_exists(folder + "/a.csv"));
        // second fails before publishing (e.g. the disk filled): neither is published.
    }
    CHECK_FALSE(test::file_exists(folder + "/a.csv"));
    CHECK_FALSE(test::file_exists(folder + "/b.csv"));
}
