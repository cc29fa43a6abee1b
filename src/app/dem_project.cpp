// SPDX-License-Identifier: MIT
#include "catchpeak/app/dem_project.hpp"

#include "catchpeak/app/delineate.hpp"
#include "catchpeak/app/inputs.hpp"
#include "catchpeak/app/land_inputs.hpp"
#include "catchpeak/app/pipeline.hpp"
#include "catchpeak/core/error.hpp"
#include "catchpeak/core/spelling.hpp"
#include "catchpeak/core/units.hpp"
#include "catchpeak/io/raster.hpp"
#include "catchpeak/io/vector.hpp"
#include "catchpeak/io/wkb.hpp"
#include "catchpeak/land/overlay.hpp"
#include "catchpeak/land/tables.hpp"
#include "catchpeak/terrain/breach_ends.hpp"

#include <fmt/format.h>

#include <algorithm>
#include <cmath>
#include <cstdlib>
#include <functional>
#include <limits>
#include <map>
#include <numbers>
#include <set>
#include <tuple>

namespace catchpeak::app {

using project::Problems;
using project::Project;

namespace {

/// The largest side of the map's hillshade, pixels.
constexpr std::size_t hillshade_max_px = 600;

std::vector<report::Polygon> rings_of(const std::vector<unsigned char> &wkb) {
    std::vector<report::Polygon> out;
    for (auto &p : io::wkb_polygon_rings(wkb)) {
        out.push_back(std::move(p));
    }
    return out;
}

/// Vertical exaggeration of the hillshade: catchments of drainage design are often gentle (1 to
/// 5 %), and a true-scale hillshade of them is a flat grey.
constexpr double hillshade_z_factor = 4.0;

/// A standard hillshade (light from the north-west, 45 degrees above the horizon; Horn's
/// gradient, heights exaggerated hillshade_z_factor times) of the DEM window [min_x, max_x] x
/// [min_y, max_y], at most hillshade_max_px a side. Only a backdrop for the map: no number on the
/// sheet depends on it.
void fill_hillshade(const Grid<float> &dem, double min_x, double min_y, double max_x, double max_y,
                    report::MapData &map) {
    const auto &t = dem.transform;
    const double dx = t.cell_dx();
    const double dy = t.cell_dy();
    const auto w = static_cast<long long>(dem.width());
    const auto h = static_cast<long long>(dem.height());
    auto col_of = [&](double x) {
        return static_cast<long long>(std::floor((x - t.origin_x) / dx));
    };
    auto row_of = [&](double y) {
        return static_cast<long long>(std::floor((t.origin_y - y) / dy));
    };
    const long long c0 = std::clamp(col_of(min_x), 0LL, w - 1);
    const long long c1 = std::clamp(col_of(max_x), 0LL, w - 1);
    const long long r0 = std::clamp(row_of(max_y), 0LL, h - 1);
    const long long r1 = std::clamp(row_of(min_y), 0LL, h - 1);
    const long long cols = c1 - c0 + 1;
    const long long rows = r1 - r0 + 1;
    const long long step =
        std::max(1LL, (std::max(cols, rows) + static_cast<long long>(hillshade_max_px) - 1) /
                          static_cast<long long>(hillshade_max_px));
    const long long pw = (cols + step - 1) / step;
    const long long ph = (rows + step - 1) / step;
    map.hillshade_width = static_cast<std::size_t>(pw);
    map.hillshade_height = static_cast<std::size_t>(ph);
    map.hillshade.assign(map.hillshade_width * map.hillshade_height, 0);
    map.hillshade_min_x = t.origin_x + static_cast<double>(c0) * dx;
    map.hillshade_max_x = t.origin_x + static_cast<double>(c0 + pw * step) * dx;
    map.hillshade_max_y = t.origin_y - static_cast<double>(r0) * dy;
    map.hillshade_min_y = t.origin_y - static_cast<double>(r0 + ph * step) * dy;

    const double zenith = (90.0 - 45.0) * std::numbers::pi / 180.0;
    const double azimuth = (360.0 - 315.0 + 90.0) * std::numbers::pi / 180.0;
    auto z = [&](long long c, long long r, double fallback) {
        c = std::clamp(c, 0LL, w - 1);
        r = std::clamp(r, 0LL, h - 1);
        const float v = dem(static_cast<std::size_t>(c), static_cast<std::size_t>(r));
        return std::isnan(v) ? fallback : hillshade_z_factor * static_cast<double>(v);
    };
    const double sdx = dx * static_cast<double>(step);
    const double sdy = dy * static_cast<double>(step);
    for (long long j = 0; j < ph; ++j) {
        for (long long i = 0; i < pw; ++i) {
            const long long c = c0 + i * step;
            const long long r = r0 + j * step;
            const double e = z(c, r, std::nan(""));
            std::uint8_t shade = 230; // nodata: light grey
            if (!std::isnan(e)) {
                const double a = z(c - step, r - step, e), b = z(c, r - step, e),
                             cc = z(c + step, r - step, e), d = z(c - step, r, e),
                             f = z(c + step, r, e), g = z(c - step, r + step, e),
                             hh = z(c, r + step, e), ii = z(c + step, r + step, e);
                const double dzdx = ((cc + 2.0 * f + ii) - (a + 2.0 * d + g)) / (8.0 * sdx);
                const double dzdy = ((g + 2.0 * hh + ii) - (a + 2.0 * b + cc)) / (8.0 * sdy);
                const double slope = std::atan(std::hypot(dzdx, dzdy));
                const double aspect = std::atan2(dzdy, -dzdx);
                const double v = std::cos(zenith) * std::cos(slope) +
                                 std::sin(zenith) * std::sin(slope) * std::cos(azimuth - aspect);
                shade = static_cast<std::uint8_t>(std::clamp(v, 0.0, 1.0) * 255.0);
            }
            map.hillshade[static_cast<std::size_t>(j * pw + i)] = shade;
        }
    }
}

/// The DEM as given (before conditioning) along a flow path: (distance from the top in m,
/// elevation in m), one per cell from the top to the outlet. Between two listed vertices the path
/// runs straight (terrain::FlowPath), so its cells are found by stepping from one to the next.
std::vector<std::pair<double, double>> flow_path_profile(const terrain::FlowPath &fp,
                                                         const Grid<float> &dem) {
    std::vector<std::pair<double, double>> out;
    if (fp.cells.empty()) {
        return out;
    }
    out.reserve(fp.cell_count);
    const auto w = static_cast<long long>(dem.width());
    const double dx = dem.transform.cell_dx();
    const double dy = dem.transform.cell_dy();
    const double diagonal = std::hypot(dx, dy);
    double distance = 0.0;
    const auto add = [&](long long row, long long col) {
        out.emplace_back(distance,
                         static_cast<double>(dem.cells()[static_cast<std::size_t>(row * w + col)]));
    };
    add(static_cast<long long>(fp.cells[0]) / w, static_cast<long long>(fp.cells[0]) % w);
    for (std::size_t k = 1; k < fp.cells.size(); ++k) {
        const auto a = static_cast<long long>(fp.cells[k - 1]);
        const auto b = static_cast<long long>(fp.cells[k]);
        const long long ra = a / w, ca = a % w, rb = b / w, cb = b % w;
        const long long dr = (rb > ra) - (rb < ra), dc = (cb > ca) - (cb < ca);
        const long long n = std::max(std::llabs(rb - ra), std::llabs(cb - ca));
        const double step = (dr != 0 && dc != 0) ? diagonal : (dr != 0 ? dy : dx);
        for (long long i = 1; i <= n; ++i) {
            distance += step;
            add(ra + i * dr, ca + i * dc);
        }
    }
    return out;
}

report::MapData make_map(const Delineation &d, std::size_t i) {
    const auto &p = d.result.points[i];
    report::MapData map;
    map.catchment = rings_of(d.total_wkb[i]);
    if (!p.upstream_points.empty()) {
        map.local_catchment = rings_of(d.local_wkb[i]);
    }
    map.longest_flow_path = p.longest_flow_path.vertices_xy;
    map.crs_unit = d.dem.horizontal_unit;
    map.crs_unit_m = d.dem.horizontal_unit_m;
    map.given_xy = {p.given_x, p.given_y};
    map.snapped_xy = {p.snapped_x, p.snapped_y};
    double min_x = std::min(p.given_x, p.snapped_x), max_x = std::max(p.given_x, p.snapped_x);
    double min_y = std::min(p.given_y, p.snapped_y), max_y = std::max(p.given_y, p.snapped_y);
    for (const auto &poly : map.catchment) {
        for (const auto &[x, y] : poly.front()) {
            min_x = std::min(min_x, x);
            max_x = std::max(max_x, x);
            min_y = std::min(min_y, y);
            max_y = std::max(max_y, y);
        }
    }
    // The sheet pads the catchment's box and widens it to the frame's shape: the hillshade
    // covers a square around the catchment with a margin, and wider still east and west.
    const auto &t = d.dem.elevation_m.transform;
    const double half = std::max(0.65 * std::max(max_x - min_x, max_y - min_y), 5.0 * t.cell_dx());
    const double cx = 0.5 * (min_x + max_x);
    const double cy = 0.5 * (min_y + max_y);
    min_x = cx - 1.6 * half;
    max_x = cx + 1.6 * half;
    min_y = cy - half;
    max_y = cy + half;
    fill_hillshade(d.dem.elevation_m, min_x, min_y, max_x, max_y, map);
    for (const auto &s : d.result.streams) {
        const bool inside = std::any_of(s.vertices_xy.begin(), s.vertices_xy.end(), [&](auto xy) {
            return xy.first >= min_x && xy.first <= max_x && xy.second >= min_y &&
                   xy.second <= max_y;
        });
        if (inside && s.vertices_xy.size() >= 2) {
            map.streams.push_back(s.vertices_xy);
        }
    }
    return map;
}

land::OverlaySettings overlay_settings(const Project &p) {
    land::OverlaySettings s;
    s.class_field = p.inputs.class_field;
    s.soil_group_field = p.inputs.soil_group_field;
    s.drained = p.settings.dual_soil_group == project::DualSoilGroup::drained;
    if (const auto *c = std::get_if<project::UncoveredAsClass>(&p.settings.uncovered_land)) {
        s.uncovered = land::Uncovered::use_default;
        s.default_class = c->land_class;
    }
    s.units = p.info.units;
    s.min_part_area_m2 = p.settings.min_land_part_m2;
    return s;
}

void require_layers(const Project &p) {
    const std::string pf = p.file.string();
    if (!p.inputs.design_points) {
        throw_input_error(pf + ": [inputs] design_points", "is missing for a DEM project",
                          "a point layer of design points beside 'dem'");
    }
    if (!p.inputs.land_cover || !p.inputs.soils) {
        throw_input_error(
            pf + (p.inputs.land_cover ? ": [inputs] soils" : ": [inputs] land_cover"),
            "is missing for a DEM project",
            "a land-cover layer or raster ('land_cover') and a soils layer or raster ('soils'), "
            "to weight C and CN over each catchment");
    }
}

// The wording of the terrain lines of a design point, declared once.
constexpr std::string_view d8_where = "D8 (O'Callaghan & Mark 1984) on the conditioned DEM";
constexpr std::string_view dem_where = "DEM as given (before conditioning)";
constexpr Formula point_given{
    "terrain.point_given",          "Design point as given", "",
    "x = {x} {x:u}, y = {y} {y:u}", Ref::project_input,      " ({points})"};
// One label per snap rule ([settings] snap), the same key and numbers.
constexpr std::string_view snapped_numbers = "x = {x} {x:u}, y = {y} {y:u}; moved {d} {d:u}{dir}";
constexpr Formula point_snapped_nearest{
    "terrain.point_snapped",
    "Design point snapped to the nearest stream cell within the snap radius",
    "",
    snapped_numbers,
    Ref::none,
    d8_where};
constexpr Formula point_snapped_largest{
    "terrain.point_snapped",
    "Design point snapped to the cell of largest flow accumulation within the snap radius",
    "",
    snapped_numbers,
    Ref::none,
    d8_where};
constexpr Formula point_not_snapped{"terrain.point_snapped",
                                    "Design point kept on the cell under it (not snapped)",
                                    "",
                                    snapped_numbers,
                                    Ref::none,
                                    d8_where};
constexpr Formula snap_areas_note{
    "terrain.snap_areas",
    "Catchments around the design point (flow accumulation)",
    "",
    "cell under the given point {Ag} {Ag:u}; snapped cell {As} {As:u}; cells within r = {r} "
    "{r:u}: smallest {Amin} {Amin:u}, largest {Amax} {Amax:u}",
    Ref::none,
    d8_where};
constexpr Formula snap_no_stream_warning{
    "terrain.snap_no_stream",
    "No stream cell within the snap radius",
    "",
    "no cell draining at least {T} {T:u} ([settings] snap_stream_threshold_m2) lies within {r} "
    "{r:u} ([settings] snap_radius_m) of the given point; the point stays on the cell under it, "
    "whose catchment is {A} {A:u}: check that it lies on the intended channel",
    Ref::none,
    d8_where};
constexpr Formula snap_grew_warning{
    "terrain.snap_grew",
    "Snapped catchment much larger than at the given point",
    "",
    "the snap moved the point {d} {d:u}{dir} to a catchment of {As} {As:u}, more than {k} times "
    "the {Ag} {Ag:u} of the cell under the given point ([settings] snap_area_factor = {k}): "
    "check that the snapped cell lies on the intended channel ([settings] snap, snap_radius_m)",
    Ref::none,
    d8_where};
constexpr Formula snap_spread_warning{
    "terrain.snap_spread",
    "A much larger flow route within the snap radius",
    "",
    "a cell within {r} {r:u} ([settings] snap_radius_m) drains {Amax} {Amax:u}, more than {k} "
    "times the {As} {As:u} of the snapped cell ([settings] snap_area_factor = {k}; the smallest "
    "within the radius drains {Amin} {Amin:u}): the catchment depends on where within the "
    "radius the point lies; check on the map that the snapped cell is on the intended channel",
    Ref::none,
    d8_where};
constexpr Formula area_note{
    "terrain.area",
    "Catchment area",
    "",
    "A = {A} {A:u}",
    Ref::none,
    "D8 (O'Callaghan & Mark 1984) on the DEM conditioned by Priority-Flood (Barnes et al. 2014)"};
constexpr Formula local_area_note{
    "terrain.local_area",
    "Local catchment area (without the catchments of the design points upstream)",
    "",
    "A local = {A} {A:u}; upstream: {[{id}|, ]}",
    Ref::none,
    d8_where};
constexpr Formula length_note{"terrain.flow_path_length",
                              "Longest flow path length",
                              "",
                              "L = {L} {L:u}",
                              Ref::none,
                              d8_where};
constexpr Formula top_note{"terrain.elevation_top",
                           "Elevation at the top of the longest flow path",
                           "",
                           "Z top = {Z} {Z:u}",
                           Ref::none,
                           dem_where};
constexpr Formula outlet_note{"terrain.elevation_outlet",
                              "Elevation at the outlet",
                              "",
                              "Z outlet = {Z} {Z:u}",
                              Ref::none,
                              dem_where};
constexpr Formula slope_calc{"terrain.slope",
                             "Slope of the longest flow path",
                             "S = (Z top - Z outlet) / L",
                             "S = ({Ztop} - {Zoutlet}) / {L}",
                             Ref::none,
                             "H/L of the longest flow path"};
constexpr Formula slope_10_85_note{"terrain.slope_10_85",
                                   "Slope 10-85 of the longest flow path",
                                   "",
                                   "S 10-85 = {S} {S:u}",
                                   Ref::none,
                                   "elevations at 10 % and 85 % of L from the outlet"};
constexpr Formula mean_slope_note{"terrain.mean_slope",
                                  "Mean catchment slope",
                                  "",
                                  "S mean = {S} {S:u}",
                                  Ref::none,
                                  "Horn (1981) slope of every cell, averaged over the catchment"};
/// A warning of the delineation, `{message}` as the terrain module words it.
constexpr Formula delineation_warning{"terrain.delineation", "Delineation", "",
                                      "{message}",           Ref::none,     d8_where};
constexpr Formula local_weighting_note{
    "terrain.local_weighting",
    "Local catchment (own part, without the catchments of the design points upstream): land "
    "weighting for information",
    "",
    "the peaks of this design point use the total catchment above",
    Ref::none,
    d8_where};

/// A layer reprojected to the DEM's CRS as it was read: `{layer}` the key and file as the
/// project gives them, `{from}` its CRS (and who declared it), `{to}` the DEM's.
constexpr Formula layer_reprojected{"inputs.reprojected",
                                    "Layer reprojected to the DEM's CRS",
                                    "",
                                    "{layer}: from {from} to {to}",
                                    Ref::none,
                                    "coordinates transformed with PROJ (through GDAL)"};
constexpr Formula raster_reprojected{
    "inputs.reprojected_raster",
    "Raster reprojected to the DEM's CRS",
    "",
    "{layer}: from {from} to {to}",
    Ref::none,
    "cells warped by nearest neighbour with GDAL (class codes are never averaged)"};

/// "[inputs] land_cover 'land.gpkg'" for the sheet.
std::string input_name(const std::string &key, const project::InputPath &in) {
    return fmt::format("[inputs] {} '{}'", key, in.given);
}

/// The reprojection line of one layer, when it was reprojected.
void add_reprojection(CalcLines &lines, const Formula &f, const std::string &layer,
                      const std::optional<io::Reprojection> &r) {
    if (!r) {
        return;
    }
    const std::string from = r->declared_by.empty()
                                 ? r->from
                                 : fmt::format("{} (as {} declares)", r->from, r->declared_by);
    lines.note(f, {word("layer", layer), word("from", from), word("to", r->to)});
}

/// The lines of every layer the run reprojected to the DEM's CRS: they head the lines of each
/// design point, whose coordinates, catchment and land weighting they concern.
CalcLines reprojection_lines(const Project &p, const Delineation &d,
                             const io::LayerFacts &land_cover, const io::LayerFacts &soils) {
    CalcLines lines;
    add_reprojection(lines, layer_reprojected, input_name("design_points", *p.inputs.design_points),
                     d.points_reprojection);
    if (p.inputs.breach_lines) {
        add_reprojection(lines, layer_reprojected,
                         input_name("breach_lines", *p.inputs.breach_lines),
                         d.breach_lines_reprojection);
    }
    for (const auto &[key, in, facts] :
         {std::tuple{"land_cover", &*p.inputs.land_cover, &land_cover},
          std::tuple{"soils", &*p.inputs.soils, &soils}}) {
        const bool raster = io::data_kind(in->resolved) == io::DataKind::raster;
        add_reprojection(lines, raster ? raster_reprojected : layer_reprojected,
                         input_name(key, *in), facts->reprojection);
    }
    return lines;
}

/// The CRS the project declares for the design points' coordinates ([inputs]
/// design_points_crs), for io.
io::DeclaredCrs declared_points_crs(const Project &p) {
    io::DeclaredCrs c;
    c.text = p.inputs.design_points_crs;
    c.key = "[inputs] design_points_crs";
    c.where = fmt::format("{}:{}: {}", p.file.string(), p.inputs.design_points_crs_line, c.key);
    return c;
}

/// The land-cover or soils input over `window`, refused when it does not overlap the DEM.
io::VectorLayer land_input_over_dem(const Project &p, LandInput which, const std::string &crs,
                                    const io::Extent &window, const io::Extent &dem,
                                    io::LayerFacts &facts, bool polygons = true,
                                    LandClasses *classes = nullptr) {
    io::VectorLayer layer = read_land_input(p, which, crs, window, polygons, &facts, classes);
    const bool soils = which == LandInput::soils;
    const project::InputPath &in = soils ? *p.inputs.soils : *p.inputs.land_cover;
    require_over_dem(facts.extent, dem,
                     fmt::format("{}:{}: {}", p.file.string(), in.line,
                                 input_name(soils ? "soils" : "land_cover", in)),
                     soils ? "soils layer" : "land-cover layer");
    return layer;
}

/// The unit of the DEM file's own CRS, in which the engineer's survey gives coordinates.
Unit crs_unit(const std::string &horizontal_unit) {
    return horizontal_unit == "US survey foot"       ? Unit::us_ft
           : horizontal_unit == "international foot" ? Unit::ft
                                                     : Unit::m;
}

/// " to the north-east" for a move from the given point to the snapped cell; "" for none.
std::string move_direction(const terrain::DesignPointTerrain &pt) {
    const std::string dir =
        terrain::compass_direction(pt.snapped_x - pt.given_x, pt.snapped_y - pt.given_y);
    return dir.empty() ? dir : " to the " + dir;
}

/// The snap of one design point: where it moved, the catchments around it, and the warnings
/// when the snap or the point's place within the radius changes the catchment a lot.
void add_snap_lines(CalcLines &lines, const Project &p, const terrain::DesignPointTerrain &pt,
                    const std::function<Quantity(std::string, double)> &coord) {
    const bool us = p.info.units == units::System::us_customary;
    const auto len = [&](std::string symbol, double m) {
        return us ? qty(std::move(symbol), units::m_to_ft(m), Unit::ft)
                  : qty(std::move(symbol), m, Unit::m);
    };
    const auto area = [&](std::string symbol, double m2) {
        return us ? qty(std::move(symbol), units::m2_to_acre(m2), Unit::ac)
                  : qty(std::move(symbol), units::m2_to_ha(m2), Unit::ha);
    };
    const auto &s = p.settings;
    const Formula &moved = s.snap == SnapRule::nearest_stream ? point_snapped_nearest
                           : s.snap == SnapRule::largest_flow ? point_snapped_largest
                                                              : point_not_snapped;
    const Quantity dir = word("dir", move_direction(pt));
    lines.note(moved, {coord("x", pt.snapped_x), coord("y", pt.snapped_y), dir},
               len("d", pt.snap_distance_m));
    const Quantity given = area("Ag", pt.given_cell_area_m2);
    const Quantity snapped = area("As", pt.accumulation_m2);
    const Quantity smallest = area("Amin", pt.min_area_within_radius_m2);
    const Quantity largest = area("Amax", pt.max_area_within_radius_m2);
    const Quantity radius = len("r", s.snap_radius_m);
    const Quantity factor = qty("k", s.snap_area_factor, Unit::none, Shown::exact());
    lines.note(snap_areas_note, {given, snapped, radius, smallest, largest});
    const SnapChecks checks = snap_checks(pt, s.snap_area_factor);
    if (checks.no_stream) {
        lines.warn(snap_no_stream_warning,
                   {area("T", s.snap_stream_threshold_m2), radius, area("A", pt.accumulation_m2)});
    }
    if (checks.grew) {
        lines.warn(snap_grew_warning, {len("d", pt.snap_distance_m), dir, snapped, factor, given});
    }
    if (checks.spread) {
        lines.warn(snap_spread_warning, {radius, largest, factor, snapped, smallest});
    }
}

/// The lines of the terrain figures of one design point (not numbered yet).
CalcLines terrain_lines(const Project &p, const Delineation &d, std::size_t i) {
    const bool us = p.info.units == units::System::us_customary;
    const auto &pt = d.result.points[i];
    const auto &fp = pt.longest_flow_path;
    CalcLines lines;
    const Unit lu = us ? Unit::ft : Unit::m;
    auto len = [&](std::string symbol, double m) {
        return qty(std::move(symbol), us ? units::m_to_ft(m) : m, lu);
    };
    auto area = [&](std::string symbol, double m2) {
        return us ? qty(std::move(symbol), units::m2_to_acre(m2), Unit::ac)
                  : qty(std::move(symbol), units::m2_to_ha(m2), Unit::ha);
    };
    const Unit su = us ? Unit::ft_per_ft : Unit::m_per_m;
    // Coordinates in the unit of the DEM file's own CRS, as the engineer's survey gives them.
    const double crs_m = d.dem.horizontal_unit_m > 0.0 ? d.dem.horizontal_unit_m : 1.0;
    const Unit cu = crs_unit(d.dem.horizontal_unit);
    auto coord = [&](std::string symbol, double m) {
        return qty(std::move(symbol), m / crs_m, cu, Shown::fixed(2));
    };
    lines.note(point_given, {coord("x", pt.given_x), coord("y", pt.given_y),
                             word("points", p.inputs.design_points->given)});
    add_snap_lines(lines, p, pt, coord);
    lines.note(area_note, {}, area("A", pt.area_m2));
    if (!pt.upstream_points.empty()) {
        std::vector<std::vector<Quantity>> upstream;
        for (auto k : d.all_upstream[i]) {
            upstream.push_back({word("id", d.result.points[k].id)});
        }
        lines.note(local_area_note, {}, area("A", pt.local_area_m2)).rows = std::move(upstream);
    }
    lines.note(length_note, {}, len("L", fp.length_m));
    lines.note(top_note, {}, len("Z", fp.elevation_top_m));
    lines.note(outlet_note, {}, len("Z", fp.elevation_outlet_m));
    lines.calc(slope_calc,
               {len("Ztop", fp.elevation_top_m), len("Zoutlet", fp.elevation_outlet_m),
                len("L", fp.length_m)},
               qty("S", fp.slope_m_per_m, su));
    lines.note(slope_10_85_note, {}, qty("S", fp.slope_10_85_m_per_m, su));
    lines.note(mean_slope_note, {}, qty("S", pt.mean_slope_m_per_m, su));
    for (const auto &w : pt.warnings) {
        lines.warn(delineation_warning, {word("message", w)});
    }
    return lines;
}

/// The publications of the terrain lines, for the references page.
std::vector<report::Reference> terrain_references() {
    return {
        {"O'Callaghan & Mark 1984",
         "O'Callaghan, J.F. and Mark, D.M. (1984). The extraction of drainage networks from "
         "digital elevation data. Computer Vision, Graphics, and Image Processing 28, 323-344."},
        {"Barnes et al. 2014",
         "Barnes, R., Lehman, C. and Mulla, D. (2014). Priority-flood: an optimal "
         "depression-filling and watershed-labeling algorithm for digital elevation models. "
         "Computers & Geosciences 62, 117-127."},
        {"Horn (1981)", "Horn, B.K.P. (1981). Hill shading and the reflectance map. Proceedings "
                        "of the IEEE 69(1), 14-47."},
    };
}

/// "project.toml:45: [settings] snap_radius_m" (no line when the key is not given).
std::string settings_key(const Project &p, std::string_view key, std::size_t line) {
    return line == 0 ? fmt::format("{}: [settings] {}", p.file.string(), key)
                     : fmt::format("{}:{}: [settings] {}", p.file.string(), line, key);
}

/// The figures of one design point's snap, for results.json and the sheet.
report::SnapFigures snap_figures(const Project &p, const terrain::DesignPointTerrain &pt) {
    report::SnapFigures f;
    f.rule = p.settings.snap;
    f.radius_m = p.settings.snap_radius_m;
    f.stream_threshold_m2 = p.settings.snap_stream_threshold_m2;
    f.given_cell_area_m2 = pt.given_cell_area_m2;
    f.snapped_area_m2 = pt.accumulation_m2;
    f.min_area_within_radius_m2 = pt.min_area_within_radius_m2;
    f.max_area_within_radius_m2 = pt.max_area_within_radius_m2;
    f.no_stream_within_radius = pt.no_stream_within_radius;
    f.direction = terrain::compass_direction(pt.snapped_x - pt.given_x, pt.snapped_y - pt.given_y);
    f.area_factor = p.settings.snap_area_factor;
    return f;
}

/// An area the engineer expects for a design point, and where it is given.
struct ExpectedArea {
    std::string id;
    double area_m2 = 0.0;
    std::string where; ///< for the message: the key or field with its file and line or feature
    std::string key;   ///< the key or field alone
};

/// Every expected area: from [[methods.point]] and from the design point layer's field.
std::vector<ExpectedArea> expected_areas(const Project &p, const Delineation &d) {
    std::vector<ExpectedArea> out;
    for (const auto &o : p.methods.points) {
        if (o.expected_area_m2) {
            out.push_back({o.id, *o.expected_area_m2,
                           fmt::format("{}:{}: [[methods.point]] {}", p.file.string(), o.line,
                                       o.expected_area_key),
                           o.expected_area_key});
        }
    }
    for (const auto &pt : d.given_points) {
        if (pt.expected_area_m2) {
            out.push_back({pt.id, *pt.expected_area_m2,
                           fmt::format("{}: feature {}: field '{}'", d.points_source, pt.fid,
                                       d.expected_area_field),
                           d.expected_area_field});
        }
    }
    return out;
}

/// Refuses (all at once) the design points whose delineated catchment lies outside [settings]
/// expected_area_tolerance_percent of an area the project expects.
void check_expected_areas(const Project &p, const Delineation &d) {
    const bool us = p.info.units == units::System::us_customary;
    const auto area = [&](double m2) {
        return us ? fmt::format("{} ac", sig(units::m2_to_acre(m2)))
                  : fmt::format("{} ha", sig(units::m2_to_ha(m2)));
    };
    const auto length = [&](double m) {
        return us ? fmt::format("{:.1f} ft", units::m_to_ft(m)) : fmt::format("{:.1f} m", m);
    };
    const double tol = p.settings.expected_area_tolerance_percent;
    Problems problems;
    for (const ExpectedArea &e : expected_areas(p, d)) {
        const auto it = std::find_if(d.result.points.begin(), d.result.points.end(),
                                     [&](const auto &pt) { return pt.id == e.id; });
        if (it == d.result.points.end()) { // never silently unchecked
            std::vector<std::string> ids;
            for (const auto &pt : d.result.points) {
                ids.push_back(pt.id);
            }
            const std::string hint = closest_match(e.id, ids);
            problems.add(input_message(
                e.where,
                fmt::format("an expected area is given for design point '{}', which is not in "
                            "{}{}",
                            e.id, d.points_source,
                            hint.empty() ? "" : fmt::format(" (did you mean '{}'?)", hint)),
                "the id of a design point of [inputs] design_points"));
            continue;
        }
        if (std::abs(it->area_m2 - e.area_m2) <= tol / 100.0 * e.area_m2) {
            continue;
        }
        problems.add(input_message(
            e.where,
            fmt::format("design point '{}': the delineated catchment is {}, {} than the expected "
                        "{} by more than {} % ([settings] expected_area_tolerance_percent); the "
                        "point was snapped {}{} ([settings] snap = \"{}\")",
                        e.id, area(it->area_m2), it->area_m2 > e.area_m2 ? "larger" : "smaller",
                        area(e.area_m2), tol, length(it->snap_distance_m), move_direction(*it),
                        option_key(snap_rule_options, p.settings.snap)),
            fmt::format("a catchment from {} to {}: check the point's location and [settings] "
                        "snap and snap_radius_m, or correct {}",
                        area(std::max(0.0, e.area_m2 * (1.0 - tol / 100.0))),
                        area(e.area_m2 * (1.0 + tol / 100.0)), e.key)));
    }
    problems.throw_if_any();
}

/// The breach line nearest to each design point, for culverts without inverts in the table.
CulvertSites culvert_sites(const Project &p, const Delineation &d) {
    CulvertSites sites;
    if (!p.inputs.culvert_table || !p.inputs.breach_lines || d.breach_lines.empty()) {
        return sites;
    }
    const auto &g = d.dem.elevation_m;
    sites.reach_m =
        p.settings.snap_radius_m + std::hypot(g.transform.cell_dx(), g.transform.cell_dy());
    for (const auto &pt : d.result.points) {
        if (auto e = terrain::nearest_breach_ends(g, d.breach_lines, pt.given_x, pt.given_y)) {
            // The line as the project names its file ("'lines.gpkg' feature 3"), not by the
            // path of this machine.
            const auto at = e->line_id.rfind(": feature ");
            e->line_id =
                fmt::format("'{}'{}", p.inputs.breach_lines->given,
                            at == std::string::npos ? std::string() : e->line_id.substr(at + 1));
            sites.ends.emplace(pt.id, std::move(*e));
        }
    }
    return sites;
}

} // namespace

DemPoints compute_dem_points(const Project &p, const HydrologyTables &tables,
                             std::ostream *progress) {
    require_layers(p);
    DelineateOptions o;
    o.dem = p.inputs.dem->resolved;
    o.points = p.inputs.design_points->resolved;
    o.id_field = p.inputs.id_field;
    o.points_crs = declared_points_crs(p);
    o.snap_radius_m = p.settings.snap_radius_m;
    o.snap_rule = p.settings.snap;
    o.snap_stream_threshold_m2 = p.settings.snap_stream_threshold_m2;
    o.snap_area_factor = p.settings.snap_area_factor;
    o.snap_radius_key = settings_key(p, "snap_radius_m", p.settings.snap_radius_line);
    o.out_dir = p.output_dir; // not written to: delineate_catchments writes nothing
    if (p.inputs.breach_lines) {
        o.breach_lines = p.inputs.breach_lines->resolved;
    }
    const Delineation d = delineate_catchments(o, progress);
    check_expected_areas(p, d);
    const std::string &crs = d.dem.elevation_m.crs_wkt;

    if (progress != nullptr) {
        *progress << "catchpeak: weighting land cover and soils\n";
    }
    // Rasters of land cover or soils are read over the catchments' extent only.
    const io::Extent window = extent_of(d.total_wkb);
    const io::Extent dem_box = dem_extent(d.dem.elevation_m);
    io::LayerFacts land_cover_facts;
    io::LayerFacts soils_facts;
    const io::VectorLayer land_cover =
        land_input_over_dem(p, LandInput::land_cover, crs, window, dem_box, land_cover_facts);
    const io::VectorLayer soils =
        land_input_over_dem(p, LandInput::soils, crs, window, dem_box, soils_facts);
    const land::LandOverlay overlay(land_cover, soils, project_land_tables(p), overlay_settings(p));
    const CalcLines reprojections = reprojection_lines(p, d, land_cover_facts, soils_facts);

    DemPoints out;
    out.layers = d.layers;
    out.references = terrain_references();
    const std::size_t n = d.result.points.size();
    for (std::size_t i = 0; i < n; ++i) {
        const auto &pt = d.result.points[i];
        const auto &fp = pt.longest_flow_path;
        report::DesignPointResult dp;
        dp.id = pt.id;
        dp.given_xy = {pt.given_x, pt.given_y};
        dp.snapped_xy = {pt.snapped_x, pt.snapped_y};
        dp.snap_distance_m = pt.snap_distance_m;
        dp.snap = snap_figures(p, pt);
        dp.catchment.area_m2 = pt.area_m2;
        dp.catchment.local_area_m2 = pt.local_area_m2;
        dp.catchment.longest_flow_path_m = fp.length_m;
        dp.catchment.elevation_top_m = fp.elevation_top_m;
        dp.catchment.elevation_outlet_m = fp.elevation_outlet_m;
        dp.catchment.slope_flow_path = fp.slope_m_per_m;
        dp.catchment.slope_10_85 = fp.slope_10_85_m_per_m;
        dp.catchment.mean_slope = pt.mean_slope_m_per_m;
        for (auto k : d.all_upstream[i]) {
            dp.catchment.upstream_points.push_back(d.result.points[k].id);
        }
        dp.lines = reprojections;
        dp.lines.append(terrain_lines(p, d, i));
        if (i == 0) {
            dp.lines.append(overlay.layer_warnings());
        }
        const land::CatchmentLand total =
            overlay.weight(d.total_wkb[i], pt.id, pt.mean_slope_m_per_m);
        dp.land = total.weighting;
        dp.lines.append(total.lines);
        if (!pt.upstream_points.empty() && !d.local_wkb[i].empty()) {
            const land::CatchmentLand local =
                overlay.weight(d.local_wkb[i], pt.id + " local", pt.mean_slope_m_per_m);
            dp.lines.note(local_weighting_note);
            dp.lines.append(local.lines);
        }
        dp.map = make_map(d, i);

        PointInputs in;
        in.restate_inputs = false; // the terrain and land lines above give them
        in.area_m2 = pt.area_m2;
        in.longest_flow_path_m = fp.length_m;
        in.slope = fp.slope_m_per_m;
        in.mean_slope = pt.mean_slope_m_per_m;
        in.profile = flow_path_profile(fp, d.dem.elevation_m);
        in.profile_source = "DEM as given (before conditioning), along the longest flow path; "
                            "elevations linear between cell centres";
        if (std::isfinite(dp.land.c_weighted)) {
            in.c = dp.land.c_weighted;
        }
        if (std::isfinite(dp.land.cn_weighted)) {
            in.cn = dp.land.cn_weighted;
        }
        in.land_parts = land_parts_of(dp.land);
        in.source = "from the lines above: delineation (DEM) and land weighting";
        compute_point_hydrology(p, in, tables, dp);
        out.points.push_back(std::move(dp));
    }
    out.culvert_sites = culvert_sites(p, d);
    return out;
}

void check_dem_inputs(const Project &p, Problems &problems) {
    auto collect = [&](auto &&f) {
        try {
            f();
        } catch (const InputError &e) {
            problems.add(e.what());
        }
    };
    collect([&] { require_layers(p); });
    if (!problems.empty()) {
        return;
    }
    std::string crs;
    io::Extent dem_box;
    collect([&] {
        const io::Dem dem = io::read_dem(p.inputs.dem->resolved);
        crs = dem.elevation_m.crs_wkt;
        dem_box = dem_extent(dem.elevation_m);
        const auto [min_x, min_y, max_x, max_y] = dem_box;
        const io::DesignPointLayer pts = io::read_design_points(
            p.inputs.design_points->resolved, p.inputs.id_field, crs, declared_points_crs(p));
        require_over_dem(pts.extent, dem_box, pts.source, design_points_named(pts));
        for (const auto &pt : pts.points) {
            if (!(pt.x >= min_x && pt.x < max_x && pt.y > min_y && pt.y <= max_y)) {
                problems.add(input_message(
                    fmt::format("{}: feature {}", pts.source, pt.fid),
                    fmt::format("design point '{}' at ({:.3f}, {:.3f}) lies outside the DEM "
                                "extent",
                                pt.id, pt.x, pt.y),
                    fmt::format("points inside the DEM extent, x {:.3f} to {:.3f}, y {:.3f} "
                                "to {:.3f}",
                                min_x, max_x, min_y, max_y)));
            }
        }
    });
    if (crs.empty()) {
        return;
    }
    collect([&] {
        // A raster is read over the DEM's extent and its codes checked, without polygons.
        io::LayerFacts facts;
        LandClasses classes;
        const io::VectorLayer land_cover = land_input_over_dem(
            p, LandInput::land_cover, crs, dem_box, dem_box, facts, false, &classes);
        const io::VectorLayer soils =
            land_input_over_dem(p, LandInput::soils, crs, dem_box, dem_box, facts, false);
        const land::LandTables tables = project_land_tables(p);
        const land::LandOverlay overlay(land_cover, soils, tables, overlay_settings(p));
        (void)overlay;
        // Every class of the layer, and the class of uncovered land, in every table, before
        // any computation (a run would stop at the first catchment that holds one).
        if (const auto *c = std::get_if<project::UncoveredAsClass>(&p.settings.uncovered_land)) {
            classes.uses.push_back({c->land_class, 0, std::nan(""),
                                    fmt::format("{}: [settings] uncovered_land", p.file.string())});
        }
        check_classes_in_tables(classes, tables, p.info.units, problems);
    });
}

} // namespace catchpeak::app
