// SPDX-License-Identifier: MIT
#pragma once

#include <cstdint>
#include <map>
#include <optional>
#include <string>
#include <vector>

namespace catchpeak::io {

/// A rectangle in the target CRS.
struct Extent {
    double min_x = 0.0;
    double min_y = 0.0;
    double max_x = 0.0;
    double max_y = 0.0;

    /// Whether the two rectangles share a point (touching counts).
    [[nodiscard]] bool overlaps(const Extent &o) const noexcept {
        return min_x <= o.max_x && o.min_x <= max_x && min_y <= o.max_y && o.min_y <= max_y;
    }
};

/// A layer whose coordinates were transformed to the target CRS as it was read.
struct Reprojection {
    std::string from; ///< name of the layer's CRS ("WGS 84")
    std::string to;   ///< name of the target CRS
    /// Where the layer's CRS came from when the user declared it ("[inputs] design_points_crs"),
    /// "" when the file declares it.
    std::string declared_by;
};

/// One feature of a vector layer, as `io` hands it to the other modules: geometry as ISO WKB
/// (2D, in the target CRS, coordinates in metres) and the attributes as text.
struct VectorFeature {
    std::int64_t fid = -1;                         ///< feature id in its layer, for messages
    std::vector<unsigned char> wkb;                ///< geometry, ISO WKB, little-endian
    std::map<std::string, std::string> attributes; ///< field name -> value as text
};

/// A vector layer read whole.
struct VectorLayer {
    std::string source;  ///< "<file>" or "<file>, layer '<name>'", for messages
    std::string crs_wkt; ///< CRS of the geometries (after any reprojection)
    std::vector<VectorFeature> features;
    /// What a feature id names in messages: "feature" for a vector layer, "code" for polygons
    /// made from a raster of class codes (their id is the code).
    std::string feature_noun = "feature";
};

/// What reading a layer found out besides its features.
struct LayerFacts {
    std::optional<Extent> extent;             ///< of the geometries (target CRS); none: empty
    std::optional<Reprojection> reprojection; ///< set when transformed from another CRS
};

} // namespace catchpeak::io
