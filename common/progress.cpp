#include "common/progress.hpp"

#include <unistd.h>

#include <cstdio>

namespace ringroad {

namespace {
constexpr auto kRedrawInterval = std::chrono::milliseconds(200);
}

Progress::Progress(bool quiet)
    : enabled_(!quiet && ::isatty(STDERR_FILENO) == 1),
      start_(std::chrono::steady_clock::now()),
      last_draw_(start_ - kRedrawInterval) {}

Progress::~Progress() { finish(); }

void Progress::phase(const std::string& name) {
    finish();
    phase_ = name;
    last_draw_ = std::chrono::steady_clock::now() - kRedrawInterval;
    draw(-1.0);
}

void Progress::update(double fraction) {
    if (!enabled_) return;
    const auto now = std::chrono::steady_clock::now();
    if (now - last_draw_ < kRedrawInterval) return;
    draw(fraction);
}

void Progress::draw(double fraction) {
    if (!enabled_) return;
    last_draw_ = std::chrono::steady_clock::now();
    if (fraction >= 0.0) {
        std::fprintf(stderr, "\r\033[K%-28s %3d%%  %6.1f s", phase_.c_str(),
                     static_cast<int>(fraction * 100.0 + 0.5), elapsed_seconds());
    } else {
        std::fprintf(stderr, "\r\033[K%-28s       %6.1f s", phase_.c_str(), elapsed_seconds());
    }
    std::fflush(stderr);
    line_open_ = true;
}

void Progress::finish() {
    if (!enabled_ || !line_open_) return;
    std::fputc('\n', stderr);
    line_open_ = false;
}

double Progress::elapsed_seconds() const {
    return std::chrono::duration<double>(std::chrono::steady_clock::now() - start_).count();
}

} // namespace ringroad
