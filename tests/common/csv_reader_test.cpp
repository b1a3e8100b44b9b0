// CSV reading follows RFC 4180 (quoted fields with commas, doubled quotes and line breaks; CRLF);
// the examples are those of the RFC's section 2.

#include "common/csv_reader.hpp"
#include "common/csv_writer.hpp"
#include "common/input_error.hpp"

#include <catch2/catch.hpp>

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
