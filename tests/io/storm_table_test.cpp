// SPDX-License-Identifier: MIT
#include "catchpeak/io/storm_table.hpp"
#include "support/input_error.hpp"

#include "catchpeak/core/error.hpp"

#include "support/test_env.hpp"

#include <gtest/gtest.h>

#include <string>

using catchpeak::InputError;
using catchpeak::parse_csv;
using catchpeak::io::storm_from_csv;

namespace {

const char *meta = "# name: test storm\n# source: invented\n# status: checked (invented)\n";

} // namespace

TEST(StormTable, ReadsATable) {
    const auto d = storm_from_csv(
        parse_csv(std::string(meta) + "hour,cumulative_fraction\n0,0\n1,0.4\n3,1\n", "storm.csv"));
    EXPECT_EQ(d.name, "test storm");
    EXPECT_EQ(d.source, "invented");
    EXPECT_EQ(d.status, "checked (invented)");
    EXPECT_EQ(d.hours, (std::vector<double>{0, 1, 3}));
    EXPECT_EQ(d.cumulative_fraction, (std::vector<double>{0, 0.4, 1}));
    EXPECT_DOUBLE_EQ(d.duration_h(), 3.0);
}

TEST(StormTable, ReadsEveryNrcsTableInConfig) {
    const auto config = catchpeak::test::source_dir() / "config";
    for (const auto &[text, type] : catchpeak::hydro::storm_type_options) {
        const auto d =
            catchpeak::io::read_storm_table(catchpeak::io::nrcs_storm_file(config, type));
        EXPECT_DOUBLE_EQ(d.duration_h(), 24.0) << text;
        EXPECT_FALSE(d.source.empty()) << text;
    }
}

TEST(StormTable, MessagesNameFileLineAndColumn) {
    auto msg = catchpeak::test::input_error_of([] {
        (void)storm_from_csv(parse_csv(
            std::string(meta) + "hour,cumulative_fraction\n0,0\n1,0.4\n2,0.3\n3,1\n", "storm.csv"));
    });
    EXPECT_NE(msg.find("storm.csv:7: column 'cumulative_fraction': cumulative fraction 0.3000 "
                       "after 0.4000"),
              std::string::npos)
        << msg;

    msg = catchpeak::test::input_error_of([] {
        (void)storm_from_csv(parse_csv(
            std::string(meta) + "hour,cumulative_fraction\n0,0\n2,0.4\n1,0.5\n3,1\n", "storm.csv"));
    });
    EXPECT_NE(msg.find("storm.csv:7: column 'hour': hour 1.000 after 2.000 h"), std::string::npos)
        << msg;

    msg = catchpeak::test::input_error_of([] {
        (void)storm_from_csv(parse_csv(
            std::string(meta) + "hour,cumulative_fraction\n0,0\n1,0.4\n3,0.98\n", "storm.csv"));
    });
    EXPECT_NE(msg.find("storm.csv:7: column 'cumulative_fraction': the last cumulative fraction "
                       "is 0.980000"),
              std::string::npos)
        << msg;

    msg = catchpeak::test::input_error_of([] {
        (void)storm_from_csv(parse_csv(
            std::string(meta) + "hour,cumulative_fraction\n0,0\n1,1.4\n3,1\n", "storm.csv"));
    });
    EXPECT_NE(msg.find("storm.csv:6: column 'cumulative_fraction': cumulative fraction 1.400"),
              std::string::npos)
        << msg;

    msg = catchpeak::test::input_error_of([] {
        (void)storm_from_csv(
            parse_csv(std::string(meta) + "hour,cumulative_fraction\n1,0\n3,1\n", "storm.csv"));
    });
    EXPECT_NE(msg.find("storm.csv:5: the first row is (1.000 h, 0)"), std::string::npos) << msg;

    msg = catchpeak::test::input_error_of([] {
        (void)storm_from_csv(
            parse_csv("# name: x\n# source: y\nhour,cumulative_fraction\n0,0\n1,1\n", "storm.csv"));
    });
    EXPECT_NE(msg.find("storm.csv: no '# status:' line"), std::string::npos) << msg;

    msg = catchpeak::test::input_error_of([] {
        (void)storm_from_csv(
            parse_csv(std::string(meta) + "hour,fraction\n0,0\n1,1\n", "storm.csv"));
    });
    EXPECT_NE(msg.find("no column 'cumulative_fraction'"), std::string::npos) << msg;
}

TEST(StormTable, NrcsFileIsNamedByTheTypeInLowerCase) {
    EXPECT_EQ(catchpeak::io::nrcs_storm_file("config", catchpeak::hydro::StormType::type_ia),
              std::filesystem::path("config") / "storms" / "nrcs_type_ia.csv");
    EXPECT_EQ(catchpeak::io::nrcs_storm_file("config", catchpeak::hydro::StormType::type_iii),
              std::filesystem::path("config") / "storms" / "nrcs_type_iii.csv");
}
