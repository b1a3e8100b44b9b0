#pragma once
// The caution every route, matrix and tour output carries (JSON field "caution"; stderr for CSV).

namespace ringroad {

inline constexpr const char* kSafetyNotice =
    "Travel times and routes are estimates from volunteer map data: roads may be closed and signs "
    "may differ. Obey road signs and local law. Emergency-service or hazardous-goods use needs "
    "local validation.";

} // namespace ringroad
