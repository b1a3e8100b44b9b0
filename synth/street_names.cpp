#include "synth/street_names.hpp"

#include "synth/mixing_hash.hpp"

#include <array>
#include <string_view>

namespace ringroad::synth {

namespace {

constexpr std::array<std::string_view, 24> kOpenings{"Am", "Bel", "Cor", "Dal", "Eld", "Fen", "Gar", "Hal",
                                                     "Ith", "Jor", "Kes", "Lor", "Mar", "Nel", "Orr", "Pel",
                                                     "Quen", "Ros", "Sel", "Tam", "Ul", "Ver", "Wyn", "Zan"};
constexpr std::array<std::string_view, 8> kMiddles{"a", "e", "i", "o", "u", "ae", "y", "ia"};
constexpr std::array<std::string_view, 16> kEndings{"brook", "by", "dale", "ford", "ham", "mere", "mont", "ridge",
                                                    "stead", "ton", "wick", "vale", "holt", "field", "worth", "combe"};

template <std::size_t size>
std::string_view pick(const std::array<std::string_view, size>& words, std::uint64_t& hash) {
    const std::string_view word = words[hash % size];
    hash /= size;
    return word;
}

std::string_view suffix_of(RoadKind kind, std::uint64_t& hash) {
    static constexpr std::array<std::string_view, 6> residential{"Street", "Lane", "Way", "Grove", "Terrace", "Walk"};
    static constexpr std::array<std::string_view, 3> closes{"Close", "Court", "Rise"};
    static constexpr std::array<std::string_view, 2> tertiary{"Road", "Avenue"};
    static constexpr std::array<std::string_view, 2> secondary{"Avenue", "Drive"};
    static constexpr std::array<std::string_view, 2> primary{"Parkway", "Boulevard"};
    switch (kind) {
    case RoadKind::residential: return pick(residential, hash);
    case RoadKind::cul_de_sac: return pick(closes, hash);
    case RoadKind::tertiary: return pick(tertiary, hash);
    case RoadKind::secondary: return pick(secondary, hash);
    case RoadKind::primary: return pick(primary, hash);
    case RoadKind::motorway: return "Motorway";
    default: return {};
    }
}

} // namespace

std::string invented_word(std::uint64_t key) {
    std::uint64_t hash = mix64(key);
    std::string word{pick(kOpenings, hash)};
    word += pick(kMiddles, hash);
    word += pick(kEndings, hash);
    return word;
}

std::string invented_road_name(RoadKind kind, std::uint32_t name_key, std::uint64_t seed) {
    if (name_key == 0) return {};
    std::uint64_t hash = choice_hash(seed, 101, static_cast<std::uint64_t>(kind), name_key);
    const std::string_view suffix = suffix_of(kind, hash);
    if (suffix.empty()) return {};
    return invented_word(hash) + " " + std::string{suffix};
}

} // namespace ringroad::synth
