// SPDX-License-Identifier: MIT
// The culvert tables of config/: the inlet coefficients as the hydraulics tests hold them in
// memory, the standard size lists, and every bad value refused with its file, line and column.
#include "catchpeak/io/culvert_tables.hpp"

#include "catchpeak/core/error.hpp"

#include "hydraulics/inlet_rows.hpp"
#include "support/input_error.hpp"
#include "support/test_env.hpp"

#include <gtest/gtest.h>

#include <cmath>
#include <fstream>
#include <string>

namespace {

using catchpeak::InputError;
namespace io = catchpeak::io;
namespace hy = catchpeak::hydraulics;

std::filesystem::path write(const std::string &test, const std::string &name,
                            const std::string &text) {
    const auto path = catchpeak::test::scratch_dir(test) / name;
    std::ofstream(path) << text;
    return path;
}

// The shipped CSV and the table the hydraulics tests build in memory (both typed from HDS-5
// (2012) Table A.1 and its entrance loss table) hold the same keys and values: a typing slip in
// one of them fails here.
TEST(CulvertTables, ShippedInletTableMatchesTheTestTable) {
    const auto shipped =
        io::read_culvert_inlet_table(catchpeak::test::config_dir() / io::culvert_inlets_file);
    const auto memory = catchpeak::test::hds5_inlets();
    ASSERT_EQ(shipped.rows().size(), memory.rows().size());
    for (const auto &m : memory.rows()) {
        const auto &s = shipped.at(m.key);
        EXPECT_EQ(s.shape, m.shape) << m.key;
        EXPECT_EQ(s.form, m.form) << m.key;
        EXPECT_DOUBLE_EQ(s.k, m.k) << m.key;
        EXPECT_DOUBLE_EQ(s.m, m.m) << m.key;
        EXPECT_DOUBLE_EQ(s.c, m.c) << m.key;
        EXPECT_DOUBLE_EQ(s.y, m.y) << m.key;
        EXPECT_DOUBLE_EQ(s.ks, m.ks) << m.key;
        EXPECT_DOUBLE_EQ(s.ke, m.ke) << m.key;
    }
    // The keys the culvert table accepts (the list) are all there.
    for (const char *key : {"concrete_square_headwall", "concrete_groove_headwall",
                            "concrete_groove_projecting", "cmp_headwall", "cmp_mitered",
                            "cmp_projecting", "box_wingwall_30_75", "box_wingwall_0"}) {
        EXPECT_NO_THROW((void)shipped.at(key)) << key;
    }
}

TEST(CulvertTables, BadInletRowsNameTheCell) {
    const std::string head = "# source: s\n# status: t\nkey,shape,form,k,m,c,y,ks,ke,source\n";
    const std::string good = "a,circular,1,0.0098,2.0,0.0398,0.67,-0.5,0.5,x\n";
    EXPECT_NO_THROW((void)io::read_culvert_inlet_table(write("inlets_ok", "t.csv", head + good)));
    const auto refused = [&](const std::string &name, const std::string &text,
                             const std::string &expect) {
        const auto path = write("inlets_bad_" + name, "t.csv", text);
        const std::string m =
            catchpeak::test::input_error_of([&] { (void)io::read_culvert_inlet_table(path); });
        EXPECT_NE(m.find(expect), std::string::npos) << m;
    };
    refused("form", head + "a,circular,3,0.0098,2.0,0.0398,0.67,-0.5,0.5,x\n", "column 'form'");
    refused("k", head + "a,circular,1,-0.1,2.0,0.0398,0.67,-0.5,0.5,x\n", "column 'k'");
    refused("shape", head + "a,oval,1,0.0098,2.0,0.0398,0.67,-0.5,0.5,x\n", "column 'shape'");
    refused("ke", head + "a,circular,1,0.0098,2.0,0.0398,0.67,-0.5,2.5,x\n", "column 'ke'");
    refused("source", "# status: t\nkey,shape,form,k,m,c,y,ks,ke,source\n" + good, "# source");
    refused("twice", head + good + good, "twice");
}

TEST(CulvertTables, ShippedSizeListsInBothUnits) {
    const auto dir = catchpeak::test::config_dir();
    const auto si = io::read_culvert_sizes(dir / io::culvert_sizes_file(false));
    const auto us = io::read_culvert_sizes(dir / io::culvert_sizes_file(true));
    for (const auto *list : {&si, &us}) {
        std::size_t circular = 0;
        std::size_t box = 0;
        for (const auto &s : *list) {
            EXPECT_GT(s.rise_m, 0.0);
            if (s.shape == hy::Shape::circular) {
                ++circular;
                EXPECT_DOUBLE_EQ(s.span_m, s.rise_m);
            } else {
                ++box;
            }
        }
        EXPECT_GE(circular, 15U);
        EXPECT_GE(box, 20U);
    }
    // 24 in = 0.6096 m exactly (1 in = 25.4 mm); 600 mm = 0.6 m.
    const auto has = [](const std::vector<hy::Section> &l, double d) {
        for (const auto &s : l) {
            if (s.shape == hy::Shape::circular && std::abs(s.rise_m - d) < 1e-12) {
                return true;
            }
        }
        return false;
    };
    EXPECT_TRUE(has(us, 0.6096));
    EXPECT_TRUE(has(si, 0.6));
}

TEST(CulvertTables, BadSizeListsAreRefused) {
    const std::string head = "# source: s\n# status: t\n";
    const auto refused = [&](const std::string &name, const std::string &text,
                             const std::string &expect) {
        const auto path = write("sizes_bad_" + name, "s.csv", text);
        const std::string m =
            catchpeak::test::input_error_of([&] { (void)io::read_culvert_sizes(path); });
        EXPECT_NE(m.find(expect), std::string::npos) << m;
    };
    refused("units", head + "shape,span,rise\ncircular,300,300\n", "span_mm");
    refused("round", head + "shape,span_mm,rise_mm\ncircular,300,450\n", "column 'rise_mm'");
    refused("zero", head + "shape,span_mm,rise_mm\nbox,0,450\n", "column 'span_mm'");
    refused("twice", head + "shape,span_in,rise_in\nbox,48,24\nbox,48,24\n", "twice");
    refused("empty", head + "shape,span_mm,rise_mm\n", "no data rows");
}

} // namespace
