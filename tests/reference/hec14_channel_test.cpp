// SPDX-License-Identifier: MIT
// Normal depth of the outlet channel (the culvert's tailwater) against a published table:
// FHWA HEC-14, Hydraulic Design of Energy Dissipators for Culverts and Channels, 3rd ed.
// (FHWA-NHI-06-086, 2006), Appendix B, Table B.1 "Uniform Flow in Trapezoidal Channels by
// Manning's Formula", values of Qn/(b^(8/3) S^(1/2)) by y/b and side slope z, in US customary
// units (the table's alpha = 1). Each entry gives the flow of a channel whose normal depth is
// y = (y/b) b; the test solves the depth back from that flow.
#include "catchpeak/hydraulics/channel.hpp"

#include <gtest/gtest.h>

#include <cmath>

namespace {

using catchpeak::hydraulics::normal_depth_m;
using catchpeak::hydraulics::Trapezoid;
namespace units = catchpeak::units;

struct Entry {
    double y_over_b;
    double z;
    double value; ///< Qn/(b^(8/3) S^(1/2)) as printed
};

// Table B.1 rows 0.02, 0.05, 0.10 and 0.12 of y/b, several columns of z.
constexpr Entry entries[] = {
    {0.02, 0.0, 0.00213}, {0.02, 3.0, 0.00223}, {0.05, 0.0, 0.00947}, {0.05, 1.0, 0.0100},
    {0.10, 0.0, 0.0283},  {0.10, 2.0, 0.0339},  {0.12, 1.5, 0.0450},  {0.12, 3.0, 0.0497},
};

} // namespace

TEST(Hec14TableB1, NormalDepthOfTrapezoidalChannels) {
    const double b_ft = 10.0;
    const double n = 0.030;
    const double s = 0.005;
    for (const auto &e : entries) {
        const double q_cfs = e.value * std::pow(b_ft, 8.0 / 3.0) * std::sqrt(s) / n;
        const Trapezoid ch{units::ft_to_m(b_ft), e.z, n, s};
        const auto yn = normal_depth_m(ch, units::cfs_to_m3s(q_cfs), units::System::us_customary);
        const double y_ft = units::m_to_ft(yn.value);
        // The table prints three significant figures (half a unit of the last digit is 0.25 %
        // of 0.00213); the depth varies as about the 3/5 power of the flow, so 0.3 % of y
        // covers the rounding.
        EXPECT_NEAR(y_ft, e.y_over_b * b_ft, 0.003 * e.y_over_b * b_ft)
            << "y/b = " << e.y_over_b << ", z = " << e.z;
    }
}
