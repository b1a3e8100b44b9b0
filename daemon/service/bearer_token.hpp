#pragma once
// The shared secret that guards a service listening beyond this machine: read from a file (first
// line, surrounding blanks removed; at least 16 characters), and checked on every request against
// "Authorization: Bearer <token>" in time that does not depend on where the two differ.

#include <string>
#include <string_view>

namespace ringroad::service {

// Throws InputError naming the file when it cannot be read or the token is too short.
std::string read_token_file(const std::string& path);

// Whether `authorization` (the header's value, possibly empty) is "Bearer <expected>".
bool bearer_token_matches(std::string_view authorization, std::string_view expected);

} // namespace ringroad::service
