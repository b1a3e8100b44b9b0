#include "daemon/service/bearer_token.hpp"

#include "common/input_error.hpp"

#include <algorithm>
#include <cctype>
#include <fstream>

namespace ringroad::service {

namespace {

constexpr std::size_t kShortestToken = 16;

std::string_view trimmed(std::string_view text) {
    const auto first = text.find_first_not_of(" \t\r\n");
    if (first == std::string_view::npos) return {};
    const auto last = text.find_last_not_of(" \t\r\n");
    return text.substr(first, last - first + 1);
}

// Looks at every byte of the longer string whatever the contents, so the time taken tells an
// attacker nothing about how much of a guess was right.
bool equal_in_constant_time(std::string_view given, std::string_view expected) {
    const std::size_t length = std::max(given.size(), expected.size());
    unsigned difference = given.size() == expected.size() ? 0u : 1u;
    for (std::size_t i = 0; i < length; ++i) {
        const unsigned char a = i < given.size() ? static_cast<unsigned char>(given[i]) : 0;
        const unsigned char b = i < expected.size() ? static_cast<unsigned char>(expected[i]) : 0;
        difference |= static_cast<unsigned>(a ^ b);
    }
    return difference == 0;
}

} // namespace

std::string read_token_file(const std::string& path) {
    std::ifstream file(path);
    if (!file) throw InputError(path + ": cannot read the token file", "--token-file");
    std::string line;
    std::getline(file, line);
    const std::string token(trimmed(line));
    if (token.size() < kShortestToken) {
        throw InputError(path + ": the token on the first line must be at least " + std::to_string(kShortestToken) +
                             " characters",
                         "--token-file");
    }
    if (token.find_first_of(" \t") != std::string::npos) {
        throw InputError(path + ": the token must not contain blanks", "--token-file");
    }
    return token;
}

bool bearer_token_matches(std::string_view authorization, std::string_view expected) {
    constexpr std::string_view scheme = "Bearer ";
    if (authorization.size() < scheme.size()) return false;
    // The scheme name is case-insensitive (RFC 7235 section 2.1); the token is not.
    for (std::size_t i = 0; i < scheme.size(); ++i) {
        if (std::tolower(static_cast<unsigned char>(authorization[i])) != std::tolower(static_cast<unsigned char>(scheme[i]))) {
            return false;
        }
    }
    return equal_in_constant_time(trimmed(authorization.substr(scheme.size())), expected);
}

} // namespace ringroad::service
