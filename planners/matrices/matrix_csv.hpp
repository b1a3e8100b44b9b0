#pragma once
// MATRIX.csv: a square cost matrix with stop ids, as the user supplies it or as we write it.
//
//   id,depot,north,east
//   depot,0,12.5,
//   north,13,0,7
//   east,9,6.5,0
//
// Reading promises: every header id is unique and non-empty; every header id has exactly one
// row; every cell is empty (no connection) or a number from 0 to kLargestMatrixCost; the diagonal
// is 0 or empty; ids are valid UTF-8 (they are echoed in JSON).
// Rows may come in any order: they are matched to the header by their id, and the result keeps
// the header's order (spreadsheets re-sort rows easily; reordering them must not change the
// matrix). Any problem throws InputError with one line naming the file, line and column.

#include "planners/matrices/cost_matrix.hpp"

#include <string>
#include <string_view>

namespace ringroad::planners::matrices {

// The largest cost a cell may hold: 1e12 (over 31,000 years in seconds, a million km in mm).
// Sums of a million such costs stay far below the largest double, so no tour or network cost
// overflows to infinity, and below 2^53 * 1e6 integral costs still add up exactly in the range
// anyone uses. Larger cells are refused with their file, line and column.
inline constexpr double kLargestMatrixCost = 1e12;

LabelledMatrix read_matrix_csv(const std::string& path);
// The same from text in memory; `source_name` is used in error messages.
LabelledMatrix parse_matrix_csv(std::string_view text, const std::string& source_name);

// RFC 4180 text in the layout above; missing entries become empty cells and numbers are written
// in the shortest form that reads back to the same double.
std::string matrix_to_csv(const LabelledMatrix& matrix);
// Writes through a temporary file (nothing half-written is ever left under `path`).
void write_matrix_csv(const LabelledMatrix& matrix, const std::string& path);

} // namespace ringroad::planners::matrices
