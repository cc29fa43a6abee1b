// SPDX-License-Identifier: MIT
#pragma once

#include "catchpeak/core/calc_line.hpp"
#include "catchpeak/core/units.hpp"
#include "catchpeak/rain/hyetograph.hpp"
#include "catchpeak/rain/idf.hpp"

#include <optional>
#include <string>
#include <vector>

namespace catchpeak::rain {

/// A dimensionless cumulative rainfall distribution (a design storm shape), e.g. the NRCS
/// 24-hour Type II storm. The tables live in config/storms/ and are read by io.
struct StormDistribution {
    std::string name;                        ///< e.g. "NRCS 24-hour Type II"
    std::vector<double> hours;               ///< from 0, strictly increasing
    std::vector<double> cumulative_fraction; ///< from 0 to 1, never decreasing
    std::string source;                      ///< where the table comes from
    std::string status;                      ///< how sure we are: "checked (primary)", "memory" ...
    /// The project's own table as written in the project file ([rainfall] storm_table), named
    /// on the sheet beside the distribution; empty for a table shipped in config/storms/.
    std::string project_file{};

    [[nodiscard]] double duration_h() const { return hours.empty() ? 0.0 : hours.back(); }
};

/// Checks a distribution; throws InputError naming it, the point and the rule: at least two
/// points, hours start at 0 and strictly increase, fractions start at 0, end at 1 and never
/// decrease, all values finite.
void validate(const StormDistribution &d);

/// True when the status says the table was checked against a published source (it starts
/// with "checked"). Hyetographs built from any other table carry a warning line.
[[nodiscard]] bool is_checked(const StormDistribution &d);

/// Cumulative fraction at `hour`, interpolated linearly between the table's points.
[[nodiscard]] double cumulative_fraction_at(const StormDistribution &d, double hour);

/// Hyetograph of a design storm of total depth `depth_mm` over the distribution's duration,
/// in steps of `step_min`: depth of step k = P (F(t_k+1) - F(t_k)), with F interpolated
/// LINEARLY between the table's points (a smoother curve would invent values the table does not
/// give). The step must divide the storm duration into a whole number of steps. The lines show
/// the distribution and its status, P, the step, and the largest step with its two cumulative
/// fractions (peak_table_interval() tells whether that step is an interval's average). Throws
/// InputError for a non-positive depth or step, or a step that does not divide the duration.
[[nodiscard]] WithLines<Hyetograph> storm_hyetograph(const StormDistribution &d, double depth_mm,
                                                     double step_min, units::System sheet_units);

/// An interval between two consecutive points of a storm table, h.
struct TableInterval {
    double start_h = 0.0;
    double end_h = 0.0;
};

/// The interval of the table `d` that holds the largest step of `h` (a storm_hyetograph of `d`)
/// when the interval is longer than the step. Linear interpolation spreads the rain of an
/// interval evenly over its steps, so there the storm's peak intensity is the interval's
/// average, whatever the step: a table with more points near the peak would give a higher one.
/// Empty when the largest step spans a point of the table or the interval is no longer than a
/// step.
[[nodiscard]] std::optional<TableInterval> peak_table_interval(const StormDistribution &d,
                                                               const Hyetograph &h);

/// Alternating-block hyetograph (Chow, Maidment & Mays 1988, Applied Hydrology, sec. 14.4):
/// block depths D_k = i(k dt) k dt for k = 1..n, increments D_k - D_(k-1) sorted in descending
/// order, the largest at the centre (block (n-1)/2, counting from 0: for an even n the earlier of
/// the two middle blocks) and the rest alternately right and left of it. `duration_min` must be
/// a whole number of steps. When the increments already decrease with k (the usual IDF), the k
/// largest blocks form a window around the centre whose sum is D_k; otherwise a note line says
/// they were reordered. The lines show the storm, each block's depth from the IDF with where it
/// is placed (every block of a storm of up to 12 blocks, else the first 6 and a note for the
/// rest), with the IDF's intensity lines, the storm depth i(Td) Td and the peak intensity.
/// Throws InputError when an increment would be negative (the IDF's depth falls with duration)
/// and whatever Idf::intensity throws (e.g. a duration outside a table).
[[nodiscard]] WithLines<Hyetograph>
alternating_block_hyetograph(const Idf &idf, double duration_min, double step_min,
                             double return_period_yr, units::System sheet_units);

} // namespace catchpeak::rain
