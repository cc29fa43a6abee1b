// SPDX-License-Identifier: MIT
#include "catchpeak/app/land_inputs.hpp"

#include "catchpeak/app/inputs.hpp"

#include "catchpeak/core/calc_line.hpp"
#include "catchpeak/core/csv.hpp"
#include "catchpeak/core/error.hpp"
#include "catchpeak/core/units.hpp"
#include "catchpeak/io/polygonize.hpp"
#include "catchpeak/io/vector.hpp"
#include "catchpeak/io/wkb.hpp"
#include "catchpeak/land/tables.hpp"

#include <fmt/format.h>

#include <algorithm>
#include <cmath>
#include <limits>
#include <map>

namespace catchpeak::app {

using project::InputPath;
using project::Problems;
using project::Project;

namespace {

/// What differs between the land-cover input and the soils input.
struct Kind {
    const InputPath &input;
    const std::optional<InputPath> &codes;
    std::string key;         ///< "land_cover" or "soils"
    std::string codes_key;   ///< "land_cover_codes" or "soil_group_codes"
    std::string field;       ///< the class or soil group field of the polygons
    std::string name_column; ///< column of the code table: "class" or "soil_group"
    std::string names;       ///< "classes" or "soil groups"
};

Kind kind_of(const Project &p, LandInput which) {
    if (which == LandInput::soils) {
        return {*p.inputs.soils,    p.inputs.soil_group_codes, "soils",
                "soil_group_codes", p.inputs.soil_group_field, "soil_group",
                "soil groups"};
    }
    return {*p.inputs.land_cover,
            p.inputs.land_cover_codes,
            "land_cover",
            "land_cover_codes",
            p.inputs.class_field,
            "class",
            "classes"};
}

/// "10.00 x 10.00 m" (or "0.0001000 x 0.0001000 degree"): 4 significant figures, as the sheet.
std::string cells(double x, double y, const std::string &unit) {
    const std::string u = unit == "metre" || unit == "meter" ? "m" : unit;
    return fmt::format("{} x {} {}", sig(x), sig(y), u);
}

/// `source` (a file name as io gives it, resolved against the project's folder) with the file
/// named as the project file gives it, so that the lines on the sheet and in results.json are the
/// same whatever folder catchpeak runs from.
std::string as_given(const std::string &source, const InputPath &in) {
    const std::string resolved = in.resolved.string();
    if (!resolved.empty() && source.rfind(resolved, 0) == 0) {
        return in.given + source.substr(resolved.size());
    }
    return source;
}

/// A polygon layer in the DEM's CRS. A layer without a CRS is refused: C and CN of a catchment
/// must not hang on a guess of where its polygons lie.
io::VectorLayer read_vector_input(const Project &p, const Kind &k, const std::string &crs,
                                  io::LayerFacts *facts) {
    const std::string where =
        fmt::format("{}:{}: [inputs] {} '{}'", p.file.string(), k.input.line, k.key, k.input.given);
    if (k.codes) {
        throw_input_error(
            fmt::format("{}:{}: [inputs] {}", p.file.string(), k.codes->line, k.codes_key),
            fmt::format("'{}' is a vector layer, whose polygons carry their {} in field '{}'; a "
                        "code table applies to a raster of codes only",
                        k.input.given, k.names, k.field),
            fmt::format("no '{}' for a polygon layer, or a raster of codes in '{}'", k.codes_key,
                        k.key));
    }
    std::vector<std::string> notes;
    io::VectorLayer layer = io::read_vector_layer(k.input.resolved, crs, {}, &notes, {}, facts);
    layer.source = as_given(layer.source, k.input);
    for (const auto &n : notes) {
        if (n.find("has no coordinate reference system") != std::string::npos) {
            throw_input_error(where, "the layer has no coordinate reference system",
                              "a layer with its CRS (a GeoPackage, or a shapefile with its .prj); "
                              "it is reprojected to the DEM's CRS when it differs");
        }
    }
    return layer;
}

/// The area of polygons given as ISO WKB (outer rings less holes); NaN when it cannot be read.
double wkb_area_m2(const std::vector<unsigned char> &wkb) {
    try {
        double area = 0.0;
        for (const auto &poly : io::wkb_polygon_rings(wkb)) {
            for (std::size_t r = 0; r < poly.size(); ++r) {
                double twice = 0.0;
                const auto &ring = poly[r];
                for (std::size_t i = 0; i + 1 < ring.size(); ++i) {
                    twice +=
                        ring[i].first * ring[i + 1].second - ring[i + 1].first * ring[i].second;
                }
                area += (r == 0 ? 0.5 : -0.5) * std::abs(twice);
            }
        }
        return area;
    } catch (const std::exception &) {
        return std::numeric_limits<double>::quiet_NaN(); // the overlay names the feature
    }
}

/// The classes of a polygon layer's class field, in the order first found.
LandClasses vector_classes(const io::VectorLayer &layer, const std::string &field) {
    LandClasses out;
    out.noun = "feature";
    std::map<std::string, std::size_t, std::less<>> index;
    for (const auto &f : layer.features) {
        const auto attr = f.attributes.find(field);
        if (attr == f.attributes.end() || attr->second.empty()) {
            continue; // the overlay refuses it, naming the feature
        }
        const auto [it, added] = index.emplace(attr->second, out.uses.size());
        if (added) {
            out.uses.push_back({attr->second, 0, 0.0,
                                fmt::format("{}: {} {}", layer.source, layer.feature_noun, f.fid)});
        }
        auto &use = out.uses[it->second];
        ++use.count;
        use.area_m2 += wkb_area_m2(f.wkb);
    }
    return out;
}

/// "12.34 ha" or "30.49 ac", as the sheet gives areas; "area not known" for NaN.
std::string area_text(double area_m2, units::System system) {
    if (!std::isfinite(area_m2)) {
        return "area not known";
    }
    return system == units::System::si ? fmt::format("{} ha", sig(units::m2_to_ha(area_m2)))
                                       : fmt::format("{} ac", sig(units::m2_to_acre(area_m2)));
}

} // namespace

void check_classes_in_tables(const LandClasses &classes, const land::LandTables &tables,
                             units::System system, Problems &problems) {
    struct Table {
        std::vector<std::string> names;
        const land::TableInfo *info;
        std::string_view kind;
        std::string_view key;
    };
    std::vector<Table> list;
    if (tables.c) {
        list.push_back({tables.c->classes(), &tables.c->info(), "runoff coefficient", "c_table"});
    }
    if (tables.cn) {
        list.push_back({tables.cn->classes(), &tables.cn->info(), "curve number", "cn_table"});
    }
    if (tables.impervious) {
        list.push_back({tables.impervious->classes(), &tables.impervious->info(),
                        "impervious share", "impervious_table"});
    }
    for (const auto &use : classes.uses) {
        for (const auto &t : list) {
            if (std::binary_search(t.names.begin(), t.names.end(), use.land_class)) {
                continue;
            }
            const std::string hint = project::closest_match(use.land_class, t.names);
            const std::string amount =
                use.count == 0
                    ? std::string()
                    : fmt::format(" ({} {}{}, {})", use.count, classes.noun,
                                  use.count == 1 ? "" : "s", area_text(use.area_m2, system));
            problems.add(input_message(
                use.where,
                fmt::format("land-cover class '{}'{} is not in the {} table {}{}", use.land_class,
                            amount, t.kind, t.info->name,
                            hint.empty() ? "" : fmt::format(" (did you mean '{}'?)", hint)),
                fmt::format("a class of that table, or the project's own table ([inputs] {})",
                            t.key)));
        }
    }
}

io::Extent extent_of(const std::vector<std::vector<unsigned char>> &polygons) {
    constexpr double inf = std::numeric_limits<double>::infinity();
    io::Extent e{inf, inf, -inf, -inf};
    for (const auto &wkb : polygons) {
        for (const auto &poly : io::wkb_polygon_rings(wkb)) {
            for (const auto &[x, y] : poly.front()) {
                e.min_x = std::min(e.min_x, x);
                e.min_y = std::min(e.min_y, y);
                e.max_x = std::max(e.max_x, x);
                e.max_y = std::max(e.max_y, y);
            }
        }
    }
    return e.min_x <= e.max_x ? e : io::Extent{};
}

std::map<std::int64_t, std::string> read_code_table(const InputPath &table,
                                                    const std::string &name_column) {
    const CsvTable t = read_csv(table.resolved);
    const std::size_t code_col = t.column("code");
    const std::size_t name_col = t.column(name_column);
    std::map<std::int64_t, std::string> names;
    std::map<std::int64_t, std::size_t> line_of;
    for (const auto &row : t.rows) {
        const double v = t.number(row, code_col);
        if (v != std::floor(v) || std::abs(v) > 9007199254740992.0) {
            throw_input_error(t.where(row, code_col),
                              fmt::format("'{}' is not an integer code", t.text(row, code_col)),
                              "the integer codes of the raster");
        }
        const auto code = static_cast<std::int64_t>(v);
        const std::string &name = t.text(row, name_col);
        if (name.empty()) {
            throw_input_error(t.where(row, name_col), fmt::format("code {} has no name", code),
                              fmt::format("a {} for every code", name_column));
        }
        if (const auto it = line_of.find(code); it != line_of.end()) {
            throw_input_error(t.where(row, code_col),
                              fmt::format("code {} is listed twice (lines {} and {})", code,
                                          it->second, row.line),
                              "each code once");
        }
        line_of.emplace(code, row.line);
        names.emplace(code, name);
    }
    return names;
}

io::VectorLayer read_land_input(const Project &p, LandInput which, const std::string &crs_wkt,
                                const io::Extent &window, bool polygons, io::LayerFacts *facts,
                                LandClasses *classes) {
    const Kind k = kind_of(p, which);
    if (io::data_kind(k.input.resolved) == io::DataKind::vector) {
        io::VectorLayer layer = read_vector_input(p, k, crs_wkt, facts);
        if (classes != nullptr) {
            *classes = vector_classes(layer, k.field);
        }
        return layer;
    }
    const io::ClassRaster r = io::read_class_raster(k.input.resolved, crs_wkt, window, k.field);

    // Names of the codes: the project's table when it gives one, else the raster's own.
    std::map<std::int64_t, std::string> names;
    std::string names_from;
    if (k.codes) {
        names = read_code_table(*k.codes, k.name_column);
        names_from = fmt::format("the code table '{}' ([inputs] {})", k.codes->given, k.codes_key);
    } else if (!r.names_from.empty()) {
        names = r.names;
        names_from = r.names_from;
    } else {
        throw_input_error(
            r.source,
            fmt::format("is a raster of codes ([inputs] {}) without category names or an "
                        "attribute table that names them, and the project gives no code table",
                        k.key),
            fmt::format("'{}' in [inputs]: a CSV with columns code,{}, one row per code; or a "
                        "raster whose attribute table has a column '{}' or a name column, or "
                        "that has category names",
                        k.codes_key, k.name_column, k.field));
    }
    for (std::size_t i = 0; i < r.codes.size(); ++i) {
        const std::int64_t code = r.codes[i];
        const auto it = names.find(code);
        const std::string what =
            fmt::format("code {} ({} cells within the catchments' extent)", code, r.cell_counts[i]);
        if (it == names.end()) {
            throw_input_error(r.source, fmt::format("{} is not named by {}", what, names_from),
                              fmt::format("a name for every code of the raster{}",
                                          k.codes ? fmt::format(" (a row code,{} in '{}')",
                                                                k.name_column, k.codes->given)
                                                  : std::string()));
        }
        if (which == LandInput::soils) {
            (void)land::read_soil_group(
                it->second, p.settings.dual_soil_group == project::DualSoilGroup::drained,
                fmt::format("{}: {}, named '{}' by {}", r.source, what, it->second, names_from));
        }
    }

    io::VectorLayer layer;
    layer.crs_wkt = crs_wkt;
    layer.feature_noun = "code";
    if (facts != nullptr) {
        facts->extent = r.extent;
        facts->reprojection.reset();
        if (r.reprojected) {
            facts->reprojection = io::Reprojection{r.file_crs_name, io::crs_name(crs_wkt), {}};
        }
    }
    if (classes != nullptr) {
        classes->noun = "cell";
        classes->uses.clear();
        for (std::size_t i = 0; i < r.codes.size(); ++i) {
            const auto n = r.cell_counts[i];
            classes->uses.push_back(
                {names.at(r.codes[i]), n, static_cast<double>(n) * r.cell_x_m * r.cell_y_m,
                 fmt::format("{}: code {}", as_given(r.source, k.input), r.codes[i])});
        }
    }
    const std::string size = cells(r.cell_x_m, r.cell_y_m, "metre");
    layer.source =
        r.reprojected
            ? fmt::format("{} (raster of {} cells in {}, reprojected to {} cells in the DEM's "
                          "CRS by nearest neighbour; codes to {} by {})",
                          as_given(r.source, k.input),
                          cells(r.file_cell_x, r.file_cell_y, r.file_unit), r.file_crs_name, size,
                          k.names, names_from)
            : fmt::format("{} (raster of {} cells; codes to {} by {})", as_given(r.source, k.input),
                          size, k.names, names_from);
    if (polygons) {
        for (auto &patch : io::polygonize_patches(r.labels)) {
            const std::int64_t code = r.codes[patch.label - 1];
            io::VectorFeature f;
            f.fid = code;
            f.wkb = std::move(patch.wkb);
            f.attributes.emplace(k.field, names.at(code));
            layer.features.push_back(std::move(f));
        }
    }
    return layer;
}

land::LandTables project_land_tables(const Project &p) {
    const auto base = config_dir() / "land";
    const auto own = [&](const std::optional<InputPath> &table, const char *shipped) {
        return table ? table->resolved : base / shipped;
    };
    return land::read_land_tables(own(p.inputs.c_table, "runoff_coefficients.csv"),
                                  own(p.inputs.cn_table, "curve_numbers.csv"),
                                  own(p.inputs.impervious_table, "impervious_shares.csv"));
}

std::vector<LandPart> land_parts_of(const report::LandWeighting &w) {
    std::vector<LandPart> parts;
    parts.reserve(w.parts.size());
    for (const auto &part : w.parts) {
        parts.push_back({fmt::format("{}, soil group {}", part.land_class, part.soil_group),
                         part.area_m2, part.cn});
    }
    return parts;
}

} // namespace catchpeak::app
