#pragma once
// The checks every numeric command-line option gets, in one place: the text must be a plain
// decimal number (no NaN, no infinity, no hex, no sign on a count) inside the option's allowed
// range, else a one-line usage error (exit 2) that names the option, the value and the range.
// Attached in the option declarations: `->check(cli::number_between(0, 3600))`. The checks run
// on the text, before CLI11 converts it, so a value can never wrap (-1 into 2^64 - 1) or
// overflow on the way in.

#include <cstdint>

namespace CLI { class Validator; }

namespace ringroad::cli {

// A whole number (digits only) in [lowest, highest].
CLI::Validator count_between(std::uint64_t lowest, std::uint64_t highest);

// A finite decimal number in [lowest, highest]; with `above_lowest`, in (lowest, highest].
CLI::Validator number_between(double lowest, double highest, bool above_lowest = false);

// Limits shared by commands (DEVELOPERS.md, "Options").
inline constexpr double kLargestSnapRadiusMeters = 100000.0;   // 100 km: past any stop one would mean
inline constexpr double kLargestTimeLimitSeconds = 86400.0;    // planners::tours::kLongestTimeLimitSeconds
inline constexpr std::uint64_t kMostThreads = 1024;

} // namespace ringroad::cli
