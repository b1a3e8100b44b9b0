#include "daemon/answers/json_answer.hpp"

#include "daemon/answers/question_answers.hpp"

namespace ringroad::answers {

nlohmann::ordered_json answer_json(Question question, const nlohmann::ordered_json& body, const LoadedRegion* region,
                                   const AnswerLimits& limits) {
    switch (question) {
    case Question::matrix: return answer_matrix(body, region, limits);
    case Question::route: return answer_route(body, region, limits);
    case Question::tour: return answer_tour(body, region, limits);
    case Question::network: return answer_network(body, region, limits);
    }
    throw RequestError(404, "unknown_question", "unknown question");
}

nlohmann::ordered_json answer_json(Question question, const nlohmann::json& body, const LoadedRegion* region,
                                   const AnswerLimits& limits) {
    // nlohmann::json keeps object fields sorted by name, so extra stop fields come back sorted;
    // a caller that wants them echoed in its own order passes an ordered_json.
    return answer_json(question, nlohmann::ordered_json(body), region, limits);
}

router::Engine read_engine(RequestObject& body) {
    return *router::engine_from_name(body.choice("engine", {"auto", "hierarchy", "dijkstra"}, "auto"));
}

router::Metric read_metric(RequestObject& body) {
    return *router::metric_from_name(body.choice("metric", {"time", "distance"}, "time"));
}

std::string engine_used(const router::RoadRouter& router, router::Metric metric, router::Engine engine) {
    return engine == router::Engine::dijkstra || (engine == router::Engine::automatic && !router.has_stored_hierarchy(metric))
               ? "dijkstra"
               : "hierarchy";
}

} // namespace ringroad::answers
