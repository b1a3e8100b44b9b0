#pragma once
// A reader for TSPLIB 95 instances (G. Reinelt, "TSPLIB 95", Universität Heidelberg, 1995,
// sections 1-2), used by tests and benchmarks to check the planners against published optima.
// Supports TYPE TSP/ATSP with EDGE_WEIGHT_TYPE EUC_2D, CEIL_2D, ATT, GEO and EXPLICIT (formats
// FULL_MATRIX, UPPER_ROW, LOWER_ROW, UPPER_DIAG_ROW, LOWER_DIAG_ROW). Distances are the
// integers defined by the TSPLIB documentation, so tour lengths compare exactly with published
// values. Malformed input throws ringroad::InputError naming the file and the problem.

#include "planners/matrices/cost_matrix.hpp"

#include <map>
#include <string>
#include <string_view>

namespace ringroad::test {

struct TsplibInstance {
    std::string name;
    bool asymmetric = false;          // TYPE: ATSP
    planners::matrices::CostMatrix costs;
};

TsplibInstance read_tsplib_file(const std::string& path);
TsplibInstance parse_tsplib(std::string_view text, const std::string& source_name);

// The distance functions of TSPLIB 95 section 2, exposed for tests.
long tsplib_euclidean(double x1, double y1, double x2, double y2);       // EUC_2D: nint
long tsplib_ceiling(double x1, double y1, double x2, double y2);         // CEIL_2D
long tsplib_pseudo_euclidean(double x1, double y1, double x2, double y2);  // ATT
long tsplib_geographic(double x1, double y1, double x2, double y2);      // GEO (DDD.MM degrees)

// Reads an optimal.txt file: lines "name : length" (anything after the number is ignored).
std::map<std::string, long> read_tsplib_optima(const std::string& path);

} // namespace ringroad::test
