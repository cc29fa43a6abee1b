// SPDX-License-Identifier: MIT
#include "catchpeak/hydro/tables.hpp"

#include "catchpeak/core/error.hpp"

#include <gtest/gtest.h>

namespace {

namespace h = catchpeak::hydro;

TEST(StormType, ParsesTheFourTypes) {
    EXPECT_EQ(h::parse_storm_type("I", "x"), h::StormType::type_i);
    EXPECT_EQ(h::parse_storm_type("ia", "x"), h::StormType::type_ia);
    EXPECT_EQ(h::parse_storm_type("Type II", "x"), h::StormType::type_ii);
    EXPECT_EQ(h::parse_storm_type("III", "x"), h::StormType::type_iii);
    for (auto t : {h::StormType::type_i, h::StormType::type_ia, h::StormType::type_ii,
                   h::StormType::type_iii}) {
        EXPECT_EQ(h::parse_storm_type(h::to_string(t), "x"), t);
    }
    try {
        (void)h::parse_storm_type("IV", "storms.csv:4");
        FAIL() << "no InputError";
    } catch (const catchpeak::InputError &e) {
        const std::string m = e.what();
        EXPECT_NE(m.find("storms.csv:4"), std::string::npos) << m;
        EXPECT_NE(m.find("'IV'"), std::string::npos) << m;
        EXPECT_NE(m.find("I, IA, II, III"), std::string::npos) << m;
    }
}

TEST(DimensionlessUnitHydrograph, InterpolatesLinearly) {
    h::DimensionlessUnitHydrograph t;
    t.t_over_tp = {0.0, 1.0, 3.0};
    t.q_over_qp = {0.0, 1.0, 0.0};
    EXPECT_DOUBLE_EQ(t.ratio_at(0.5), 0.5);
    EXPECT_DOUBLE_EQ(t.ratio_at(1.0), 1.0);
    EXPECT_DOUBLE_EQ(t.ratio_at(2.0), 0.5);
    EXPECT_DOUBLE_EQ(t.ratio_at(-1.0), 0.0);
    EXPECT_DOUBLE_EQ(t.ratio_at(4.0), 0.0);
}

TEST(TableOrigin, CiteNamesSourceFileAndStatus) {
    h::TableOrigin o{"peaks.csv", "TR-55 (1986) App. F", "from memory, not checked"};
    EXPECT_EQ(o.cite(), "TR-55 (1986) App. F [table peaks.csv; from memory, not checked]");
    EXPECT_EQ(h::TableOrigin{}.cite(), "table without source");
}

} // namespace
