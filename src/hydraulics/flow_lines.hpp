// SPDX-License-Identifier: MIT
// Lines shared by the inlet and outlet control sources (internal).
#pragma once

#include "catchpeak/hydraulics/section.hpp"

#include "sheet.hpp"

namespace catchpeak::hydraulics::detail {

/// The section in sheet units.
inline Section in_sheet(const Section &s, const Sheet &u) noexcept {
    return {s.shape, u.len(s.span_m), u.len(s.rise_m)};
}

/// The formulas of a flow area at a depth `y`, one per shape.
struct AreaFormulas {
    const Formula &circle;
    const Formula &box;
};

/// Appends the line of the flow area of `v` (sheet units) at depth `y`, result `symbol`;
/// returns that area (sheet units).
inline double area_line(CalcLines &lines, const AreaFormulas &f, const Section &v, double y,
                        const char *symbol, const Sheet &u) {
    const double a = y >= v.rise_m ? full_flow_area(v).area : flow_area_at(v, y).area;
    if (v.shape == Shape::circular) {
        lines.calc(f.circle, {u.sheet_len("D", v.rise_m), u.sheet_len("y", y)},
                   u.sheet_area(symbol, a));
    } else {
        lines.calc(f.box, {u.sheet_len("B", v.span_m), u.sheet_len("y", y)},
                   u.sheet_area(symbol, a));
    }
    return a;
}

} // namespace catchpeak::hydraulics::detail
