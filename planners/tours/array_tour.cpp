#include "planners/tours/array_tour.hpp"

#include <cassert>

namespace ringroad::planners::tours {

ArrayTour::ArrayTour(const ClosedTour& tour) : order_(tour), position_(tour.size()) {
    for (std::size_t i = 0; i < order_.size(); ++i) position_[static_cast<std::size_t>(order_[i])] = static_cast<int>(i);
}

void ArrayTour::reverse_without_journal(int first, int last) {
    int length = wrap(last - first) + 1;
    int left = first;
    int right = last;
    for (int step = 0; step < length / 2; ++step) {
        const std::size_t l = static_cast<std::size_t>(wrap(left));
        const std::size_t r = static_cast<std::size_t>(wrap(right));
        std::swap(order_[l], order_[r]);
        position_[static_cast<std::size_t>(order_[l])] = static_cast<int>(l);
        position_[static_cast<std::size_t>(order_[r])] = static_cast<int>(r);
        ++left;
        --right;
    }
    work += static_cast<std::uint64_t>(length / 2 + 1);
}

void ArrayTour::reverse_positions(int first, int last) {
    first = wrap(first);
    last = wrap(last);
    reverse_without_journal(first, last);
    journal_.emplace_back(first, last);
}

void ArrayTour::reverse_path(int from, int to) {
    const int first = position(from);
    const int last = position(to);
    const int length = wrap(last - first) + 1;
    if (2 * length <= size()) reverse_positions(first, last);
    else if (length < size()) reverse_positions(last + 1, first - 1);
}

void ArrayTour::two_opt_move(int a, int b, int c, int d) {
    static_cast<void>(d);  // only checked in debug builds
    if (next(a) == b) {
        assert(next(c) == d);
        reverse_path(b, c);
    } else {
        assert(previous(a) == b && previous(c) == d);
        reverse_path(c, b);
    }
}

void ArrayTour::exchange_segments(int position_before, int first_length, int second_length) {
    const int start = position_before + 1;
    const int middle = start + first_length;
    const int end = middle + second_length - 1;
    reverse_positions(start, middle - 1);
    reverse_positions(middle, end);
    reverse_positions(start, end);
}

void ArrayTour::undo_to(std::size_t mark) {
    while (journal_.size() > mark) {
        const auto [first, last] = journal_.back();
        journal_.pop_back();
        reverse_without_journal(first, last);
    }
}

} // namespace ringroad::planners::tours
