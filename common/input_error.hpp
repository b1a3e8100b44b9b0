#pragma once
// InputError: a problem with what the user gave us (a file, a field, a stop, a request).
// The command line maps it to exit code 1 and the daemon to a 4xx answer; anything else that
// escapes is an internal error (exit 3, 5xx). The message is one line and names the culprit.

#include <stdexcept>
#include <string>

namespace ringroad {

class InputError : public std::runtime_error {
public:
    explicit InputError(const std::string& message, std::string field = {})
        : std::runtime_error(message), field_(std::move(field)) {}

    // The request field or CSV column at fault, when there is one (the daemon echoes it).
    const std::string& field() const noexcept { return field_; }

private:
    std::string field_;
};

} // namespace ringroad
