// The TSPLIB reader, checked against values published with TSPLIB 95 (Reinelt 1991/1995).
#include "common/input_error.hpp"
#include "planners/tours/held_karp.hpp"
#include "planners/tours/tour_planner.hpp"
#include "tests/support/run_command.hpp"
#include "tests/support/tsplib_reader.hpp"

#include <catch2/catch.hpp>

#include <sstream>

using namespace ringroad;

namespace {

std::string tsplib(const std::string& name) { return test::fixture_path("tsplib/" + name); }

double identity_tour_length(const planners::matrices::CostMatrix& costs) {
    double total = 0.0;
    for (std::size_t i = 0; i < costs.size(); ++i) total += costs(i, (i + 1) % costs.size());
    return total;
}

// Writes a symmetric matrix in the given EDGE_WEIGHT_FORMAT.
std::string explicit_instance(const planners::matrices::CostMatrix& costs, const std::string& format) {
    std::ostringstream out;
    const std::size_t n = costs.size();
    out << "NAME : recoded\nTYPE : TSP\nDIMENSION : " << n << "\nEDGE_WEIGHT_TYPE : EXPLICIT\n"
        << "EDGE_WEIGHT_FORMAT : " << format << "\nEDGE_WEIGHT_SECTION\n";
    for (std::size_t i = 0; i < n; ++i) {
        for (std::size_t j = 0; j < n; ++j) {
            const bool take = format == "FULL_MATRIX" || (format == "UPPER_ROW" && j > i) ||
                              (format == "UPPER_DIAG_ROW" && j >= i) || (format == "LOWER_ROW" && j < i) ||
                              (format == "LOWER_DIAG_ROW" && j <= i);
            if (take) out << costs(i, j) << ' ';
        }
        out << '\n';
    }
    out << "EOF\n";
    return out.str();
}

} // namespace

TEST_CASE("pcb442 canonical tour 1,2,...,n has the published length") {
    // TSPLIB 95 documentation (Reinelt 1995), the canonical-tour lengths it lists for checking
    // distance code: pcb442 221440 (quoted from memory; the issue cites the same value).
    const auto instance = test::read_tsplib_file(tsplib("symmetric/pcb442.tsp"));
    REQUIRE(instance.costs.size() == 442);
    CHECK(identity_tour_length(instance.costs) == 221440.0);
}

TEST_CASE("every EDGE_WEIGHT_FORMAT encodes gr17 to the same published optimum") {
    // gr17 ships as LOWER_DIAG_ROW; its optimum 2085 is published with TSPLIB. The same
    // matrix re-encoded in each other format must read back to a matrix with that optimum.
    const auto original = test::read_tsplib_file(tsplib("symmetric/gr17.tsp"));
    REQUIRE(original.costs.size() == 17);
    for (const char* format : {"FULL_MATRIX", "UPPER_ROW", "UPPER_DIAG_ROW", "LOWER_ROW", "LOWER_DIAG_ROW"}) {
        INFO(format);
        const auto recoded = test::parse_tsplib(explicit_instance(original.costs, format), "recoded");
        for (std::size_t i = 0; i < 17; ++i)
            for (std::size_t j = 0; j < 17; ++j) REQUIRE(recoded.costs(i, j) == original.costs(i, j));
        CHECK(planners::tours::held_karp(recoded.costs, 0, planners::tours::TripShape::closed).cost == 2085.0);
    }
}

TEST_CASE("GEO distances give the published optimum of burma14") {
    // burma14 optimum 3323 (TSPLIB optimal.txt). The TSPLIB GEO rule rounds coordinates to
    // whole degrees toward zero; nint() would change several distances and the optimum.
    const auto instance = test::read_tsplib_file(tsplib("symmetric/burma14.tsp"));
    CHECK(planners::tours::held_karp(instance.costs, 0, planners::tours::TripShape::closed).cost == 3323.0);
}

TEST_CASE("ATT distances give the published optimum of att48") {
    // att48 optimum 10628 (TSPLIB optimal.txt). The search reaches it on this budget
    // (deterministic); plain EUC_2D distances would make every tour about sqrt(10) times longer.
    const auto instance = test::read_tsplib_file(tsplib("symmetric/att48.tsp"));
    planners::tours::TourRequest request;
    request.work_limit = 20'000'000;
    const auto result = planners::tours::plan_tour(instance.costs, request);
    CHECK(result.cost == 10628.0);
    CHECK(result.lower_bound <= 10628.0);
}

TEST_CASE("distance functions follow TSPLIB 95 section 2") {
    // Worked by hand from the formulas: EUC_2D rounds to nearest, CEIL_2D rounds up, ATT is
    // sqrt(d^2/10) rounded up when nint falls below it.
    CHECK(test::tsplib_euclidean(0, 0, 3, 4) == 5);
    CHECK(test::tsplib_euclidean(0, 0, 1, 1) == 1);     // 1.414 -> 1
    CHECK(test::tsplib_ceiling(0, 0, 1, 1) == 2);       // 1.414 -> 2
    CHECK(test::tsplib_pseudo_euclidean(0, 0, 10, 0) == 4);  // sqrt(10) = 3.16, nint 3 < 3.16 -> 4
    CHECK(test::tsplib_pseudo_euclidean(0, 0, 30, 40) == 16); // sqrt(250) = 15.81, nint 16
    // Same point: GEO gives (int)(RRR * acos(1) + 1) = 1 by the TSPLIB formula.
    CHECK(test::tsplib_geographic(16.47, 96.10, 16.47, 96.10) == 1);
}

TEST_CASE("asymmetric FULL_MATRIX instances read as asymmetric") {
    const auto instance = test::read_tsplib_file(tsplib("asymmetric/br17.atsp"));
    CHECK(instance.asymmetric);
    CHECK(instance.costs.size() == 17);
    CHECK(planners::tours::held_karp(instance.costs, 0, planners::tours::TripShape::closed).cost == 39.0);  // TSPLIB: br17 39
}

TEST_CASE("optimal.txt lists the published optima") {
    const auto symmetric = test::read_tsplib_optima(tsplib("symmetric/optimal.txt"));
    CHECK(symmetric.at("pcb442") == 50778);   // TSPLIB optimal tour lengths
    CHECK(symmetric.at("dsj1000") == 18660188);
    const auto asymmetric = test::read_tsplib_optima(tsplib("asymmetric/optimal.txt"));
    CHECK(asymmetric.at("ftv70") == 1950);
}

TEST_CASE("malformed TSPLIB input is rejected with a message naming the source") {
    auto message_of = [](const std::string& text) {
        try {
            test::parse_tsplib(text, "bad.tsp");
        } catch (const InputError& error) {
            return std::string(error.what());
        }
        return std::string("no error");
    };
    CHECK(message_of("NAME : x\nTYPE : TSP\nEOF\n").find("bad.tsp") == 0);
    CHECK(message_of("TYPE : TSP\nDIMENSION : 3\nEDGE_WEIGHT_TYPE : EXPLICIT\nEDGE_WEIGHT_FORMAT : FULL_MATRIX\n"
                     "EDGE_WEIGHT_SECTION\n0 1 2\n1 0\n")
              .find("ends early") != std::string::npos);
    CHECK(message_of("TYPE : TSP\nDIMENSION : 2\nEDGE_WEIGHT_TYPE : MAN_2D\nNODE_COORD_SECTION\n1 0 0\n2 1 1\n")
              .find("MAN_2D") != std::string::npos);
    CHECK_THROWS_AS(test::read_tsplib_file(tsplib("symmetric/missing.tsp")), InputError);
}
