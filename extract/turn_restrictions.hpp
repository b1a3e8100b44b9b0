#pragma once
// Reading turn restrictions: a type=restriction relation with a via node says that arriving
// along a "from" way and leaving along a "to" way is forbidden (no_*) or the only way out
// (only_*). restriction:motorcar=* takes precedence over restriction=* for cars, and except=*
// naming motorcar exempts cars. Only the car profile reads them.

#include "extract/collected_roads.hpp"
#include "extract/profile.hpp"

#include <optional>

namespace osmium { class Relation; }

namespace ringroad::extract {

// nullopt when the relation is no turn restriction for this profile. A restriction that applies
// but cannot be used (an unknown value, a via way, missing members) comes back with
// readable == false, to be counted as unmatched.
std::optional<CollectedRestriction> read_turn_restriction(const osmium::Relation& relation, const Profile& profile);

} // namespace ringroad::extract
