// SPDX-License-Identifier: MIT
#pragma once

#include <cstdint>
#include <string_view>

namespace catchpeak {

/// A source a calculation line cites: a publication, or the project's own inputs and settings.
/// Each has a short form (printed in the line's source, e.g. "TR-55 (1986)") and, for a
/// publication, a full citation (the sheet's references page). Listed once, in references.cpp.
enum class Ref : std::uint8_t {
    none,            ///< no citation; the line's `where` says it all
    project_input,   ///< "project input"
    project_setting, ///< "project setting"
    common_practice, ///< "common practice, no source"
    tr55_1986,
    tp149_1973,
    neh630_ch15_2010,
    neh630_ch16_2007,
    kirpich_1940,
    kerby_1959,
    roussel_2005,
    txdot_hdm,
    chow_1988,
    hawkins_2002,
    hosking_1990,
    hosking_wallis_1997,
    hosking_wallis_wood_1985,
    ocallaghan_mark_1984,
    barnes_2014,
    horn_1981,
    nist_sp811,
    hds5_2012,
    chow_1959,
    hec22_2009,
};

/// The short form of a source as a line prints it ("TR-55 (1986)"; "" for Ref::none).
[[nodiscard]] std::string_view short_form(Ref r) noexcept;

/// The full citation of a publication ("" for the project's own inputs and for Ref::none).
[[nodiscard]] std::string_view citation(Ref r) noexcept;

} // namespace catchpeak
