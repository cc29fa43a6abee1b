// SPDX-License-Identifier: MIT
#include "catchpeak/report/sheet_units.hpp"

#include <gtest/gtest.h>

namespace catchpeak::report {
namespace {

// Expected values from the exact definitions of NIST SP 811 (2008), appendix B:
// 1 acre = 4046.8564224 m2, 1 ft = 0.3048 m, 1 ft3/s = 0.028316846592 m3/s, 1 in = 25.4 mm.
// Tolerance: one unit in the last place or so of a double (1e-12 relative).
constexpr double rel = 1e-12;

TEST(SheetUnits, UsCustomary) {
    const auto us = units::System::us_customary;
    EXPECT_NEAR(sheet_area(4046.8564224, us).value, 1.0, rel);
    EXPECT_EQ(sheet_area(1.0, us).unit, "acre");
    EXPECT_NEAR(sheet_length(0.3048, us).value, 1.0, rel);
    EXPECT_EQ(sheet_length(1.0, us).unit, "ft");
    EXPECT_NEAR(sheet_flow(0.028316846592, us).value, 1.0, rel);
    EXPECT_EQ(sheet_flow(1.0, us).unit, "cfs");
    EXPECT_NEAR(sheet_depth(25.4, us).value, 1.0, rel);
    EXPECT_EQ(sheet_depth(1.0, us).unit, "in");
    EXPECT_EQ(area_key_unit(us), "acre");
    EXPECT_EQ(flow_key_unit(us), "cfs");
}

TEST(SheetUnits, Si) {
    const auto si = units::System::si;
    EXPECT_NEAR(sheet_area(25000.0, si).value, 2.5, rel); // 1 ha = 10^4 m2
    EXPECT_EQ(sheet_area(1.0, si).unit, "ha");
    EXPECT_EQ(sheet_length(12.5, si).value, 12.5);
    EXPECT_EQ(sheet_flow(3.25, si).value, 3.25);
    EXPECT_EQ(sheet_flow(1.0, si).unit, "m3/s");
    EXPECT_EQ(flow_key_unit(si), "m3_s");
}

TEST(SheetUnits, Titles) {
    EXPECT_EQ(method_title(catchpeak::PeakMethod::rational), "Rational Method");
    EXPECT_EQ(method_title(catchpeak::PeakMethod::tr55_graphical), "TR-55 graphical peak");
    EXPECT_EQ(method_title(catchpeak::PeakMethod::scs_unit_hydrograph), "SCS unit hydrograph");
    // tc methods by the names of their publications, not by the project file's keys.
    EXPECT_EQ(method_title(catchpeak::TcMethod::kirpich), "Kirpich");
    EXPECT_EQ(method_title(catchpeak::TcMethod::kerby_kirpich), "Kerby-Kirpich");
    EXPECT_EQ(method_title(catchpeak::TcMethod::given), "given by the engineer");
    EXPECT_EQ(return_period_title(10.0), "10-yr");
    EXPECT_EQ(return_period_title(2.33), "2.33-yr");
}

// A culvert's size: whole millimetres, or inches to 0.1 in (1 in = 25.4 mm exactly, so
// 1.8288 m = 72 in and 1.2192 m = 48 in).
TEST(SheetUnits, CulvertSize) {
    EXPECT_EQ(culvert_size_title(false, 1.2, 1.2, units::System::si), "1200 mm");
    EXPECT_EQ(culvert_size_title(true, 1.5, 1.2, units::System::si), "1500 x 1200 mm");
    EXPECT_EQ(culvert_size_title(true, 1.8288, 1.2192, units::System::us_customary), "72 x 48 in");
    EXPECT_EQ(culvert_size_title(false, 0.45, 0.45, units::System::us_customary), "17.7 in");
    EXPECT_EQ(length_key_unit(units::System::us_customary), "ft");
    EXPECT_EQ(velocity_key_unit(units::System::si), "m_s");
    // 3.048 m/s = 10 ft/s exactly.
    EXPECT_DOUBLE_EQ(sheet_velocity(3.048, units::System::us_customary).value, 10.0);
}

} // namespace
} // namespace catchpeak::report
