// SPDX-License-Identifier: MIT
#include "catchpeak/terrain/conditioning.hpp"

#include "catchpeak/core/error.hpp"
#include "catchpeak/terrain/flow_direction.hpp"
#include "internal.hpp"

#include <algorithm>
#include <array>
#include <bit>
#include <cmath>
#include <cstddef>
#include <functional>
#include <limits>
#include <queue>
#include <utility>
#include <vector>

namespace catchpeak::terrain {

namespace {

constexpr std::uint8_t closed_flag = 1;
/// In a banded fill: a cell whose local fill drains to the raster edge or nodata (label 0,
/// kept in the marks so that the label grid is touched only by the other cells), and nodata.
constexpr std::uint8_t outlet_flag = 4;

/// The eight neighbours of the cells of rows [r_lo, r_hi) of a grid w cells wide (a band of
/// rows, or the whole grid): index offsets for a cell inside the band, bounds checks for one on
/// its outer ring (neighbours outside the band are left out), decided once per cell.
class Neighbours {
  public:
    Neighbours(std::size_t w, std::size_t h) : Neighbours(w, 0, h, true) {}
    Neighbours(std::size_t w, std::size_t r_lo, std::size_t r_hi, bool)
        : w_(w), r_lo_(r_lo), r_hi_(r_hi) {
        for (std::uint8_t k = 1; k <= 8; ++k) {
            offset_[k] = static_cast<std::ptrdiff_t>(d8::drow[k]) * static_cast<std::ptrdiff_t>(w) +
                         d8::dcol[k];
        }
    }
    /// True when cell i lies on the band's outer ring.
    [[nodiscard]] bool on_ring(std::size_t i) const noexcept {
        const std::size_t r = i / w_;
        const std::size_t c = i - r * w_;
        return c == 0 || r == r_lo_ || c + 1 == w_ || r + 1 == r_hi_;
    }
    /// Calls body(k, n) for each neighbour n (code k, ascending) of cell i that is in the band.
    template <typename Body> void each(std::size_t i, bool ring, Body body) const {
        if (!ring) {
            for (std::uint8_t k = 1; k <= 8; ++k) {
                body(k, static_cast<std::size_t>(static_cast<std::ptrdiff_t>(i) + offset_[k]));
            }
            return;
        }
        const std::size_t r = i / w_;
        const std::size_t c = i - r * w_;
        for (std::uint8_t k = 1; k <= 8; ++k) {
            // A step off column 0 or row 0 wraps to a huge value.
            const std::size_t nc = c + static_cast<std::size_t>(std::ptrdiff_t{d8::dcol[k]});
            const std::size_t nr = r + static_cast<std::size_t>(std::ptrdiff_t{d8::drow[k]});
            if (nc < w_ && nr >= r_lo_ && nr < r_hi_) {
                body(k, nr * w_ + nc);
            }
        }
    }
    template <typename Body> void each(std::size_t i, Body body) const {
        each(i, on_ring(i), body);
    }

  private:
    std::size_t w_;
    std::size_t r_lo_;
    std::size_t r_hi_;
    std::array<std::ptrdiff_t, 9> offset_{};
};

/// First-in first-out queue in a ring buffer that doubles when full: its memory follows the
/// longest queue at any moment, not the number of cells that pass through it.
template <typename T> class Fifo {
  public:
    [[nodiscard]] bool empty() const noexcept { return size_ == 0; }
    void push(T v) {
        if (size_ == buf_.size()) {
            grow();
        }
        buf_[(head_ + size_) & mask_] = v;
        ++size_;
    }
    T pop() noexcept {
        const T v = buf_[head_];
        head_ = (head_ + 1) & mask_;
        --size_;
        return v;
    }

  private:
    void grow() {
        std::vector<T> bigger(std::max<std::size_t>(1024, buf_.size() * 2));
        for (std::size_t k = 0; k < size_; ++k) {
            bigger[k] = buf_[(head_ + k) & mask_];
        }
        buf_.swap(bigger);
        head_ = 0;
        mask_ = buf_.size() - 1; // a power of two
    }
    std::vector<T> buf_;
    std::size_t mask_ = 0;
    std::size_t head_ = 0;
    std::size_t size_ = 0;
};

/// Key of an elevation whose unsigned order is the order of the floats (for non-NaN values).
inline std::uint32_t ordered_key(float z) noexcept {
    const auto u = std::bit_cast<std::uint32_t>(z);
    return (u & 0x80000000U) != 0 ? ~u : (u | 0x80000000U);
}

/// Monotone priority queue of cells by elevation (a radix heap: Ahuja, Mehlhorn, Orlin and
/// Tarjan 1990, "Faster algorithms for the shortest path problem", J. ACM 37(2); reference from
/// memory, not checked): it pops the lowest key, and no key pushed is below the last key popped,
/// which holds in Priority-Flood (a cell waits in the queue at its own, final, level). Bucket b
/// holds the keys that first differ from the last popped key at bit b - 1, so a pop moves each item
/// at most 32 times. Cells of equal elevation come out in no set order; the filled elevations
/// do not depend on it.
template <typename Index> class RadixHeap {
  public:
    struct Item {
        std::uint32_t key;
        Index cell;
    };
    [[nodiscard]] bool empty() const noexcept { return size_ == 0; }
    void push(std::uint32_t key, Index cell) {
        if (key < last_) {
            throw InternalError("Priority-Flood: a cell queued below the current level");
        }
        buckets_[bucket_of(key)].push_back({key, cell});
        ++size_;
    }
    Index pop() {
        if (buckets_[0].empty()) {
            std::size_t b = 1;
            while (buckets_[b].empty()) {
                ++b;
            }
            auto &from = buckets_[b];
            std::uint32_t low = from.front().key;
            for (const Item &it : from) {
                low = std::min(low, it.key);
            }
            last_ = low;
            for (const Item &it : from) {
                buckets_[bucket_of(it.key)].push_back(it);
            }
            from.clear();
        }
        const Index cell = buckets_[0].back().cell;
        buckets_[0].pop_back();
        --size_;
        return cell;
    }

  private:
    [[nodiscard]] std::size_t bucket_of(std::uint32_t key) const noexcept {
        return key == last_ ? 0 : static_cast<std::size_t>(32 - std::countl_zero(key ^ last_));
    }
    std::array<std::vector<Item>, 33> buckets_;
    std::uint32_t last_ = 0;
    std::size_t size_ = 0;
};

/// Label of the cells whose local fill drains to the raster edge or to nodata.
constexpr std::uint32_t outlet_label = 0;
/// Labels of the shared rows must stay below this.
constexpr std::uint32_t max_labels = std::numeric_limits<std::uint32_t>::max();

/// A band of rows filled on its own, in the parallel fill of Barnes (2016, "Parallel
/// Priority-Flood depression filling for trillion cell digital elevation models on desktops or
/// clusters", C&G 96:56-68; reference from memory, not checked). Its cells on a row shared with
/// another band are outlets too, each with a label of its own; every other cell takes the label of
/// the outlet its local fill drains to. Outlet cells (label 0) carry outlet_flag in the marks and
/// leave the label grid alone.
struct Band {
    std::size_t r_lo = 0;
    std::size_t r_hi = 0;
    /// Label of the first cell of the band's top (bottom) row when that row borders another
    /// band, else 0.
    std::uint32_t top_labels = 0;
    std::uint32_t bottom_labels = 0;
    /// For the top (bottom) row: 1 where a cell touches nodata in the band beyond (may be null).
    const std::uint8_t *top_touches_nodata = nullptr;
    const std::uint8_t *bottom_touches_nodata = nullptr;
};

/// The lowest elevation at which water crosses between the areas of two labels.
struct Spill {
    std::uint64_t key; ///< smaller label in the high half
    float z;
};

/// Spill elevations gathered while flooding a band: a small table keeps the lowest level of the
/// pairs met most recently (the same pair is met many times in a row along a divide), and hands
/// an entry on to a list when another pair takes its slot.
class SpillList {
  public:
    void add(std::uint32_t a, std::uint32_t b, float z) {
        const std::uint64_t key =
            a < b ? (std::uint64_t{a} << 32) | b : (std::uint64_t{b} << 32) | a;
        Spill &slot = table_[(key * 0x9E3779B97F4A7C15ULL) >> (64 - table_bits)];
        if (slot.key == key) {
            slot.z = std::min(slot.z, z);
            return;
        }
        if (slot.key != empty) {
            list_.push_back(slot);
        }
        slot = {key, z};
    }
    /// All spills gathered (a pair may appear more than once).
    std::vector<Spill> take() {
        for (Spill &slot : table_) {
            if (slot.key != empty) {
                list_.push_back(slot);
                slot.key = empty;
            }
        }
        return std::move(list_);
    }

  private:
    static constexpr int table_bits = 12;
    static constexpr std::uint64_t empty = std::numeric_limits<std::uint64_t>::max();
    std::vector<Spill> table_ =
        std::vector<Spill>(std::size_t{1} << table_bits, Spill{empty, 0.0F});
    std::vector<Spill> list_;
};

/// A band's grids as plain pointers: a write through a byte pointer could alias a grid's own
/// members, which would make the compiler reload them after every write to the marks.
struct BandCells {
    float *dem;
    std::uint8_t *marks;
    std::uint32_t *labels; ///< null without labels
    std::size_t w;
    std::size_t h;
    std::size_t first; ///< the band's first cell
    std::size_t last;  ///< one past its last cell
};

/// In a band fill's marks: a cell on the band's outer ring, whose neighbours need bounds checks
/// (the others use index offsets).
constexpr std::uint8_t edge_flag = 2;

/// Takes a band's cells; gives their marks: closed_flag on nodata (which counts as closed, with
/// outlet_flag when `Labelled`), edge_flag on the band's outer ring, 0 elsewhere.
template <bool Labelled>
void mark_band(const BandCells &g, const Band &band, const detail::ValidTest &valid) {
    const float *const dem = g.dem;
    std::uint8_t *const marks = g.marks;
    const std::size_t w = g.w;
    constexpr std::uint8_t nodata_marks = Labelled ? closed_flag | outlet_flag : closed_flag;
    for (std::size_t i = g.first; i < g.last; ++i) {
        marks[i] = valid(dem[i]) ? 0 : nodata_marks;
    }
    for (std::size_t c = 0; c < w; ++c) {
        marks[g.first + c] |= edge_flag;
        marks[g.last - w + c] |= edge_flag;
    }
    for (std::size_t r = band.r_lo; r < band.r_hi; ++r) {
        marks[r * w] |= edge_flag;
        marks[r * w + w - 1] |= edge_flag;
    }
}

/// Takes a marked band; closes its seeds and pushes them into `open`: valid cells on the raster
/// edge or next to a nodata cell, found from the edge ring and from the nodata cells (a byte
/// test for every other cell). With `Labelled`, also the cells touching nodata in the next band
/// (outlets) and the other cells of a row shared with another band (labels of their own). The
/// priority queue orders by elevation, so the order of the pushes does not matter.
template <typename Index, bool Labelled>
void seed_band(const BandCells &g, const Band &band, const Neighbours &around,
               const detail::ValidTest &valid, RadixHeap<Index> &open) {
    const float *const dem = g.dem;
    std::uint8_t *const marks = g.marks;
    const std::size_t w = g.w;
    const std::size_t h = g.h;
    const std::size_t first = g.first;
    const std::size_t last = g.last;
    constexpr std::uint8_t outlet_marks = Labelled ? closed_flag | outlet_flag : closed_flag;
    const auto seed = [&](std::size_t i) {
        if ((marks[i] & closed_flag) == 0) {
            marks[i] |= outlet_marks;
            open.push(ordered_key(dem[i]), static_cast<Index>(i));
        }
    };
    const auto on_raster_edge = [&](std::size_t i) {
        const std::size_t r = i / w;
        const std::size_t c = i - r * w;
        return c == 0 || r == 0 || c + 1 == w || r + 1 == h;
    };
    for (std::size_t i = first; i < last; ++i) {
        if ((marks[i] & closed_flag) == 0) {
            if ((marks[i] & edge_flag) != 0 && (!Labelled || on_raster_edge(i))) {
                seed(i);
            }
            continue;
        }
        if (valid(dem[i])) {
            continue; // a seed already
        }
        around.each(i, (marks[i] & edge_flag) != 0, [&](std::uint8_t, std::size_t n) { seed(n); });
    }
    if constexpr (Labelled) {
        for (std::size_t c = 0; c < w; ++c) {
            if (band.top_touches_nodata != nullptr && band.top_touches_nodata[c] != 0) {
                seed(first + c);
            }
            if (band.bottom_touches_nodata != nullptr && band.bottom_touches_nodata[c] != 0) {
                seed(last - w + c);
            }
        }
        std::uint32_t *const labels = g.labels;
        const auto seed_labelled = [&](std::size_t i, std::uint32_t label) {
            if ((marks[i] & closed_flag) == 0) {
                marks[i] |= closed_flag;
                labels[i] = label;
                open.push(ordered_key(dem[i]), static_cast<Index>(i));
            }
        };
        for (std::size_t c = 0; c < w; ++c) {
            if (band.top_labels != 0) {
                seed_labelled(first + c, band.top_labels + static_cast<std::uint32_t>(c));
            }
            if (band.bottom_labels != 0) {
                seed_labelled(last - w + c, band.bottom_labels + static_cast<std::uint32_t>(c));
            }
        }
    }
}

/// Takes a seeded band (its seeds closed and in `open`); floods it, raising the cells of each
/// depression to their spill level and closing every valid cell. With `Labelled`, each cell
/// takes the label of the area it was reached from and the spill elevations between labels go
/// to `spills`.
template <typename Index, bool Labelled>
void flood_from_seeds(const BandCells &g, const Neighbours &around, const detail::ValidTest &valid,
                      RadixHeap<Index> &open, SpillList *spills) {
    float *const dem = g.dem;
    std::uint8_t *const marks = g.marks;
    std::uint32_t *const labels = g.labels;
    Fifo<Index> pit;
    Fifo<Index> trace;
    while (true) {
        std::size_t i = 0;
        bool traced = false;
        if (!pit.empty()) {
            i = pit.pop();
        } else if (!trace.empty()) {
            i = trace.pop();
            traced = true;
        } else if (!open.empty()) {
            i = open.pop();
        } else {
            break;
        }
        const float z = dem[i];
        const std::uint8_t mi = marks[i];
        // Labelled: what a cell closed from this one gets, and this cell's label.
        const std::uint8_t close_marks = mi & (closed_flag | outlet_flag);
        [[maybe_unused]] std::uint32_t label = outlet_label;
        if constexpr (Labelled) {
            label = (mi & outlet_flag) != 0 ? outlet_label : labels[i];
        }
        bool waits = false;
        // Forced inline: GCC left the labelled version a call per neighbour, a third slower.
        const auto visit = [&](std::uint8_t, std::size_t n) __attribute__((always_inline)) {
            const std::uint8_t mn = marks[n];
            if ((mn & closed_flag) != 0) {
                if constexpr (Labelled) {
                    // Two areas meet: water crosses at the higher of the two cells. Outlet
                    // cells share label 0, and nodata cells carry outlet_flag too (their valid
                    // neighbours are all outlets), so two outlet marks need no test.
                    if ((mn & close_marks & outlet_flag) == 0) {
                        const std::uint32_t other =
                            (mn & outlet_flag) != 0 ? outlet_label : labels[n];
                        if (other != label && valid(dem[n])) {
                            spills->add(label, other, std::max(z, dem[n]));
                        }
                    }
                }
                return;
            }
            if (dem[n] > z) {
                marks[n] = mn | close_marks;
                trace.push(static_cast<Index>(n));
            } else if (traced) {
                waits = true; // leave it for the priority queue
                return;
            } else {
                marks[n] = mn | close_marks;
                dem[n] = z;
                pit.push(static_cast<Index>(n));
            }
            if constexpr (Labelled) {
                if ((close_marks & outlet_flag) == 0) {
                    labels[n] = label;
                }
            }
        };
        around.each(i, (mi & edge_flag) != 0, visit);
        if (waits) {
            open.push(ordered_key(z), static_cast<Index>(i));
        }
    }
}

/// Priority-Flood (Barnes, Lehman and Mulla 2014) with two plain FIFO queues beside the priority
/// queue:
/// - `pit`: cells raised to the level of the cell that found them (inside a depression), as in
///   the improved variant of Barnes et al. (2014);
/// - `trace`: cells higher than the cell that found them. They drain through it, so their
///   final elevation is their own; their higher neighbours are closed the same way without the
///   priority queue (the slope tracing of Zhou, Sun and Fu 2016). A traced cell goes to the
///   priority queue only when it has an unprocessed neighbour not higher than itself, which
///   must wait for its turn in elevation order.
/// The priority queue is popped only when both plain queues are empty, so every closed cell
/// with unprocessed neighbours is then in the priority queue, as Priority-Flood requires.
///
/// Fills the cells of `band` looking at no cell outside it. With `Labelled` (a band of a
/// parallel fill), cells take labels as described at Band and the spill elevations between
/// labels go to `spills`; without, the band is the whole grid.
template <typename Index, bool Labelled>
void flood_band(Grid<float> &dem_grid, Grid<std::uint8_t> &marks_grid,
                Grid<std::uint32_t> *label_grid, const Band &band, SpillList *spills) {
    const std::size_t w = dem_grid.width();
    const BandCells g{dem_grid.cells().data(),
                      marks_grid.cells().data(),
                      Labelled ? label_grid->cells().data() : nullptr,
                      w,
                      dem_grid.height(),
                      band.r_lo * w,
                      band.r_hi * w};
    const detail::ValidTest valid(dem_grid);
    mark_band<Labelled>(g, band, valid);
    const Neighbours around(w, band.r_lo, band.r_hi, true);
    RadixHeap<Index> open;
    seed_band<Index, Labelled>(g, band, around, valid, open);
    flood_from_seeds<Index, Labelled>(g, around, valid, open, spills);
}

/// Takes the DEM and the number of bands; gives the bands of rows, their shared rows labelled
/// (boundary j, between bands j and j + 1, has its upper row labelled from 1 + 2 j w and its
/// lower row from 1 + (2 j + 1) w), and in `touches` (which they point into) the cells of the
/// shared rows touching nodata in the band beyond.
std::vector<Band> plan_bands(const Grid<float> &dem, std::size_t bands,
                             std::vector<std::uint8_t> &touches) {
    const std::size_t w = dem.width();
    const std::size_t h = dem.height();
    const detail::ValidTest valid(dem);
    std::vector<Band> band(bands);
    touches.assign(2 * (bands - 1) * w, 0);
    for (std::size_t b = 0; b < bands; ++b) {
        band[b].r_lo = h * b / bands;
        band[b].r_hi = h * (b + 1) / bands;
    }
    for (std::size_t j = 0; j + 1 < bands; ++j) {
        const std::size_t upper = band[j].r_hi - 1;
        const auto base = static_cast<std::uint32_t>(1 + 2 * j * w);
        band[j].bottom_labels = base;
        band[j + 1].top_labels = base + static_cast<std::uint32_t>(w);
        std::uint8_t *up_touch = &touches[2 * j * w];
        std::uint8_t *down_touch = up_touch + w;
        band[j].bottom_touches_nodata = up_touch;
        band[j + 1].top_touches_nodata = down_touch;
        for (std::size_t c = 0; c < w; ++c) {
            for (std::size_t k = c == 0 ? 0 : c - 1; k <= c + 1 && k < w; ++k) {
                if (!valid(dem[(upper + 1) * w + k])) {
                    up_touch[c] = 1;
                }
                if (!valid(dem[upper * w + k])) {
                    down_touch[c] = 1;
                }
            }
        }
    }
    return band;
}

/// Takes the flooded bands (their marks and labels); gives the spills between facing cells of
/// two bands.
std::vector<Spill> facing_spills(const Grid<float> &dem, const Grid<std::uint8_t> &marks,
                                 const Grid<std::uint32_t> &labels, const std::vector<Band> &band) {
    const std::size_t w = dem.width();
    const detail::ValidTest valid(dem);
    const auto label_of = [&](std::size_t i) {
        return (marks[i] & outlet_flag) != 0 ? outlet_label : labels[i];
    };
    SpillList facing;
    for (std::size_t j = 0; j + 1 < band.size(); ++j) {
        const std::size_t upper = band[j].r_hi - 1;
        for (std::size_t c = 0; c < w; ++c) {
            const std::size_t a = upper * w + c;
            if (!valid(dem[a])) {
                continue;
            }
            for (std::size_t k = c == 0 ? 0 : c - 1; k <= c + 1 && k < w; ++k) {
                const std::size_t b = (upper + 1) * w + k;
                if (valid(dem[b]) && label_of(a) != label_of(b)) {
                    facing.add(label_of(a), label_of(b), std::max(dem[a], dem[b]));
                }
            }
        }
    }
    return facing.take();
}

/// Takes the spills between labels (0..n_labels - 1); gives each label's level: the lowest
/// elevation at which its area drains to the outlet label, from a Priority-Flood over the
/// labels (a minimax search from the outlet label); infinite for a label with no way out.
std::vector<float> label_levels(const std::vector<std::vector<Spill>> &spills,
                                std::size_t n_labels) {
    std::vector<std::vector<std::pair<std::uint32_t, float>>> graph(n_labels);
    for (const auto &list : spills) {
        for (const Spill &s : list) {
            const auto a = static_cast<std::uint32_t>(s.key >> 32);
            const auto b = static_cast<std::uint32_t>(s.key & 0xFFFFFFFFU);
            graph[a].emplace_back(b, s.z);
            graph[b].emplace_back(a, s.z);
        }
    }
    const float infinite = std::numeric_limits<float>::infinity();
    std::vector<float> level(n_labels, infinite);
    level[outlet_label] = -infinite;
    using Entry = std::pair<float, std::uint32_t>;
    std::priority_queue<Entry, std::vector<Entry>, std::greater<>> queue;
    queue.emplace(-infinite, outlet_label);
    while (!queue.empty()) {
        const auto [z, a] = queue.top();
        queue.pop();
        if (z > level[a]) {
            continue;
        }
        for (const auto &[b, spill] : graph[a]) {
            const float through = std::max(z, spill);
            if (through < level[b]) {
                level[b] = through;
                queue.emplace(through, b);
            }
        }
    }
    return level;
}

/// The parallel fill of Barnes (2016): each band is flooded on its own thread with its shared
/// rows as outlets (flood_band); the lowest level at which each label's area drains to the
/// raster edge or nodata follows from a Priority-Flood over the graph of labels and their
/// spill elevations (within bands, and between facing cells of two bands); each cell then
/// rises to its label's level where that is higher than its own fill. The filled elevations
/// are the same as one flood of the whole grid (they depend only on the DEM).
template <typename Index>
void fill_in_bands(Grid<float> &dem, Grid<std::uint8_t> &marks, Grid<std::uint32_t> &labels,
                   std::size_t bands, unsigned threads) {
    const std::size_t w = dem.width();
    const std::size_t h = dem.height();
    if (labels.width() != w || labels.height() != h) {
        labels = Grid<std::uint32_t>(w, h, no_fill);
    }
    std::vector<std::uint8_t> touches;
    const std::vector<Band> band = plan_bands(dem, bands, touches);
    std::vector<std::vector<Spill>> spills(bands);
    detail::run_on_threads(bands, [&](std::size_t b) {
        SpillList list;
        flood_band<Index, true>(dem, marks, &labels, band[b], &list);
        spills[b] = list.take();
    });
    spills.push_back(facing_spills(dem, marks, labels, band));
    const std::vector<float> level = label_levels(spills, 1 + 2 * (bands - 1) * w);
    const float infinite = std::numeric_limits<float>::infinity();
    std::vector<char> stranded(bands, 0);
    detail::for_row_blocks(h, threads, 256, [&](std::size_t b, std::size_t r0, std::size_t r1) {
        for (std::size_t i = r0 * w; i < r1 * w; ++i) {
            if ((marks[i] & outlet_flag) == 0) {
                const std::uint32_t l = labels[i];
                if (level[l] == infinite) {
                    stranded[b % bands] = 1;
                }
                dem[i] = std::max(dem[i], level[l]);
            }
        }
    });
    if (std::find(stranded.begin(), stranded.end(), 1) != stranded.end()) {
        throw InternalError("parallel fill: an area of the DEM found no way out");
    }
}

} // namespace

std::vector<std::size_t> rasterize_polyline(const GeoTransform &transform, std::size_t width,
                                            std::size_t height,
                                            const std::vector<std::pair<double, double>> &xy) {
    std::vector<std::size_t> cells;
    if (xy.empty() || width == 0 || height == 0) {
        return cells;
    }
    const auto to_cell = [&](double x, double y) {
        return std::pair<double, double>{(x - transform.origin_x) / transform.pixel_width,
                                         (y - transform.origin_y) / transform.pixel_height};
    };
    const auto add = [&](double fc, double fr) {
        const double c = std::floor(fc);
        const double r = std::floor(fr);
        if (c < 0.0 || r < 0.0 || c >= static_cast<double>(width) ||
            r >= static_cast<double>(height)) {
            return;
        }
        const std::size_t i = static_cast<std::size_t>(r) * width + static_cast<std::size_t>(c);
        if (cells.empty() || cells.back() != i) {
            cells.push_back(i);
        }
    };
    auto [c0, r0] = to_cell(xy.front().first, xy.front().second);
    add(c0, r0);
    for (std::size_t v = 1; v < xy.size(); ++v) {
        const auto [c1, r1] = to_cell(xy[v].first, xy[v].second);
        // Samples at most half a cell apart in each axis, so consecutive cells are neighbours.
        const double span = std::max(std::abs(c1 - c0), std::abs(r1 - r0));
        const auto steps = static_cast<std::size_t>(std::ceil(span * 2.0)) + 1;
        for (std::size_t s = 1; s <= steps; ++s) {
            const double t = static_cast<double>(s) / static_cast<double>(steps);
            add(c0 + (c1 - c0) * t, r0 + (r1 - r0) * t);
        }
        c0 = c1;
        r0 = r1;
    }
    return cells;
}

void apply_breach_lines(Grid<float> &dem, const std::vector<BreachLine> &lines) {
    const detail::ValidTest valid(dem);
    for (const auto &line : lines) {
        auto cells = rasterize_polyline(dem.transform, dem.width(), dem.height(), line.vertices_xy);
        // Drop nodata cells; the walk continues past them.
        std::erase_if(cells, [&](std::size_t i) { return !valid(dem[i]); });
        if (cells.size() < 2) {
            continue;
        }
        if (dem[cells.back()] > dem[cells.front()]) {
            std::reverse(cells.begin(), cells.end());
        }
        float level = dem[cells.front()];
        for (const std::size_t i : cells) {
            level = std::min(level, dem[i]);
            dem[i] = level;
        }
    }
}

void fill_depressions(Grid<float> &dem, unsigned threads) {
    Grid<std::uint8_t> marks(dem.width(), dem.height(), no_fill);
    Grid<std::uint32_t> labels;
    detail::fill_depressions_with(dem, marks, labels, threads);
}

void fill_depressions(Grid<float> &dem, Grid<std::uint8_t> &marks) {
    Grid<std::uint32_t> labels;
    detail::fill_depressions_with(dem, marks, labels, 1);
}

void detail::fill_depressions_with(Grid<float> &dem, Grid<std::uint8_t> &marks,
                                   Grid<std::uint32_t> &labels, unsigned threads) {
    if (marks.width() != dem.width() || marks.height() != dem.height()) {
        throw InternalError("fill_depressions: scratch grid size differs from the DEM");
    }
    // Bands of at least 64 rows, one per thread, while the labels of their shared rows fit in
    // 32 bits. The flood sets every cell of marks (and labels) before reading any.
    constexpr std::size_t min_band_rows = 64;
    const unsigned n_threads = thread_count(threads);
    const std::size_t w = dem.width();
    std::size_t bands =
        std::max<std::size_t>(1, std::min<std::size_t>(n_threads, dem.height() / min_band_rows));
    if (bands > 1 && 2 * (bands - 1) * w >= max_labels) {
        bands = 1;
    }
    const bool small = dem.size() < (std::size_t{1} << 32);
    if (bands > 1) {
        if (small) {
            fill_in_bands<std::uint32_t>(dem, marks, labels, bands, n_threads);
        } else {
            fill_in_bands<std::size_t>(dem, marks, labels, bands, n_threads);
        }
        return;
    }
    const Band whole{0, dem.height()};
    if (small) {
        flood_band<std::uint32_t, false>(dem, marks, nullptr, whole, nullptr);
    } else {
        flood_band<std::size_t, false>(dem, marks, nullptr, whole, nullptr);
    }
}

void resolve_flats(const Grid<float> &dem, Grid<std::uint8_t> &dirs, unsigned threads) {
    Grid<std::uint32_t> scratch;
    detail::resolve_flats_with(dem, dirs, scratch, threads);
}

namespace {

/// Resolves the flats of a filled DEM whose cells lie in one band of rows (Barnes, Lehman and
/// Mulla 2014, C&G 62:128-135). Flats are handled one at a time (a flat: valid cells of one
/// elevation left at d8::none by D8, 8-connected), so that each search stays within the flat's
/// part of the grids. Distances within a flat do not depend on the order in which flats or cells
/// are taken, so neither do the results.
///
/// Bands let flats be resolved on several threads: a solver marks only cells of its band, and
/// reads and writes only cells at most one row outside it. A flat that reaches outside the band
/// is put off: its cells found so far get `deferred`, and it is resolved later by a solver over
/// the whole grid. Bands at least four rows apart never touch the same cell.
class FlatSolver {
  public:
    // Bits of dirs on flat cells while resolving: flat_flag, seen_flag (found by the sweep
    // through the flat), away_flag (reached by the search away from higher terrain),
    // visited_flag (reached by the search toward lower terrain); the low nibble takes the code
    // at the end. On cells with a direction, low_edge_flag marks a low edge already listed for
    // the current flat. `deferred` (flat_flag alone) marks the cells of a flat put off.
    static constexpr std::uint8_t flat_flag = 0x40;
    static constexpr std::uint8_t seen_flag = 0x80;
    static constexpr std::uint8_t away_flag = 0x10;
    static constexpr std::uint8_t visited_flag = 0x20;
    static constexpr std::uint8_t low_edge_flag = 0x80;
    static constexpr std::uint8_t deferred = flat_flag;
    static constexpr std::uint8_t code_mask = 0x0F;

    FlatSolver(const Grid<float> &dem, Grid<std::uint8_t> &dirs, Grid<std::uint32_t> &mask)
        : dem_(dem.cells().data()), dirs_(dirs.cells().data()), mask_(mask.cells().data()),
          width_(dem.width()), size_(dem.size()), valid_(dem), around_(dem.width(), dem.height()) {}

    /// Resolves every flat with a cell in rows [r0, r1), except those reaching outside rows
    /// [r0, r1) when `whole` is false; their start cells go to deferred_starts(). Returns true
    /// when any flat cell was found.
    bool run(std::size_t r0, std::size_t r1, bool whole) {
        const std::size_t w = width_;
        whole_ = whole;
        first_ = whole ? 0 : r0 * w;
        last_ = whole ? size_ : r1 * w;
        bool any = false;
        for (std::size_t i = r0 * w; i < r1 * w; ++i) {
            const std::uint8_t d = dirs_[i];
            if ((d == d8::none && valid_(dem_[i])) || (whole && d == deferred)) {
                any = true;
                resolve_flat(i);
            }
        }
        return any;
    }
    [[nodiscard]] const std::vector<std::size_t> &deferred_starts() const noexcept {
        return deferred_starts_;
    }
    /// Resolves the flats put off by the band solvers (those not already resolved).
    void run_deferred(const std::vector<std::size_t> &starts) {
        whole_ = true;
        first_ = 0;
        last_ = size_;
        for (const std::size_t i : starts) {
            if (dirs_[i] == deferred) {
                resolve_flat(i);
            }
        }
    }

  private:
    // Direction of a flat cell: to a low edge when one is adjacent, otherwise to the flat
    // neighbour of smallest combined value below the cell's own. A cell's neighbours on the
    // flat lie at most one step nearer or farther from the low edges, so the cells at distance
    // t are given their directions once the search has reached distance t + 1.
    void pick(std::size_t i) {
        const float *const dem = dem_;
        std::uint8_t *const dirs = dirs_;
        std::uint32_t *const mask = mask_;
        const Neighbours around = around_;
        const float z = dem[i];
        std::uint8_t low_edge = d8::none;
        std::uint8_t best = d8::none;
        std::uint32_t best_mask = mask[i];
        around.each(i, [&](std::uint8_t k, std::size_t n) {
            if (dem[n] != z) {
                return;
            }
            if ((dirs[n] & flat_flag) == 0) {
                if (dirs[n] != d8::none && low_edge == d8::none) {
                    low_edge = k;
                }
            } else if (mask[n] < best_mask) {
                best_mask = mask[n];
                best = k;
            }
        });
        const std::uint8_t code = low_edge != d8::none ? low_edge : best;
        if (code == d8::none) {
            throw InternalError("resolve_flats: no lower neighbour on a flat gradient");
        }
        dirs[i] = static_cast<std::uint8_t>(flat_flag | visited_flag | code);
    }

    /// Sweep through the flat of `start`: its cells (all_), its high edges (flat cells next to
    /// higher valid terrain) and its low edges (cells with a direction next to a flat cell of
    /// the same elevation). A flat cell not yet found has d8::none (or `deferred`). Returns false,
    /// leaving the cells found `deferred`, when the flat reaches outside [first_, last_).
    bool sweep(std::size_t start) {
        const float *const dem = dem_;
        std::uint8_t *const dirs = dirs_;
        std::uint32_t *const mask = mask_;
        const Neighbours around = around_;
        const float z = dem[start];
        high_edges_.clear();
        low_edges_.clear();
        all_.assign(1, start);
        dirs[start] = flat_flag | seen_flag;
        for (std::size_t k = 0; k < all_.size(); ++k) {
            const std::size_t i = all_[k];
            bool high_edge = false;
            bool outside = false;
            around.each(i, [&](std::uint8_t, std::size_t n) {
                const float zn = dem[n];
                if (zn == z) {
                    const std::uint8_t dn = dirs[n];
                    if (dn == d8::none || dn == deferred) {
                        // In a band, a `deferred` cell means this flat was put off before.
                        if (n < first_ || n >= last_ || (dn == deferred && !whole_)) {
                            outside = true;
                            return;
                        }
                        dirs[n] = flat_flag | seen_flag;
                        all_.push_back(n);
                    } else if ((dn & (flat_flag | low_edge_flag)) == 0) {
                        dirs[n] = static_cast<std::uint8_t>(dn | low_edge_flag);
                        low_edges_.push_back(n);
                    }
                } else if (zn > z && valid_(zn)) {
                    high_edge = true;
                }
            });
            if (outside) {
                for (const std::size_t f : all_) {
                    dirs[f] = deferred;
                }
                for (const std::size_t e : low_edges_) {
                    dirs[e] = static_cast<std::uint8_t>(dirs[e] & ~low_edge_flag);
                }
                deferred_starts_.push_back(start);
                return false;
            }
            mask[i] = high_edge ? 1U : 0U;
            if (high_edge) {
                dirs[i] |= away_flag;
                high_edges_.push_back(i);
            }
        }
        return true;
    }

    void resolve_flat(std::size_t start) {
        std::uint8_t *const dirs = dirs_;
        std::uint32_t *const mask = mask_;
        const Neighbours around = around_;
        // Scratch values: the away distance (>= 0) first, then the combined value 2 t - away
        // stored with a bias of 2^31 so that unsigned comparisons order it like the signed value.
        // Only flat cells' values are read, and the sweep through each flat sets them all.
        constexpr std::int64_t bias = std::int64_t{1} << 31;
        if (!sweep(start)) {
            return;
        }
        // Gradient away from higher terrain: BFS distance from the high edges (1 at the edge).
        // 0 where a flat has no higher edge. While a flat is resolved, the only cells with
        // seen_flag are its own (flats done earlier have lost it, flats not yet swept have no
        // flag or are `deferred`), so the searches need no elevation test.
        frontier_.swap(high_edges_);
        while (!frontier_.empty()) {
            next_.clear();
            for (const std::size_t i : frontier_) {
                const std::uint32_t away = mask[i] + 1;
                around.each(i, [&](std::uint8_t, std::size_t n) {
                    if (dirs[n] == (flat_flag | seen_flag)) {
                        dirs[n] |= away_flag;
                        mask[n] = away;
                        next_.push_back(n);
                    }
                });
            }
            frontier_.swap(next_);
        }
        // Gradient toward lower terrain: BFS distance t from the low edges. Combined value
        // 2 t - away; the constant "highest away value of the flat" of Barnes et al. cancels
        // when cells of one flat are compared, so it is left out.
        for (const std::size_t i : low_edges_) {
            dirs[i] = static_cast<std::uint8_t>(dirs[i] & ~low_edge_flag);
        }
        frontier_.swap(low_edges_);
        std::int64_t t = 0;
        std::size_t reached = 0;
        while (!frontier_.empty()) {
            ++t;
            next_.clear();
            for (const std::size_t i : frontier_) {
                around.each(i, [&](std::uint8_t, std::size_t n) {
                    if ((dirs[n] & (flat_flag | seen_flag | visited_flag)) ==
                        (flat_flag | seen_flag)) {
                        dirs[n] |= visited_flag;
                        mask[n] = static_cast<std::uint32_t>(2 * t - std::int64_t{mask[n]} + bias);
                        next_.push_back(n);
                    }
                });
            }
            if (t > 1) { // frontier holds the flat cells at distance t - 1 (not the low edges)
                for (const std::size_t i : frontier_) {
                    pick(i);
                }
                reached += frontier_.size();
            }
            frontier_.swap(next_);
        }
        if (reached != all_.size()) {
            throw InternalError("resolve_flats: a flat has no outlet (was the DEM filled?)");
        }
    }

    // Plain pointers, copied to locals in the searches: a write through a byte pointer could
    // alias the solver's members, which would make the compiler reload them after every write.
    const float *dem_;
    std::uint8_t *dirs_;
    std::uint32_t *mask_;
    std::size_t width_;
    std::size_t size_;
    detail::ValidTest valid_;
    Neighbours around_;
    bool whole_ = true;     ///< false in a band: flats reaching outside it are put off
    std::size_t first_ = 0; ///< cells [first_, last_) may be marked
    std::size_t last_ = 0;
    std::vector<std::size_t> all_;
    std::vector<std::size_t> frontier_;
    std::vector<std::size_t> next_;
    std::vector<std::size_t> high_edges_;
    std::vector<std::size_t> low_edges_;
    std::vector<std::size_t> deferred_starts_;
};

} // namespace

void detail::resolve_flats_with(const Grid<float> &dem, Grid<std::uint8_t> &dirs,
                                Grid<std::uint32_t> &mask, unsigned threads) {
    const std::size_t w = dem.width();
    const std::size_t h = dem.height();
    if (mask.width() != w || mask.height() != h) {
        mask = Grid<std::uint32_t>(w, h, no_fill);
    }
    // Bands of rows, one per thread, with a margin of four rows between them that no band
    // marks (each band touches at most one row beyond the cells it marks). Flats in the
    // margins or reaching out of their band are resolved afterwards over the whole grid.
    constexpr std::size_t margin = 4;
    constexpr std::size_t min_band_rows = 64;
    const unsigned n_threads = thread_count(threads);
    const std::size_t bands =
        std::max<std::size_t>(1, std::min<std::size_t>(n_threads, h / min_band_rows));
    bool any_flat = false;
    if (bands <= 1) {
        FlatSolver whole(dem, dirs, mask);
        any_flat = whole.run(0, h, true);
    } else {
        std::vector<std::size_t> row0(bands + 1);
        for (std::size_t b = 0; b <= bands; ++b) {
            row0[b] = h * b / bands;
        }
        std::vector<FlatSolver> solvers;
        solvers.reserve(bands);
        for (std::size_t b = 0; b < bands; ++b) {
            solvers.emplace_back(dem, dirs, mask);
        }
        std::vector<char> found(bands, 0);
        detail::run_on_threads(bands, [&](std::size_t b) {
            const std::size_t r0 = row0[b] + (b == 0 ? 0 : margin / 2);
            const std::size_t r1 = row0[b + 1] - (b + 1 == bands ? 0 : margin / 2);
            found[b] = solvers[b].run(r0, r1, false) ? 1 : 0;
        });
        FlatSolver rest(dem, dirs, mask);
        for (std::size_t b = 0; b < bands; ++b) {
            any_flat = any_flat || found[b] != 0;
            rest.run_deferred(solvers[b].deferred_starts());
        }
        for (std::size_t b = 1; b < bands; ++b) {
            any_flat = rest.run(row0[b] - margin / 2, row0[b] + margin / 2, true) || any_flat;
        }
    }
    if (!any_flat) {
        return;
    }
    detail::for_row_blocks(h, n_threads, 256, [&](std::size_t, std::size_t r0, std::size_t r1) {
        for (std::size_t i = r0 * w; i < r1 * w; ++i) {
            dirs[i] = static_cast<std::uint8_t>(dirs[i] & FlatSolver::code_mask);
        }
    });
}

Grid<std::uint8_t> conditioned_directions(const Grid<float> &dem,
                                          const std::vector<BreachLine> &lines, unsigned threads) {
    Grid<float> work;
    Grid<std::uint8_t> dirs;
    Grid<std::uint32_t> scratch;
    detail::condition(dem, lines, threads, work, dirs, scratch);
    return dirs;
}

void detail::condition(const Grid<float> &dem, const std::vector<BreachLine> &lines,
                       unsigned threads, Grid<float> &work, Grid<std::uint8_t> &dirs,
                       Grid<std::uint32_t> &scratch) {
    // A copy with NaN on nodata cells: one pass over row blocks, no zero fill first.
    const std::size_t w = dem.width();
    if (work.width() != w || work.height() != dem.height()) {
        work = Grid<float>(w, dem.height(), no_fill);
    }
    work.copy_georef_from(dem);
    work.nodata.reset(); // nodata is NaN in the copy
    const detail::ValidTest valid(dem);
    constexpr float nan = std::numeric_limits<float>::quiet_NaN();
    detail::for_row_blocks(dem.height(), thread_count(threads), 256,
                           [&](std::size_t, std::size_t r0, std::size_t r1) {
                               for (std::size_t i = r0 * w; i < r1 * w; ++i) {
                                   const float v = dem[i];
                                   work[i] = valid(v) ? v : nan;
                               }
                           });
    apply_breach_lines(work, lines);
    dirs = Grid<std::uint8_t>(dem.width(), dem.height(), no_fill); // fill sets every mark
    dirs.copy_georef_from(dem);
    detail::fill_depressions_with(work, dirs, scratch, threads);
    detail::d8_directions_into(work, dirs, threads);
    detail::resolve_flats_with(work, dirs, scratch, threads);
}

} // namespace catchpeak::terrain
