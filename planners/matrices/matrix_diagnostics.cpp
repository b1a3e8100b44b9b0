#include "planners/matrices/matrix_diagnostics.hpp"

#include <algorithm>
#include <cmath>

namespace ringroad::planners::matrices {

namespace {

void check_symmetry_and_missing(const CostMatrix& costs, const DiagnosticsOptions& options,
                                MatrixDiagnostics& report) {
    const std::size_t size = costs.size();
    for (std::size_t a = 0; a < size; ++a) {
        for (std::size_t b = 0; b < size; ++b) {
            if (a == b) continue;
            if (!costs.has(a, b)) {
                ++report.missing_entries;
                if (report.missing_examples.size() < options.max_examples) {
                    report.missing_examples.push_back({a, b});
                }
            }
            if (b < a) continue;
            const double forward = costs(a, b);
            const double backward = costs(b, a);
            if (forward == backward) continue;   // also true when both are missing
            ++report.asymmetric_pairs;
            if (std::isfinite(forward) && std::isfinite(backward)) {
                report.largest_asymmetry = std::max(report.largest_asymmetry, std::abs(forward - backward));
            }
            if (report.asymmetry_examples.size() < options.max_examples) {
                report.asymmetry_examples.push_back({a, b});
            }
        }
    }
    report.symmetric = report.asymmetric_pairs == 0;
}

// The `via` stops to test: all of them, or an evenly spread sample within the budget.
std::vector<std::size_t> via_stops(std::size_t size, const DiagnosticsOptions& options) {
    const double pairs = static_cast<double>(size) * static_cast<double>(size);
    std::size_t count = size;
    if (pairs * static_cast<double>(size) > options.full_check_triples) {
        count = std::clamp<std::size_t>(static_cast<std::size_t>(options.full_check_triples / std::max(pairs, 1.0)),
                                        std::min<std::size_t>(size, 8), size);
    }
    std::vector<std::size_t> stops;
    for (std::size_t i = 0; i < count; ++i) stops.push_back(i * size / count);
    return stops;
}

void keep_largest_examples(std::vector<TriangleViolation>& examples, const TriangleViolation& found,
                           std::size_t max_examples) {
    const auto excess = [](const TriangleViolation& v) { return v.direct - v.through; };
    if (examples.size() == max_examples && excess(examples.back()) >= excess(found)) return;
    if (examples.size() == max_examples) examples.pop_back();
    const auto position = std::find_if(examples.begin(), examples.end(),
                                       [&](const TriangleViolation& v) { return excess(v) < excess(found); });
    examples.insert(position, found);
}

void check_triangles(const CostMatrix& costs, const DiagnosticsOptions& options, MatrixDiagnostics& report) {
    const std::size_t size = costs.size();
    const std::vector<std::size_t> vias = via_stops(size, options);
    report.via_stops_checked = vias.size();
    report.triangle_sampled = vias.size() < size;
    const double slack = 1.0 + options.relative_tolerance;
    for (std::size_t from = 0; from < size; ++from) {
        for (const std::size_t via : vias) {
            if (via == from || !costs.has(from, via)) continue;
            const double first_leg = costs(from, via);
            for (std::size_t to = 0; to < size; ++to) {
                const double direct = costs(from, to);
                // A missing direct entry is reported as missing, not as a violation.
                if (!std::isfinite(direct) || to == from) continue;
                const double through = first_leg + costs(via, to);
                if (direct <= through * slack) continue;
                ++report.triangle_violations;
                if (options.max_examples > 0) {
                    keep_largest_examples(report.triangle_examples, {from, via, to, direct, through},
                                          options.max_examples);
                }
            }
        }
    }
}

} // namespace

MatrixDiagnostics diagnose_matrix(const CostMatrix& costs, const DiagnosticsOptions& options) {
    MatrixDiagnostics report;
    report.size = costs.size();
    check_symmetry_and_missing(costs, options, report);
    check_triangles(costs, options, report);
    return report;
}

} // namespace ringroad::planners::matrices
