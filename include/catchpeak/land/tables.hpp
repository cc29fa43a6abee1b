// SPDX-License-Identifier: MIT
#pragma once

#include "catchpeak/core/csv.hpp"

#include <array>
#include <cstddef>
#include <filesystem>
#include <limits>
#include <map>
#include <optional>
#include <string>
#include <string_view>
#include <vector>

/// Land-cover and soil tables: runoff coefficient C, curve number CN and impervious share per
/// land-cover class (config/land/*.csv; the format is documented in each file's header).
namespace catchpeak::land {

/// A hydrologic soil group, after dual groups (A/D, B/D, C/D) are resolved.
enum class SoilGroup { a, b, c, d };

/// "A", "B", "C" or "D".
[[nodiscard]] std::string_view to_string(SoilGroup g) noexcept;

/// A soil group as written in a soils layer, and what it was resolved to.
struct SoilGroupReading {
    SoilGroup group = SoilGroup::d;
    bool dual = false; ///< the text was a dual group (A/D, B/D, C/D)
};

/// Reads a hydrologic soil group: A, B, C, D, or a dual group A/D, B/D, C/D (case-insensitive,
/// blanks around it ignored). A dual group resolves to its first letter when `drained` is true
/// (the drained condition), to D otherwise. Throws InputError naming `where`, the text and the
/// accepted values.
[[nodiscard]] SoilGroupReading read_soil_group(std::string_view text, bool drained,
                                               std::string_view where);

/// Identity of a table for the sheet: "<file name> (<# name:>)" and its `# source:` line.
struct TableInfo {
    std::string name;   ///< e.g. "curve_numbers.csv (TR-55 curve numbers)"
    std::string source; ///< the `# source:` metadata ("" when the file has none)
    std::string status; ///< the `# status:` metadata ("" when the file has none)
};

/// Runoff coefficient C per land-cover class, optionally by soil group and slope band.
class RunoffCoefficientTable {
  public:
    struct Row {
        std::string land_class;
        std::optional<SoilGroup> soil_group; ///< empty: any group
        double slope_min_percent = -std::numeric_limits<double>::infinity();
        double slope_max_percent = std::numeric_limits<double>::infinity();
        double c = 0.0;
        std::size_t line = 0; ///< line in the file, for messages

        /// True when the row is limited to a slope band.
        [[nodiscard]] bool has_band() const noexcept {
            return slope_min_percent > -std::numeric_limits<double>::infinity() ||
                   slope_max_percent < std::numeric_limits<double>::infinity();
        }
    };

    /// Builds the table from a CSV read with read_csv / parse_csv. Columns: class,
    /// soil_group, slope_min_percent, slope_max_percent, c (others ignored). Throws InputError
    /// naming the file, line and column for a bad cell (C outside 0..1, an unknown soil group,
    /// a band with min >= max).
    [[nodiscard]] static RunoffCoefficientTable from_csv(const CsvTable &csv);

    [[nodiscard]] const TableInfo &info() const noexcept { return info_; }
    [[nodiscard]] bool has_class(std::string_view land_class) const;
    /// The classes of the table, sorted, each once.
    [[nodiscard]] std::vector<std::string> classes() const;
    /// True when some row of the class has a slope band (then a slope is needed to look it up).
    [[nodiscard]] bool uses_slope(std::string_view land_class) const;

    /// The row for a class, soil group and slope (percent; needed only when
    /// the rows of the class and group have slope bands). A row of the group itself is
    /// preferred over an "any" row. Throws InputError naming the class and the table when the
    /// class is missing, no row applies, several rows apply equally, or a slope is needed and
    /// not given.
    [[nodiscard]] const Row &lookup(std::string_view land_class, SoilGroup group,
                                    std::optional<double> slope_percent) const;

  private:
    TableInfo info_;
    std::vector<Row> rows_;
};

/// Curve number per land-cover class and hydrologic soil group.
class CurveNumberTable {
  public:
    struct Row {
        std::array<double, 4> cn{}; ///< by SoilGroup a, b, c, d
        std::string reference;      ///< the row's `reference` cell, or the table's source
    };

    /// Columns: class, A, B, C, D, optional reference (others ignored). CN from 30 to 100
    /// (TR-55 Tables 2-2a to 2-2d print CN 30 as the lowest value used). Throws InputError
    /// for a bad cell or a class listed twice.
    [[nodiscard]] static CurveNumberTable from_csv(const CsvTable &csv);

    [[nodiscard]] const TableInfo &info() const noexcept { return info_; }
    [[nodiscard]] bool has_class(std::string_view land_class) const;
    /// The classes of the table, sorted.
    [[nodiscard]] std::vector<std::string> classes() const;
    /// Throws InputError naming the class and the table when the class is missing.
    [[nodiscard]] const Row &lookup(std::string_view land_class) const;
    [[nodiscard]] double cn(std::string_view land_class, SoilGroup group) const;

  private:
    TableInfo info_;
    std::map<std::string, Row, std::less<>> rows_;
};

/// Impervious share per land-cover class.
class ImperviousShareTable {
  public:
    struct Row {
        double share = 0.0;    ///< 0..1 (the file holds percent)
        std::string reference; ///< the row's `reference` cell, or the table's source
    };

    /// Columns: class, impervious_percent (0..100), optional reference. Throws InputError for a
    /// bad cell or a class listed twice.
    [[nodiscard]] static ImperviousShareTable from_csv(const CsvTable &csv);

    [[nodiscard]] const TableInfo &info() const noexcept { return info_; }
    [[nodiscard]] bool has_class(std::string_view land_class) const;
    /// The classes of the table, sorted.
    [[nodiscard]] std::vector<std::string> classes() const;
    /// Throws InputError naming the class and the table when the class is missing.
    [[nodiscard]] const Row &lookup(std::string_view land_class) const;

  private:
    TableInfo info_;
    std::map<std::string, Row, std::less<>> rows_;
};

/// The tables a run uses. Each is optional: a run that uses only the Rational Method needs no
/// curve numbers, and the other way round. A table that is given must list every class found
/// in a catchment (exit 2 otherwise).
struct LandTables {
    std::optional<RunoffCoefficientTable> c;
    std::optional<CurveNumberTable> cn;
    std::optional<ImperviousShareTable> impervious;
};

/// Reads the three tables from their files (paths as the project gives them).
[[nodiscard]] LandTables read_land_tables(const std::filesystem::path &c_csv,
                                          const std::filesystem::path &cn_csv,
                                          const std::filesystem::path &impervious_csv);

/// The shipped tables in a config folder: land/runoff_coefficients.csv,
/// land/curve_numbers.csv, land/impervious_shares.csv.
[[nodiscard]] LandTables read_default_land_tables(const std::filesystem::path &config_dir);

} // namespace catchpeak::land
