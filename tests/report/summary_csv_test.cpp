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

/// A culvert at DP1: two 1200 mm pipes chosen from the list, checked for one flow that overtops
/// the road (round values, so the printed fields follow by hand).
RunResults with_culvert(units::System system) {
    RunResults r = two_points(system);
    CulvertResult c;
    c.shape = "circular";
    c.barrels = 2;
    c.span_m = c.rise_m = 1.2;
    c.sized = true;
    CulvertCase k;
    k.return_period_yr = 10.0;
    k.design = true;
    k.flow_m3_s = 2.5;
    k.culvert_flow_m3_s = 2.0;
    k.overtopping_flow_m3_s = 0.5;
    k.headwater_m = 1.8;
    k.headwater_elevation_m = 101.8;
    k.control = "inlet";
    k.outlet_velocity_m_per_s = 3.25;
    k.passes = true;
    k.headwater_line_id = "DP1-L40";
    k.flow_line_id = "DP1-L7";
    c.cases.push_back(k);
    k.return_period_yr = 100.0;
    k.design = false;
    k.control = "outlet";
    k.passes = false;
    k.headwater_line_id = "DP1-L61";
    k.flow_line_id = "DP1-L9";
    c.cases.push_back(k);
    r.points[0].culvert = c;
    return r;
}

// A run with a culvert: the twelve culvert columns after the peak columns, empty on the peak
// rows, and one row per culvert case (HW/D = 1.8/1.2 = 1.5; the size in whole mm).
TEST(SummaryCsv, CulvertRowsAndColumns) {
    const auto text = summary_csv(with_culvert(units::System::si));
    const std::string empty12 = ",,,,,,,,,,,,";
    EXPECT_EQ(text, "design_point,return_period_yr,method,area_ha,tc_min,q_m3_s,peak_line_id,"
                    "warning_count,culvert_size,size_basis,barrels,culvert_flow_m3_s,"
                    "road_flow_m3_s,headwater_m,headwater_elevation_m,hw_over_d,control,"
                    "outlet_velocity_m_s,passes,headwater_line_id\n"
                    "DP1,10,rational,4.047,12.50,2.832,DP1-L7,2" +
                        empty12 +
                        "\n"
                        "DP1,100,tr55_graphical,4.047,12.50,0.2832,DP1-L9,2" +
                        empty12 +
                        "\n"
                        "DP1,10,culvert,4.047,12.50,2.500,DP1-L7,2,1200 mm,chosen,2,2.000,"
                        "0.5000,1.800,101.800,1.500,inlet,3.250,yes,DP1-L40\n"
                        "DP1,100,culvert,4.047,12.50,2.500,DP1-L9,2,1200 mm,chosen,2,2.000,"
                        "0.5000,1.800,101.800,1.500,outlet,3.250,no,DP1-L61\n"
                        "\"Outfall, east\",2,rational,123.5,7.000,1.000,,0" +
                        empty12 + "\n");
}

// US customary: the size in inches, the lengths in ft, the velocity in ft/s, the elevation to
// 0.01 ft. 1.2 m = 47.24 in (computed: 1.2/0.0254), 1.8 m = 5.906 ft, 101.8 m = 333.99 ft,
// 3.25 m/s = 10.66 ft/s, 2.5 m3/s = 88.29 cfs (computed with 1 ft = 0.3048 m).
TEST(SummaryCsv, CulvertRowsInUsCustomaryUnits) {
    auto r = with_culvert(units::System::us_customary);
    r.points[0].culvert->sized = false;
    const auto text = summary_csv(r);
    EXPECT_NE(text.find("culvert_flow_cfs,road_flow_cfs,headwater_ft,headwater_elevation_ft,"
                        "hw_over_d,control,outlet_velocity_ft_s,passes,headwater_line_id\n"),
              std::string::npos)
        << text;
    EXPECT_NE(text.find("DP1,10,culvert,10.00,12.50,88.29,DP1-L7,2,47.2 in,given,2,70.63,17.66,"
                        "5.906,333.99,1.500,inlet,10.66,yes,DP1-L40\n"),
              std::string::npos)
        << text;
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
