#pragma once
// The four questions behind answer_json, one file each (<question>_answer.cpp). Each reads its
// fields from `body` through RequestObject (so unknown fields are refused) and builds the answer
// document; the fields are listed in ANSWERS.md.

#include "daemon/answers/json_answer.hpp"
#include "daemon/answers/request_fields.hpp"

namespace ringroad::answers {

Json answer_matrix(const Json& body, const LoadedRegion* region, const AnswerLimits& limits);
Json answer_route(const Json& body, const LoadedRegion* region, const AnswerLimits& limits);
Json answer_tour(const Json& body, const LoadedRegion* region, const AnswerLimits& limits);
Json answer_network(const Json& body, const LoadedRegion* region, const AnswerLimits& limits);

// "auto" | "hierarchy" | "dijkstra" and the engine a matrix or route actually ran on.
router::Engine read_engine(RequestObject& body);
router::Metric read_metric(RequestObject& body);
std::string engine_used(const router::RoadRouter& router, router::Metric metric, router::Engine engine);

} // namespace ringroad::answers
