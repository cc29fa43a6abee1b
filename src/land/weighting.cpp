// SPDX-License-Identifier: MIT
#include "catchpeak/land/weighting.hpp"

#include "catchpeak/core/error.hpp"

#include <fmt/format.h>

#include <cmath>
#include <limits>
#include <map>
#include <utility>

namespace catchpeak::land {

namespace {

constexpr double nan = std::numeric_limits<double>::quiet_NaN();

std::string area_unit(units::System s) { return s == units::System::si ? "ha" : "ac"; }

double area_in_sheet_units(double area_m2, units::System s) {
    return s == units::System::si ? units::m2_to_ha(area_m2) : units::m2_to_acre(area_m2);
}

} // namespace

PartsWeighting weight_parts(const std::vector<PartArea> &parts, const LandTables &tables,
                            const PartsContext &context) {
    const std::string &label = context.label;
    if (parts.empty()) {
        throw_input_error(fmt::format("catchment '{}'", label), "it has no land parts",
                          "at least one part (land-cover class, soil group, area)");
    }
    // Parts of the same class and soil group add into one, sorted by class then group.
    struct PartSum {
        double area_m2 = 0.0;
        const PartArea *first = nullptr; ///< names the part in messages
    };
    std::map<std::pair<std::string, SoilGroup>, PartSum> sums;
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

    // Look up C, CN and impervious share per part.
    bool slope_used = false;
    PartsWeighting out;
    auto &w = out.weighting;
    double total_m2 = 0.0;
    for (const auto &[key, sum] : sums) {
        const std::string &cls = key.first;
        const SoilGroup g = key.second;
        const auto missing = [&](const TableInfo &info, std::string_view kind) {
            throw_input_error(info.name,
                              fmt::format("land-cover class '{}' ({}, in catchment '{}') is not "
                                          "in this {} table",
                                          cls, sum.first->origin, label, kind),
                              "a table that lists every class of the land-cover layer (a project "
                              "may point to its own table)");
        };
        report::LandPart part;
        part.land_class = cls;
        part.soil_group = std::string(to_string(g));
        part.area_m2 = sum.area_m2;
        part.c = nan;
        part.cn = nan;
        part.impervious_share = nan;
        if (tables.c) {
            if (!tables.c->has_class(cls)) {
                missing(tables.c->info(), "runoff coefficient");
            }
            const auto &row = tables.c->lookup(cls, g, context.slope_percent);
            slope_used = slope_used || row.has_band();
            part.c = row.c;
        }
        if (tables.cn) {
            if (!tables.cn->has_class(cls)) {
                missing(tables.cn->info(), "curve number");
            }
            part.cn = tables.cn->cn(cls, g);
        }
        if (tables.impervious) {
            if (!tables.impervious->has_class(cls)) {
                missing(tables.impervious->info(), "impervious share");
            }
            const auto &row = tables.impervious->lookup(cls);
            part.impervious_share = row.share;
        }
        total_m2 += part.area_m2;
        w.parts.push_back(std::move(part));
    }

    // Weighted sums.
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

    // ---- calculation lines ----------------------------------------------------------------
    const units::System su = context.units;
    const std::string au = area_unit(su);
    const auto sheet_area = [&](double m2) { return area_in_sheet_units(m2, su); };
    auto &lines = out.lines;
    if (!context.area_label.empty()) {
        lines.note(context.area_label, context.area_text, context.area_source,
                   sheet_area(context.catchment_area_m2), au);
    }
    lines.append(context.input_notes);
    if (tables.c) {
        lines.note("Runoff coefficient table", tables.c->info().name, tables.c->info().source);
    }
    if (tables.cn) {
        lines.note("Curve number table", tables.cn->info().name, tables.cn->info().source);
    }
    if (tables.impervious) {
        lines.note("Impervious share table", tables.impervious->info().name,
                   tables.impervious->info().source);
    }
    if (!context.dual_groups.empty()) {
        lines.note("Dual hydrologic soil groups",
                   fmt::format("{} (setting drained = {}: {})",
                               fmt::format("{}", fmt::join(context.dual_groups, ", ")),
                               context.drained,
                               context.drained ? "the drained group, the first letter" : "group D"),
                   "project setting");
    }
    if (slope_used) {
        lines.note("Slope for the C slope bands", context.slope_text, context.slope_source,
                   *context.slope_percent, "%");
    }
    lines.append(context.warnings);
    const double area_m2 = context.catchment_area_m2;
    if (std::abs(total_m2 - area_m2) > 1e-6 * area_m2) {
        lines.warn("Parts do not add up to the catchment",
                   fmt::format("the parts add up to {} {}, the catchment is {} {}",
                               sig(sheet_area(total_m2)), au, sig(sheet_area(area_m2)), au),
                   context.area_check_source);
    }
    for (std::size_t i = 0; i < w.parts.size(); ++i) {
        const auto &p = w.parts[i];
        std::vector<std::string> values;
        if (tables.c) {
            values.push_back(fmt::format("C = {}", sig(p.c)));
        }
        if (tables.cn) {
            values.push_back(fmt::format("CN = {}", sig(p.cn)));
        }
        if (tables.impervious) {
            values.push_back(fmt::format("impervious {} %", sig(100.0 * p.impervious_share)));
        }
        values.push_back(fmt::format("{} % of the catchment", sig(100.0 * p.area_m2 / total_m2)));
        lines.calc(fmt::format("Part {}: {}, soil group {}", i + 1, p.land_class, p.soil_group),
                   fmt::format("A{} = area of catchment, class {} and soil group {}", i + 1,
                               p.land_class, p.soil_group),
                   fmt::format("{}", fmt::join(values, ", ")), sheet_area(p.area_m2), au,
                   context.parts_source);
    }
    const auto weighted_line = [&](std::string label_text, std::string symbol, auto member,
                                   double value, std::string unit, double scale,
                                   std::string source) {
        std::vector<std::string> terms;
        for (const auto &p : w.parts) {
            terms.push_back(
                fmt::format("{} x {}", sig(sheet_area(p.area_m2)), sig(scale * (p.*member))));
        }
        lines.calc(std::move(label_text), fmt::format("{0} = sum(Ai {0}i) / sum(Ai)", symbol),
                   fmt::format("{} = ({}) / {}", symbol, fmt::join(terms, " + "),
                               sig(sheet_area(total_m2))),
                   scale * value, std::move(unit), std::move(source));
    };
    if (tables.c) {
        weighted_line("Runoff coefficient, area-weighted", "C", &report::LandPart::c, w.c_weighted,
                      "", 1.0, fmt::format("area-weighted; C from {}", tables.c->info().name));
    }
    if (tables.cn) {
        weighted_line(
            "Curve number, composite (area-weighted)", "CN", &report::LandPart::cn, w.cn_weighted,
            "", 1.0,
            fmt::format("TR-55 (1986) ch. 2, composite CN; CN from {}", tables.cn->info().name));
    }
    if (tables.impervious) {
        weighted_line("Impervious share, area-weighted", "I", &report::LandPart::impervious_share,
                      w.impervious_share, "%", 100.0,
                      fmt::format("area-weighted; shares from {}", tables.impervious->info().name));
    }
    return out;
}

} // namespace catchpeak::land
