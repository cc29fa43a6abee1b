// SPDX-License-Identifier: MIT
#pragma once

#include "catchpeak/core/option_table.hpp"

#include <string_view>

/// The time-of-concentration and peak flow methods a project may choose, by value. Their texts
/// (the keys of the project file and of results.json) are in the tables below and nowhere
/// else; the project parser turns the text into the value once.
namespace catchpeak {

enum class TcMethod {
    kirpich,        ///< Kirpich (1940)
    nrcs_lag,       ///< NRCS lag equation, NEH 630 ch. 15
    tr55_segmental, ///< TR-55 sheet, shallow concentrated and channel flow
    kerby_kirpich,  ///< Kerby overland flow, then Kirpich
    given,          ///< a tc given by the engineer for a design point
};

inline constexpr OptionTable<TcMethod, 5> tc_method_options{{
    {"kirpich", TcMethod::kirpich},
    {"nrcs_lag", TcMethod::nrcs_lag},
    {"tr55_segmental", TcMethod::tr55_segmental},
    {"kerby_kirpich", TcMethod::kerby_kirpich},
    {"given", TcMethod::given},
}};

/// In the order of the columns of the summaries.
enum class PeakMethod {
    rational,            ///< Rational Method
    tr55_graphical,      ///< TR-55 graphical peak discharge
    scs_unit_hydrograph, ///< SCS dimensionless unit hydrograph
};

inline constexpr OptionTable<PeakMethod, 3> peak_method_options{{
    {"rational", PeakMethod::rational},
    {"tr55_graphical", PeakMethod::tr55_graphical},
    {"scs_unit_hydrograph", PeakMethod::scs_unit_hydrograph},
}};

[[nodiscard]] inline std::string_view key_of(TcMethod m) {
    return option_key(tc_method_options, m);
}
[[nodiscard]] inline std::string_view key_of(PeakMethod m) {
    return option_key(peak_method_options, m);
}

} // namespace catchpeak
