// SPDX-License-Identifier: MIT
#include "catchpeak/report/summary_csv.hpp"
#include "support/calc_lines.hpp"

#include "support/test_env.hpp"

#include <gtest/gtest.h>

#include <fstream>
#include <sstream>

namespace catchpeak::report {
namespace {

/// Two design points with round values in US customary units, so that the expected sheet
/// values follow from the exact unit definitions (NIST SP 811, appendix B):
/// 40468.564224 m2 = 10 acre, 2.8316846592 m3/s = 100 cfs, 0.28316846592 m3/s = 10 cfs.
RunResults two_points(units::System system) {
    RunResults r;
    r.project.units = system;
    DesignPointResult a;
    a.id = "DP1";
    a.catchment.area_m2 = 40468.564224;
    a.tc_min = 12.5;
    a.peaks.push_back(
        {10.0, catchpeak::PeakMethod::rational, 2.8316846592, "DP1-L7", {}, std::nullopt});
    a.peaks.push_back(
        {100.0, catchpeak::PeakMethod::tr55_graphical, 0.28316846592, "DP1-L9", {}, std::nullopt});
    a.lines.add(catchpeak::test::text_warn("Slope above the method's range", "S = 0.2",
                                           "common practice, no source"));
    a.lines.add(catchpeak::test::text_warn("Area above the method's range", "A = 10 acre",
                                           "common practice, no source"));
    DesignPointResult b;
    b.id = "Outfall, east"; // a comma: the field must be quoted
    b.catchment.area_m2 = 1234567.0;
    b.tc_min = 7.0;
    b.peaks.push_back({2.0, catchpeak::PeakMethod::rational, 1.0, "", {}, std::nullopt});
    r.points = {a, b};
    return r;
}

TEST(SummaryCsv, UsCustomaryRowsInSheetUnits) {
    const auto text = summary_csv(two_points(units::System::us_customary));
    // Expected: 10 acre and 100 cfs / 10 cfs from the exact definitions above; 1234567 m2 =
    // 305.06... acre (computed: 1234567 / 4046.8564224 = 305.066), 1 m3/s = 35.3147 cfs
    // (computed: 1 / 0.028316846592); 4 significant figures as on the sheet.
    EXPECT_EQ(text, "design_point,return_period_yr,method,area_acre,tc_min,q_cfs,peak_line_id,"
                    "warning_count\n"
                    "DP1,10,rational,10.00,12.50,100.0,DP1-L7,2\n"
                    "DP1,100,tr55_graphical,10.00,12.50,10.00,DP1-L9,2\n"
                    "\"Outfall, east\",2,rational,305.1,7.000,35.31,,0\n");
}

TEST(SummaryCsv, SiHeaderAndValues) {
    const auto text = summary_csv(two_points(units::System::si));
    // 40468.564224 m2 = 4.0468564224 ha; 1234567 m2 = 123.4567 ha (1 ha = 10^4 m2).
    EXPECT_EQ(text, "design_point,return_period_yr,method,area_ha,tc_min,q_m3_s,peak_line_id,"
                    "warning_count\n"
                    "DP1,10,rational,4.047,12.50,2.832,DP1-L7,2\n"
                    "DP1,100,tr55_graphical,4.047,12.50,0.2832,DP1-L9,2\n"
                    "\"Outfall, east\",2,rational,123.5,7.000,1.000,,0\n");
}

TEST(SummaryCsv, WrittenFileHoldsTheSameText) {
    const auto r = two_points(units::System::si);
    const auto dir = test::scratch_dir("summary_csv");
    write_summary_csv(r, dir);
    std::ifstream in(dir / "summary.csv", std::ios::binary);
    std::ostringstream s;
    s << in.rdbuf();
    const std::string back = s.str();
    EXPECT_EQ(back, summary_csv(r));
}

} // namespace
} // namespace catchpeak::report
