// SPDX-License-Identifier: MIT
// The summary table printed at the end of a run: what a user reads first.
#include "catchpeak/app/pipeline.hpp"

#include <fmt/format.h>
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

TEST(SummaryTable, LongIdsWrapInThePointColumnByDisplayWidth) {
    // Nine CJK ideographs: East Asian wide characters, two terminal columns each (Unicode
    // Standard Annex #11, East Asian Width "W"), 18 columns in all: six fit in the 12 columns
    // of the point column, three go on below. A 20-letter id: 12 on the row, 8 below.
    report::RunResults r;
    r.project.units = units::System::si;
    auto a = point("\u6392\u6c34\u53e3\u4e1c\u897f\u5357\u5317\u4e2d\u592e", 25000.0, 7.5);
    a.peaks = {peak(10, "rational", 0.5)};
    auto b = point("ABCDEFGHIJKLMNOPQRST", 10000.0, 5.0);
    b.peaks = {peak(10, "rational", 0.25)};
    r.points = {a, b};
    const auto table = summary_table(r);
    const auto l = lines_of(table);
    ASSERT_EQ(l.size(), 6u) << table;
    // The area column ends where the header's does: the 12 columns of the point column, a
    // blank, the 10 of the area column (the six ideographs take 18 bytes for 12 columns).
    const std::string head_area = "area ha";
    const std::size_t area_end = l[0].find(head_area) + head_area.size();
    EXPECT_EQ(area_end, 12u + 1u + 10u) << l[0];
    const std::string first_six = "\u6392\u6c34\u53e3\u4e1c\u897f\u5357";
    ASSERT_EQ(l[1].rfind(first_six + " ", 0), 0u) << l[1];
    EXPECT_EQ(l[1].substr(first_six.size() + 1, 10), fmt::format("{:>10}", "2.500")) << l[1];
    EXPECT_EQ(l[2], "\u5317\u4e2d\u592e") << "the rest of the id on the line below";
    ASSERT_EQ(l[3].rfind("ABCDEFGHIJKL ", 0), 0u) << l[3];
    EXPECT_EQ(l[3].substr(13, 10), fmt::format("{:>10}", "1.000")) << l[3];
    EXPECT_EQ(l[4], "MNOPQRST");
}

TEST(SummaryTable, AWideCharacterIsNeverSplitAcrossPieces) {
    // "A" then six ideographs: 1 + 2 x 5 = 11 columns fit, the sixth would make 13, so the
    // first piece holds 11 columns and a blank, and the sixth goes below, whole. With several
    // methods the rest of the id goes in the point column of the point's next row.
    report::RunResults r;
    r.project.units = units::System::si;
    auto a = point("A\u6392\u6c34\u53e3\u4e1c\u897f\u5357", 25000.0, 7.5);
    a.peaks = {peak(2, "rational", 0.25), peak(2, "scs_unit_hydrograph", 0.3),
               peak(10, "rational", 0.5), peak(10, "scs_unit_hydrograph", 0.6)};
    r.points = {a};
    const auto l = lines_of(summary_table(r));
    ASSERT_EQ(l.size(), 4u) << summary_table(r);
    const std::string first = "A\u6392\u6c34\u53e3\u4e1c\u897f";
    ASSERT_EQ(l[1].rfind(first + "  ", 0), 0u) << l[1];
    EXPECT_EQ(l[1].substr(first.size() + 2, 10), fmt::format("{:>10}", "2.500")) << l[1];
    EXPECT_EQ(words(l[2]), (std::vector<std::string>{"\u5357", "10", "0.5000", "0.6000"}));
    // The ideograph (2 columns) and 10 blanks fill the point column of the second row.
    EXPECT_EQ(l[2].rfind("\u5357" + std::string(10, ' ') + " ", 0), 0u) << l[2];
}

} // namespace
} // namespace catchpeak::app
