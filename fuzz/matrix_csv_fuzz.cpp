// Fuzz target: MATRIX.csv (planners::matrices::parse_matrix_csv). Beyond not crashing, it checks
// the promises of planners/matrices/matrix_csv.hpp: a matrix read has unique non-empty ids, one
// row and column per id, cells that are missing or finite and >= 0, a zero diagonal; and writing
// it (matrix_to_csv) and reading it back gives the same ids and bit-for-bit the same costs.

#include "common/input_error.hpp"
#include "planners/matrices/matrix_csv.hpp"

#include <cmath>
#include <cstddef>
#include <cstdint>
#include <cstdio>
#include <cstdlib>
#include <cstring>
#include <set>
#include <string>
#include <string_view>

namespace {

using namespace ringroad;
using planners::matrices::LabelledMatrix;

void require(bool condition, const char* what) {
    if (!condition) {
        std::fprintf(stderr, "matrix_csv_fuzz: broken promise: %s\n", what);
        std::abort();
    }
}

bool same_bits(double a, double b) { return std::memcmp(&a, &b, sizeof a) == 0; }

void check_matrix(const LabelledMatrix& matrix) {
    const std::size_t n = matrix.ids.size();
    require(matrix.costs.size() == n, "one row and column per id");
    std::set<std::string> ids;
    for (const std::string& id : matrix.ids) {
        require(!id.empty(), "ids are not empty");
        require(ids.insert(id).second, "ids are unique");
    }
    for (std::size_t i = 0; i < n; ++i) {
        require(matrix.costs(i, i) == 0.0, "the diagonal is 0");
        for (std::size_t j = 0; j < n; ++j) {
            const double cost = matrix.costs(i, j);
            require(!std::isnan(cost) && cost >= 0.0, "costs are missing or >= 0");
        }
    }
}

} // namespace

extern "C" int LLVMFuzzerTestOneInput(const std::uint8_t* data, std::size_t size) {
    const std::string_view text(reinterpret_cast<const char*>(data), size);
    LabelledMatrix matrix;
    try {
        matrix = planners::matrices::parse_matrix_csv(text, "fuzz.csv");
    } catch (const InputError&) {
        return 0;
    }
    check_matrix(matrix);
    LabelledMatrix again;
    try {
        again = planners::matrices::parse_matrix_csv(planners::matrices::matrix_to_csv(matrix), "written.csv");
    } catch (const InputError&) {
        require(false, "a matrix written by matrix_to_csv reads back");
    }
    require(again.ids == matrix.ids, "the ids read back the same");
    for (std::size_t i = 0; i < matrix.ids.size(); ++i) {
        for (std::size_t j = 0; j < matrix.ids.size(); ++j) {
            require(same_bits(again.costs(i, j), matrix.costs(i, j)), "every cost reads back bit for bit");
        }
    }
    return 0;
}
