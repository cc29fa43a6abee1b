// SPDX-License-Identifier: MIT
#pragma once

#include <cmath>
#include <cstddef>
#include <cstdint>
#include <memory>
#include <new>
#include <optional>
#include <string>
#include <type_traits>
#include <utility>
#include <vector>

namespace catchpeak {

/// Affine georeferencing of a north-up raster, in the order GDAL uses:
/// x = origin_x + col * pixel_width + row * row_rotation
/// y = origin_y + col * col_rotation + row * pixel_height
/// Coordinates are those of the raster's CRS, in metres once read by `io` (feet are converted).
/// `pixel_height` is negative for a north-up raster.
struct GeoTransform {
    double origin_x = 0.0;
    double pixel_width = 1.0;
    double row_rotation = 0.0;
    double origin_y = 0.0;
    double col_rotation = 0.0;
    double pixel_height = -1.0;

    /// Centre of cell (col, row) in CRS coordinates.
    [[nodiscard]] std::pair<double, double> cell_centre(std::size_t col,
                                                        std::size_t row) const noexcept {
        const double c = static_cast<double>(col) + 0.5;
        const double r = static_cast<double>(row) + 0.5;
        return {origin_x + c * pixel_width + r * row_rotation,
                origin_y + c * col_rotation + r * pixel_height};
    }
    /// True when the raster has no rotation terms (the only kind catchpeak accepts).
    [[nodiscard]] bool is_north_up() const noexcept {
        return row_rotation == 0.0 && col_rotation == 0.0;
    }
    /// Cell width and height in CRS units (positive).
    [[nodiscard]] double cell_dx() const noexcept { return std::abs(pixel_width); }
    [[nodiscard]] double cell_dy() const noexcept { return std::abs(pixel_height); }
    [[nodiscard]] double cell_area() const noexcept { return cell_dx() * cell_dy(); }
};

/// Allocator of grid cells: std::allocator, except that an element constructed without a value
/// is left uninitialised (default-initialised), so that a grid whose next pass writes every
/// cell is not zero-filled first (`Grid(w, h, no_fill)`). (Transparent huge pages for large
/// grids were tried too: on the machine measured the kernel's zeroing of the huge pages cost
/// more than the TLB misses they saved, at 16 and at 100 million cells.)
template <typename T> class GridAllocator : public std::allocator<T> {
  public:
    using value_type = T;
    template <typename U> struct rebind { using other = GridAllocator<U>; };
    GridAllocator() noexcept = default;
    template <typename U> GridAllocator(const GridAllocator<U> &) noexcept {} // NOLINT

    template <typename U>
    void construct(U *p) noexcept(std::is_nothrow_default_constructible_v<U>) {
        ::new (static_cast<void *>(p)) U; // default-initialised: no zero fill
    }
    template <typename U, typename... Args> void construct(U *p, Args &&...args) {
        ::new (static_cast<void *>(p)) U(std::forward<Args>(args)...);
    }
};

/// Tag for a grid whose cells are left uninitialised, for a caller that writes every cell next.
struct NoFill {};
inline constexpr NoFill no_fill{};

/// A raster held in memory, row-major (row 0 is the top, north), with its georeferencing.
///
/// Nodata is a value: a cell equal to `nodata` (or NaN, for floating-point grids) is not valid.
/// `valid_mask()` turns it into an explicit mask when one is needed. Keeping nodata as a value
/// instead of a separate mask saves a byte per cell on large DEMs.
template <typename T> class Grid {
  public:
    Grid() = default;
    Grid(std::size_t width, std::size_t height, T fill = T{})
        : width_(width), height_(height), cells_(width * height, fill) {}
    /// Cells left uninitialised: the caller writes every cell before reading any.
    Grid(std::size_t width, std::size_t height, NoFill) : width_(width), height_(height) {
        cells_.resize(width * height);
    }

    [[nodiscard]] std::size_t width() const noexcept { return width_; }
    [[nodiscard]] std::size_t height() const noexcept { return height_; }
    [[nodiscard]] std::size_t size() const noexcept { return cells_.size(); }
    [[nodiscard]] bool empty() const noexcept { return cells_.empty(); }

    [[nodiscard]] std::size_t index(std::size_t col, std::size_t row) const noexcept {
        return row * width_ + col;
    }
    [[nodiscard]] T &operator()(std::size_t col, std::size_t row) noexcept {
        return cells_[index(col, row)];
    }
    [[nodiscard]] const T &operator()(std::size_t col, std::size_t row) const noexcept {
        return cells_[index(col, row)];
    }
    [[nodiscard]] T &operator[](std::size_t i) noexcept { return cells_[i]; }
    [[nodiscard]] const T &operator[](std::size_t i) const noexcept { return cells_[i]; }

    using Cells = std::vector<T, GridAllocator<T>>;
    [[nodiscard]] Cells &cells() noexcept { return cells_; }
    [[nodiscard]] const Cells &cells() const noexcept { return cells_; }

    [[nodiscard]] bool in_bounds(long long col, long long row) const noexcept {
        return col >= 0 && row >= 0 && static_cast<std::size_t>(col) < width_ &&
               static_cast<std::size_t>(row) < height_;
    }

    /// Georeferencing. Copy it to derived grids with `copy_georef_from`.
    GeoTransform transform;
    /// CRS as WKT (empty when unknown).
    std::string crs_wkt;
    /// Nodata value, if the raster has one.
    std::optional<T> nodata;

    /// True when cell i holds data (not equal to the nodata value, not NaN).
    [[nodiscard]] bool is_valid(std::size_t i) const noexcept {
        const T v = cells_[i];
        if constexpr (std::is_floating_point_v<T>) {
            if (std::isnan(v)) {
                return false;
            }
        }
        return !(nodata && v == *nodata);
    }

    /// 1 where the cell holds data, 0 where it is nodata.
    [[nodiscard]] Grid<std::uint8_t> valid_mask() const {
        Grid<std::uint8_t> mask(width_, height_, 0);
        mask.copy_georef_from(*this);
        for (std::size_t i = 0; i < cells_.size(); ++i) {
            mask[i] = is_valid(i) ? 1 : 0;
        }
        return mask;
    }

    template <typename U> void copy_georef_from(const Grid<U> &other) {
        transform = other.transform;
        crs_wkt = other.crs_wkt;
    }

  private:
    std::size_t width_ = 0;
    std::size_t height_ = 0;
    Cells cells_;
};

} // namespace catchpeak
