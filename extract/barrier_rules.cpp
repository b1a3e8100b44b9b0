#include "extract/barrier_rules.hpp"

#include "extract/way_rules.hpp"

#include <osmium/osm/tag.hpp>

#include <array>
#include <string_view>

namespace ringroad::extract {

namespace {

struct BarrierEntry {
    std::string_view barrier;
    BarrierRule car;
    BarrierRule bicycle;
    BarrierRule foot;
};

constexpr BarrierRule kPass{BarrierEffect::none, 0};
constexpr BarrierRule kBlock{BarrierEffect::blocks, 0};
constexpr BarrierRule delay(double seconds) { return {BarrierEffect::delays, seconds}; }

// Common practice: posts and blocks keep cars out but let bicycles and pedestrians through;
// stiles and turnstiles stop bicycles too; gates are opened and closed again (the delay is a
// typical time to stop, open, pass and close). Barriers not listed have no effect.
// Mirrored in extract/PROFILES.md.
constexpr std::array<BarrierEntry, 20> kBarrierTable{{
    {"bollard",              kBlock,     kPass,      kPass},
    {"block",                kBlock,     kPass,      kPass},
    {"jersey_barrier",       kBlock,     kPass,      kPass},
    {"log",                  kBlock,     kPass,      kPass},
    {"planter",              kBlock,     kPass,      kPass},
    {"chain",                kBlock,     kPass,      kPass},
    {"rope",                 kBlock,     kPass,      kPass},
    {"debris",               kBlock,     kPass,      kPass},
    {"bus_trap",             kBlock,     kPass,      kPass},
    {"sump_buster",          kBlock,     kPass,      kPass},
    {"motorcycle_barrier",   kBlock,     kPass,      kPass},
    {"cycle_barrier",        kBlock,     delay(5),   kPass},
    {"kissing_gate",         kBlock,     kBlock,     delay(5)},
    {"stile",                kBlock,     kBlock,     delay(5)},
    {"turnstile",            kBlock,     kBlock,     delay(5)},
    {"full-height_turnstile",kBlock,     kBlock,     delay(5)},
    {"gate",                 delay(30),  delay(10),  delay(5)},
    {"swing_gate",           delay(30),  delay(10),  delay(5)},
    {"lift_gate",            delay(20),  kPass,      kPass},
    {"toll_booth",           delay(30),  kPass,      kPass},
}};

BarrierRule table_rule(const BarrierEntry& entry, const Profile& profile) {
    switch (profile.kind) {
        case ProfileKind::car: return entry.car;
        case ProfileKind::bicycle: return entry.bicycle;
        case ProfileKind::foot: return entry.foot;
    }
    return entry.car;
}

} // namespace

BarrierRule evaluate_barrier(const osmium::TagList& tags, const Profile& profile) {
    const char* barrier = tags.get_value_by_key("barrier");
    if (barrier == nullptr) return kPass;
    BarrierRule rule = kPass;
    for (const auto& entry : kBarrierTable) {
        if (entry.barrier == barrier) {
            rule = table_rule(entry, profile);
            break;
        }
    }
    switch (profile_access(tags, profile)) {
        case AccessVerdict::denied:
            return kBlock;
        case AccessVerdict::allowed:
        case AccessVerdict::destination:
            // Explicitly open: passable, but opening a gate still takes its time.
            if (rule.effect == BarrierEffect::blocks) return kPass;
            return rule;
        case AccessVerdict::unknown:
            return rule;
    }
    return rule;
}

} // namespace ringroad::extract
