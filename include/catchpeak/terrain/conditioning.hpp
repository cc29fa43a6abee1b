// SPDX-License-Identifier: MIT
#pragma once

#include "catchpeak/core/grid.hpp"

#include <cstddef>
#include <cstdint>
#include <string>
#include <utility>
#include <vector>

/// Hydrological conditioning of a DEM: breach lines, depression filling, and flat resolution,
/// giving D8 directions that drain every valid cell to the raster edge or to a nodata cell.
namespace catchpeak::terrain {

/// A polyline in CRS coordinates (metres), e.g. a culvert under a road embankment.
struct BreachLine {
    std::string id; ///< for messages
    std::vector<std::pair<double, double>> vertices_xy;
};

/// The cells a polyline crosses, in order from its first to its last vertex, as an 8-connected
/// chain (consecutive cells are D8 neighbours, so water can follow it). Cells outside the grid
/// are left out. Pure geometry on the grid's transform (north-up grids only). No cell repeats
/// consecutively.
[[nodiscard]] std::vector<std::size_t>
rasterize_polyline(const GeoTransform &transform, std::size_t width, std::size_t height,
                   const std::vector<std::pair<double, double>> &vertices_xy);

/// Lowers the DEM along each breach line so that water can pass an embankment.
///
/// Rule: the line's cells are taken in order from its higher end to its lower end (comparing
/// the DEM at the first and last cell; the first vertex when they are equal). Walking that way,
/// each cell is set to min(its own elevation, the elevation of the cell before it), so the line
/// never rises on its way down; nothing is ever raised. Nodata cells on the line are skipped
/// (the walk continues past them). The flats this can make are resolved later like any flat.
void apply_breach_lines(Grid<float> &dem, const std::vector<BreachLine> &lines);

/// Priority-Flood depression filling (Barnes, Lehman and Mulla 2014, C&G 62:117-127), in a
/// fast variant: the inside of depressions is flooded with a plain queue (Barnes et al.'s
/// improved variant) and cells rising away from a closed cell are traced with a second plain
/// queue, entering the priority queue only when they border unprocessed lower cells (after Zhou,
/// Sun and Fu 2016, C&G 90:87-96). Water leaves at the raster edge and at nodata cells. After the
/// fill every valid cell has a path to an edge or nodata cell that never rises. Depressions become
/// exact flats (no epsilon gradient). Invalid cells are left as they are. `marks` is scratch space
/// of the grid's size (used as "closed" flags; contents on return are unspecified); passing the
/// directions grid that will be computed next saves memory.
void fill_depressions(Grid<float> &dem, Grid<std::uint8_t> &marks);
/// Same, with its own scratch space, on up to `threads` threads (0: all cores): bands of rows
/// are flooded on their own and joined as in Barnes (2016, C&G 96:56-68; reference from memory,
/// not checked). The filled elevations do not depend on the thread count.
void fill_depressions(Grid<float> &dem, unsigned threads = 1);

/// Flat resolution (Barnes, Lehman and Mulla 2014, C&G 62:128-135): gives a direction to every
/// valid cell of a filled DEM that `d8_directions` left at d8::none, using the combined
/// gradient away from higher terrain and (with twice the weight) toward lower terrain, computed
/// by breadth-first searches over each flat. Uses an int32 scratch grid (4 bytes a cell).
/// Throws InternalError if a flat has no way out (the DEM was not filled).
/// Flats in different bands of rows are resolved on up to `threads` threads (0: all cores); the
/// result does not depend on the thread count.
void resolve_flats(const Grid<float> &filled_dem, Grid<std::uint8_t> &dirs, unsigned threads = 1);

/// The whole conditioning chain on a copy of the DEM: breach lines, fill, D8, flats. Returns D8
/// directions that drain every valid cell. Peak extra memory about 9 bytes a cell plus queues.
[[nodiscard]] Grid<std::uint8_t> conditioned_directions(const Grid<float> &dem,
                                                        const std::vector<BreachLine> &lines,
                                                        unsigned threads = 0);

} // namespace catchpeak::terrain
