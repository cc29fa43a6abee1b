// SPDX-License-Identifier: MIT
// Unit conversions against their exact definitions. Source of every expected value: the
// international yard and pound agreement of 1959 (1 yd = 0.9144 m exactly, so 1 ft = 0.3048 m,
// 1 in = 25.4 mm) and NIST SP 811 (2008), appendix B.8/B.9, which lists the same factors as exact.
#include "catchpeak/core/error.hpp"
#include "catchpeak/core/units.hpp"

#include <gtest/gtest.h>

namespace u = catchpeak::units;

// Exact factors are stored as given; a conversion may differ from its definition only by one
// rounding of a double multiplication: relative tolerance 2 ulp.
constexpr double rel_tol_rounding = 4.5e-16;

TEST(Units, FootIsExactly0_3048Metre) {
    // 1959 agreement: 1 yd = 0.9144 m, 1 ft = 1/3 yd.
    EXPECT_EQ(u::ft_to_m(1.0), 0.3048);
    EXPECT_NEAR(u::ft_to_m(3.0), 0.9144, 0.9144 * rel_tol_rounding);
    EXPECT_NEAR(u::m_to_ft(0.3048), 1.0, rel_tol_rounding);
}

TEST(Units, InchIsExactly25_4Millimetres) {
    // 1959 agreement: 1 in = 1/36 yd = 25.4 mm.
    EXPECT_EQ(u::in_to_mm(1.0), 25.4);
    EXPECT_NEAR(u::mm_to_in(254.0), 10.0, 10.0 * rel_tol_rounding);
}

TEST(Units, MileIs5280Feet) {
    // NIST SP 811 B.8: mile (international) = 1.609344 E+03 m, exact.
    EXPECT_EQ(u::mi_to_m(1.0), 1609.344);
    EXPECT_NEAR(u::mi_to_m(1.0), 5280.0 * 0.3048, 1609.344 * rel_tol_rounding);
}

TEST(Units, AcreIs43560SquareFeet) {
    // NIST SP 811 B.8: acre (based on U.S. survey foot) differs; the international acre is
    // 43560 ft2 = 4046.8564224 m2 exactly, which is what the issue fixes for catchpeak.
    EXPECT_EQ(u::acre_to_m2(1.0), 4046.8564224);
    EXPECT_NEAR(u::acre_to_m2(1.0), 43560.0 * 0.3048 * 0.3048, 4046.86 * rel_tol_rounding);
    EXPECT_NEAR(u::m2_to_acre(4046.8564224), 1.0, rel_tol_rounding);
}

TEST(Units, CubicFootPerSecond) {
    // NIST SP 811 B.9: cubic foot per second = 2.831 685 E-02 m3/s; exact value 0.3048^3.
    EXPECT_EQ(u::cfs_to_m3s(1.0), 0.028316846592);
    EXPECT_NEAR(u::cfs_to_m3s(1.0), 0.3048 * 0.3048 * 0.3048, 0.0283 * rel_tol_rounding);
    EXPECT_NEAR(u::m3s_to_cfs(0.028316846592), 1.0, rel_tol_rounding);
}

TEST(Units, SquareMileAndHectare) {
    // 1 mi2 = 1609.344^2 m2 = 2589988.110336 m2 (exact, from the mile); 1 ha = 10^4 m2 (SI).
    EXPECT_NEAR(u::mi2_to_m2(1.0), 2589988.110336, 2.59e6 * rel_tol_rounding);
    EXPECT_EQ(u::ha_to_m2(1.0), 10000.0);
    EXPECT_EQ(u::km2_to_m2(1.0), 1.0e6);
    // 1 mi2 = 640 acre (definition of the acre, 43560 ft2, and the mile, 5280 ft).
    EXPECT_NEAR(u::m2_to_acre(u::mi2_to_m2(1.0)), 640.0, 640.0 * 4 * rel_tol_rounding);
}

TEST(Units, RainfallIntensity) {
    // 1 in/h = 25.4 mm/h (from the inch).
    EXPECT_EQ(u::in_per_h_to_mm_per_h(1.0), 25.4);
    EXPECT_NEAR(u::mm_per_h_to_in_per_h(50.8), 2.0, 2.0 * rel_tol_rounding);
}

TEST(Units, ParseSystem) {
    EXPECT_EQ(u::parse_system("SI", "project.toml"), u::System::si);
    EXPECT_EQ(u::parse_system("us", "project.toml"), u::System::us_customary);
    EXPECT_THROW((void)u::parse_system("imperial", "project.toml"), catchpeak::InputError);
    try {
        (void)u::parse_system("imperial", "project.toml: [project] units");
        FAIL() << "expected InputError";
    } catch (const catchpeak::InputError &e) {
        const std::string msg = e.what();
        EXPECT_NE(msg.find("project.toml: [project] units"), std::string::npos) << msg;
        EXPECT_NE(msg.find("imperial"), std::string::npos) << msg;
        EXPECT_NE(msg.find("\"SI\" or \"US\""), std::string::npos) << msg;
    }
}
