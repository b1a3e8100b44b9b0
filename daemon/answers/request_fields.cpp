#include "daemon/answers/request_fields.hpp"

#include <algorithm>
#include <cmath>
#include <cstdio>

namespace ringroad::answers {

namespace {

std::string shown(double value) {
    char text[40];
    std::snprintf(text, sizeof text, "%.10g", value);
    return text;
}

const char* type_name(const Json& value) {
    switch (value.type()) {
    case Json::value_t::null: return "null";
    case Json::value_t::object: return "an object";
    case Json::value_t::array: return "an array";
    case Json::value_t::string: return "a string";
    case Json::value_t::boolean: return "true/false";
    case Json::value_t::number_integer:
    case Json::value_t::number_unsigned:
    case Json::value_t::number_float: return "a number";
    default: return "something else";
    }
}

} // namespace

void refuse(const std::string& path, const std::string& what, int status, const std::string& code) {
    throw RequestError(status, code, path.empty() ? what : path + ": " + what, path);
}

std::string field_path(const std::string& parent, const std::string& key) {
    return parent.empty() ? key : parent + "." + key;
}

std::string item_path(const std::string& parent, std::size_t index) {
    return parent + "[" + std::to_string(index) + "]";
}

double finite_number(const Json& value, const std::string& path) {
    if (!value.is_number()) refuse(path, std::string("must be a number, not ") + type_name(value));
    const double number = value.get<double>();
    if (!std::isfinite(number)) refuse(path, "must be a finite number");
    return number;
}

RequestObject::RequestObject(const Json& value, std::string path) : value_(value), path_(std::move(path)) {
    if (!value_.is_object()) {
        refuse(path_.empty() ? std::string("body") : path_,
               std::string("must be a JSON object, not ") + type_name(value_));
    }
}

bool RequestObject::has(const std::string& key) { return find(key) != nullptr; }

const Json* RequestObject::find(const std::string& key) {
    if (std::find(known_.begin(), known_.end(), key) == known_.end()) known_.push_back(key);
    const auto it = value_.find(key);
    return it == value_.end() ? nullptr : &*it;
}

const Json& RequestObject::required(const std::string& key) {
    const Json* value = find(key);
    if (value == nullptr) refuse(field_path(path_, key), "missing (required)");
    return *value;
}

std::optional<std::string> RequestObject::text(const std::string& key) {
    const Json* value = find(key);
    if (value == nullptr) return std::nullopt;
    if (!value->is_string()) refuse(field_path(path_, key), std::string("must be a string, not ") + type_name(*value));
    return value->get<std::string>();
}

std::string RequestObject::choice(const std::string& key, std::initializer_list<const char*> allowed,
                                  const std::string& fallback) {
    const std::optional<std::string> value = text(key);
    if (!value) return fallback;
    std::string listed;
    for (const char* name : allowed) {
        if (*value == name) return *value;
        listed += (listed.empty() ? "" : ", ") + std::string("\"") + name + "\"";
    }
    refuse(field_path(path_, key), "\"" + *value + "\" is not one of " + listed);
}

std::optional<bool> RequestObject::flag(const std::string& key) {
    const Json* value = find(key);
    if (value == nullptr) return std::nullopt;
    if (!value->is_boolean()) refuse(field_path(path_, key), std::string("must be true or false, not ") + type_name(*value));
    return value->get<bool>();
}

std::optional<double> RequestObject::number(const std::string& key, double low, double high, bool low_open) {
    const Json* value = find(key);
    if (value == nullptr) return std::nullopt;
    const std::string path = field_path(path_, key);
    const double number = finite_number(*value, path);
    if (number < low || number > high || (low_open && number == low)) {
        refuse(path, shown(number) + " is outside " + (low_open ? "(" : "[") + shown(low) + ", " + shown(high) + "]");
    }
    return number;
}

std::optional<std::uint64_t> RequestObject::whole(const std::string& key, std::uint64_t low, std::uint64_t high) {
    const Json* value = find(key);
    if (value == nullptr) return std::nullopt;
    const std::string path = field_path(path_, key);
    if (value->is_number_unsigned() || (value->is_number_integer() && value->get<std::int64_t>() >= 0)) {
        const std::uint64_t number = value->get<std::uint64_t>();
        if (number < low || number > high) {
            refuse(path, std::to_string(number) + " is outside [" + std::to_string(low) + ", " + std::to_string(high) + "]");
        }
        return number;
    }
    if (value->is_number_float() && std::isfinite(value->get<double>()) &&
        value->get<double>() == std::floor(value->get<double>()) && value->get<double>() >= 0.0 &&
        value->get<double>() <= static_cast<double>(high) && value->get<double>() >= static_cast<double>(low)) {
        return static_cast<std::uint64_t>(value->get<double>());
    }
    if (value->is_number()) {
        if (value->is_number_float()) refuse(path, shown(value->get<double>()) + " is not a whole number in [" +
                                                       std::to_string(low) + ", " + std::to_string(high) + "]");
        refuse(path, std::to_string(value->get<std::int64_t>()) + " is outside [" + std::to_string(low) + ", " +
                         std::to_string(high) + "]");
    }
    refuse(path, std::string("must be a whole number, not ") + type_name(*value));
}

void RequestObject::finish() const {
    for (const auto& [key, value] : value_.items()) {
        if (std::find(known_.begin(), known_.end(), key) == known_.end()) {
            refuse(field_path(path_, key), "unknown field");
        }
    }
}

} // namespace ringroad::answers
