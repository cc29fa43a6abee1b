// SPDX-License-Identifier: MIT
#pragma once

#include <cstdint>
#include <map>
#include <string>
#include <vector>

namespace catchpeak::io {

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

} // namespace catchpeak::io
