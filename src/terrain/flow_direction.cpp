// SPDX-License-Identifier: MIT
#include "catchpeak/terrain/flow_direction.hpp"

#include "internal.hpp"

#include <array>
#include <cstddef>
#include <limits>
#include <thread>

namespace catchpeak::terrain {

unsigned thread_count(unsigned requested) noexcept {
    if (requested != 0) {
        return requested;
    }
    const unsigned hw = std::thread::hardware_concurrency();
    return hw == 0 ? 1U : hw;
}

std::size_t downstream_cell(const Grid<std::uint8_t> &dirs, std::size_t i) noexcept {
    const std::uint8_t k = dirs[i];
    if (k == d8::none || k > 8) {
        return no_cell;
    }
    const std::size_t w = dirs.width();
    const long long col = static_cast<long long>(i % w) + d8::dcol[k];
    const long long row = static_cast<long long>(i / w) + d8::drow[k];
    if (!dirs.in_bounds(col, row)) {
        return no_cell;
    }
    return static_cast<std::size_t>(row) * w + static_cast<std::size_t>(col);
}

Grid<std::uint8_t> d8_directions(const Grid<float> &dem, unsigned threads) {
    Grid<std::uint8_t> dirs(dem.width(), dem.height(), d8::none);
    dirs.copy_georef_from(dem);
    detail::d8_directions_into(dem, dirs, threads);
    return dirs;
}

namespace {

/// What the direction of a cell is found from: the DEM's cells as a plain pointer (a write
/// through a byte pointer could alias the grids' own members, which would make the compiler
/// reload them after every write to the directions), its size, the validity test and, per code,
/// the inverse step length and the index offset.
struct D8Input {
    const float *z_at;
    std::size_t w;
    std::size_t h;
    detail::ValidTest valid;
    std::array<double, 9> inv_dist;
    std::array<std::ptrdiff_t, 9> offset;
};

/// Takes a valid cell i of elevation z inside the raster's outer ring (every neighbour on the
/// grid); gives true and its code of steepest descent in `code` when all its neighbours are
/// valid (there is no way out to consider, and the steepest descent gives the same code as
/// general_direction), false otherwise. Branch-free: a neighbour not lower gives a slope <= 0
/// and a nodata (NaN) one gives NaN, and neither passes `s > best_in`; ties keep the lowest
/// code, as in general_direction.
[[gnu::always_inline]] inline bool inner_direction(const D8Input &in, std::size_t i, float z,
                                                   std::uint8_t &code) {
    double best_in = 0.0;
    std::uint8_t best_in_k = d8::none;
    bool all_valid = true;
    for (std::uint8_t k = 1; k <= 8; ++k) {
        const float zn =
            in.z_at[static_cast<std::size_t>(static_cast<std::ptrdiff_t>(i) + in.offset[k])];
        all_valid &= in.valid(zn);
        const double s = (static_cast<double>(z) - static_cast<double>(zn)) * in.inv_dist[k];
        const bool steeper = s > best_in;
        best_in = steeper ? s : best_in;
        best_in_k = steeper ? k : best_in_k;
    }
    code = best_in_k;
    return all_valid;
}

/// Takes a valid cell (c, r) of elevation z anywhere on the raster; gives its code: the
/// steepest descent to a lower valid neighbour, else the way out for a cell with no lower
/// neighbour: an off-raster or nodata neighbour, cardinal first, then the one opposite the
/// highest neighbour (water keeps its course), then the lowest code; d8::none when there is
/// neither.
std::uint8_t general_direction(const D8Input &in, std::size_t c, std::size_t r, float z) {
    const auto in_bounds = [&](long long col, long long row) {
        return col >= 0 && row >= 0 && static_cast<std::size_t>(col) < in.w &&
               static_cast<std::size_t>(row) < in.h;
    };
    double best = 0.0;
    std::uint8_t best_k = d8::none;
    std::uint8_t out_k = d8::none;
    float out_score = 0.0F;
    const auto consider_out = [&](std::uint8_t k) {
        const long long oc = static_cast<long long>(c) - d8::dcol[k];
        const long long orow = static_cast<long long>(r) - d8::drow[k];
        float score = -std::numeric_limits<float>::infinity();
        if (in_bounds(oc, orow)) {
            const float zo =
                in.z_at[static_cast<std::size_t>(orow) * in.w + static_cast<std::size_t>(oc)];
            if (in.valid(zo)) {
                score = zo;
            }
        }
        const bool better = out_k == d8::none || (d8::is_diagonal(out_k) && !d8::is_diagonal(k)) ||
                            (d8::is_diagonal(out_k) == d8::is_diagonal(k) && score > out_score);
        if (better) {
            out_k = k;
            out_score = score;
        }
    };
    for (std::uint8_t k = 1; k <= 8; ++k) {
        const long long nc = static_cast<long long>(c) + d8::dcol[k];
        const long long nr = static_cast<long long>(r) + d8::drow[k];
        if (!in_bounds(nc, nr)) {
            consider_out(k);
            continue;
        }
        const float zn =
            in.z_at[static_cast<std::size_t>(nr) * in.w + static_cast<std::size_t>(nc)];
        if (!in.valid(zn)) {
            consider_out(k);
            continue;
        }
        if (zn < z) {
            const double s = (static_cast<double>(z) - static_cast<double>(zn)) * in.inv_dist[k];
            if (s > best) {
                best = s;
                best_k = k;
            }
        }
    }
    return best_k != d8::none ? best_k : out_k;
}

} // namespace

void detail::d8_directions_into(const Grid<float> &dem, Grid<std::uint8_t> &dirs,
                                unsigned threads) {
    const std::size_t w = dem.width();
    const std::size_t h = dem.height();
    const double dx = dem.transform.cell_dx();
    const double dy = dem.transform.cell_dy();
    D8Input in{dem.cells().data(), w, h, detail::ValidTest(dem), {}, {}};
    for (std::uint8_t k = 1; k <= 8; ++k) {
        in.inv_dist[k] = 1.0 / step_length_m(k, dx, dy);
        in.offset[k] =
            static_cast<std::ptrdiff_t>(d8::drow[k]) * static_cast<std::ptrdiff_t>(w) + d8::dcol[k];
    }
    std::uint8_t *const dir_at = dirs.cells().data();
    detail::for_row_blocks(h, thread_count(threads), 64,
                           [&](std::size_t, std::size_t r0, std::size_t r1) {
                               for (std::size_t r = r0; r < r1; ++r) {
                                   const bool inner_row = r > 0 && r + 1 < h;
                                   for (std::size_t c = 0; c < w; ++c) {
                                       const std::size_t i = r * w + c;
                                       const float z = in.z_at[i];
                                       if (!in.valid(z)) {
                                           dir_at[i] = d8::none;
                                           continue;
                                       }
                                       if (inner_row && c > 0 && c + 1 < w) {
                                           std::uint8_t code = d8::none;
                                           if (inner_direction(in, i, z, code)) {
                                               dir_at[i] = code;
                                               continue;
                                           }
                                       }
                                       dir_at[i] = general_direction(in, c, r, z);
                                   }
                               }
                           });
}

} // namespace catchpeak::terrain
