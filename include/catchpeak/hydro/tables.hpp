// SPDX-License-Identifier: MIT
#pragma once

#include "catchpeak/core/option_table.hpp"

#include <string>
#include <vector>

/// Method tables that hydro functions take as input. They are plain values: io reads them from
/// config/ (catchpeak/io/hydro_tables.hpp), tests may build them in code. Every table carries
/// where it comes from (`source`) and how sure we are of it (`status`), so that the
/// calculation lines that use it can name both.
namespace catchpeak::hydro {

/// Where a table comes from and how sure we are of it.
struct TableOrigin {
    std::string file;   ///< file it was read from ("" when built in code)
    std::string source; ///< published document, table or equation
    std::string status; ///< "checked (primary)", "from memory, not checked ...", ...

    /// "<source> (<status>)", for the source column of a calculation line.
    [[nodiscard]] std::string cite() const;
};

/// Rational Method frequency factor Cf by return period (ascending return period).
struct FrequencyFactorTable {
    struct Row {
        double return_period_yr = 0.0;
        double cf = 1.0;
    };
    std::vector<Row> rows;
    TableOrigin origin;
};

/// NRCS design storm type, as used by the TR-55 graphical peak discharge method.
enum class StormType { type_i, type_ia, type_ii, type_iii };

/// The texts of the storm types: in the project file, the tables and the storm files' names.
inline constexpr OptionTable<StormType, 4> storm_type_options{{
    {"I", StormType::type_i},
    {"IA", StormType::type_ia},
    {"II", StormType::type_ii},
    {"III", StormType::type_iii},
}};

/// "I", "IA", "II", "III".
[[nodiscard]] std::string to_string(StormType t);
/// Parses "I", "IA", "II", "III" (case-insensitive, an optional "type " prefix). Throws
/// InputError naming `where` otherwise.
[[nodiscard]] StormType parse_storm_type(const std::string &text, const std::string &where);

/// TR-55 unit peak discharge coefficients: log10(qu) = C0 + C1 log10(tc) + C2 (log10 tc)^2,
/// qu in csm/in, tc in h; one row per storm type and Ia/P, ascending Ia/P within a type.
struct PeakCoefficientTable {
    struct Row {
        StormType storm_type = StormType::type_ii;
        double ia_over_p = 0.0;
        double c0 = 0.0;
        double c1 = 0.0;
        double c2 = 0.0;
    };
    std::vector<Row> rows;
    TableOrigin origin;
};

/// TR-55 pond and swamp adjustment factor Fp by percentage of ponds and swamps (ascending).
struct PondFactorTable {
    struct Row {
        double pond_percent = 0.0;
        double fp = 1.0;
    };
    std::vector<Row> rows;
    TableOrigin origin;
};

/// SCS dimensionless unit hydrograph: q/qp at t/tp (ascending t/tp, starting at 0).
struct DimensionlessUnitHydrograph {
    std::vector<double> t_over_tp;
    std::vector<double> q_over_qp;
    TableOrigin origin;

    /// q/qp at t/tp by linear interpolation; 0 outside the table.
    [[nodiscard]] double ratio_at(double t_over_tp_value) const;
};

} // namespace catchpeak::hydro
