// SPDX-License-Identifier: MIT
#pragma once

#include "catchpeak/core/calc_line.hpp"
#include "catchpeak/core/units.hpp"
#include "catchpeak/io/feature.hpp"
#include "catchpeak/land/tables.hpp"
#include "catchpeak/report/results.hpp"

#include <cstdint>
#include <memory>
#include <optional>
#include <string>
#include <string_view>
#include <vector>

/// Overlay of catchment polygons with a land-cover layer and a soils layer (GEOS), and the
/// area-weighted runoff coefficient, composite curve number and impervious share.
namespace catchpeak::land {

/// What to do with the part of a catchment that a layer does not cover.
enum class Uncovered {
    refuse,     ///< exit 2, naming the catchment, the layer and the uncovered area
    use_default ///< give it the default class (or soil group), with a warning line
};

struct OverlaySettings {
    std::string class_field = "class";    ///< land-cover attribute holding the class name
    std::string soil_group_field = "hsg"; ///< soils attribute holding the soil group
    bool drained = false;                 ///< dual groups A/D, B/D, C/D: first letter if true
    Uncovered uncovered = Uncovered::refuse;
    std::string default_class;            ///< for land cover not covered (use_default)
    std::string default_soil_group = "D"; ///< for soils not covered (use_default)
    /// Areas below this share of the catchment's area count as zero (uncovered parts,
    /// overlaps). 1e-9: the rounding of GEOS's double-precision overlay is far below it.
    double area_tolerance_share = 1e-9;
    /// Coverage of the land-cover layer: by default the parts are summed and, only when they
    /// do not add up to the catchment's area (a gap or an overlap), the catchment is cut by the
    /// layer and the union of the pieces tells gaps from overlaps. An overlap inside a
    /// catchment whose area equals that of a gap in the same catchment (to the tolerance) adds
    /// up and passes unseen; `true` computes the union for every catchment, which finds it too
    /// (about 2.3 times slower in land_bench).
    bool exact_coverage_check = false;
    units::System units = units::System::si; ///< unit system of the calculation lines
    double min_part_area_m2 = 0.0;           ///< PartsContext::min_part_area_m2 of the weighting
};

/// The weighting of one catchment polygon.
struct CatchmentLand {
    /// Parts (land-cover class, soil group) sorted by class then group, the weighted C, CN
    /// and impervious share (NaN when the table was not given), and the table names.
    report::LandWeighting weighting;
    double area_m2 = 0.0;                 ///< area of the catchment polygon (GEOS)
    double uncovered_land_cover_m2 = 0.0; ///< not covered by the land-cover layer
    double uncovered_soils_m2 = 0.0;      ///< not covered by the soils layer
    CalcLines lines;                      ///< the sheet's lines (not numbered yet)
};

/// The overlay of a land-cover layer and a soils layer, ready to weight many catchments.
///
/// The layers are read once (WKB parsed, invalid geometries made valid, attributes checked,
/// an STRtree built per layer); `weight` then intersects one catchment polygon with both.
/// Coordinates must be in the same CRS as the catchments (metres); reprojection is done when
/// the layers are read. Not thread-safe: use one LandOverlay per thread.
class LandOverlay {
  public:
    /// Throws InputError naming the layer, the feature id and the field for a geometry that
    /// cannot be read or is not a polygon, a missing class or soil group field, or a soil group
    /// that is not one of A, B, C, D, A/D, B/D, C/D.
    LandOverlay(const io::VectorLayer &land_cover, const io::VectorLayer &soils, LandTables tables,
                OverlaySettings settings);
    ~LandOverlay();
    LandOverlay(LandOverlay &&) noexcept;
    LandOverlay &operator=(LandOverlay &&) noexcept;
    LandOverlay(const LandOverlay &) = delete;
    LandOverlay &operator=(const LandOverlay &) = delete;

    /// Weights one catchment polygon (ISO WKB, polygon or multipolygon). `label` names it in
    /// messages and lines (the design point id, "DP3 local"). `mean_slope` (m/m) is needed
    /// only when the C table has slope bands for a class found in the catchment.
    ///
    /// Local and total catchments of nested design points are both weighted by calling this
    /// once per polygon.
    ///
    /// Throws InputError when a layer leaves part of the catchment uncovered and the setting
    /// is `refuse`, when polygons of one layer overlap inside the catchment (naming their
    /// feature ids), and when a class is missing from a table (naming the class and the table).
    [[nodiscard]] CatchmentLand weight(const std::vector<unsigned char> &catchment_wkb,
                                       std::string_view label,
                                       std::optional<double> mean_slope = std::nullopt) const;

    /// Warnings about the layers themselves (geometries made valid), one line per feature.
    [[nodiscard]] const CalcLines &layer_warnings() const noexcept;

  private:
    struct Impl;
    std::unique_ptr<Impl> impl_;
};

} // namespace catchpeak::land
