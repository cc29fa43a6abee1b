// SPDX-License-Identifier: MIT
#include "catchpeak/app/catchment_land.hpp"

#include "catchpeak/app/land_inputs.hpp"

#include "catchpeak/core/calc_line.hpp"
#include "catchpeak/core/error.hpp"

#include <fmt/format.h>

#include <cmath>
#include <map>
#include <set>
#include <utility>

namespace catchpeak::app {

using project::closest_match;
using project::Problems;
using project::Project;

namespace {

/// The note naming the land parts of a catchment: `{table}` the land table as given, `{lines}`
/// its lines of the parts.
constexpr Formula land_parts_note{"point.land_parts",
                                  "Land parts",
                                  "",
                                  "{table}, {lines}: class, soil group and area of each part",
                                  Ref::project_input,
                                  ""};

/// "lines 3, 4 and 7" / "line 3" of the parts.
std::string lines_of(const std::vector<TableLandPart> &parts) {
    std::vector<std::size_t> lines;
    lines.reserve(parts.size());
    for (const auto &p : parts) {
        lines.push_back(p.line);
    }
    if (lines.size() == 1) {
        return fmt::format("line {}", lines.front());
    }
    const std::size_t last = lines.back();
    lines.pop_back();
    return fmt::format("lines {} and {}", fmt::join(lines, ", "), last);
}

/// The classes of the parts, with how many parts and how much area each has (the classes'
/// absence from a table is checked by check_classes_in_tables).
LandClasses part_classes(const std::vector<const TableLandPart *> &parts,
                         const std::string &land_file) {
    LandClasses out;
    out.noun = "part";
    std::map<std::string, std::size_t, std::less<>> index;
    for (const TableLandPart *part : parts) {
        const auto [it, added] = index.emplace(part->land_class, out.uses.size());
        if (added) {
            out.uses.push_back({part->land_class, 0, 0.0,
                                fmt::format("{}:{}: column 'class'", land_file, part->line)});
        }
        ++out.uses[it->second].count;
        out.uses[it->second].area_m2 += part->area_m2;
    }
    return out;
}

/// The C table has one row for the part's soil group at the catchment's slope. Adds a problem
/// naming the land table's line otherwise.
void check_class(const TableLandPart &part, const TableCatchment &c, const land::LandTables &tables,
                 const std::string &land_file, Problems &problems) {
    if (tables.c && tables.c->has_class(part.land_class)) {
        try {
            (void)tables.c->lookup(part.land_class, part.soil.group, 100.0 * c.slope);
        } catch (const InputError &e) {
            problems.add(input_message(
                fmt::format("{}:{}: column 'soil_group'", land_file, part.line),
                fmt::format("catchment '{}', class '{}', soil group {}: {}", part.id,
                            part.land_class, land::to_string(part.soil.group), e.what())));
        }
    }
}

} // namespace

LandPartsById check_land_parts(const Project &p, const std::vector<TableCatchment> &catchments,
                               const std::vector<TableLandPart> &parts,
                               const land::LandTables &tables, Problems &problems) {
    const std::string land_file =
        p.inputs.catchment_land_table ? p.inputs.catchment_land_table->resolved.string() : "";
    const std::string table_file =
        p.inputs.catchment_table ? p.inputs.catchment_table->resolved.string() : "";
    std::map<std::string, const TableCatchment *> by_id;
    std::vector<std::string> ids;
    for (const auto &c : catchments) {
        by_id.emplace(c.id, &c);
        ids.push_back(c.id);
    }
    LandPartsById out;
    std::vector<const TableLandPart *> known;
    for (const auto &part : parts) {
        const auto it = by_id.find(part.id);
        if (it == by_id.end()) {
            const std::string hint = closest_match(part.id, ids);
            problems.add(input_message(
                fmt::format("{}:{}: column 'id'", land_file, part.line),
                fmt::format("catchment '{}' is not in the catchment table {}{}", part.id,
                            table_file,
                            hint.empty() ? "" : fmt::format(" (did you mean '{}'?)", hint)),
                "an id of the catchment table"));
            continue;
        }
        check_class(part, *it->second, tables, land_file, problems);
        known.push_back(&part);
        out[part.id].push_back(part);
    }
    check_classes_in_tables(part_classes(known, land_file), tables, p.info.units, problems);
    for (const auto &[id, own] : out) {
        const TableCatchment &c = *by_id.at(id);
        if (c.c || c.cn) {
            const std::string given = c.c && c.cn ? "'c' and 'cn'" : c.c ? "'c'" : "'cn'";
            problems.add(input_message(
                fmt::format("{}:{}", table_file, c.line),
                fmt::format("catchment '{}' gives {} and has land parts ({}, {}); it is not "
                            "clear which to use",
                            id, given, land_file, lines_of(own)),
                "either 'c' and 'cn' in the catchment table, or land parts in the land table, "
                "not both"));
        }
        double sum_m2 = 0.0;
        for (const auto &part : own) {
            sum_m2 += part.area_m2;
        }
        if (std::abs(sum_m2 - c.area_m2) > land_parts_area_tolerance_share * c.area_m2) {
            // Both sums in the unit of the land table's area column.
            const auto &first = own.front();
            const double per_m2 = first.area_given / first.area_m2;
            const std::string unit = first.area_column.substr(std::string("area_").size());
            problems.add(input_message(
                fmt::format("{}:{}: catchment '{}' ({})", land_file, first.line, id, lines_of(own)),
                fmt::format("the land parts add up to {} {}, the catchment table gives {} {} "
                            "({}:{}), a difference of {} %",
                            sig(sum_m2 * per_m2), unit, sig(c.area_m2 * per_m2), unit, table_file,
                            c.line, sig(100.0 * (sum_m2 - c.area_m2) / c.area_m2, 3)),
                fmt::format("parts that add up to the catchment's area within {:g} % (common "
                            "practice, no source)",
                            100.0 * land_parts_area_tolerance_share)));
        }
    }
    return out;
}

LandPartsById read_land_parts(const Project &p, const std::vector<TableCatchment> &catchments,
                              Problems &problems) {
    if (!p.inputs.catchment_land_table) {
        return {};
    }
    try {
        const auto parts = read_catchment_land_table(p.inputs.catchment_land_table->resolved,
                                                     p.settings.dual_soil_group ==
                                                         project::DualSoilGroup::drained);
        return check_land_parts(p, catchments, parts, project_land_tables(p), problems);
    } catch (const InputError &e) {
        problems.add(e.what());
    }
    return {};
}

land::PartsWeighting weight_table_catchment(const Project &p, const TableCatchment &c,
                                            const std::vector<TableLandPart> &parts,
                                            const land::LandTables &tables) {
    const std::string land_given =
        p.inputs.catchment_land_table ? p.inputs.catchment_land_table->given : "";
    const std::string table_given = p.inputs.catchment_table ? p.inputs.catchment_table->given : "";
    std::vector<land::PartArea> areas;
    areas.reserve(parts.size());
    std::set<land::DualGroup> duals;
    for (const auto &part : parts) {
        areas.push_back({part.land_class, part.soil.group, part.area_m2,
                         fmt::format("{}, line {}", land_given, part.line)});
        if (part.soil.dual) {
            duals.insert({part.soil_group_text, std::string(land::to_string(part.soil.group))});
        }
    }
    land::PartsContext pc;
    pc.label = c.id;
    pc.catchment_area_m2 = c.area_m2;
    const std::string rows = fmt::format("{}, {}", land_given, lines_of(parts));
    pc.input_notes.note(land_parts_note,
                        {word("table", land_given), word("lines", lines_of(parts))});
    pc.parts_source = fmt::format("project input ({})", rows);
    pc.area_check_source =
        fmt::format("project input ({}; {}, line {})", rows, table_given, c.line);
    pc.dual_groups.assign(duals.begin(), duals.end());
    pc.drained = p.settings.dual_soil_group == project::DualSoilGroup::drained;
    pc.slope_percent = 100.0 * c.slope;
    pc.slope_text = "slope of the longest flow path (a catchment table gives no mean slope of "
                    "the catchment)";
    pc.slope_source = fmt::format("project input ({}, line {})", table_given, c.line);
    pc.units = p.info.units;
    pc.min_part_area_m2 = p.settings.min_land_part_m2;
    return land::weight_parts(areas, tables, pc);
}

} // namespace catchpeak::app
