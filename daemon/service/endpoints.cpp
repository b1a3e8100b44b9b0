#include "daemon/service/endpoints.hpp"

#include "daemon/service/request_body.hpp"

#include <nlohmann/json.hpp>

#include <array>
#include <exception>
#include <new>
#include <string>

namespace ringroad::service {

namespace {

struct EndpointEntry {
    std::string_view path;
    std::string_view method;
    Endpoint endpoint;
    std::optional<answers::Question> question;
};

const std::array<EndpointEntry, 6> kEndpoints{{
    {"/v1/matrix", "POST", Endpoint::matrix, answers::Question::matrix},
    {"/v1/tour", "POST", Endpoint::tour, answers::Question::tour},
    {"/v1/network", "POST", Endpoint::network, answers::Question::network},
    {"/v1/route", "POST", Endpoint::route, answers::Question::route},
    {"/v1/status", "GET", Endpoint::status, std::nullopt},
    {"/v1/reload", "POST", Endpoint::reload, std::nullopt},
}};

} // namespace

RouteMatch route_request(std::string_view method, std::string_view target) {
    const std::string_view path = target.substr(0, target.find('?'));
    for (const EndpointEntry& entry : kEndpoints) {
        if (entry.path != path) continue;
        RouteMatch match{entry.endpoint, entry.question, std::nullopt};
        // HEAD is not offered: every answer is computed, and a status check is cheap to GET.
        if (method != entry.method) {
            match.refusal = error_reply(405, "method_not_allowed",
                                        std::string(path) + " takes " + std::string(entry.method) + ", not " +
                                            std::string(method));
        }
        return match;
    }
    RouteMatch match;
    match.refusal = error_reply(404, "unknown_endpoint",
                                "no endpoint " + std::string(path) +
                                    "; the endpoints are /v1/matrix, /v1/tour, /v1/network, /v1/route (POST), "
                                    "/v1/status (GET) and /v1/reload (POST)");
    return match;
}

Reply answer_request(answers::Question question, std::string_view body, const answers::LoadedRegion* region,
                     const answers::AnswerLimits& limits, std::size_t max_json_depth, const AnswerFunction& answer) {
    try {
        const nlohmann::ordered_json request = parse_request_body(body, max_json_depth);
        Reply reply;
        const nlohmann::ordered_json document =
            answer ? answer(question, request, region, limits) : answers::answer_json(question, request, region, limits);
        reply.body = document.dump(-1, ' ', false, nlohmann::json::error_handler_t::replace);
        return reply;
    } catch (const answers::RequestError& error) {
        return error_reply(error.status(), error.code(), error.what(), error.field());
    } catch (const InputError& error) {
        return error_reply(400, "invalid_request", error.what(), error.field());
    } catch (const std::bad_alloc&) {
        Reply reply = error_reply(503, "out_of_memory", "the service ran short of memory for this request; try a smaller one");
        reply.internal_message = "out of memory";
        return reply;
    } catch (const std::exception& error) {
        const std::string incident = new_incident_id();
        Reply reply = error_reply(500, "internal_error",
                                  "the service failed unexpectedly on this request (incident " + incident +
                                      "); it keeps serving");
        reply.incident = incident;
        reply.internal_message = error.what();
        return reply;
    }
}

} // namespace ringroad::service
