// SPDX-License-Identifier: MIT
#include "catchpeak/land/weighting.hpp"

#include "catchpeak/core/error.hpp"

#include <fmt/format.h>

#include <array>
#include <cmath>
#include <limits>
#include <map>
#include <utility>

namespace catchpeak::land {

namespace {

constexpr double nan = std::numeric_limits<double>::quiet_NaN();

// ---- the formulas of the lines --------------------------------------------------------------

constexpr Formula c_table_note{
    "land.c_table", "Runoff coefficient table", "", "{table}", Ref::none, "{table_source}"};
constexpr Formula cn_table_note{"land.cn_table", "Curve number table", "", "{table}",
                                Ref::none,       "{table_source}"};
constexpr Formula impervious_table_note{
    "land.impervious_table", "Impervious share table", "", "{table}", Ref::none, "{table_source}"};
constexpr Formula dual_groups_drained{
    "land.dual_groups_drained",
    "Dual hydrologic soil groups",
    "",
    "{[{g} -> {used}|, ]} (setting drained = true: the drained group, the first letter)",
    Ref::project_setting,
    ""};
constexpr Formula dual_groups_undrained{"land.dual_groups_undrained",
                                        "Dual hydrologic soil groups",
                                        "",
                                        "{[{g} -> {used}|, ]} (setting drained = false: group D)",
                                        Ref::project_setting,
                                        ""};
constexpr Formula slope_note{
    "land.slope", "Slope for the C slope bands", "", "{what}", Ref::none, ""};
constexpr Formula parts_merged{
    "land.parts_merged",
    "Parts below the minimum area added to the largest part",
    "",
    "{[{class}, soil group {group}: {a} {a:u}|; ]} added to {into}, soil group {into_group} "
    "(parts below {Amin} {Amin:u})",
    Ref::project_setting,
    " min_land_part_m2"};
constexpr Formula area_check{"land.area_check",
                             "Parts do not add up to the catchment",
                             "",
                             "the parts add up to {sum} {sum:u}, the catchment is {A} {A:u}",
                             Ref::none,
                             ""};

/// A part line; its numbers list the values of the tables given (see part_formula).
constexpr Formula part_with(std::string_view numbers) {
    return {"land.part",
            "Part {i}: {class}, soil group {group}",
            "A{i} = area of catchment, class {class} and soil group {group}",
            numbers,
            Ref::none,
            ""};
}
/// By the tables given: C (1), CN (2), impervious share (4).
constexpr std::array<Formula, 8> part_formulas{
    part_with("{P} % of the catchment"),
    part_with("C = {C}, {P} % of the catchment"),
    part_with("CN = {CN}, {P} % of the catchment"),
    part_with("C = {C}, CN = {CN}, {P} % of the catchment"),
    part_with("impervious {I} %, {P} % of the catchment"),
    part_with("C = {C}, impervious {I} %, {P} % of the catchment"),
    part_with("CN = {CN}, impervious {I} %, {P} % of the catchment"),
    part_with("C = {C}, CN = {CN}, impervious {I} %, {P} % of the catchment"),
};

constexpr Formula c_weighted{"land.c_weighted",
                             "Runoff coefficient, area-weighted",
                             "C = sum(Ai Ci) / sum(Ai)",
                             "C = ({[{A} x {C}| + ]}) / {At}",
                             Ref::none,
                             "area-weighted; C from {table}"};
constexpr Formula cn_composite{"land.cn_composite",
                               "Curve number, composite (area-weighted)",
                               "CN = sum(Ai CNi) / sum(Ai)",
                               "CN = ({[{A} x {CN}| + ]}) / {At}",
                               Ref::tr55_1986,
                               " ch. 2, composite CN; CN from {table}"};
constexpr Formula impervious_weighted{"land.impervious_weighted",
                                      "Impervious share, area-weighted",
                                      "I = sum(Ai Ii) / sum(Ai)",
                                      "I = ({[{A} x {I}| + ]}) / {At}",
                                      Ref::none,
                                      "area-weighted; shares from {table}"};

/// Gives a line the source of the caller.
CalcLine &cite(CalcLine &line, const LineSource &source) {
    line.ref = source.ref;
    line.pattern.where = source.where;
    line.inputs.insert(line.inputs.end(), source.inputs.begin(), source.inputs.end());
    return line;
}

// ---- the steps ------------------------------------------------------------------------------

/// Parts of the same class and soil group add into one, sorted by class then group.
struct PartSum {
    double area_m2 = 0.0;
    const PartArea *first = nullptr; ///< names the part in messages
};
using PartSums = std::map<std::pair<std::string, SoilGroup>, PartSum>;

PartSums sum_parts(const std::vector<PartArea> &parts, const std::string &label) {
    if (parts.empty()) {
        throw_input_error(fmt::format("catchment '{}'", label), "it has no land parts",
                          "at least one part (land-cover class, soil group, area)");
    }
    PartSums sums;
    for (const auto &p : parts) {
        if (!(p.area_m2 > 0.0) || !std::isfinite(p.area_m2)) {
            throw_input_error(p.origin,
                              fmt::format("the area of class '{}' in catchment '{}' is {} m2",
                                          p.land_class, label, p.area_m2),
                              "a positive area");
        }
        auto &sum = sums[{p.land_class, p.soil_group}];
        sum.area_m2 += p.area_m2;
        if (sum.first == nullptr) {
            sum.first = &p;
        }
    }
    return sums;
}

/// A part added to the largest part of its catchment.
struct MergedPart {
    std::string land_class;
    SoilGroup group = SoilGroup::d;
    double area_m2 = 0.0;
};

/// Adds the parts below `min_m2` to the largest part (the first of equal ones); returns them,
/// and the key of the part they went to.
std::pair<std::vector<MergedPart>, PartSums::key_type> merge_small_parts(PartSums &sums,
                                                                         double min_m2) {
    auto largest = sums.begin();
    for (auto it = sums.begin(); it != sums.end(); ++it) {
        if (it->second.area_m2 > largest->second.area_m2) {
            largest = it;
        }
    }
    std::vector<MergedPart> merged;
    for (auto it = sums.begin(); it != sums.end();) {
        if (it != largest && it->second.area_m2 < min_m2) {
            merged.push_back({it->first.first, it->first.second, it->second.area_m2});
            largest->second.area_m2 += it->second.area_m2;
            it = sums.erase(it);
        } else {
            ++it;
        }
    }
    return {std::move(merged), largest->first};
}

/// The line naming the parts added to the largest part.
void merged_line(CalcLines &lines, const std::vector<MergedPart> &merged,
                 const PartSums::key_type &into, const PartsContext &context) {
    if (merged.empty()) {
        return;
    }
    auto &l =
        lines.note(parts_merged, {word("into", into.first),
                                  word("into_group", std::string(to_string(into.second))),
                                  sheet_area("Amin", context.min_part_area_m2, context.units)});
    for (const auto &m : merged) {
        l.rows.push_back({word("class", m.land_class),
                          word("group", std::string(to_string(m.group))),
                          sheet_area("a", m.area_m2, context.units)});
    }
}

/// C, CN and impervious share of one part from the tables given (NaN for a table not given).
/// Sets `slope_used` when the C row is one of a class's slope bands.
report::LandPart look_up_part(const std::pair<std::string, SoilGroup> &key, const PartSum &sum,
                              const LandTables &tables, const PartsContext &context,
                              bool &slope_used) {
    const std::string &cls = key.first;
    const SoilGroup g = key.second;
    const auto require = [&](const auto &table, std::string_view kind) {
        if (!table.has_class(cls)) {
            throw_input_error(table.info().name,
                              fmt::format("land-cover class '{}' ({}, in catchment '{}') is not "
                                          "in this {} table",
                                          cls, sum.first->origin, context.label, kind),
                              "a table that lists every class of the land-cover layer (a project "
                              "may point to its own table)");
        }
    };
    report::LandPart part;
    part.land_class = cls;
    part.soil_group = std::string(to_string(g));
    part.area_m2 = sum.area_m2;
    part.c = nan;
    part.cn = nan;
    part.impervious_share = nan;
    if (tables.c) {
        require(*tables.c, "runoff coefficient");
        const auto &row = tables.c->lookup(cls, g, context.slope_percent);
        slope_used = slope_used || row.has_band();
        part.c = row.c;
    }
    if (tables.cn) {
        require(*tables.cn, "curve number");
        part.cn = tables.cn->cn(cls, g);
    }
    if (tables.impervious) {
        require(*tables.impervious, "impervious share");
        part.impervious_share = tables.impervious->lookup(cls).share;
    }
    return part;
}

/// The area-weighted values of the parts (NaN for a table not given) and the table names.
void weight(report::LandWeighting &w, const LandTables &tables, double total_m2) {
    const auto weighted = [&](auto member) {
        double acc = 0.0;
        for (const auto &p : w.parts) {
            acc += p.area_m2 * (p.*member);
        }
        return acc / total_m2;
    };
    w.c_weighted = tables.c ? weighted(&report::LandPart::c) : nan;
    w.cn_weighted = tables.cn ? weighted(&report::LandPart::cn) : nan;
    w.impervious_share = tables.impervious ? weighted(&report::LandPart::impervious_share) : nan;
    w.c_table = tables.c ? tables.c->info().name : "";
    w.cn_table = tables.cn ? tables.cn->info().name : "";
}

void table_note(CalcLines &lines, const Formula &f, const TableInfo &info) {
    lines.note(f, {word("table", info.name), word("table_source", info.source)});
}

/// The lines before the parts: the caller's notes, the tables, the dual soil groups, the slope
/// of the slope bands, the caller's warnings and the check of the parts' sum.
void input_lines(CalcLines &lines, const LandTables &tables, const PartsContext &context,
                 bool slope_used, double total_m2) {
    lines.append(context.input_notes);
    if (tables.c) {
        table_note(lines, c_table_note, tables.c->info());
    }
    if (tables.cn) {
        table_note(lines, cn_table_note, tables.cn->info());
    }
    if (tables.impervious) {
        table_note(lines, impervious_table_note, tables.impervious->info());
    }
    if (!context.dual_groups.empty()) {
        auto &l = lines.note(context.drained ? dual_groups_drained : dual_groups_undrained);
        for (const auto &g : context.dual_groups) {
            l.rows.push_back({word("g", g.written), word("used", g.used)});
        }
    }
    if (slope_used) {
        cite(lines.note(slope_note, {word("what", context.slope_text)},
                        qty("S", *context.slope_percent, Unit::percent)),
             context.slope_source);
    }
    lines.append(context.warnings);
    const double area_m2 = context.catchment_area_m2;
    if (std::abs(total_m2 - area_m2) > 1e-6 * area_m2) {
        cite(lines.warn(area_check, {sheet_area("sum", total_m2, context.units),
                                     sheet_area("A", area_m2, context.units)}),
             context.area_check_source);
    }
}

/// One line per part: its area, with its C, CN and impervious share.
void part_lines(CalcLines &lines, const report::LandWeighting &w, const LandTables &tables,
                const PartsContext &context, double total_m2) {
    const std::size_t given =
        (tables.c ? 1U : 0U) | (tables.cn ? 2U : 0U) | (tables.impervious ? 4U : 0U);
    for (std::size_t i = 0; i < w.parts.size(); ++i) {
        const auto &p = w.parts[i];
        std::vector<Quantity> inputs{
            qty("i", static_cast<double>(i + 1), Unit::none, Shown::integer()),
            word("class", p.land_class), word("group", p.soil_group)};
        if (tables.c) {
            inputs.push_back(qty("C", p.c));
        }
        if (tables.cn) {
            inputs.push_back(qty("CN", p.cn));
        }
        if (tables.impervious) {
            inputs.push_back(qty("I", 100.0 * p.impervious_share, Unit::percent));
        }
        inputs.push_back(qty("P", 100.0 * p.area_m2 / total_m2, Unit::percent));
        cite(lines.calc(part_formulas[given], std::move(inputs),
                        sheet_area("A", p.area_m2, context.units)),
             context.parts_source);
    }
}

/// The line of one weighted value: its terms area x value over the parts. `value` is the
/// quantity `symbol` of a part, in the unit of the result.
template <typename Value>
void weighted_line(CalcLines &lines, const Formula &f, const report::LandWeighting &w,
                   const TableInfo &table, double total_m2, units::System system, Quantity result,
                   const Value &value) {
    auto &l = lines.calc(f, {sheet_area("At", total_m2, system), word("table", table.name)},
                         std::move(result));
    for (const auto &p : w.parts) {
        l.rows.push_back({sheet_area("A", p.area_m2, system), value(p)});
    }
}

void weighted_lines(CalcLines &lines, const report::LandWeighting &w, const LandTables &tables,
                    units::System system, double total_m2) {
    if (tables.c) {
        weighted_line(lines, c_weighted, w, tables.c->info(), total_m2, system,
                      qty("C", w.c_weighted),
                      [](const report::LandPart &p) { return qty("C", p.c); });
    }
    if (tables.cn) {
        weighted_line(lines, cn_composite, w, tables.cn->info(), total_m2, system,
                      qty("CN", w.cn_weighted),
                      [](const report::LandPart &p) { return qty("CN", p.cn); });
    }
    if (tables.impervious) {
        weighted_line(lines, impervious_weighted, w, tables.impervious->info(), total_m2, system,
                      qty("I", 100.0 * w.impervious_share, Unit::percent),
                      [](const report::LandPart &p) {
                          return qty("I", 100.0 * p.impervious_share, Unit::percent);
                      });
    }
}

} // namespace

LineSource::LineSource(Ref r, std::string where_template, std::vector<Quantity> where_inputs)
    : ref(r), where(std::move(where_template)), inputs(std::move(where_inputs)) {}

LineSource::LineSource(std::string text)
    : where("{source_text}"), inputs{word("source_text", std::move(text))} {}

LineSource::LineSource(const char *text) : LineSource(std::string(text)) {}

Quantity sheet_area(std::string symbol, double area_m2, units::System system) {
    return system == units::System::si
               ? qty(std::move(symbol), units::m2_to_ha(area_m2), Unit::ha)
               : qty(std::move(symbol), units::m2_to_acre(area_m2), Unit::ac);
}

PartsWeighting weight_parts(const std::vector<PartArea> &parts, const LandTables &tables,
                            const PartsContext &context) {
    PartSums sums = sum_parts(parts, context.label);
    const auto [merged, into] = merge_small_parts(sums, context.min_part_area_m2);
    bool slope_used = false;
    PartsWeighting out;
    auto &w = out.weighting;
    double total_m2 = 0.0;
    for (const auto &[key, sum] : sums) {
        w.parts.push_back(look_up_part(key, sum, tables, context, slope_used));
        total_m2 += sum.area_m2;
    }
    weight(w, tables, total_m2);
    input_lines(out.lines, tables, context, slope_used, total_m2);
    merged_line(out.lines, merged, into, context);
    part_lines(out.lines, w, tables, context, total_m2);
    weighted_lines(out.lines, w, tables, context.units, total_m2);
    return out;
}

} // namespace catchpeak::land
