// SPDX-License-Identifier: MIT
// Helpers shared by the terrain sources (not public).
#pragma once

#include "catchpeak/core/grid.hpp"
#include "catchpeak/core/threads.hpp"
#include "catchpeak/terrain/accumulation.hpp"
#include "catchpeak/terrain/catchments.hpp"
#include "catchpeak/terrain/conditioning.hpp"
#include "catchpeak/terrain/slope.hpp"

#include <algorithm>
#include <cmath>
#include <cstddef>
#include <cstdint>
#include <thread>
#include <vector>

namespace catchpeak::terrain::detail {

/// Validity test for DEM values: not NaN and not the nodata value.
class ValidTest {
  public:
    explicit ValidTest(const Grid<float> &dem)
        : has_nodata_(dem.nodata.has_value()), nodata_(dem.nodata.value_or(0.0F)) {}
    [[nodiscard]] bool operator()(float v) const noexcept {
        return !std::isnan(v) && !(has_nodata_ && v == nodata_);
    }

  private:
    bool has_nodata_;
    float nodata_;
};

/// Runs body(row_begin, row_end) over fixed blocks of rows on up to `threads` threads. Blocks
/// are fixed in size (independent of the thread count), so a body that writes only its own rows
/// gives the same result whatever the thread count.
template <typename Body>
void for_row_blocks(std::size_t height, unsigned threads, std::size_t block_rows, Body body) {
    const std::size_t blocks = (height + block_rows - 1) / block_rows;
    const auto run_block = [&](std::size_t b) {
        const std::size_t r0 = b * block_rows;
        body(b, r0, std::min(height, r0 + block_rows));
    };
    if (threads <= 1 || blocks <= 1) {
        for (std::size_t b = 0; b < blocks; ++b) {
            run_block(b);
        }
        return;
    }
    const std::size_t n = std::min<std::size_t>(threads, blocks);
    std::vector<std::thread> pool;
    pool.reserve(n);
    for (std::size_t t = 0; t < n; ++t) {
        pool.emplace_back([&, t] {
            for (std::size_t b = t; b < blocks; b += n) {
                run_block(b);
            }
        });
    }
    for (auto &th : pool) {
        th.join();
    }
}

using catchpeak::run_on_threads;

/// d8_directions writing into an existing grid of the DEM's size (every cell is overwritten).
void d8_directions_into(const Grid<float> &dem, Grid<std::uint8_t> &dirs, unsigned threads);

/// fill_depressions on up to `threads` threads with the caller's scratch grids: `marks` of the
/// DEM's size, `labels` resized when its size differs (used when the fill runs in bands).
void fill_depressions_with(Grid<float> &dem, Grid<std::uint8_t> &marks, Grid<std::uint32_t> &labels,
                           unsigned threads);

/// resolve_flats with a caller's scratch grid (resized when its size differs), so that the
/// pipeline can hand the same buffer on as the accumulation grid.
void resolve_flats_with(const Grid<float> &filled_dem, Grid<std::uint8_t> &dirs,
                        Grid<std::uint32_t> &scratch, unsigned threads);

/// The conditioning chain with the caller's buffers: `work` ends as the filled DEM (NaN on
/// nodata), `dirs` as the directions, `scratch` as used by resolve_flats.
void condition(const Grid<float> &dem, const std::vector<BreachLine> &lines, unsigned threads,
               Grid<float> &work, Grid<std::uint8_t> &dirs, Grid<std::uint32_t> &scratch);

/// What the accumulation walk did, to check that its cost stays near the number of cells.
struct AccumulationWalkStats {
    std::size_t strips = 1;         ///< strips of rows walked on their own threads
    std::size_t leaving_cells = 0;  ///< cells draining into another strip
    std::size_t affected_cells = 0; ///< cells walked again below them (each once)
};

/// accumulation_and_length into the caller's grids (reused when of the right size). The inflow
/// counts are gathered over row blocks and the walk runs on strips of rows, on up to `threads`
/// threads; the result is the same for any thread count. `stats`, when given, is filled.
void accumulation_and_length_into(const Grid<std::uint8_t> &dirs, AccumulationAndLength &out,
                                  unsigned threads, AccumulationWalkStats *stats = nullptr);

/// delineate_catchments with the caller's grid as the label buffer (reused when of the right
/// size).
void delineate_catchments_into(const Grid<std::uint8_t> &dirs,
                               const std::vector<std::size_t> &outlets, Catchments &out,
                               CatchmentSearch how, unsigned threads);

/// slope_sums_by_label; without the unlabelled cells (index 0 left at zero) when
/// `with_unlabelled` is false, which spares the slope of every cell outside the catchments.
SlopeSums slope_sums_by_label(const Grid<float> &dem, const Grid<std::uint32_t> &labels,
                              std::uint32_t max_label, unsigned threads, bool with_unlabelled);

} // namespace catchpeak::terrain::detail
