// Fuzz target: STOPS.csv (router::parse_stops_csv) and the RFC 4180 reader under it
// (common/csv_reader.hpp). Beyond not crashing, two properties are checked, each against a
// promise in the headers: every stop list read has unique non-empty ids, coordinates in range and
// one extra value per extra column; and any table the CSV reader accepts reads back the same
// after being written out by common/csv_writer.hpp.

#include "common/csv_reader.hpp"
#include "common/csv_writer.hpp"
#include "common/input_error.hpp"
#include "router/stops.hpp"

#include <cmath>
#include <cstddef>
#include <cstdint>
#include <cstdio>
#include <cstdlib>
#include <set>
#include <string>
#include <string_view>

namespace {

using namespace ringroad;

void require(bool condition, const char* what) {
    if (!condition) {
        std::fprintf(stderr, "stops_csv_fuzz: broken promise: %s\n", what);
        std::abort();
    }
}

void check_stop_list(std::string_view text) {
    router::StopList list;
    try {
        list = router::parse_stops_csv(text, "fuzz.csv");
    } catch (const InputError&) {
        return;
    }
    require(!list.stops.empty(), "a stop list read without error has stops");
    std::set<std::string> ids;
    for (const router::Stop& stop : list.stops) {
        require(!stop.id.empty(), "ids are not empty");
        require(ids.insert(stop.id).second, "ids are unique");
        require(std::isfinite(stop.lat) && stop.lat >= -90 && stop.lat <= 90, "latitude in [-90, 90]");
        require(std::isfinite(stop.lon) && stop.lon >= -180 && stop.lon <= 180, "longitude in [-180, 180]");
        require(stop.extra_values.size() == list.extra_columns.size(), "one extra value per extra column");
    }
}

void check_csv_round_trip(std::string_view text) {
    CsvTable table;
    try {
        table = parse_csv(text, "fuzz.csv");
    } catch (const InputError&) {
        return;
    }
    // A second byte-order mark is data to the reader but would be skipped as the first one when
    // read back: an asymmetry of no consequence (no header it could start is valid), left aside.
    if (!table.header.empty() && std::string_view(table.header[0]).starts_with("\xEF\xBB\xBF")) return;
    std::string written;
    append_csv_row(written, table.header);
    for (const CsvRow& row : table.rows) append_csv_row(written, row.fields);
    CsvTable again;
    try {
        again = parse_csv(written, "written.csv");
    } catch (const InputError&) {
        require(false, "a table written by append_csv_row reads back");
    }
    require(again.header == table.header, "the header reads back the same");
    require(again.rows.size() == table.rows.size(), "as many rows read back");
    for (std::size_t i = 0; i < table.rows.size(); ++i) {
        require(again.rows[i].fields == table.rows[i].fields, "every row reads back the same");
    }
}

} // namespace

extern "C" int LLVMFuzzerTestOneInput(const std::uint8_t* data, std::size_t size) {
    const std::string_view text(reinterpret_cast<const char*>(data), size);
    check_stop_list(text);
    check_csv_round_trip(text);
    return 0;
}
