#pragma once
// Reading maxspeed=* values: "50", "50 km/h", "30 mph", "10 knots", "walk" give a speed in km/h;
// "none", "signals", "variable", country-class values such as "DE:urban" or "FR:rural", and
// anything unreadable give nullopt, meaning "use the road class default". Rules in PROFILES.md.

#include <optional>
#include <string_view>

namespace ringroad::extract {

// Speed meant by maxspeed=walk (km/h): common practice, a brisk walking pace.
inline constexpr double kWalkingPaceKmh = 5.0;

std::optional<double> parse_maxspeed_kmh(std::string_view value);

// Travel time of a ferry from its duration=* tag: "HH:MM", "HH:MM:SS", "MM" (minutes) or an
// ISO 8601 duration such as "PT1H30M". nullopt when absent or unreadable.
std::optional<double> parse_duration_seconds(std::string_view value);

} // namespace ringroad::extract
