// MATRIX.csv reading and writing: every bad file gets one line naming file, line and column.
#include "planners/matrices/matrix_csv.hpp"

#include "common/input_error.hpp"
#include "tests/support/run_command.hpp"

#include <catch2/catch.hpp>

#include <cmath>
#include <random>
#include <string>

using ringroad::InputError;
using ringroad::planners::matrices::LabelledMatrix;
using ringroad::planners::matrices::matrix_to_csv;
using ringroad::planners::matrices::parse_matrix_csv;
using ringroad::planners::matrices::read_matrix_csv;

namespace {

// The message of the InputError that parsing `text` throws (empty if none).
std::string error_of(const std::string& text) {
    try {
        parse_matrix_csv(text, "m.csv");
    } catch (const InputError& error) {
        return error.what();
    }
    return {};
}

bool one_line(const std::string& message) { return message.find('\n') == std::string::npos; }

} // namespace

TEST_CASE("a well-formed matrix reads with missing entries as no connection") {
    const LabelledMatrix m = parse_matrix_csv("id,a,b,c\na,0,12.5,\nb,13,0,7\nc,9,6.5,0\n", "m.csv");
    REQUIRE(m.ids == std::vector<std::string>{"a", "b", "c"});
    REQUIRE(m.costs.size() == 3);
    CHECK(m.costs(0, 1) == 12.5);
    CHECK_FALSE(m.costs.has(0, 2));
    CHECK(m.costs(1, 0) == 13.0);
    CHECK(m.costs(2, 1) == 6.5);
    CHECK(m.costs(1, 1) == 0.0);
}

TEST_CASE("rows in another order than the header are matched by id") {
    const LabelledMatrix m = parse_matrix_csv("id,a,b,c\nc,9,6.5,0\na,0,1,2\nb,3,0,4\n", "m.csv");
    REQUIRE(m.ids == std::vector<std::string>{"a", "b", "c"});
    CHECK(m.costs(2, 0) == 9.0);
    CHECK(m.costs(0, 2) == 2.0);
    CHECK(m.costs(1, 2) == 4.0);
}

TEST_CASE("CRLF endings, quoted ids and an empty corner cell are accepted") {
    // RFC 4180 section 2 (from memory): CRLF line breaks; fields holding commas or doubled
    // quotes are quoted.
    const LabelledMatrix m =
        parse_matrix_csv(",\"Depot, north\",\"Yard \"\"B\"\"\"\r\n\"Depot, north\",,5\r\n\"Yard \"\"B\"\"\",6,\r\n", "m.csv");
    REQUIRE(m.ids == std::vector<std::string>{"Depot, north", "Yard \"B\""});
    CHECK(m.costs(0, 1) == 5.0);
    CHECK(m.costs(1, 0) == 6.0);
    CHECK(m.costs(0, 0) == 0.0);
}

TEST_CASE("writing then reading gives back the same matrix, exactly") {
    std::mt19937_64 random(7);
    std::uniform_real_distribution<double> cost(0.0, 1e5);
    LabelledMatrix m;
    const std::size_t size = 23;
    m.costs = ringroad::planners::matrices::CostMatrix(size);
    for (std::size_t i = 0; i < size; ++i) {
        // Every fifth id holds a comma, so writing must quote it (RFC 4180 section 2, from memory).
        std::string id = i % 5 == 0 ? "stop, " : "s";
        id += std::to_string(i);
        m.ids.push_back(id);
    }
    for (std::size_t i = 0; i < size; ++i)
        for (std::size_t j = 0; j < size; ++j)
            if (i != j && (i * 7 + j) % 11 != 0) m.costs(i, j) = cost(random);
    const std::string text = matrix_to_csv(m);
    CHECK(text.rfind("id,\"stop, 0\",s1,", 0) == 0);
    CHECK(text.find("\r\n") != std::string::npos);   // RFC 4180 record separator
    const LabelledMatrix back = parse_matrix_csv(text, "round.csv");
    REQUIRE(back.ids == m.ids);
    for (std::size_t i = 0; i < size; ++i) {
        for (std::size_t j = 0; j < size; ++j) {
            INFO(i << "," << j);
            CHECK(back.costs.has(i, j) == m.costs.has(i, j));
            if (m.costs.has(i, j)) CHECK(back.costs(i, j) == m.costs(i, j));
        }
    }
}

TEST_CASE("files on disk: read, and atomic write leaves no temporary") {
    const std::string folder = ringroad::test::make_scratch_dir("matrix-csv");
    const std::string path = folder + "/m.csv";
    ringroad::test::write_file(path, "id,x,y\nx,0,3\ny,4,0\n");
    const LabelledMatrix m = read_matrix_csv(path);
    CHECK(m.costs(1, 0) == 4.0);
    const std::string copy = folder + "/copy.csv";
    ringroad::planners::matrices::write_matrix_csv(m, copy);
    CHECK(read_matrix_csv(copy).costs(0, 1) == 3.0);
    CHECK_THROWS_WITH(read_matrix_csv(folder + "/absent.csv"), Catch::Contains("absent.csv"));
}

TEST_CASE("bad matrices get one line naming file, line and column") {
    struct Case {
        const char* what;
        std::string text;
        std::vector<std::string> must_contain;
    };
    const std::vector<Case> cases = {
        {"ragged row", "id,a,b\na,0,1\nb,2\n", {"m.csv:3:", "2 fields, expected 3"}},
        {"too many fields", "id,a,b\na,0,1,9\nb,2,0\n", {"m.csv:2:", "4 fields, expected 3"}},
        {"non-numeric cell", "id,a,b\na,0,x7\nb,2,0\n", {"m.csv:2: column 3", "'x7' is not a number", "'a'", "'b'"}},
        {"negative cost", "id,a,b\na,0,1\nb,-2,0\n", {"m.csv:3: column 2", "negative cost -2"}},
        {"duplicate header id", "id,a,b,a\na,0,1,1\nb,1,0,1\n", {"m.csv:1: column 4", "duplicate stop id 'a'", "column 2"}},
        {"duplicate row", "id,a,b\na,0,1\na,0,1\n", {"m.csv:3: column 1", "duplicate row for stop 'a'", "line 2"}},
        {"not square (missing row)", "id,a,b,c\na,0,1,2\nb,1,0,2\n", {"m.csv:", "not square", "no row for stop 'c'"}},
        {"row id not in header", "id,a,b\na,0,1\nz,1,0\n", {"m.csv:3: column 1", "stop 'z' is not in the header"}},
        {"wrong corner cell", "stop,a,b\na,0,1\nb,1,0\n", {"m.csv:1: column 1", "'id'"}},
        {"non-zero diagonal", "id,a,b\na,0,1\nb,1,5\n", {"m.csv:3: column 3", "'b' to itself"}},
        {"empty stop id", "id,a,\na,0,1\n,1,0\n", {"m.csv:1: column 3", "empty stop id"}},
        {"header without stops", "id\n", {"m.csv:1:", "names no stops"}},
        {"infinite value", "id,a,b\na,0,inf\nb,1,0\n", {"m.csv:2: column 3", "not a number"}},
        {"unterminated quote", "id,a,b\na,0,\"1\nb,1,0\n", {"m.csv"}},
        {"cost near the largest double", "id,a,b\na,0,1.7e308\nb,1,0\n",
         {"m.csv:2: column 3", "(from 'a' to 'b')", "above the largest allowed, 1e12"}},
        {"cost just above the maximum", "id,a,b\na,0,1\nb,1000000000001,0\n", {"m.csv:3: column 2", "above the largest"}},
        {"stop id not UTF-8", "id,a,b\xff\na,0,1\nb\xff,1,0\n", {"m.csv:1: column 3", "not valid UTF-8"}},
    };
    for (const Case& c : cases) {
        INFO(c.what);
        const std::string message = error_of(c.text);
        REQUIRE_FALSE(message.empty());
        CHECK(one_line(message));
        for (const std::string& part : c.must_contain) CHECK_THAT(message, Catch::Contains(part));
    }
}

TEST_CASE("costs up to the documented maximum are read exactly") {
    const LabelledMatrix matrix = parse_matrix_csv("id,a,b\na,0,1e12\nb,999999999999.5,0\n", "m.csv");
    CHECK(matrix.costs(0, 1) == ringroad::planners::matrices::kLargestMatrixCost);
    CHECK(matrix.costs(1, 0) == 999999999999.5);
}
