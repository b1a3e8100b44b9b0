#include "planners/tours/minimum_weight_matching.hpp"

#include <algorithm>
#include <cmath>
#include <limits>
#include <stdexcept>

// Vocabulary. Vertices are 0..n-1; a blossom is an odd cycle of smaller blossoms (its children)
// joined by tight links, numbered n..2n-1; a vertex is a trivial blossom. "Top" blossoms are not
// inside another one. In a stage, a top blossom is free, even (a tree root, or reached through a
// matched link) or odd (reached through an unmatched link from an even blossom).
//
// Duals (minimum-cost form): y[v] per vertex, z[b] >= 0 per blossom; the slack of a link u-v
// between different top blossoms is c(u,v) - y[u] - y[v] >= 0 (links inside a blossom are kept
// tight by z). A dual step delta adds delta to y of even vertices, subtracts it from odd ones,
// and changes z of even/odd top blossoms by +2 delta / -2 delta. delta is the least of
//   - the slack of a link from an even to a free vertex (the free blossom joins a tree),
//   - half the slack of a link between two even top blossoms (new blossom or augmentation),
//   - half of z of an odd top blossom (it is opened up).
// Because a top blossom's vertices all move by the same amount, the cheapest link from a
// vertex to the even vertices, or from an even blossom to a given even vertex, keeps its rank
// while the duals move; that is what the "best" records below rely on.

namespace ringroad::planners::tours {
namespace {

constexpr int kNone = -1;

struct Link {
    int from = kNone; // a vertex in the blossom nearer the tree root (or in "this" blossom)
    int to = kNone;
};

enum class Label : unsigned char { free, even, odd };

class BlossomMatcher {
public:
    explicit BlossomMatcher(const matrices::CostMatrix& costs);
    std::vector<int> solve();

private:
    double cost(int u, int v) const { return cost_[static_cast<std::size_t>(u) * vertex_count_ + static_cast<std::size_t>(v)]; }
    double slack(int u, int v) const { return cost(u, v) - y_[static_cast<std::size_t>(u)] - y_[static_cast<std::size_t>(v)]; }
    double slack(const Link& link) const { return slack(link.from, link.to); }
    bool in_use(int blossom) const { return blossom < n_ || !children_[idx(blossom)].empty(); }
    bool is_top(int blossom) const { return parent_[idx(blossom)] == kNone && in_use(blossom); }
    static std::size_t idx(int value) { return static_cast<std::size_t>(value); }

    void start_from_tight_links();
    void leaves(int blossom, std::vector<int>& out) const;
    int child_containing(int blossom, int vertex) const;
    void run_stage();
    bool scan(int vertex);
    void record_even_pair(int u, int v);
    void make_even(int blossom, Link label_link);
    void make_odd(int vertex, Link label_link);
    bool join_even_pair(Link link);
    void form_blossom(int common, Link link);
    void augment(Link link);
    void rebase(int blossom, int vertex);
    void match(const Link& link, int blossom);
    void open_odd_blossom(int blossom);
    void clear_even_records(int blossom);

    int n_ = 0;
    std::size_t vertex_count_ = 0;
    std::vector<double> cost_;
    std::vector<int> mate_;
    std::vector<double> y_;                    // vertex duals
    std::vector<double> z_;                    // blossom duals (index >= n)
    std::vector<int> top_;                     // top blossom of each vertex
    std::vector<int> parent_;                  // enclosing blossom or kNone
    std::vector<int> base_;                    // base vertex of each blossom
    std::vector<std::vector<int>> children_;   // cycle order, children_[b][0] holds the base
    std::vector<std::vector<Link>> cycle_;     // cycle_[b][i] joins children i and i+1 (mod size)
    std::vector<Label> label_;
    std::vector<Link> label_link_;             // link through which a labelled top blossom was reached
    std::vector<int> unused_ids_;
    std::vector<int> queue_;                   // even vertices still to scan
    std::vector<int> best_even_vertex_;        // for non-even vertices: least-slack even neighbour
    std::vector<Link> best_even_link_;         // for even top blossoms: least-slack link to another even blossom
    std::vector<std::vector<int>> best_from_;  // [b - n][w]: vertex of even blossom b nearest to even vertex w
    std::vector<int> mark_;
    int stamp_ = 0;
};

BlossomMatcher::BlossomMatcher(const matrices::CostMatrix& costs)
    : n_(static_cast<int>(costs.size())), vertex_count_(costs.size()) {
    if (vertex_count_ % 2 != 0) throw std::invalid_argument("perfect matching needs an even number of vertices");
    cost_.resize(vertex_count_ * vertex_count_, 0.0);
    for (std::size_t i = 0; i < vertex_count_; ++i)
        for (std::size_t j = 0; j < vertex_count_; ++j) {
            if (i == j) continue;
            if (!std::isfinite(costs(i, j))) throw std::invalid_argument("perfect matching needs finite costs");
            cost_[i * vertex_count_ + j] = costs(i, j);
        }
    const std::size_t ids = 2 * vertex_count_;
    mate_.assign(vertex_count_, kNone);
    y_.assign(vertex_count_, 0.0);
    z_.assign(ids, 0.0);
    top_.resize(vertex_count_);
    parent_.assign(ids, kNone);
    base_.assign(ids, kNone);
    children_.resize(ids);
    cycle_.resize(ids);
    label_.assign(ids, Label::free);
    label_link_.assign(ids, Link{});
    best_even_vertex_.assign(vertex_count_, kNone);
    best_even_link_.assign(ids, Link{});
    best_from_.assign(vertex_count_, std::vector<int>(vertex_count_, kNone));
    mark_.assign(ids, 0);
    for (int v = 0; v < n_; ++v) {
        top_[idx(v)] = v;
        base_[idx(v)] = v;
    }
    for (int b = 2 * n_ - 1; b >= n_; --b) unused_ids_.push_back(b);
    start_from_tight_links();
}

// Feasible starting duals and a matching of tight links, which saves most of the stages:
// y[v] = half the cheapest link at v (all slacks >= 0); then each vertex in turn raises its
// dual by its least slack, which makes a link tight, and takes that link if its other end is
// still unmatched.
void BlossomMatcher::start_from_tight_links() {
    if (n_ < 2) return;
    for (int v = 0; v < n_; ++v) {
        double cheapest = std::numeric_limits<double>::infinity();
        for (int w = 0; w < n_; ++w)
            if (w != v) cheapest = std::min(cheapest, cost(v, w));
        y_[idx(v)] = cheapest / 2.0;
    }
    for (int v = 0; v < n_; ++v) {
        int tightest = kNone;
        for (int w = 0; w < n_; ++w)
            if (w != v && (tightest == kNone || slack(v, w) < slack(v, tightest) ||
                           (slack(v, w) == slack(v, tightest) && mate_[idx(tightest)] != kNone)))
                tightest = w;
        y_[idx(v)] += slack(v, tightest);
        if (mate_[idx(v)] == kNone && mate_[idx(tightest)] == kNone) {
            mate_[idx(v)] = tightest;
            mate_[idx(tightest)] = v;
        }
    }
}

void BlossomMatcher::leaves(int blossom, std::vector<int>& out) const {
    if (blossom < n_) {
        out.push_back(blossom);
        return;
    }
    for (int child : children_[idx(blossom)]) leaves(child, out);
}

int BlossomMatcher::child_containing(int blossom, int vertex) const {
    int child = vertex;
    while (parent_[idx(child)] != blossom) child = parent_[idx(child)];
    return child;
}

std::vector<int> BlossomMatcher::solve() {
    for (int stage = 0; stage <= n_ / 2; ++stage) {
        if (std::none_of(mate_.begin(), mate_.end(), [](int mate) { return mate == kNone; })) break;
        run_stage();
    }
    return mate_;
}

void BlossomMatcher::clear_even_records(int blossom) {
    best_even_link_[idx(blossom)] = Link{};
    if (blossom >= n_) std::fill(best_from_[idx(blossom - n_)].begin(), best_from_[idx(blossom - n_)].end(), kNone);
}

void BlossomMatcher::make_even(int blossom, Link label_link) {
    label_[idx(blossom)] = Label::even;
    label_link_[idx(blossom)] = label_link;
    clear_even_records(blossom);
    leaves(blossom, queue_);
}

// The free top blossom of `vertex` becomes odd; the blossom matched to its base becomes even.
void BlossomMatcher::make_odd(int vertex, Link label_link) {
    const int blossom = top_[idx(vertex)];
    label_[idx(blossom)] = Label::odd;
    label_link_[idx(blossom)] = label_link;
    const int base = base_[idx(blossom)];
    const int partner = mate_[idx(base)];
    make_even(top_[idx(partner)], Link{base, partner});
}

// Records the link on the side of `from` only: every link between even vertices is recorded
// when the later of its ends is scanned, and the records of blossoms that merge are combined,
// so the least-slack link between even top blossoms is always held by one of them.
void BlossomMatcher::record_even_pair(int from, int to) {
    const int blossom = top_[idx(from)];
    const double link_slack = slack(from, to);
    if (blossom >= n_) {
        int& nearest = best_from_[idx(blossom - n_)][idx(to)];
        if (nearest == kNone || link_slack < slack(nearest, to)) nearest = from;
    }
    Link& best = best_even_link_[idx(blossom)];
    if (best.from == kNone || link_slack < slack(best)) best = Link{from, to};
}

// Looks at every link of a newly even vertex; returns true when the stage ended in an augmentation.
bool BlossomMatcher::scan(int vertex) {
    for (int other = 0; other < n_; ++other) {
        if (other == vertex || top_[idx(other)] == top_[idx(vertex)]) continue;
        const double other_slack = slack(vertex, other);
        const Label other_label = label_[idx(top_[idx(other)])];
        if (other_label == Label::even) {
            record_even_pair(vertex, other);
            if (other_slack <= 0.0 && join_even_pair(Link{vertex, other})) return true;
            continue;
        }
        int& nearest = best_even_vertex_[idx(other)];
        if (nearest == kNone || other_slack < slack(nearest, other)) nearest = vertex;
        if (other_label == Label::free && other_slack <= 0.0) make_odd(other, Link{vertex, other});
    }
    return false;
}

// A tight link between two even top blossoms: a new blossom when they are in the same tree,
// otherwise an augmenting path (returns true).
bool BlossomMatcher::join_even_pair(Link link) {
    ++stamp_;
    int walker = top_[idx(link.from)];
    int other_walker = top_[idx(link.to)];
    int common = kNone;
    while (walker != kNone || other_walker != kNone) {
        if (walker != kNone) {
            if (mark_[idx(walker)] == stamp_) {
                common = walker;
                break;
            }
            mark_[idx(walker)] = stamp_;
            const Link up = label_link_[idx(walker)];
            if (up.from == kNone) {
                walker = kNone;
            } else {
                const int odd = top_[idx(up.from)];
                walker = top_[idx(label_link_[idx(odd)].from)];
            }
        }
        std::swap(walker, other_walker);
    }
    if (common == kNone) {
        augment(link);
        return true;
    }
    form_blossom(common, link);
    return false;
}

void BlossomMatcher::form_blossom(int common, Link link) {
    // Path of top blossoms from each end of the link up to the common ancestor, with the label
    // links between them (label_link_[b] goes from the next blossom up into b).
    auto climb = [&](int start, std::vector<int>& blossoms, std::vector<Link>& links) {
        for (int b = start; b != common; b = top_[idx(label_link_[idx(b)].from)]) {
            blossoms.push_back(b);
            links.push_back(label_link_[idx(b)]);
        }
    };
    std::vector<int> from_side, to_side;
    std::vector<Link> from_links, to_links;
    climb(top_[idx(link.from)], from_side, from_links);
    climb(top_[idx(link.to)], to_side, to_links);

    const int blossom = unused_ids_.back();
    unused_ids_.pop_back();
    std::vector<int>& children = children_[idx(blossom)];
    std::vector<Link>& cycle = cycle_[idx(blossom)];
    children.assign(1, common);
    cycle.clear();
    for (std::size_t i = from_side.size(); i-- > 0;) {
        cycle.push_back(from_links[i]);
        children.push_back(from_side[i]);
    }
    cycle.push_back(link);
    for (std::size_t i = 0; i < to_side.size(); ++i) {
        children.push_back(to_side[i]);
        cycle.push_back(Link{to_links[i].to, to_links[i].from});
    }
    base_[idx(blossom)] = base_[idx(common)];
    parent_[idx(blossom)] = kNone;
    z_[idx(blossom)] = 0.0;
    label_[idx(blossom)] = Label::even;
    label_link_[idx(blossom)] = label_link_[idx(common)];
    clear_even_records(blossom);

    std::vector<int> members;
    for (int child : children) {
        parent_[idx(child)] = blossom;
        const std::size_t first = members.size();
        leaves(child, members);
        // Odd children turn even: their vertices are scanned, which records their links.
        if (label_[idx(child)] == Label::odd) queue_.insert(queue_.end(), members.begin() + static_cast<std::ptrdiff_t>(first), members.end());
    }
    for (int v : members) top_[idx(v)] = blossom;

    // Even children's records toward even vertices outside the new blossom carry over.
    std::vector<int>& nearest = best_from_[idx(blossom - n_)];
    auto offer = [&](int from, int to) {
        if (nearest[idx(to)] == kNone || slack(from, to) < slack(nearest[idx(to)], to)) nearest[idx(to)] = from;
    };
    for (int child : children) {
        if (label_[idx(child)] != Label::even) continue;
        for (int w = 0; w < n_; ++w) {
            if (top_[idx(w)] == blossom || label_[idx(top_[idx(w)])] != Label::even) continue;
            if (child < n_) offer(child, w);
            else if (best_from_[idx(child - n_)][idx(w)] != kNone) offer(best_from_[idx(child - n_)][idx(w)], w);
        }
    }
    Link& best = best_even_link_[idx(blossom)];
    for (int w = 0; w < n_; ++w)
        if (nearest[idx(w)] != kNone && top_[idx(w)] != blossom &&
            (best.from == kNone || slack(nearest[idx(w)], w) < slack(best)))
            best = Link{nearest[idx(w)], w};
}

// Matches the two ends of `link`, whose ends lie in children of `blossom` (or are top
// blossoms when blossom is kNone), making each end the base of its child first.
void BlossomMatcher::match(const Link& link, int blossom) {
    for (int end : {link.from, link.to}) {
        const int child = blossom == kNone ? top_[idx(end)] : child_containing(blossom, end);
        if (child >= n_) rebase(child, end);
    }
    mate_[idx(link.from)] = link.to;
    mate_[idx(link.to)] = link.from;
}

// Makes `vertex` the base of `blossom` by flipping the even-length path around the cycle
// from the child holding it to the old base child.
void BlossomMatcher::rebase(int blossom, int vertex) {
    const int holder = child_containing(blossom, vertex);
    if (holder >= n_) rebase(holder, vertex);
    std::vector<int>& children = children_[idx(blossom)];
    std::vector<Link>& cycle = cycle_[idx(blossom)];
    const std::size_t length = children.size();
    const std::size_t position = static_cast<std::size_t>(std::find(children.begin(), children.end(), holder) - children.begin());
    if (position % 2 == 1) {
        for (std::size_t i = position + 1; i < length; i += 2) match(cycle[i], blossom);
    } else {
        for (std::size_t i = position; i >= 2; i -= 2) match(cycle[i - 2], blossom);
    }
    std::rotate(children.begin(), children.begin() + static_cast<std::ptrdiff_t>(position), children.end());
    std::rotate(cycle.begin(), cycle.begin() + static_cast<std::ptrdiff_t>(position), cycle.end());
    base_[idx(blossom)] = vertex;
}

// Flips the alternating path root - ... - link.from - link.to - ... - root.
void BlossomMatcher::augment(Link link) {
    for (auto [vertex, partner] : {std::pair{link.from, link.to}, std::pair{link.to, link.from}}) {
        for (;;) {
            const int even = top_[idx(vertex)];
            if (even >= n_) rebase(even, vertex);
            mate_[idx(vertex)] = partner;
            const Link up = label_link_[idx(even)];
            if (up.from == kNone) break;
            const int odd = top_[idx(up.from)];
            const Link odd_link = label_link_[idx(odd)];
            if (odd >= n_) rebase(odd, odd_link.to);
            mate_[idx(odd_link.to)] = odd_link.from;
            vertex = odd_link.from;
            partner = odd_link.to;
        }
    }
}

// An odd top blossom whose z reached 0 is replaced by its children: those on the even-length
// path from the child reached by the label link to the base child stay in the tree (odd, even,
// ..., odd), the others become free.
void BlossomMatcher::open_odd_blossom(int blossom) {
    const std::vector<int> children = children_[idx(blossom)];
    const std::vector<Link> cycle = cycle_[idx(blossom)];
    const Link entry = label_link_[idx(blossom)];
    const std::size_t length = children.size();
    const int entry_child = child_containing(blossom, entry.to);
    for (int child : children) {
        parent_[idx(child)] = kNone;
        label_[idx(child)] = Label::free;
        std::vector<int> members;
        leaves(child, members);
        for (int v : members) top_[idx(v)] = child;
    }
    children_[idx(blossom)].clear();
    cycle_[idx(blossom)].clear();
    unused_ids_.push_back(blossom);

    std::size_t position = static_cast<std::size_t>(std::find(children.begin(), children.end(), entry_child) - children.begin());
    label_[idx(entry_child)] = Label::odd;
    label_link_[idx(entry_child)] = entry;
    const bool forward = position % 2 == 1;
    auto step = [&](std::size_t from) {
        const std::size_t to = forward ? (from + 1) % length : from - 1;
        const Link link = forward ? cycle[from] : Link{cycle[to].to, cycle[to].from};
        return std::pair{to, link};
    };
    while (position != 0) {
        const auto [even_position, matched] = step(position);
        label_[idx(children[even_position])] = Label::even;
        label_link_[idx(children[even_position])] = matched;
        clear_even_records(children[even_position]);
        leaves(children[even_position], queue_);
        const auto [odd_position, unmatched] = step(even_position);
        label_[idx(children[odd_position])] = Label::odd;
        label_link_[idx(children[odd_position])] = unmatched;
        position = odd_position;
    }
}

void BlossomMatcher::run_stage() {
    std::fill(label_.begin(), label_.end(), Label::free);
    std::fill(best_even_vertex_.begin(), best_even_vertex_.end(), kNone);
    queue_.clear();
    for (int b = 0; b < 2 * n_; ++b)
        if (is_top(b) && mate_[idx(base_[idx(b)])] == kNone) make_even(b, Link{});

    for (;;) {
        while (!queue_.empty()) {
            const int vertex = queue_.back();
            queue_.pop_back();
            if (scan(vertex)) return;
        }
        enum class Event { join_tree, join_even, open_blossom } event = Event::join_tree;
        double delta = std::numeric_limits<double>::infinity();
        Link event_link;
        int event_blossom = kNone;
        for (int v = 0; v < n_; ++v) {
            const int nearest = best_even_vertex_[idx(v)];
            if (label_[idx(top_[idx(v)])] == Label::free && nearest != kNone && slack(nearest, v) < delta) {
                delta = slack(nearest, v);
                event = Event::join_tree;
                event_link = Link{nearest, v};
            }
        }
        for (int b = 0; b < 2 * n_; ++b) {
            if (!is_top(b)) continue;
            const Link& best = best_even_link_[idx(b)];
            if (label_[idx(b)] == Label::even && best.from != kNone && slack(best) / 2.0 < delta) {
                delta = slack(best) / 2.0;
                event = Event::join_even;
                event_link = best;
            } else if (label_[idx(b)] == Label::odd && b >= n_ && z_[idx(b)] / 2.0 < delta) {
                delta = z_[idx(b)] / 2.0;
                event = Event::open_blossom;
                event_blossom = b;
            }
        }
        if (!std::isfinite(delta)) throw std::logic_error("blossom matching: no dual step possible");
        delta = std::max(delta, 0.0);
        for (int v = 0; v < n_; ++v) {
            const Label label = label_[idx(top_[idx(v)])];
            if (label == Label::even) y_[idx(v)] += delta;
            else if (label == Label::odd) y_[idx(v)] -= delta;
        }
        for (int b = n_; b < 2 * n_; ++b) {
            if (!is_top(b)) continue;
            if (label_[idx(b)] == Label::even) z_[idx(b)] += 2.0 * delta;
            else if (label_[idx(b)] == Label::odd) z_[idx(b)] -= 2.0 * delta;
        }
        switch (event) {
        case Event::join_tree: make_odd(event_link.to, event_link); break;
        case Event::join_even:
            if (join_even_pair(event_link)) return;
            break;
        case Event::open_blossom:
            z_[idx(event_blossom)] = 0.0;
            open_odd_blossom(event_blossom);
            break;
        }
    }
}

} // namespace

std::vector<int> minimum_weight_perfect_matching(const matrices::CostMatrix& costs) {
    BlossomMatcher matcher(costs);
    return matcher.solve();
}

double matching_cost(const matrices::CostMatrix& costs, const std::vector<int>& mate) {
    double total = 0.0;
    for (std::size_t v = 0; v < mate.size(); ++v)
        if (mate[v] > static_cast<int>(v)) total += costs(v, static_cast<std::size_t>(mate[v]));
    return total;
}

} // namespace ringroad::planners::tours
