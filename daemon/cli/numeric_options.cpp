#include "daemon/cli/numeric_options.hpp"

#include <CLI/CLI.hpp>

#include <charconv>
#include <cmath>
#include <cstdio>
#include <string>

namespace ringroad::cli {

namespace {

// Shortest text that reads back the same ("0.5", "100000"), never a 309-digit expansion.
std::string shortest(double value) {
    char buffer[64];
    const auto result = std::to_chars(buffer, buffer + sizeof buffer, value);
    return std::string(buffer, result.ptr);
}

} // namespace

CLI::Validator count_between(std::uint64_t lowest, std::uint64_t highest) {
    const std::string range = std::to_string(lowest) + " .. " + std::to_string(highest);
    return CLI::Validator(
        [lowest, highest, range](std::string& text) -> std::string {
            std::uint64_t value = 0;
            const bool digits = !text.empty() && text.find_first_not_of("0123456789") == std::string::npos;
            const auto [end, error] = std::from_chars(text.data(), text.data() + text.size(), value);
            if (!digits) return "'" + text + "' is not a whole number (allowed range " + range + ")";
            if (error != std::errc() || end != text.data() + text.size() || value < lowest || value > highest) {
                return text + " is outside the allowed range " + range;
            }
            return {};
        },
        "INT in " + range);
}

CLI::Validator number_between(double lowest, double highest, bool above_lowest) {
    const std::string range = (above_lowest ? "above " + shortest(lowest) + ", at most " : shortest(lowest) + " .. ") +
                              shortest(highest);
    return CLI::Validator(
        [lowest, highest, above_lowest, range](std::string& text) -> std::string {
            double value = 0;
            const char* first = text.data();
            const char* last = text.data() + text.size();
            const auto [end, error] = std::from_chars(first, last, value, std::chars_format::general);
            // from_chars also reads "nan", "inf" and "infinity": those are not numbers here.
            const bool plain = text.find_first_not_of("0123456789.-eE+") == std::string::npos;
            if (text.empty() || !plain || error == std::errc::invalid_argument || end != last) {
                return "'" + text + "' is not a number (allowed range " + range + ")";
            }
            if (error == std::errc::result_out_of_range || !std::isfinite(value) || value < lowest || value > highest ||
                (above_lowest && value == lowest)) {
                return text + " is outside the allowed range " + range;
            }
            return {};
        },
        "NUMBER in " + range);
}

} // namespace ringroad::cli
