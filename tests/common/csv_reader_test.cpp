// CSV reading follows RFC 4180 (quoted fields with commas, doubled quotes and line breaks; CRLF);
// the examples are those of the RFC's section 2.

#include "common/csv_reader.hpp"
#include "common/csv_writer.hpp"
#include "common/input_error.hpp"

#include <catch2/catch.hpp>

#include <filesystem>

using namespace ringroad;

TEST_CASE("RFC 4180 section 2 examples parse as the RFC describes") {
    const auto table = parse_csv("field_name,field_name,field_name\r\n"
                                 "aaa,bbb,ccc\r\n"
                                 "\"aaa\",\"b\r\nbb\",\"ccc\"\r\n"
                                 "\"aaa\",\"b\"\"bb\",\"ccc\"\r\n",
                                 "rfc.csv");
    REQUIRE(table.header.size() == 3);
    REQUIRE(table.rows.size() == 3);
    CHECK(table.rows[0].fields == std::vector<std::string>{"aaa", "bbb", "ccc"});
    CHECK(table.rows[1].fields[1] == "b\r\nbb");
    CHECK(table.rows[2].fields[1] == "b\"bb");
    // Rows remember the line they start on; the quoted line break moves the next row down.
    CHECK(table.rows[0].line == 2);
    CHECK(table.rows[1].line == 3);
    CHECK(table.rows[2].line == 5);
}

TEST_CASE("blank lines, a byte-order mark and a missing final newline are tolerated") {
    const auto table = parse_csv("\xEF\xBB\xBFid,lat\n\n1,2\n3,4", "stops.csv");
    CHECK(table.header == std::vector<std::string>{"id", "lat"});
    REQUIRE(table.rows.size() == 2);
    CHECK(table.rows[1].line == 4);
    CHECK(table.column("lat") == 1);
    CHECK(table.column("lon") == -1);
}

TEST_CASE("malformed CSV gets a one-line error with file and line") {
    try {
        parse_csv("id,name\n1,\"open\n2,x\n", "bad.csv");
        FAIL("no error");
    } catch (const InputError& error) {
        CHECK(std::string(error.what()) == "bad.csv:2: unterminated quoted field");
    }
    CHECK_THROWS_WITH(parse_csv("", "empty.csv"), Catch::Contains("empty.csv"));
    CHECK_THROWS_WITH(read_csv_file("/nonexistent/stops.csv"), Catch::StartsWith("/nonexistent/stops.csv: cannot open"));
}

TEST_CASE("cells must be whole finite numbers") {
    double value = 0;
    CHECK(parse_double_cell(" 12.5 ", value));
    CHECK(value == 12.5);
    CHECK(parse_double_cell("-3", value));
    CHECK_FALSE(parse_double_cell("12abc", value));
    CHECK_FALSE(parse_double_cell("", value));
    CHECK_FALSE(parse_double_cell("nan", value));
    CHECK_FALSE(parse_double_cell("inf", value));
}

TEST_CASE("writing quotes only what needs quoting and round-trips") {
    std::string out;
    append_csv_row(out, {"a", "b,c", "say \"hi\"", "line\nbreak"});
    CHECK(out == "a,\"b,c\",\"say \"\"hi\"\"\",\"line\nbreak\"\r\n");
    const auto table = parse_csv("h1,h2,h3,h4\r\n" + out, "x.csv");
    CHECK(table.rows[0].fields == std::vector<std::string>{"a", "b,c", "say \"hi\"", "line\nbreak"});
}

TEST_CASE("a sign must be followed by a number: +-47.3 is not -47.3") {
    double value = 0.0;
    CHECK_FALSE(parse_double_cell("+-47.3", value));
    CHECK_FALSE(parse_double_cell("++1", value));
    CHECK_FALSE(parse_double_cell("+", value));
    CHECK(parse_double_cell("+47.3", value));
    CHECK(value == 47.3);
    CHECK(parse_double_cell("-47.3", value));
    CHECK(value == -47.3);
}

TEST_CASE("text after a closing quote is refused, naming line and column (RFC 4180 section 2, rule 7)") {
    try {
        parse_csv("id,name\n1,\"ab\"cd\n", "quotes.csv");
        FAIL("accepted \"ab\"cd");
    } catch (const InputError& error) {
        CHECK(std::string(error.what()).rfind("quotes.csv:2: column 2: text after the closing quote", 0) == 0);
    }
    // Spaces after the closing quote are harmless.
    CHECK(parse_csv("id,name\n1,\"ab\"  \n", "quotes.csv").rows[0].fields[1] == "ab");
}

TEST_CASE("CR-only line endings (old Mac files) end lines like LF and CRLF") {
    const auto table = parse_csv("id,lat,lon\rdepot,1,2\rs1,3,4\r", "mac.csv");
    CHECK(table.header == std::vector<std::string>{"id", "lat", "lon"});
    REQUIRE(table.rows.size() == 2);
    CHECK(table.rows[1].fields == std::vector<std::string>{"s1", "3", "4"});
    CHECK(table.rows[1].line == 3);
    const auto mixed = parse_csv("id\r\na\rb\nc", "mixed.csv");
    CHECK(mixed.rows.size() == 3);
}

TEST_CASE("a folder is named as a folder, not as an empty file") {
    const std::string folder = std::filesystem::temp_directory_path().string();
    CHECK_THROWS_WITH(read_csv_file(folder), folder + ": is a folder, not a CSV file");
}
