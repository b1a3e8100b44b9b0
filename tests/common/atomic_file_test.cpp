// Outputs are all-or-nothing: until commit() the target is untouched, and an abandoned write
// leaves neither the target nor a temporary behind.

#include "common/atomic_file.hpp"
#include "common/input_error.hpp"
#include "tests/support/run_command.hpp"

#include <catch2/catch.hpp>

#include <filesystem>

using namespace ringroad;

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
