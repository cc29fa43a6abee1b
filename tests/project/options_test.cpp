// SPDX-License-Identifier: MIT
// Every option's table: each value of its enum has exactly one text, and text and value
// round-trip; and the project parser takes every text of every table.
#include "catchpeak/project/options.hpp"

#include "catchpeak/core/methods.hpp"
#include "catchpeak/core/snap_rule.hpp"
#include "catchpeak/core/units.hpp"
#include "catchpeak/hydro/tables.hpp"
#include "catchpeak/project/project.hpp"
#include "catchpeak/report/results.hpp"
#include "support/test_project.hpp"

#include <gtest/gtest.h>

#include <set>
#include <string>

using namespace catchpeak;

namespace {

/// A project of the 2-year return period with its 24-hour depth, for a method to be added.
test::ProjectToml two_year_project() {
    test::ProjectToml t;
    t.project.text("name", "x");
    t.inputs.text("catchment_table", "c.csv");
    t.rainfall.text("idf", "i.csv")
        .set("return_periods_yr", "[2]")
        .set("depths_24h_mm", "{ \"2\" = 50 }");
    return t;
}

/// Each text names one value and each value has one text; `count` is the number of the enum's
/// values (its last enumerator + 1), so a value added to the enum without a row fails here.
template <class E, std::size_t N>
void expect_round_trip(const OptionTable<E, N> &table, std::size_t count) {
    EXPECT_EQ(N, count) << "a value of the enum has no row, or a row is extra";
    std::set<std::string_view> keys;
    std::set<int> values;
    for (const auto &[key, value] : table) {
        EXPECT_TRUE(keys.insert(key).second) << "text listed twice: " << key;
        EXPECT_TRUE(values.insert(static_cast<int>(value)).second) << "value listed twice: " << key;
        EXPECT_EQ(option_key(table, value), key);
        EXPECT_EQ(find_option(table, key), value) << key;
    }
    for (std::size_t v = 0; v < count; ++v) {
        EXPECT_NO_THROW((void)option_key(table, static_cast<E>(v))) << v;
    }
    EXPECT_EQ(find_option(table, "no such option"), std::nullopt);
}

} // namespace

TEST(OptionTables, EveryValueRoundTripsThroughItsText) {
    expect_round_trip(tc_method_options, static_cast<std::size_t>(TcMethod::given) + 1);
    expect_round_trip(peak_method_options,
                      static_cast<std::size_t>(PeakMethod::scs_unit_hydrograph) + 1);
    expect_round_trip(hydro::storm_type_options,
                      static_cast<std::size_t>(hydro::StormType::type_iii) + 1);
    expect_round_trip(units::system_options,
                      static_cast<std::size_t>(units::System::us_customary) + 1);
    expect_round_trip(report::page_size_options,
                      static_cast<std::size_t>(report::PageSize::a4) + 1);
    expect_round_trip(project::design_storm_options,
                      static_cast<std::size_t>(project::DesignStorm::alternating_block) + 1);
    expect_round_trip(project::cn_weighting_options,
                      static_cast<std::size_t>(project::CnWeighting::runoff) + 1);
    expect_round_trip(project::ams_distribution_options,
                      static_cast<std::size_t>(project::AmsDistribution::gev) + 1);
    expect_round_trip(project::dual_soil_group_options,
                      static_cast<std::size_t>(project::DualSoilGroup::undrained) + 1);
    expect_round_trip(snap_rule_options, static_cast<std::size_t>(SnapRule::none) + 1);
    // hydro::ShallowSurface { paved, unpaved }.
    expect_round_trip(project::shallow_surface_options,
                      static_cast<std::size_t>(hydro::ShallowSurface::unpaved) + 1);
}

TEST(OptionTables, UncoveredLandIsARefusalOrAClass) {
    EXPECT_EQ(project::parse_uncovered_land(project::refuse_uncovered_key),
              project::UncoveredLand{project::RefuseUncovered{}});
    EXPECT_EQ(project::parse_uncovered_land("meadow"),
              project::UncoveredLand{project::UncoveredAsClass{"meadow"}});
    for (const std::string text : {"refuse", "meadow", "woods_good"}) {
        EXPECT_EQ(project::uncovered_land_key(project::parse_uncovered_land(text)), text);
    }
}

TEST(OptionTables, TheParserTakesEveryTcMethodText) {
    for (const auto &[key, value] : tc_method_options) {
        if (value == TcMethod::given) {
            continue; // only per point, with a tc (the parser refuses it as the default)
        }
        project::Problems problems;
        auto toml = two_year_project();
        toml.methods.text("tc", std::string(key));
        const auto p = project::parse_project(toml.toml(), "dir/p.toml", problems);
        EXPECT_TRUE(problems.empty()) << key << ": " << problems.list().front();
        EXPECT_EQ(p.methods.tc_method, value) << key;
    }
}

TEST(OptionTables, TheParserTakesEverySnapRuleText) {
    for (const auto &[key, value] : snap_rule_options) {
        project::Problems problems;
        auto toml = two_year_project();
        toml.settings.text("snap", std::string(key));
        const auto p = project::parse_project(toml.toml(), "dir/p.toml", problems);
        EXPECT_TRUE(problems.empty()) << key << ": " << problems.list().front();
        EXPECT_EQ(p.settings.snap, value) << key;
    }
}

TEST(OptionTables, TheParserTakesEveryPeakMethodText) {
    for (const auto &[key, value] : peak_method_options) {
        project::Problems problems;
        auto toml = two_year_project();
        toml.rainfall.text("storm_type", "II");
        toml.methods.set("peak", "[\"" + std::string(key) + "\"]");
        const auto p = project::parse_project(toml.toml(), "dir/p.toml", problems);
        EXPECT_TRUE(problems.empty()) << key << ": " << problems.list().front();
        EXPECT_EQ(p.methods.peak_methods, std::vector<PeakMethod>{value}) << key;
    }
}

TEST(OptionTables, TheParserTakesEveryCnWeightingText) {
    for (const auto &[key, value] : project::cn_weighting_options) {
        project::Problems problems;
        auto toml = two_year_project();
        toml.methods.text("cn_weighting", std::string(key));
        const auto p = project::parse_project(toml.toml(), "dir/p.toml", problems);
        EXPECT_TRUE(problems.empty()) << key << ": " << problems.list().front();
        EXPECT_EQ(p.methods.cn_weighting, value) << key;
    }
    project::Problems problems; // not given: the composite CN, as before the option
    const auto p = project::parse_project(two_year_project().toml(), "dir/p.toml", problems);
    EXPECT_EQ(p.methods.cn_weighting, project::CnWeighting::composite);
}
