#include "router/stored_section.hpp"

#include "common/input_error.hpp"

namespace ringroad::router {

void refuse_stored_record(std::string_view tag, std::size_t record, const std::string& problem) {
    throw InputError("stored section '" + std::string(tag) + "' record " + std::to_string(record) + ": " + problem +
                     "; rebuild the region file with `ringroad build`");
}

void refuse_stored_section(std::string_view tag, const std::string& problem) {
    throw InputError("stored section '" + std::string(tag) + "': " + problem +
                     "; rebuild the region file with `ringroad build`");
}

} // namespace ringroad::router
