#pragma once
// Progress: a one-line status on stderr ("phase  42%  3.1 s") for long work, redrawn in place.
// It is silent unless stderr is a terminal and the caller did not ask for quiet, so pipes and
// logs stay clean. Updates are rate-limited; calling update() in a hot loop is cheap.

#include <chrono>
#include <string>

namespace ringroad {

class Progress {
public:
    explicit Progress(bool quiet = false);
    ~Progress();

    bool enabled() const noexcept { return enabled_; }
    void phase(const std::string& name);   // starts a new phase (ends the previous line)
    void update(double fraction);          // 0..1 within the current phase; negative = unknown
    void finish();                         // ends the current line
    double elapsed_seconds() const;        // since construction

private:
    void draw(double fraction);

    bool enabled_;
    std::string phase_;
    std::chrono::steady_clock::time_point start_;
    std::chrono::steady_clock::time_point last_draw_;
    bool line_open_ = false;
};

} // namespace ringroad
