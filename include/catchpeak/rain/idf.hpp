// SPDX-License-Identifier: MIT
#pragma once

#include "catchpeak/core/calc_line.hpp"
#include "catchpeak/core/units.hpp"

#include <optional>
#include <string>
#include <string_view>
#include <utility>
#include <variant>
#include <vector>

namespace catchpeak::rain {

/// Unit in which a set of IDF values or IDF formula constants gives the intensity.
enum class IntensityUnit { mm_per_h, in_per_h };

[[nodiscard]] std::string_view to_string(IntensityUnit u) noexcept;

/// An IDF given as a table: intensities at listed durations (min) for listed return periods (yr).
/// Intensities are held in mm/h (SI); the loader converts a table given in in/h.
struct IdfTable {
    std::string name;                      ///< shown in every source line ("project input: ...")
    std::vector<double> durations_min;     ///< strictly increasing, > 0
    std::vector<double> return_periods_yr; ///< strictly increasing, > 1
    /// intensity_mm_per_h[r][d]: return period r, duration d. Must decrease with duration and
    /// increase with return period.
    std::vector<std::vector<double>> intensity_mm_per_h;
};

/// Constants of i = a / (t + b)^c for one return period; t in min, i in the formula's unit.
struct IdfFormulaConstants {
    double return_period_yr = 0.0;
    double a = 0.0;     ///< > 0, gives i in IdfFormula::unit
    double b_min = 0.0; ///< >= 0, min
    double c = 0.0;     ///< > 0
};

/// An IDF given as the formula i = a / (t + b)^c, one set of constants per return period.
/// Constants are published per unit system: `unit` records which unit they give i in.
struct IdfFormula {
    std::string name;
    IntensityUnit unit = IntensityUnit::mm_per_h;
    std::vector<IdfFormulaConstants> constants; ///< return periods strictly increasing, > 1
    /// Durations the constants were fitted for (min). Outside it the intensity is still
    /// computed but a warning line is added. Both 0 when unknown (then no warning).
    double min_duration_min = 0.0;
    double max_duration_min = 0.0;
};

/// Intensity-duration-frequency relation, either as a table or as a formula.
///
/// Constructing an Idf validates it and throws InputError naming the IDF, the value and the
/// rule broken: non-positive values, durations or return periods not strictly increasing,
/// intensity not decreasing with duration, intensity not increasing with return period.
class Idf {
  public:
    explicit Idf(IdfTable table);
    explicit Idf(IdfFormula formula);

    [[nodiscard]] const std::string &name() const noexcept;
    [[nodiscard]] std::vector<double> return_periods_yr() const;
    [[nodiscard]] bool is_table() const noexcept { return std::holds_alternative<IdfTable>(data_); }
    /// The durations the IDF covers, min: a table's first and last duration, a formula's fitted
    /// range; nullopt for a formula whose fitted range is not given.
    [[nodiscard]] std::optional<std::pair<double, double>> duration_range_min() const;

    /// Intensity in mm/h for a duration (min) and return period (yr). The lines show the
    /// calculation in the sheet's units (in/h on a US customary sheet): for a table, the
    /// log-log interpolation i = i1 (t/t1)^(ln(i2/i1)/ln(t2/t1)) between the two bracketing
    /// durations; for a formula, i = a/(t+b)^c in the constants' unit, then a conversion line
    /// when the sheet uses the other unit.
    ///
    /// Throws InputError when the return period is not one the IDF has (the message lists
    /// them), when the duration is not positive, and for a table when the duration lies outside
    /// the table (no extrapolation; the message names the duration and the table's range).
    [[nodiscard]] WithLines<double> intensity(double duration_min, double return_period_yr,
                                              units::System sheet_units) const;

    /// Rainfall depth in mm for a duration and return period: P = i t, with the intensity's
    /// lines followed by the depth line (in the sheet's units: mm, or in on a US customary
    /// sheet). Throws what intensity() throws.
    [[nodiscard]] WithLines<double> depth(double duration_min, double return_period_yr,
                                          units::System sheet_units) const;

    /// intensity() without the lines, in mm/h.
    [[nodiscard]] double intensity_mm_per_h(double duration_min, double return_period_yr) const;

  private:
    std::variant<IdfTable, IdfFormula> data_;
};

} // namespace catchpeak::rain
