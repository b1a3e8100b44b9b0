#pragma once
// Strict reading of a JSON request body: every field is looked up through a RequestObject, which
// remembers which names it was asked for, so finish() can refuse the first unknown field. Every
// refusal is a RequestError (status 400, code "invalid_field" unless stated) whose field() is the
// exact JSON path ("stops[3].lat") and whose message starts with that path.

#include "daemon/answers/json_answer.hpp"

#include <nlohmann/json.hpp>

#include <cstdint>
#include <initializer_list>
#include <optional>
#include <string>
#include <vector>

namespace ringroad::answers {

using Json = nlohmann::ordered_json;

// "<path>: <what>" as a RequestError with the given status and code.
[[noreturn]] void refuse(const std::string& path, const std::string& what, int status = 400,
                         const std::string& code = "invalid_field");

// "stops" + 3 -> "stops[3]"; "" + "lat" -> "lat"; "stops[3]" + "lat" -> "stops[3].lat".
std::string field_path(const std::string& parent, const std::string& key);
std::string item_path(const std::string& parent, std::size_t index);

class RequestObject {
public:
    // Refuses `value` unless it is a JSON object.
    RequestObject(const Json& value, std::string path);

    const std::string& path() const noexcept { return path_; }
    bool has(const std::string& key);
    // The raw value, or null when absent.
    const Json* find(const std::string& key);
    const Json& required(const std::string& key);

    std::optional<std::string> text(const std::string& key);
    // One of `allowed`, or `fallback` when absent.
    std::string choice(const std::string& key, std::initializer_list<const char*> allowed, const std::string& fallback);
    std::optional<bool> flag(const std::string& key);
    // A finite number within [low, high] (open at low when `low_open`).
    std::optional<double> number(const std::string& key, double low, double high, bool low_open = false);
    // A whole number within [low, high].
    std::optional<std::uint64_t> whole(const std::string& key, std::uint64_t low, std::uint64_t high);

    // Refuses the first field no accessor asked for.
    void finish() const;

private:
    const Json& value_;
    std::string path_;
    std::vector<std::string> known_;
};

// A finite number from `value` (any JSON number), refused with `path` otherwise.
double finite_number(const Json& value, const std::string& path);

} // namespace ringroad::answers
