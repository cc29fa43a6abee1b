// SPDX-License-Identifier: MIT
#include "catchpeak/land/overlay.hpp"

#include "catchpeak/core/error.hpp"
#include "catchpeak/land/weighting.hpp"
#include "geos_handles.hpp"

#include <fmt/format.h>

#include <algorithm>
#include <cmath>
#include <limits>
#include <map>
#include <set>
#include <tuple>
#include <utility>

namespace catchpeak::land {

namespace {

constexpr std::size_t no_feature = std::numeric_limits<std::size_t>::max();

// ---- the formulas of the lines --------------------------------------------------------------

constexpr std::string_view make_valid = "GEOS MakeValid, structure method";
constexpr Formula feature_made_valid{
    "land.feature_made_valid",
    "Invalid geometry made valid",
    "",
    "{layer}: {noun} {fid}: the polygon was invalid ({reason}); made valid",
    Ref::none,
    make_valid};
constexpr Formula catchment_made_valid{
    "land.catchment_made_valid",
    "Invalid catchment polygon made valid",
    "",
    "catchment '{catchment}': the polygon was invalid ({reason}); made valid",
    Ref::none,
    make_valid};
constexpr Formula overlaid_feature_made_valid{
    "land.overlaid_feature_made_valid",
    "Invalid layer polygon made valid",
    "",
    "{layer}: feature {fid} was invalid ({reason}); made valid before the overlay",
    Ref::none,
    make_valid};
constexpr Formula soils_uncovered{
    "land.soils_uncovered",
    "Soils layer does not cover the catchment",
    "",
    "{U} {U:u} ({P} % of catchment '{catchment}') is not covered by the soils layer; that part "
    "is taken as soil group '{default}' (project setting)",
    Ref::none,
    "{layer}"};
constexpr Formula land_cover_uncovered{
    "land.land_cover_uncovered",
    "Land-cover layer does not cover the catchment",
    "",
    "{U} {U:u} ({P} % of catchment '{catchment}') is not covered by the land-cover layer; that "
    "part is taken as class '{default}' (project setting)",
    Ref::none,
    "{layer}"};
constexpr Formula polygon_area{"land.polygon_area",
                               "Catchment '{catchment}': area of the polygon",
                               "",
                               "A = area of the polygon",
                               Ref::none,
                               "GEOS polygon area"};
constexpr Formula layers_overlaid{
    "land.layers_overlaid",
    "Layers overlaid",
    "",
    "land cover: {land} (field '{class_field}'); soils: {soils} (field '{soil_field}')",
    Ref::project_input,
    ""};

Quantity fid_qty(std::string symbol, std::int64_t fid) {
    return qty(std::move(symbol), static_cast<double>(fid), Unit::none, Shown::integer());
}

/// One polygon of a layer, read once.
struct LayerFeature {
    std::int64_t fid = -1;
    geos::Geometry geom;
    std::string value; ///< class name, or the soil group as written
    SoilGroupReading soil;
    double area_m2 = 0.0;
    double xmin = 0.0, ymin = 0.0, xmax = 0.0, ymax = 0.0; ///< envelope (all 0 when empty)
    bool repaired = false;
    std::string repair_reason;
};

struct Layer {
    std::string source;
    std::string kind;         ///< "land-cover layer" or "soils layer"
    std::string feature_noun; ///< "feature", or "code" for a layer made from a raster
    std::vector<LayerFeature> features;
    std::unique_ptr<geos::StrTree> tree;
};

/// A piece of a catchment cut by one layer's polygon.
struct Piece {
    std::size_t feature = no_feature; ///< index in the layer, no_feature for the default
    geos::Geometry owned;             ///< the cut geometry, unless the whole feature lies inside
    const GEOSGeometry *geom = nullptr;
    double area_m2 = 0.0;
    double xmin = 0.0, ymin = 0.0, xmax = 0.0, ymax = 0.0;
};

std::string geometry_type(const geos::Context &ctx, const GEOSGeometry *g) {
    char *t = GEOSGeomType_r(ctx.get(), g);
    std::string out = t != nullptr ? t : "unknown";
    GEOSFree_r(ctx.get(), t);
    return out;
}

double area_of(const geos::Context &ctx, const GEOSGeometry *g) {
    double a = 0.0;
    if (GEOSArea_r(ctx.get(), g, &a) == 0) {
        ctx.fail("cannot compute an area");
    }
    return a;
}

bool is_polygonal(int type) { return type == GEOS_POLYGON || type == GEOS_MULTIPOLYGON; }

/// The polygonal components of a geometry (an overlay result may hold lines and points where
/// polygons touch), as one polygon or multipolygon. Null when it has none.
geos::Geometry polygonal_part(const geos::Context &ctx, geos::Geometry g) {
    const int type = GEOSGeomTypeId_r(ctx.get(), g.get());
    if (is_polygonal(type)) {
        return g;
    }
    if (type != GEOS_GEOMETRYCOLLECTION) {
        return {};
    }
    std::vector<GEOSGeometry *> polys;
    const int n = GEOSGetNumGeometries_r(ctx.get(), g.get());
    for (int i = 0; i < n; ++i) {
        const GEOSGeometry *part = GEOSGetGeometryN_r(ctx.get(), g.get(), i);
        const int pt = GEOSGeomTypeId_r(ctx.get(), part);
        if (pt == GEOS_POLYGON) {
            polys.push_back(GEOSGeom_clone_r(ctx.get(), part));
        } else if (pt == GEOS_MULTIPOLYGON) {
            const int m = GEOSGetNumGeometries_r(ctx.get(), part);
            for (int j = 0; j < m; ++j) {
                polys.push_back(
                    GEOSGeom_clone_r(ctx.get(), GEOSGetGeometryN_r(ctx.get(), part, j)));
            }
        }
    }
    if (polys.empty()) {
        return {};
    }
    return geos::own(ctx,
                     GEOSGeom_createCollection_r(ctx.get(), GEOS_MULTIPOLYGON, polys.data(),
                                                 static_cast<unsigned>(polys.size())),
                     "cannot build a multipolygon");
}

/// Reads a polygon or multipolygon; makes an invalid one valid (GEOS's "structure" method,
/// which keeps the polygonal area) and says why it was invalid.
struct ReadPolygon {
    geos::Geometry geom;
    bool repaired = false;
    std::string reason;
};

ReadPolygon read_polygonal(geos::Context &ctx, const geos::WkbReader &reader,
                           const std::vector<unsigned char> &wkb, const std::string &where) {
    ctx.clear_error();
    ReadPolygon out;
    out.geom = reader.read(wkb);
    if (!out.geom) {
        throw_input_error(where, fmt::format("the geometry cannot be read ({})", ctx.last_error()),
                          "a polygon or multipolygon as ISO WKB");
    }
    const int type = GEOSGeomTypeId_r(ctx.get(), out.geom.get());
    if (!is_polygonal(type)) {
        throw_input_error(where,
                          fmt::format("the geometry is a {}", geometry_type(ctx, out.geom.get())),
                          "a polygon or multipolygon");
    }
    const char valid = GEOSisValid_r(ctx.get(), out.geom.get());
    if (valid == 2) {
        ctx.fail("cannot check a geometry's validity at " + where);
    }
    if (valid == 0) {
        char *reason = GEOSisValidReason_r(ctx.get(), out.geom.get());
        out.reason = reason != nullptr ? reason : "invalid";
        GEOSFree_r(ctx.get(), reason);
        GEOSMakeValidParams *params = GEOSMakeValidParams_create_r(ctx.get());
        GEOSMakeValidParams_setMethod_r(ctx.get(), params, GEOS_MAKE_VALID_STRUCTURE);
        GEOSMakeValidParams_setKeepCollapsed_r(ctx.get(), params, 0);
        GEOSGeometry *fixed = GEOSMakeValidWithParams_r(ctx.get(), out.geom.get(), params);
        GEOSMakeValidParams_destroy_r(ctx.get(), params);
        auto made = polygonal_part(ctx, geos::own(ctx, fixed, "cannot make a geometry valid"));
        if (!made) {
            made = geos::own(ctx, GEOSGeom_createEmptyPolygon_r(ctx.get()),
                             "cannot create an empty polygon");
        }
        out.geom = std::move(made);
        out.repaired = true;
    }
    return out;
}

/// A catchment polygon as read, cut by the soils layer.
struct CatchmentCut {
    ReadPolygon read; // first: the polygon outlives what is prepared from it
    const GEOSGeometry *geom = nullptr;
    geos::Prepared prepared;
    double area_m2 = 0.0;
    double tol_m2 = 0.0; ///< areas below this count as zero
    std::vector<Piece> soil;
    std::vector<geos::Prepared> soil_prepared;
};

/// The parts of a catchment found by the overlay: area per class and soil group.
struct PartSums {
    struct Sum {
        double area_m2 = 0.0;
        std::int64_t first_fid = -1; ///< a land-cover feature of the class, for messages
    };
    std::map<std::pair<std::string, SoilGroup>, Sum> sums;
    std::set<std::size_t> land_used; ///< land-cover features found in the catchment
};

} // namespace

struct LandOverlay::Impl {
    geos::Context ctx; // first member: destroyed last, after every geometry
    LandTables tables;
    OverlaySettings settings;
    Layer land;
    Layer soils;
    CalcLines layer_warnings;
    SoilGroupReading default_soil;

    void load(Layer &layer, const io::VectorLayer &in, const std::string &field, bool is_soil) {
        layer.source = in.source;
        layer.kind = is_soil ? "soils layer" : "land-cover layer";
        layer.feature_noun = in.feature_noun;
        const geos::WkbReader reader(ctx);
        layer.features.reserve(in.features.size());
        for (const auto &f : in.features) {
            const std::string where = fmt::format("{}: {} {}", in.source, in.feature_noun, f.fid);
            LayerFeature lf;
            lf.fid = f.fid;
            const auto attr = f.attributes.find(field);
            if (attr == f.attributes.end()) {
                std::vector<std::string> names;
                for (const auto &[name, value] : f.attributes) {
                    names.push_back(name);
                }
                throw_input_error(where, fmt::format("no field '{}'", field),
                                  fmt::format("a {} field (fields found: {})",
                                              is_soil ? "hydrologic soil group" : "class",
                                              fmt::join(names, ", ")));
            }
            lf.value = attr->second;
            if (is_soil) {
                lf.soil = read_soil_group(lf.value, settings.drained,
                                          fmt::format("{}, field '{}'", where, field));
            } else if (lf.value.empty()) {
                throw_input_error(fmt::format("{}, field '{}'", where, field), "the class is empty",
                                  "a land-cover class name");
            }
            auto read = read_polygonal(ctx, reader, f.wkb, where);
            lf.geom = std::move(read.geom);
            lf.repaired = read.repaired;
            lf.repair_reason = read.reason;
            lf.area_m2 = area_of(ctx, lf.geom.get());
            if (GEOSisEmpty_r(ctx.get(), lf.geom.get()) == 0) {
                GEOSGeom_getXMin_r(ctx.get(), lf.geom.get(), &lf.xmin);
                GEOSGeom_getYMin_r(ctx.get(), lf.geom.get(), &lf.ymin);
                GEOSGeom_getXMax_r(ctx.get(), lf.geom.get(), &lf.xmax);
                GEOSGeom_getYMax_r(ctx.get(), lf.geom.get(), &lf.ymax);
            }
            if (lf.repaired) {
                layer_warnings.warn(feature_made_valid,
                                    {word("layer", in.source), word("noun", in.feature_noun),
                                     fid_qty("fid", f.fid), word("reason", read.reason)});
            }
            layer.features.push_back(std::move(lf));
        }
        layer.tree = std::make_unique<geos::StrTree>(ctx, 10);
        for (std::size_t i = 0; i < layer.features.size(); ++i) {
            layer.tree->insert(layer.features[i].geom.get(), i);
        }
    }

    void set_envelope(Piece &p) const {
        if (GEOSisEmpty_r(ctx.get(), p.geom) != 0) {
            return;
        }
        GEOSGeom_getXMin_r(ctx.get(), p.geom, &p.xmin);
        GEOSGeom_getYMin_r(ctx.get(), p.geom, &p.ymin);
        GEOSGeom_getXMax_r(ctx.get(), p.geom, &p.xmax);
        GEOSGeom_getYMax_r(ctx.get(), p.geom, &p.ymax);
    }

    /// The pieces of the catchment cut by every polygon of `layer`.
    std::vector<Piece> cut(const Layer &layer, const GEOSGeometry *catchment,
                           const GEOSPreparedGeometry *prepared) const {
        std::vector<Piece> pieces;
        for (const std::size_t i : layer.tree->query(catchment)) {
            const GEOSGeometry *fg = layer.features[i].geom.get();
            if (GEOSPreparedIntersects_r(ctx.get(), prepared, fg) != 1) {
                continue;
            }
            Piece p;
            p.feature = i;
            if (GEOSPreparedContainsProperly_r(ctx.get(), prepared, fg) == 1) {
                p.geom = fg;
            } else {
                p.owned = polygonal_part(
                    ctx, geos::own(ctx, GEOSIntersection_r(ctx.get(), catchment, fg),
                                   "cannot intersect a catchment with a layer polygon"));
                if (!p.owned) {
                    continue;
                }
                p.geom = p.owned.get();
            }
            p.area_m2 = area_of(ctx, p.geom);
            if (p.area_m2 <= 0.0) {
                continue;
            }
            set_envelope(p);
            pieces.push_back(std::move(p));
        }
        return pieces;
    }

    /// Union of the pieces (cloned: the pieces keep their geometries).
    geos::Geometry union_of(const std::vector<Piece> &pieces) const {
        std::vector<GEOSGeometry *> clones;
        clones.reserve(pieces.size());
        for (const auto &p : pieces) {
            clones.push_back(GEOSGeom_clone_r(ctx.get(), p.geom));
        }
        auto collection =
            geos::own(ctx,
                      GEOSGeom_createCollection_r(ctx.get(), GEOS_GEOMETRYCOLLECTION, clones.data(),
                                                  static_cast<unsigned>(clones.size())),
                      "cannot build a collection");
        return geos::own(ctx, GEOSUnaryUnion_r(ctx.get(), collection.get()),
                         "cannot union the pieces of a layer");
    }

    /// Pairs of pieces whose interiors overlap, for the message (every pair with a positive
    /// overlap, so that many small overlaps that add up above the tolerance are all named).
    std::vector<std::string> overlapping_pairs(const Layer &layer,
                                               const std::vector<Piece> &pieces) const {
        std::vector<std::string> pairs;
        for (std::size_t i = 0; i < pieces.size(); ++i) {
            for (std::size_t j = i + 1; j < pieces.size(); ++j) {
                const Piece &a = pieces[i];
                const Piece &b = pieces[j];
                if (a.xmax <= b.xmin || b.xmax <= a.xmin || a.ymax <= b.ymin || b.ymax <= a.ymin) {
                    continue;
                }
                auto inter = geos::own(ctx, GEOSIntersection_r(ctx.get(), a.geom, b.geom),
                                       "cannot intersect two layer polygons");
                const double area = area_of(ctx, inter.get());
                if (area > 0.0) {
                    pairs.push_back(fmt::format("features {} and {} ({} m2)",
                                                layer.features[a.feature].fid,
                                                layer.features[b.feature].fid, sig(area)));
                }
            }
        }
        return pairs;
    }

    /// Checks that a layer covers the catchment once: overlaps are refused with their feature
    /// ids; an uncovered part is refused or given to the default. Returns the uncovered area.
    double settle_coverage(const Layer &layer, std::vector<Piece> &pieces,
                           const GEOSGeometry *catchment, double area_m2, double tol_m2,
                           std::string_view label, CalcLines &lines) const {
        double sum_m2 = 0.0;
        for (const auto &p : pieces) {
            sum_m2 += p.area_m2;
        }
        // The union tells overlaps (sum above the union) from gaps (union below the catchment).
        const auto covered = union_of(pieces);
        const double covered_m2 = pieces.empty() ? 0.0 : area_of(ctx, covered.get());
        if (sum_m2 - covered_m2 > tol_m2) {
            const auto pairs = overlapping_pairs(layer, pieces);
            throw_input_error(
                layer.source,
                fmt::format("polygons of the {} overlap inside catchment '{}' ({} m2 counted "
                            "twice): {}",
                            layer.kind, label, sig(sum_m2 - covered_m2), fmt::join(pairs, "; ")),
                "polygons of one layer that do not overlap");
        }
        const double uncovered_m2 = std::max(0.0, area_m2 - covered_m2);
        if (uncovered_m2 <= tol_m2) {
            return uncovered_m2;
        }
        const bool soil = &layer == &soils;
        if (settings.uncovered == Uncovered::refuse) {
            throw_input_error(layer.source,
                              fmt::format("{} m2 ({} % of catchment '{}') is not covered by the {}",
                                          sig(uncovered_m2), sig(100.0 * uncovered_m2 / area_m2),
                                          label, layer.kind),
                              "a layer that covers every catchment, or the setting that gives the "
                              "uncovered part a default class and soil group");
        }
        Piece p;
        p.owned = polygonal_part(
            ctx, geos::own(ctx,
                           pieces.empty() ? GEOSGeom_clone_r(ctx.get(), catchment)
                                          : GEOSDifference_r(ctx.get(), catchment, covered.get()),
                           "cannot cut the uncovered part of a catchment"));
        if (!p.owned) {
            return uncovered_m2;
        }
        p.geom = p.owned.get();
        p.area_m2 = area_of(ctx, p.geom);
        set_envelope(p);
        pieces.push_back(std::move(p));
        lines.warn(soil ? soils_uncovered : land_cover_uncovered,
                   {qty("U", uncovered_m2, Unit::m2), qty("P", 100.0 * uncovered_m2 / area_m2),
                    word("catchment", std::string(label)),
                    word("default", soil ? settings.default_soil_group : settings.default_class),
                    word("layer", layer.source)});
        return uncovered_m2;
    }

    /// Reads the catchment polygon (made valid, with a warning, when invalid) and cuts it by
    /// the soils layer. Soils first: few pieces, so their union (exact coverage and overlap
    /// check) is cheap.
    CatchmentCut cut_catchment(const std::vector<unsigned char> &catchment_wkb,
                               std::string_view label, CatchmentLand &out, CalcLines &warnings) {
        CatchmentCut catchment;
        const geos::WkbReader reader(ctx);
        catchment.read =
            read_polygonal(ctx, reader, catchment_wkb, fmt::format("catchment '{}'", label));
        if (catchment.read.repaired) {
            warnings.warn(catchment_made_valid, {word("catchment", std::string(label)),
                                                 word("reason", catchment.read.reason)});
        }
        catchment.geom = catchment.read.geom.get();
        out.area_m2 = area_of(ctx, catchment.geom);
        if (!(out.area_m2 > 0.0)) {
            throw_input_error(fmt::format("catchment '{}'", label), "the polygon has no area",
                              "a polygon with a positive area");
        }
        catchment.area_m2 = out.area_m2;
        catchment.tol_m2 = settings.area_tolerance_share * out.area_m2;
        catchment.prepared = geos::prepare(ctx, catchment.geom);
        catchment.soil = cut(soils, catchment.geom, catchment.prepared.get());
        out.uncovered_soils_m2 = settle_coverage(soils, catchment.soil, catchment.geom, out.area_m2,
                                                 catchment.tol_m2, label, warnings);
        catchment.soil_prepared.reserve(catchment.soil.size());
        for (const auto &sp : catchment.soil) {
            catchment.soil_prepared.push_back(geos::prepare(ctx, sp.geom));
        }
        return catchment;
    }

    void add_part(PartSums &parts, std::size_t land_feature, SoilGroup g, double a) const {
        const bool is_default = land_feature == no_feature;
        const std::string &cls =
            is_default ? settings.default_class : land.features[land_feature].value;
        auto &sum = parts.sums[{cls, g}];
        sum.area_m2 += a;
        if (sum.first_fid < 0 && !is_default) {
            sum.first_fid = land.features[land_feature].fid;
        }
        if (!is_default) {
            parts.land_used.insert(land_feature);
        }
    }

    SoilGroup group_of(const Piece &sp) const {
        return sp.feature == no_feature ? default_soil.group
                                        : soils.features[sp.feature].soil.group;
    }

    /// Adds the parts of land-cover feature `i` (fast path) and their areas to `sum_m2`;
    /// `crossing` is scratch space.
    void overlay_feature(const CatchmentCut &catchment, std::size_t i, PartSums &parts,
                         std::vector<std::size_t> &crossing, double &sum_m2) const {
        const auto &f = land.features[i];
        const GEOSGeometry *fg = f.geom.get();
        if (f.area_m2 <= 0.0 ||
            GEOSPreparedIntersects_r(ctx.get(), catchment.prepared.get(), fg) != 1) {
            return;
        }
        const bool inside =
            GEOSPreparedContainsProperly_r(ctx.get(), catchment.prepared.get(), fg) == 1;
        crossing.clear(); // soil pieces the land-cover polygon reaches into
        for (std::size_t k = 0; k < catchment.soil.size(); ++k) {
            const Piece &sp = catchment.soil[k];
            if (f.xmax < sp.xmin || sp.xmax < f.xmin || f.ymax < sp.ymin || sp.ymax < f.ymin) {
                continue;
            }
            if (GEOSPreparedContainsProperly_r(ctx.get(), catchment.soil_prepared[k].get(), fg) ==
                1) {
                add_part(parts, i, group_of(sp), f.area_m2);
                sum_m2 += f.area_m2;
                return;
            }
            if (GEOSPreparedIntersects_r(ctx.get(), catchment.soil_prepared[k].get(), fg) == 1) {
                crossing.push_back(k);
            }
        }
        double done_m2 = 0.0;
        for (std::size_t j = 0; j < crossing.size(); ++j) {
            const std::size_t k = crossing[j];
            double a = 0.0;
            if (inside && j + 1 == crossing.size()) {
                // A polygon inside the catchment is covered once by the soil pieces (their
                // coverage was settled above): the last piece holds the rest of its area.
                // A rest within the rounding of the subtraction (1e-12 of the polygon's
                // area) is a piece that only touches the polygon.
                a = f.area_m2 - done_m2;
                if (a <= std::max(catchment.tol_m2, 1e-12 * f.area_m2)) {
                    a = 0.0;
                }
            } else {
                auto inter =
                    geos::own(ctx, GEOSIntersection_r(ctx.get(), catchment.soil[k].geom, fg),
                              "cannot intersect land cover with soils");
                a = area_of(ctx, inter.get());
            }
            if (a > 0.0) {
                add_part(parts, i, group_of(catchment.soil[k]), a);
                sum_m2 += a;
                done_m2 += a;
            }
        }
    }

    /// Fast path: every land-cover polygon against every soil piece (already cut to the
    /// catchment). If the land-cover layer covers the catchment once, the parts add up to the
    /// catchment's area; returns false (and no parts) on any difference (a gap or an overlap).
    bool overlay_fast(const CatchmentCut &catchment, PartSums &parts) const {
        double sum_m2 = 0.0;
        std::vector<std::size_t> crossing;
        for (const std::size_t i : land.tree->query(catchment.geom)) {
            overlay_feature(catchment, i, parts, crossing, sum_m2);
        }
        if (std::abs(sum_m2 - catchment.area_m2) > catchment.tol_m2) {
            parts = {};
            return false;
        }
        return true;
    }

    /// Area of a land-cover piece inside soil piece k.
    double area_in_soil(const CatchmentCut &catchment, std::size_t k, const GEOSGeometry *g,
                        double g_area_m2) const {
        const GEOSPreparedGeometry *soil_k = catchment.soil_prepared[k].get();
        if (GEOSPreparedContains_r(ctx.get(), soil_k, g) == 1) {
            return g_area_m2;
        }
        if (GEOSPreparedIntersects_r(ctx.get(), soil_k, g) != 1) {
            return 0.0;
        }
        auto inter = geos::own(ctx, GEOSIntersection_r(ctx.get(), catchment.soil[k].geom, g),
                               "cannot intersect land cover with soils");
        return area_of(ctx, inter.get());
    }

    /// Exact path: cut the catchment by the land-cover layer, check coverage and overlaps with
    /// the union of the pieces (refusing, or giving the uncovered part the default class), then
    /// intersect the land pieces with the soil pieces.
    void overlay_exact(const CatchmentCut &catchment, std::string_view label, PartSums &parts,
                       CatchmentLand &out, CalcLines &warnings) const {
        auto pieces = cut(land, catchment.geom, catchment.prepared.get());
        out.uncovered_land_cover_m2 = settle_coverage(
            land, pieces, catchment.geom, catchment.area_m2, catchment.tol_m2, label, warnings);
        for (const auto &lp : pieces) {
            for (std::size_t k = 0; k < catchment.soil.size(); ++k) {
                const Piece &sp = catchment.soil[k];
                if (lp.xmax < sp.xmin || sp.xmax < lp.xmin || lp.ymax < sp.ymin ||
                    sp.ymax < lp.ymin) {
                    continue;
                }
                const double a = area_in_soil(catchment, k, lp.geom, lp.area_m2);
                if (a > 0.0) {
                    add_part(parts, lp.feature, group_of(sp), a);
                }
            }
        }
    }

    static void warn_if_repaired(const Layer &layer, const LayerFeature &f, CalcLines &warnings) {
        if (f.repaired) {
            warnings.warn(overlaid_feature_made_valid,
                          {word("layer", layer.source), fid_qty("fid", f.fid),
                           word("reason", f.repair_reason)});
        }
    }

    /// Warnings for repaired polygons that reach into the catchment; returns the dual soil
    /// groups found in it (as written, and the group used), each once.
    std::vector<DualGroup> check_features(const CatchmentCut &catchment, const PartSums &parts,
                                          CalcLines &warnings) const {
        std::set<DualGroup> duals;
        for (const auto &sp : catchment.soil) {
            if (sp.feature == no_feature) {
                continue;
            }
            const auto &sf = soils.features[sp.feature];
            if (sf.soil.dual) {
                duals.insert({sf.value, std::string(to_string(sf.soil.group))});
            }
            warn_if_repaired(soils, sf, warnings);
        }
        for (const std::size_t i : parts.land_used) {
            warn_if_repaired(land, land.features[i], warnings);
        }
        return {duals.begin(), duals.end()};
    }

    /// The parts as weight_parts takes them, named by their first land-cover feature.
    std::vector<PartArea> part_areas(const PartSums &parts) const {
        std::vector<PartArea> out;
        out.reserve(parts.sums.size());
        for (const auto &[key, sum] : parts.sums) {
            out.push_back({key.first, key.second, sum.area_m2,
                           sum.first_fid < 0 ? std::string("the default class of the project "
                                                           "settings")
                                             : fmt::format("{}, {} {}", land.source,
                                                           land.feature_noun, sum.first_fid)});
        }
        return out;
    }

    /// What the lines say about the catchment: its area, the layers, the sources.
    PartsContext parts_context(std::string_view label, double area_m2,
                               std::optional<double> mean_slope) const {
        const auto &s = settings;
        PartsContext pc;
        pc.label = std::string(label);
        pc.catchment_area_m2 = area_m2;
        pc.input_notes.note(polygon_area, {word("catchment", std::string(label))},
                            sheet_area("A", area_m2, s.units));
        pc.input_notes.note(layers_overlaid,
                            {word("land", land.source), word("class_field", s.class_field),
                             word("soils", soils.source), word("soil_field", s.soil_group_field)});
        pc.parts_source = {Ref::none,
                           "overlay of the catchment with {land_layer} and {soils_layer}",
                           {word("land_layer", land.source), word("soils_layer", soils.source)}};
        pc.area_check_source = {Ref::none, "GEOS overlay"};
        pc.drained = s.drained;
        if (mean_slope) {
            pc.slope_percent = *mean_slope * 100.0;
        }
        pc.units = s.units;
        pc.min_part_area_m2 = s.min_part_area_m2;
        return pc;
    }
};

LandOverlay::LandOverlay(const io::VectorLayer &land_cover, const io::VectorLayer &soils,
                         LandTables tables, OverlaySettings settings)
    : impl_(std::make_unique<Impl>()) {
    impl_->tables = std::move(tables);
    impl_->settings = std::move(settings);
    const auto &s = impl_->settings;
    if (s.uncovered == Uncovered::use_default) {
        if (s.default_class.empty()) {
            throw_input_error("land overlay settings", "no default class is given",
                              "a land-cover class name for parts the land-cover layer does not "
                              "cover");
        }
        impl_->default_soil = read_soil_group(s.default_soil_group, s.drained,
                                              "land overlay settings, default soil group");
    }
    if (!(s.area_tolerance_share >= 0.0 && s.area_tolerance_share < 1e-3)) {
        throw_input_error("land overlay settings",
                          fmt::format("area tolerance {} is out of range", s.area_tolerance_share),
                          "a share of the catchment area from 0 to 0.001");
    }
    impl_->load(impl_->land, land_cover, s.class_field, false);
    impl_->load(impl_->soils, soils, s.soil_group_field, true);
}

LandOverlay::~LandOverlay() = default;
LandOverlay::LandOverlay(LandOverlay &&) noexcept = default;
LandOverlay &LandOverlay::operator=(LandOverlay &&) noexcept = default;

const CalcLines &LandOverlay::layer_warnings() const noexcept { return impl_->layer_warnings; }

CatchmentLand LandOverlay::weight(const std::vector<unsigned char> &catchment_wkb,
                                  std::string_view label, std::optional<double> mean_slope) const {
    Impl &im = *impl_;
    CatchmentLand out;
    CalcLines warnings;
    const auto catchment = im.cut_catchment(catchment_wkb, label, out, warnings);
    PartSums parts;
    if (im.settings.exact_coverage_check || !im.overlay_fast(catchment, parts)) {
        im.overlay_exact(catchment, label, parts, out, warnings);
    }
    auto pc = im.parts_context(label, out.area_m2, mean_slope);
    pc.dual_groups = im.check_features(catchment, parts, warnings);
    pc.warnings = std::move(warnings);
    auto weighted = weight_parts(im.part_areas(parts), im.tables, pc);
    out.weighting = std::move(weighted.weighting);
    out.lines = std::move(weighted.lines);
    return out;
}

} // namespace catchpeak::land
