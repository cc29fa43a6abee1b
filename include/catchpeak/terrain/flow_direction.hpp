// SPDX-License-Identifier: MIT
#pragma once

#include "catchpeak/core/grid.hpp"

#include <array>
#include <cmath>
#include <cstddef>
#include <cstdint>

/// D8 flow directions (O'Callaghan and Mark 1984): each cell drains to the one of its eight
/// neighbours with the steepest drop per distance. Distances respect non-square cells: dx east
/// and west, dy north and south, sqrt(dx^2 + dy^2) on the diagonals.
namespace catchpeak::terrain {

/// Direction codes as stored in a Grid<std::uint8_t>. 0 = no flow (a nodata cell, or a cell
/// whose direction is not yet resolved). 1..8 = the neighbour the cell drains to, clockwise
/// from east. A valid cell whose direction points off the raster or at a nodata cell is an
/// outlet: water leaves the DEM there.
namespace d8 {
inline constexpr std::uint8_t none = 0;
inline constexpr std::uint8_t east = 1;
inline constexpr std::uint8_t south_east = 2;
inline constexpr std::uint8_t south = 3;
inline constexpr std::uint8_t south_west = 4;
inline constexpr std::uint8_t west = 5;
inline constexpr std::uint8_t north_west = 6;
inline constexpr std::uint8_t north = 7;
inline constexpr std::uint8_t north_east = 8;

/// Column and row offsets of direction code k (index 0 unused).
inline constexpr std::array<int, 9> dcol{0, 1, 1, 0, -1, -1, -1, 0, 1};
inline constexpr std::array<int, 9> drow{0, 0, 1, 1, 1, 0, -1, -1, -1};
/// The code pointing back: opposite[k] is the direction from the neighbour to this cell.
inline constexpr std::array<std::uint8_t, 9> opposite{0, 5, 6, 7, 8, 1, 2, 3, 4};
/// True for the diagonal codes.
[[nodiscard]] constexpr bool is_diagonal(std::uint8_t k) noexcept { return k % 2 == 0 && k != 0; }
} // namespace d8

/// Length of one D8 step of code k on a grid with cell size dx by dy (metres).
[[nodiscard]] inline double step_length_m(std::uint8_t k, double dx, double dy) noexcept {
    if (d8::is_diagonal(k)) {
        return std::sqrt(dx * dx + dy * dy);
    }
    return (k == d8::east || k == d8::west) ? dx : dy;
}

/// Index of the cell downstream of `i` on `dirs`, or `no_cell` when `i` has no direction or
/// drains off the raster. (A downstream cell may be nodata: then water leaves there.)
inline constexpr std::size_t no_cell = static_cast<std::size_t>(-1);
[[nodiscard]] std::size_t downstream_cell(const Grid<std::uint8_t> &dirs, std::size_t i) noexcept;

/// D8 directions of every cell of `dem` that has a strictly lower neighbour (drop / distance,
/// the steepest wins; ties go to the lowest code). A valid cell with no lower valid neighbour
/// that touches the raster edge or a nodata cell points out there, so that edges drain: to a
/// cardinal way out before a diagonal one, then to the one opposite its highest neighbour (water
/// keeps its course), then to the lowest code. Every other cell (a flat or a pit) gets
/// d8::none; `resolve_flats` deals with the flats of a filled DEM.
/// Invalid cells (nodata, NaN) get d8::none.
/// Computed by row blocks on `threads` threads (0 = all cores); the result does not depend on
/// the thread count.
[[nodiscard]] Grid<std::uint8_t> d8_directions(const Grid<float> &dem, unsigned threads = 0);

/// Number of threads to use for a request (0 = hardware concurrency, at least 1).
[[nodiscard]] unsigned thread_count(unsigned requested) noexcept;

} // namespace catchpeak::terrain
