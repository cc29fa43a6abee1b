// SPDX-License-Identifier: MIT
#pragma once

#include "catchpeak/report/results.hpp"
#include "sheet_document.hpp"

/// What the calculation sheet says, and in which order: cover, summary, one section per design
/// point, references. Words and numbers only; how they are laid out is `render_sheet`'s.
/// Internal to `report`.
namespace catchpeak::report {

/// The document of `results`. Its map and chart blocks point into `results`, which must
/// outlive it.
[[nodiscard]] SheetDocument sheet_content(const RunResults &results);

/// The summary's warning cell of a design point: the count and the ids of its warning lines
/// (markup), or "" when it has none.
[[nodiscard]] std::string warning_flag(const DesignPointResult &p);

/// The row of the calculation table for one line: id, label with the equation in symbols and
/// the numbers put in, result with its unit, source.
[[nodiscard]] Row calc_line_row(const CalcLine &l);

} // namespace catchpeak::report
