// SPDX-License-Identifier: MIT
// The summary table printed at the end of a run: what a user reads first.
#include "catchpeak/app/pipeline.hpp"

#include <gtest/gtest.h>

#include <sstream>
#include <string>
#include <vector>

namespace catchpeak::app {
namespace {

report::Peak peak(double rp, const std::string &method, double q) {
    report::Peak p;
    p.return_period_yr = rp;
    p.method = catchpeak::find_option(catchpeak::peak_method_options, method).value();
    p.q_m3_s = q;
    return p;
}

report::DesignPointResult point(const std::string &id, double area_m2, double tc_min) {
    report::DesignPointResult dp;
    dp.id = id;
    dp.catchment.area_m2 = area_m2;
    dp.tc_min = tc_min;
    return dp;
}

std::vector<std::string> lines_of(const std::string &text) {
    std::vector<std::string> out;
    std::istringstream in(text);
    for (std::string l; std::getline(in, l);) {
        out.push_back(l);
    }
    return out;
}

/// The whitespace-separated words of a line.
std::vector<std::string> words(const std::string &line) {
    std::vector<std::string> out;
    std::istringstream in(line);
    for (std::string w; in >> w;) {
        out.push_back(w);
    }
    return out;
}

TEST(SummaryTable, OneMethodGivesARowPerPointAndAColumnPerReturnPeriod) {
    report::RunResults r;
    r.project.units = units::System::si;
    auto a = point("IN-1", 25000.0, 7.5); // 2.5 ha
    a.peaks = {peak(10, "rational", 0.5), peak(2, "rational", 0.25)};
    r.points = {a};
    const auto l = lines_of(summary_table(r));
    ASSERT_EQ(l.size(), 3u) << summary_table(r);
    EXPECT_NE(l[0].find("Q2 m3/s"), std::string::npos) << l[0];
    EXPECT_LT(l[0].find("Q2 m3/s"), l[0].find("Q10 m3/s")) << "return periods in ascending order";
    EXPECT_EQ(words(l[1]),
              (std::vector<std::string>{"IN-1", "2.500", "7.500", "0.2500", "0.5000", "0"}));
    EXPECT_NE(l[2].find("Rational Method"), std::string::npos) << l[2];
}

TEST(SummaryTable, SeveralMethodsGiveARowPerReturnPeriodAndAColumnPerMethod) {
    report::RunResults r;
    r.project.units = units::System::us_customary;
    // 1 acre = 4046.8564224 m2 and 1 ft3/s = 0.028316846592 m3/s exactly (NIST SP 811).
    auto a = point("CV-1", 4046.8564224 * 100.0, 30.0);
    a.peaks = {peak(2, "scs_unit_hydrograph", 0.028316846592 * 90.0),
               peak(2, "rational", 0.028316846592 * 80.0),
               peak(100, "rational", 0.028316846592 * 200.0),
               peak(100, "scs_unit_hydrograph", 0.028316846592 * 250.0)};
    auto b = point("IN-1", 4046.8564224 * 2.0, 5.0);
    b.peaks = {peak(2, "rational", 0.028316846592 * 3.0),
               peak(100, "rational", 0.028316846592 * 7.0)};
    r.points = {a, b};
    const auto l = lines_of(summary_table(r));
    ASSERT_EQ(l.size(), 6u) << summary_table(r);
    const auto head = words(l[0]);
    EXPECT_EQ(head,
              (std::vector<std::string>{"point", "area", "ac", "tc", "min", "T", "yr", "rational",
                                        "ft3/s", "SCS", "UH", "ft3/s", "warnings"}));
    EXPECT_EQ(words(l[1]),
              (std::vector<std::string>{"CV-1", "100.0", "30.00", "2", "80.00", "90.00", "0"}));
    EXPECT_EQ(words(l[2]), (std::vector<std::string>{"100", "200.0", "250.0"}));
    EXPECT_EQ(words(l[3]),
              (std::vector<std::string>{"IN-1", "2.000", "5.000", "2", "3.000", "-", "0"}));
    EXPECT_EQ(words(l[4]), (std::vector<std::string>{"100", "7.000", "-"}));
    EXPECT_NE(l[5].find("return period"), std::string::npos) << l[5];
}

} // namespace
} // namespace catchpeak::app
