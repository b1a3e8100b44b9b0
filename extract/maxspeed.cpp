#include "extract/maxspeed.hpp"

#include <cctype>
#include <charconv>

namespace ringroad::extract {

namespace {

// Speeds beyond this are tagging mistakes, not limits (km/h).
constexpr double kHighestPlausibleKmh = 300.0;
constexpr double kKilometresPerMile = 1.609344;     // international mile, exact by definition
constexpr double kKilometresPerNauticalMile = 1.852; // exact by definition

std::string_view trim(std::string_view text) {
    while (!text.empty() && std::isspace(static_cast<unsigned char>(text.front()))) text.remove_prefix(1);
    while (!text.empty() && std::isspace(static_cast<unsigned char>(text.back()))) text.remove_suffix(1);
    return text;
}

// Parses a leading non-negative decimal number; `rest` receives what follows it.
std::optional<double> leading_number(std::string_view text, std::string_view& rest) {
    double value = 0;
    const auto result = std::from_chars(text.data(), text.data() + text.size(), value);
    if (result.ec != std::errc{} || value < 0) return std::nullopt;
    rest = trim(std::string_view(result.ptr, static_cast<std::size_t>(text.data() + text.size() - result.ptr)));
    return value;
}

std::optional<double> single_maxspeed(std::string_view value) {
    value = trim(value);
    if (value == "walk") return kWalkingPaceKmh;
    std::string_view unit;
    const auto number = leading_number(value, unit);
    if (!number) return std::nullopt;   // none, signals, variable, XX:urban, ...
    double kmh = *number;
    if (unit.empty() || unit == "km/h" || unit == "kmh" || unit == "kph") {
        // kilometres per hour, the OSM default unit
    } else if (unit == "mph") {
        kmh *= kKilometresPerMile;
    } else if (unit == "knots") {
        kmh *= kKilometresPerNauticalMile;
    } else {
        return std::nullopt;
    }
    if (kmh <= 0 || kmh > kHighestPlausibleKmh) return std::nullopt;
    return kmh;
}

std::optional<long> whole_number(std::string_view text) {
    long value = 0;
    const auto result = std::from_chars(text.data(), text.data() + text.size(), value);
    if (result.ec != std::errc{} || result.ptr != text.data() + text.size() || value < 0) return std::nullopt;
    return value;
}

// "PT1H30M", "PT45M", "PT20M30S" (hours, minutes, seconds parts of ISO 8601 only).
std::optional<double> iso_duration_seconds(std::string_view text) {
    if (text.substr(0, 2) != "PT" || text.size() < 4) return std::nullopt;
    text.remove_prefix(2);
    double seconds = 0;
    while (!text.empty()) {
        std::string_view rest;
        const auto number = leading_number(text, rest);
        if (!number || rest.empty()) return std::nullopt;
        const char unit = rest.front();
        if (unit == 'H') seconds += *number * 3600;
        else if (unit == 'M') seconds += *number * 60;
        else if (unit == 'S') seconds += *number;
        else return std::nullopt;
        text = rest.substr(1);
    }
    return seconds;
}

} // namespace

std::optional<double> parse_maxspeed_kmh(std::string_view value) {
    // Several values separated by ';' are a tagging error; the first readable one is used.
    while (!value.empty()) {
        const auto separator = value.find(';');
        if (auto kmh = single_maxspeed(value.substr(0, separator))) return kmh;
        if (separator == std::string_view::npos) break;
        value.remove_prefix(separator + 1);
    }
    return std::nullopt;
}

std::optional<double> parse_duration_seconds(std::string_view value) {
    value = trim(value);
    if (value.empty()) return std::nullopt;
    if (value.front() == 'P') return iso_duration_seconds(value);
    long parts[3] = {0, 0, 0};
    int count = 0;
    while (count < 3) {
        const auto colon = value.find(':');
        const auto number = whole_number(value.substr(0, colon));
        if (!number) return std::nullopt;
        parts[count++] = *number;
        if (colon == std::string_view::npos) break;
        value.remove_prefix(colon + 1);
        if (count == 3) return std::nullopt;
    }
    double seconds = 0;
    switch (count) {
        case 1: seconds = parts[0] * 60.0; break;                                  // minutes
        case 2: seconds = parts[0] * 3600.0 + parts[1] * 60.0; break;              // HH:MM
        case 3: seconds = parts[0] * 3600.0 + parts[1] * 60.0 + parts[2]; break;   // HH:MM:SS
    }
    if (seconds <= 0) return std::nullopt;
    return seconds;
}

} // namespace ringroad::extract
