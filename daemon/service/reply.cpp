#include "daemon/service/reply.hpp"

#include <nlohmann/json.hpp>

#include <atomic>
#include <chrono>
#include <cstdio>
#include <random>

namespace ringroad::service {

Reply error_reply(int status, std::string_view code, std::string_view message, std::string_view field) {
    nlohmann::ordered_json error;
    error["code"] = code;
    error["field"] = field.empty() ? nlohmann::ordered_json(nullptr) : nlohmann::ordered_json(field);
    error["message"] = message;
    Reply reply;
    reply.status = status;
    // Messages may quote request bytes that are not UTF-8; replace them rather than fail.
    reply.body = nlohmann::ordered_json{{"error", error}}.dump(-1, ' ', false, nlohmann::json::error_handler_t::replace);
    return reply;
}

std::string_view reason_phrase(int status) {
    switch (status) {
    case 200: return "OK";
    case 400: return "Bad Request";
    case 401: return "Unauthorized";
    case 404: return "Not Found";
    case 405: return "Method Not Allowed";
    case 408: return "Request Timeout";
    case 411: return "Length Required";
    case 413: return "Content Too Large";
    case 415: return "Unsupported Media Type";
    case 422: return "Unprocessable Content";
    case 429: return "Too Many Requests";
    case 431: return "Request Header Fields Too Large";
    case 500: return "Internal Server Error";
    case 503: return "Service Unavailable";
    default: return "Unknown";
    }
}

std::string new_incident_id() {
    static const std::uint64_t start = [] {
        std::random_device device;
        return (static_cast<std::uint64_t>(device()) << 32) ^ device() ^
               static_cast<std::uint64_t>(std::chrono::steady_clock::now().time_since_epoch().count());
    }();
    static std::atomic<std::uint64_t> counter{0};
    // A multiplicative mix so consecutive incidents do not look alike.
    const std::uint64_t id = (start + counter.fetch_add(1)) * 0x9E3779B97F4A7C15ull;
    char text[17];
    std::snprintf(text, sizeof text, "%016llx", static_cast<unsigned long long>(id));
    return text;
}

} // namespace ringroad::service
