// SPDX-License-Identifier: MIT
// Golden test of the calculation-line text for a tiny table-input project.
//
// Every expected record below (label, symbols, numbers at 4 significant figures, result, unit,
// source) was composed BY HAND from the published equations for this project, not copied from
// catchpeak's output. The wording of labels and sources follows the conventions of the method
// code (what the sheet calls each step); every number was worked out with a calculator:
//
// Project: SI; one catchment G-1: A = 2.0 ha, L = 100 m, S = 5 % = 0.05 m/m, C = 0.5;
// Kirpich tc; minimum tc 10 min; one return period, 25 years; IDF table value at 10 min and
// 25 years = 135 mm/h (so no interpolation); Cf(25 yr) = 1.1 from a table built in this test.
//
// Kirpich, SI form (TxDOT Hydraulic Design Manual eq. 4-15): tc = 0.0195 L^0.77 S^-0.385
//   100^0.77 = 10^1.54 = 34.6737; 0.05^-0.385 = 10^(0.385 x 1.30103) = 10^0.500897 = 3.16882
//   tc = 0.0195 x 34.6737 x 3.16882 = 2.1426 min (computed by hand; 4 figures: 2.143)
//   A = 2.0 ha = 4.942 ac (inside 1-112 ac) and S = 5 % (inside 3-10 %): no warning.
// Minimum tc: tc = max(2.143, 10) = 10 min, so the duration is a table duration.
// Rational Method, SI form: Q = Cf C i A / 360 = 1.1 x 0.5 x 135 x 2.0 / 360
//   = 0.55 x 270 / 360 = 148.5 / 360 = 0.4125 m3/s (exact arithmetic).
#include "catchpeak/app/inputs.hpp"
#include "catchpeak/app/pipeline.hpp"
#include "catchpeak/app/point_hydrology.hpp"
#include "catchpeak/io/idf_csv.hpp"
#include "catchpeak/project/project.hpp"
#include "support/calc_lines.hpp"
#include "support/test_env.hpp"

#include <gtest/gtest.h>

#include <cmath>
#include <fstream>
#include <limits>
#include <string>
#include <vector>

using namespace catchpeak;
namespace fs = std::filesystem;

namespace {

void write(const fs::path &path, const std::string &text) {
    std::ofstream(path, std::ios::binary) << text;
}

constexpr double no_value = std::numeric_limits<double>::quiet_NaN();

struct Expected {
    std::string id;
    LineKind kind;
    std::string label;
    std::string symbols;
    std::string numbers;
    double value;     ///< NaN: the line carries no value
    double tolerance; ///< absolute; the reason is given beside each record
    std::string unit;
    std::string source;
};

const std::string table_src = "project input (catchments.csv, line 2)";

// Tolerances: 1e-12 where the hand arithmetic is exact (floating point only); 2e-4 for the
// Kirpich tc, whose hand calculation carries 5 to 6 significant figures.
const std::vector<Expected> &expected() {
    static const std::vector<Expected> e = {
        {"G-1-L1", LineKind::note, "Catchment area", "", "A = 2.000 ha", 2.0, 1e-12, "ha",
         table_src},
        {"G-1-L2", LineKind::note, "Longest flow path length", "", "L = 100.0 m", 100.0, 1e-12, "m",
         table_src},
        {"G-1-L3", LineKind::note, "Slope of the longest flow path", "", "S = 0.05000 m/m", 0.05,
         1e-12, "m/m", table_src},
        {"G-1-L4", LineKind::note, "Runoff coefficient", "", "C = 0.5000", 0.5, 1e-12, "",
         table_src},
        {"G-1-L5", LineKind::calculation, "Time of concentration, Kirpich",
         "tc = 0.0195 L^0.77 S^-0.385 (L m)", "tc = 0.0195 x 100.0^0.77 x 0.05000^-0.385", 2.1426,
         2e-4, "min", "Kirpich (1940); TxDOT Hydraulic Design Manual eq. 4-15"},
        {"G-1-L6", LineKind::calculation, "Time of concentration, minimum applied",
         "tc = max(tc, tc,min)", "tc = max(2.143, 10.00)", 10.0, 1e-12, "min",
         "project setting: minimum tc (common practice, no source)"},
        {"G-1-L7", LineKind::note, "Minimum tc governs", "",
         "computed tc 2.143 min is below the minimum 10.00 min; the minimum is used", no_value, 0.0,
         "", "project setting"},
        {"G-1-L8", LineKind::calculation, "Rainfall intensity, 10.00 min, 25.00 yr",
         "i = i(t, T) from the table", "i = 135.0 (table value at t = 10.00 min, T = 25.00 yr)",
         135.0, 1e-12, "mm/h", "project input: IDF table idf"},
        {"G-1-L9", LineKind::calculation, "Frequency factor", "Cf from table",
         "Cf: row 25.00 years", 1.1, 1e-12, "", "hand-made test table [table cf.csv; invented]"},
        {"G-1-L10", LineKind::calculation, "Runoff coefficient with frequency factor", "Cf C",
         "Cf C = 1.100 x 0.5000", 0.55, 1e-12, "",
         "Rational Method frequency factor (many US manuals; from memory)"},
        {"G-1-L11", LineKind::calculation, "Peak flow, Rational Method",
         "Q = Cf C i A / 360 (i mm/h, A ha)", "Q = 0.5500 x 135.0 x 2.000 / 360", 0.4125, 1e-12,
         "m3/s", "Rational Method, SI form (1 mm/h on 1 ha = 1/360 m3/s)"},
    };
    return e;
}

} // namespace

TEST(CalcLinesGolden, TinyTableProjectMatchesTheHandComposedLines) {
    const auto dir = test::scratch_dir("calc_lines_golden");
    write(dir / "project.toml", "[project]\nname = \"Golden test\"\nunits = \"SI\"\n"
                                "[inputs]\ncatchment_table = \"catchments.csv\"\n"
                                "[rainfall]\nidf = \"idf.csv\"\nreturn_periods_yr = [25]\n"
                                "[methods]\ntc = \"kirpich\"\npeak = [\"rational\"]\n"
                                "[settings]\nminimum_tc_min = 10\n");
    write(dir / "catchments.csv", "id,area_ha,length_m,slope_percent,c\nG-1,2.0,100,5,0.5\n");
    write(dir / "idf.csv", "# unit: mm/h\nduration_min,25\n5,170\n10,135\n15,112\n60,45\n");

    const project::Project project = project::load_project(dir / "project.toml");
    const auto rows = app::read_catchment_table(dir / "catchments.csv");
    const rain::Idf idf = io::read_idf_csv(dir / "idf.csv");
    hydro::FrequencyFactorTable cf;
    cf.rows = {{10.0, 1.0}, {25.0, 1.1}};
    cf.origin = {"cf.csv", "hand-made test table", "invented"};

    app::HydrologyTables tables;
    tables.idf = &idf;
    tables.frequency_factors = &cf;
    const auto results = app::compute_from_table(project, rows, tables);
    ASSERT_EQ(results.points.size(), 1u);
    const auto &lines = results.points[0].lines.lines();
    ASSERT_EQ(lines.size(), expected().size());
    for (std::size_t k = 0; k < lines.size(); ++k) {
        const auto &got = lines[k];
        const auto &want = expected()[k];
        SCOPED_TRACE(want.id);
        EXPECT_EQ(got.id, want.id);
        EXPECT_EQ(got.kind, want.kind);
        EXPECT_EQ(catchpeak::test::text(got).label, want.label);
        EXPECT_EQ(catchpeak::test::text(got).symbols, want.symbols);
        EXPECT_EQ(catchpeak::test::text(got).numbers, want.numbers);
        if (std::isnan(want.value)) {
            EXPECT_TRUE(std::isnan(got.value())) << got.value();
        } else {
            EXPECT_NEAR(got.value(), want.value, want.tolerance);
        }
        EXPECT_EQ(catchpeak::test::text(got).unit, want.unit);
        EXPECT_EQ(catchpeak::test::text(got).source, want.source);
    }
    // The restated inputs are lines of formulas of their own, found by key.
    const auto &dp_lines = results.points[0].lines;
    EXPECT_EQ(catchpeak::test::line_keyed(dp_lines, "point.area").id, "G-1-L1");
    EXPECT_EQ(catchpeak::test::line_keyed(dp_lines, "point.flow_path_length").id, "G-1-L2");
    EXPECT_EQ(catchpeak::test::line_keyed(dp_lines, "point.slope").id, "G-1-L3");
    EXPECT_EQ(catchpeak::test::line_keyed(dp_lines, "point.c").id, "G-1-L4");
    // The peak names the line that gives it.
    ASSERT_EQ(results.points[0].peaks.size(), 1u);
    EXPECT_EQ(results.points[0].peaks[0].line_id, "G-1-L11");
    EXPECT_NEAR(results.points[0].peaks[0].q_m3_s, 0.4125, 1e-12); // exact arithmetic
}
