#pragma once
// Every random choice of the generator is a hash of the seed and of what is being decided (which
// line, which link, which question), not a draw from one running stream: a choice never shifts
// because another one changed, so the calibration can vary one knob while the rest of the region
// stays put, and the same seed always gives the same region.

#include <cstdint>

namespace ringroad::synth {

// SplitMix64's finaliser (Steele, Lea, Flood: "Fast splittable pseudorandom number generators",
// 2014): a bijective mix with good avalanche.
inline std::uint64_t mix64(std::uint64_t value) {
    value += 0x9E3779B97F4A7C15ull;
    value = (value ^ (value >> 30)) * 0xBF58476D1CE4E5B9ull;
    value = (value ^ (value >> 27)) * 0x94D049BB133111EBull;
    return value ^ (value >> 31);
}

// A hash of the seed, a question (a small constant naming what is decided) and up to three keys.
inline std::uint64_t choice_hash(std::uint64_t seed, std::uint64_t question, std::uint64_t a, std::uint64_t b = 0,
                                 std::uint64_t c = 0) {
    std::uint64_t value = mix64(seed ^ (question << 56));
    value = mix64(value ^ a);
    value = mix64(value ^ b);
    return mix64(value ^ c);
}

// The hash as a number in [0, 1).
inline double unit_interval(std::uint64_t hash) { return static_cast<double>(hash >> 11) * 0x1.0p-53; }

} // namespace ringroad::synth
