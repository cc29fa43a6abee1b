// SPDX-License-Identifier: MIT
// The controlling headwater, the limit, sizing, and every line rendered in both unit systems.
#include "catchpeak/hydraulics/channel.hpp"
#include "catchpeak/hydraulics/culvert.hpp"

#include "hydraulics/inlet_rows.hpp"
#include "support/calc_lines.hpp"

#include <gtest/gtest.h>

#include <algorithm>

namespace catchpeak::hydraulics {
namespace {

using units::System;

Culvert concrete_pipe() {
    return {Section::circular(1.2),
            1,
            40.0,
            0.01,
            0.012,
            test::hds5_inlets().at("concrete_square_headwall")};
}

std::vector<Section> pipe_sizes() {
    return {Section::circular(1.5), Section::circular(0.6),  Section::circular(0.9),
            Section::circular(1.2), Section::circular(0.75), Section::circular(1.05)};
}

TEST(Culvert, TheLargerHeadwaterControls) {
    const Site site{100.0, 0.3, {std::nullopt, 1.5}};
    const auto r = analyse(concrete_pipe(), 2.0, site, System::si);
    EXPECT_DOUBLE_EQ(r.value.hw_m, std::max(r.value.inlet.hw_m, r.value.outlet.hw_m));
    EXPECT_EQ(r.value.control,
              r.value.inlet.hw_m >= r.value.outlet.hw_m ? Control::inlet : Control::outlet);
    EXPECT_DOUBLE_EQ(r.value.allowed_hw_m, 1.5 * 1.2);
    EXPECT_EQ(r.value.passes, r.value.hw_m <= 1.8);
    EXPECT_GT(r.value.outlet_velocity_m_s, 0.0);
}

// The stricter limit governs: an elevation 1.0 m above the invert against HW/D = 1.5 (1.8 m).
TEST(Culvert, TheStricterLimitGoverns) {
    const Site site{100.0, 0.3, {101.0, 1.5}};
    const auto r = analyse(concrete_pipe(), 2.0, site, System::si);
    EXPECT_NEAR(r.value.allowed_hw_m, 1.0, 1e-12);
    if (!r.value.passes) {
        EXPECT_TRUE(r.lines.has(keys::hw_over_limit));
    }
    const Site none{100.0, 0.3, {}};
    EXPECT_THROW((void)analyse(concrete_pipe(), 2.0, none, System::si), InputError);
}

TEST(Culvert, AdverseSlopeIsWarned) {
    Culvert c = concrete_pipe();
    c.slope_m_per_m = -0.002;
    const auto r = analyse(c, 1.0, {100.0, 0.2, {std::nullopt, 1.5}}, System::si);
    EXPECT_TRUE(r.lines.has(keys::adverse_slope));
}

// Sizing takes the smallest passing size whatever the list's order, and names the next smaller
// one with the headwater that fails it.
TEST(Sizing, SmallestPassingSizeAndTheNextSmaller) {
    const auto sizes = pipe_sizes();
    const Site site{100.0, 0.2, {std::nullopt, 1.2}};
    const auto z = size_culvert(concrete_pipe(), sizes, 1.5, site, System::si);
    ASSERT_TRUE(z.value.chosen);
    EXPECT_TRUE(z.value.chosen_result->passes);
    ASSERT_TRUE(z.value.next_smaller);
    EXPECT_FALSE(z.value.next_smaller_result->passes);
    EXPECT_GT(z.value.next_smaller_result->hw_m, z.value.next_smaller_result->allowed_hw_m);
    const double chosen_d = sizes[*z.value.chosen].rise_m;
    EXPECT_LT(sizes[*z.value.next_smaller].rise_m, chosen_d);
    for (const auto &s : sizes) { // every size between them would fail: none lies between
        EXPECT_FALSE(s.rise_m > sizes[*z.value.next_smaller].rise_m && s.rise_m < chosen_d);
    }
    // Each smaller size fails on its own.
    for (const auto &s : sizes) {
        if (s.rise_m < chosen_d) {
            Culvert c = concrete_pipe();
            c.section = s;
            EXPECT_FALSE(analyse(c, 1.5, site, System::si).value.passes) << s.rise_m;
        }
    }
    EXPECT_TRUE(z.lines.has("culvert.size_chosen"));
    EXPECT_TRUE(z.lines.has("culvert.size_smaller_fails"));
}

TEST(Sizing, AFlowBeyondEverySizeNamesTheLargest) {
    const auto sizes = pipe_sizes();
    const Site site{100.0, 0.2, {std::nullopt, 1.2}};
    const auto z = size_culvert(concrete_pipe(), sizes, 40.0, site, System::si);
    EXPECT_FALSE(z.value.chosen);
    EXPECT_EQ(z.value.largest_tried, 0U); // the 1.5 m pipe, first in the list
    const auto &w = test::line_keyed(z.lines, std::string(keys::no_size_passes));
    EXPECT_EQ(w.kind, LineKind::warning);
    EXPECT_NE(test::text(w).numbers.find("the largest, 1.500 m"), std::string::npos);
}

// Every line of every step renders in both unit systems (no template names a missing symbol).
TEST(Lines, EveryLineRendersInBothSystems) {
    for (const System sys : {System::si, System::us_customary}) {
        const Site site{100.0, 0.25, {101.6, 1.5}};
        CalcLines all;
        for (const double q : {0.3, 1.5, 4.0, 40.0}) {
            all.append(size_culvert(concrete_pipe(), pipe_sizes(), q, site, sys).lines);
            Culvert box{Section::box(2.0, 1.5),
                        2,
                        30.0,
                        -0.001,
                        0.013,
                        test::hds5_inlets().at("box_wingwall_30_75")};
            all.append(
                size_culvert(box, {Section::box(1.5, 1.0), Section::box(2.0, 1.5)}, q, site, sys)
                    .lines);
            all.append(normal_depth_m({3.0, 2.0, 0.035, 0.004}, q, sys).lines);
        }
        ASSERT_GT(all.size(), 100U);
        for (const auto &l : all.lines()) {
            const LineText t = test::text(l);
            EXPECT_FALSE(t.label.empty()) << l.key;
            EXPECT_FALSE(t.numbers.empty()) << l.key;
            EXPECT_EQ(l.key.rfind("culvert.", 0), 0U) << l.key;
        }
    }
}

} // namespace
} // namespace catchpeak::hydraulics
