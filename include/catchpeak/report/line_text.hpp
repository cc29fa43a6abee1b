// SPDX-License-Identifier: MIT
#pragma once

#include "catchpeak/core/calc_line.hpp"

#include <string>
#include <string_view>
#include <vector>

namespace catchpeak::report {

/// The text of a calculation line as the sheet and results.json print it: the formula's
/// templates filled with the line's quantities (see Formula), the unit's symbol, the citation's
/// short form followed by the line's `where`. A line read back from results.json carries its
/// text and is returned as it stands. Throws std::logic_error when a template names a symbol
/// the line does not have (a programming error, caught by the tests of every formula).
[[nodiscard]] LineText text_of(const CalcLine &line);

/// Fills one template with the quantities of `line` (and of `row`, searched first, when given).
[[nodiscard]] std::string fill(std::string_view pattern, const CalcLine &line,
                               const std::vector<Quantity> *row = nullptr);

/// A quantity's value as the sheet prints it (its text, for a word).
[[nodiscard]] std::string shown(const Quantity &q);

} // namespace catchpeak::report
